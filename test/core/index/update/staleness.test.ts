import { describe, expect, it } from 'vitest';
import { ChangeCounters } from '../../../../src/core/index/update/staleness.js';
import type { DocTerms } from '../../../../src/core/counting/termCounts.js';

const doc = (ids: number[], counts: number[]): DocTerms => ({
  termIds: Int32Array.from(ids),
  counts: Float32Array.from(counts),
  length: counts.reduce((s, c) => s + c, 0),
});

// Expected values are the definitions worked by hand (changed/(live + removed), unknown/folded
// tokens, mean residual / build-time mean).
describe('ChangeCounters', () => {
  it('measures changed share, new-term mass and residual ratio from folds and removals', () => {
    const c = new ChangeCounters();
    c.folded(doc([1, 5, 9], [2, 3, 1]), 5); // ids 5 and 9 are new: 4 of 6 tokens
    c.folded(doc([2], [4]), 5); // no new ids: 0 of 4
    c.removed(false); // a build-time document
    c.removed(true); // a folded one: already counted among the folded
    const slots = [{ folded: true, residual: 0.3 }, null, { folded: false, residual: 0 }, { folded: true, residual: 0.5 }];
    const s = c.measure(slots, 3, 0.2);
    expect(s.changedFiles).toBe(3); // 2 folded slots + 1 removed build-time document
    expect(s.changedShare).toBeCloseTo(3 / 4, 15);
    expect(s.newTermMass).toBeCloseTo(4 / 10, 15);
    expect(s.residualRatio).toBeCloseTo(0.4 / 0.2, 12);
  });

  it('reports a fresh index as unchanged and restores saved counters', () => {
    const c = new ChangeCounters();
    expect(c.measure([{ folded: false, residual: 0 }], 1, 0.2)).toEqual({
      changedFiles: 0,
      changedShare: 0,
      newTermMass: 0,
      residualRatio: 1,
    });
    c.restore({ removedSinceBuild: 2, foldedTokens: 10, foldedUnknownTokens: 5 });
    expect(c.counters).toEqual({ removedSinceBuild: 2, foldedTokens: 10, foldedUnknownTokens: 5 });
    expect(c.measure([{ folded: false, residual: 0 }], 1, 0.2).changedShare).toBeCloseTo(2 / 3, 15);
  });
});
