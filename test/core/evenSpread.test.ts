import { describe, expect, it } from 'vitest';
import { evenSpread } from '../../src/core/evenSpread.js';

describe('evenSpread', () => {
  it('keeps everything within the budget and spreads the budget over larger counts, ends included', () => {
    expect(evenSpread(4, 10)).toEqual([0, 1, 2, 3]);
    expect(evenSpread(11, 3)).toEqual([0, 5, 10]);
    expect(evenSpread(10, 4)).toEqual([0, 3, 6, 9]);
    expect(evenSpread(10, 1)).toEqual([0]);
    expect(evenSpread(10, 0)).toEqual([]);
  });

  it('gives budget distinct ascending indices below n', () => {
    for (const [n, budget] of [
      [1000, 7],
      [2001, 2000],
      [5, 4],
    ]) {
      const got = evenSpread(n, budget);
      expect(got).toHaveLength(budget);
      expect(new Set(got).size).toBe(budget);
      expect(got.every((x, i) => x >= 0 && x < n && (i === 0 || x > got[i - 1]))).toBe(true);
    }
  });
});
