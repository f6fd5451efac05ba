/**
 * Topic descriptions. Reference: the difference of means written out by brute force on a dense
 * copy of the matrix; the "picks first" rule checked on a hand-made list.
 */
import { describe, expect, it } from 'vitest';
import { csrFromDense } from '../../../src/core/matrix/sparse.js';
import { createRandom } from '../../../src/core/random.js';
import { rankWithPicks, termContrast } from '../../../src/core/topics/topicSignature.js';

describe('term contrast', () => {
  it('is the mean weight inside each topic minus the mean outside', () => {
    const rows = 9;
    const cols = 7;
    const r = createRandom(2);
    const data = Float64Array.from({ length: rows * cols }, () => (r.next() < 0.4 ? r.next() : 0));
    const topicOf = Int32Array.from([0, 1, 2, 0, 1, -1, 2, 0, 1]); // row 5 unplaced
    const got = termContrast(csrFromDense(rows, cols, data), topicOf, 3);
    for (let t = 0; t < 3; t++)
      for (let c = 0; c < cols; c++) {
        const inside = [...topicOf.keys()].filter((i) => topicOf[i] === t);
        const outside = [...topicOf.keys()].filter((i) => topicOf[i] !== t);
        const mean = (ids: number[]) => ids.reduce((s, i) => s + data[i * cols + c], 0) / ids.length;
        expect(got[t * cols + c]).toBeCloseTo(mean(inside) - mean(outside), 12);
      }
  });

  it('with a single topic covering everything, is the plain mean', () => {
    const got = termContrast(csrFromDense(2, 2, [1, 0, 3, 2]), Int32Array.from([0, 0]), 1);
    expect([...got]).toEqual([2, 1]);
  });
});

describe('picks-first ranking', () => {
  it('moves picked items of the top 3·count to the front, keeping order, and stops at count', () => {
    const ranked = ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h'];
    const picked = new Set(['c', 'f', 'h']);
    expect(rankWithPicks(ranked, (x) => picked.has(x), 2)).toEqual(['c', 'f']);
    expect(rankWithPicks(ranked, (x) => picked.has(x), 3)).toEqual(['c', 'f', 'h']);
    // 'h' is outside the top 3 when count = 1, so only 'c' can move up.
    expect(rankWithPicks(ranked, (x) => picked.has(x), 1)).toEqual(['c']);
    expect(rankWithPicks(ranked, () => false, 3)).toEqual(['a', 'b', 'c']);
  });
});
