/** Units of what two files share (sharedUnits.ts): the documented unit rule, case by case. */
import { describe, expect, it } from 'vitest';
import { describeShared, MIN_LINES, sharedAmount } from '../../../src/core/lookalike/sharedUnits.js';

describe('sharedAmount', () => {
  it('counts lines when both files have enough of them', () => {
    expect(sharedAmount({ sharedLines: 11, lines: [12, 12], sharedWords: 90, words: [96, 96] })).toEqual({
      unit: 'lines',
      shared: 11,
      of: 12,
    });
  });

  it('counts words for one-line files, where "0 shared lines" would say nothing', () => {
    const p = { sharedLines: 0, lines: [1, 1] as const, sharedWords: 14, words: [15, 16] as const };
    expect(MIN_LINES).toBeGreaterThan(1);
    expect(sharedAmount(p)).toEqual({ unit: 'words', shared: 14, of: 16 });
    expect(describeShared(p)).toBe('14 of 16 words shared');
    expect(describeShared({ sharedLines: 1, lines: [1, 1], sharedWords: 1, words: [1, 1] })).toBe('1 of 1 word shared');
  });
});
