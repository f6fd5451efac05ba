/**
 * NPMI coherence (Röder, Both & Hinneburg 2015; Bouma 2009), checked against values computed by
 * hand from the definition on a 4-document example (our example).
 */
import { describe, expect, it } from 'vitest';
import type { CsrMatrix } from '../../../src/core/matrix/sparse.js';
import { npmiCoherence, npmiPair, NPMI_EPSILON } from '../../../src/core/topics/coherence.js';

// Documents × terms: d0 {0,1}, d1 {0,1}, d2 {2}, d3 {1,2}
const a: CsrMatrix = {
  rows: 4,
  cols: 3,
  indptr: Int32Array.from([0, 2, 4, 5, 7]),
  indices: Int32Array.from([0, 1, 0, 1, 2, 1, 2]),
  values: Float64Array.from([1, 1, 1, 1, 1, 1, 1]),
};

describe('npmiCoherence', () => {
  it('follows the definition', () => {
    // Terms 0 and 1: P(0) = 2/4, P(1) = 3/4, P(0,1) = 2/4 → ln((.5+ε)/(.375)) / −ln(.5+ε).
    const p = 0.5 + NPMI_EPSILON;
    const want01 = Math.log(p / 0.375) / -Math.log(p);
    // Terms 1 and 2: P(2) = 2/4, P(1,2) = 1/4.
    const q = 0.25 + NPMI_EPSILON;
    const want12 = Math.log(q / 0.375) / -Math.log(q);
    const [s01, s12, s02, s012] = npmiCoherence(a, [
      [0, 1],
      [1, 2],
      [0, 2],
      [0, 1, 2],
    ]);
    expect(s01).toBeCloseTo(want01, 12);
    expect(s12).toBeCloseTo(want12, 12);
    expect(s02).toBe(-1); // never together
    expect(s012).toBeCloseTo((want01 + want12 - 1) / 3, 12);
  });

  it('always together is 1, independent is 0, a single term is NaN', () => {
    expect(npmiPair([0, 1], [0, 1], 2)).toBeCloseTo(1, 9); // P = 1: −ln(1+ε) ≈ 0 → limit 1
    expect(npmiPair([0, 1], [0, 2], 4)).toBeCloseTo(0, 9); // P(x,y) = 1/4 = P(x)·P(y)
    expect(npmiCoherence(a, [[0]])[0]).toBeNaN();
  });
});
