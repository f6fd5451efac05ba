import { describe, expect, it } from 'vitest';
import { topN } from '../../../../src/core/index/search/topN.js';
import { createRandom } from '../../../../src/core/random.js';

/** Reference: sort every accepted, non-NaN slot by score descending, then slot ascending. */
function fullSort(scores: Float64Array, n: number, accept: (s: number) => boolean): { slot: number; score: number }[] {
  return Array.from(scores, (score, slot) => ({ slot, score }))
    .filter((r) => accept(r.slot) && !Number.isNaN(r.score))
    .sort((a, b) => b.score - a.score || a.slot - b.slot)
    .slice(0, Math.max(0, n));
}

describe('topN', () => {
  it('equals a full sort, with ties, NaN, −Infinity and a filter', () => {
    const rnd = createRandom(7);
    for (let trial = 0; trial < 40; trial++) {
      const len = 1 + Math.floor(rnd.next() * 500);
      // Few distinct values so that ties are common.
      const scores = Float64Array.from({ length: len }, () => {
        const u = rnd.next();
        return u < 0.05 ? NaN : u < 0.1 ? Number.NEGATIVE_INFINITY : Math.floor(rnd.next() * 20) / 4;
      });
      const mod = 1 + Math.floor(rnd.next() * 4);
      const accept = (s: number): boolean => s % mod !== 1;
      for (const n of [0, 1, 3, 10, len, len + 5]) expect(topN(scores, n, accept)).toEqual(fullSort(scores, n, accept));
    }
  });

  it('asks the filter only about slots that would enter the selection', () => {
    const scores = Float64Array.from({ length: 1000 }, (_, i) => (i < 10 ? 100 - i : i % 50));
    const asked: number[] = [];
    const hits = topN(scores, 10, (s) => (asked.push(s), true));
    expect(hits.map((h) => h.slot)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(asked).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });
});
