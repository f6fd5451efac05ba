/**
 * Column-pivoted QR selection. Reference: the Businger–Golub rule written out by brute force with
 * ml-matrix: at each step project every column of V_kᵀ onto the orthogonal complement of the
 * columns already chosen (I − Q Q⁺ with ml-matrix's pseudoInverse) and take the largest residual.
 */
import { Matrix, pseudoInverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { pivotedQrIndices } from '../../../src/core/topics/pivotedQr.js';
import { orthonormalBasis } from './fixtures.js';

function bruteForcePivots(v: Float64Array, n: number, k: number): number[] {
  const cols = Array.from({ length: n }, (_, i) => Matrix.columnVector(Array.from(v.subarray(i * k, (i + 1) * k))));
  const chosen: number[] = [];
  for (let step = 0; step < k; step++) {
    let proj: Matrix | null = null;
    if (chosen.length > 0) {
      const q = new Matrix(k, chosen.length);
      chosen.forEach((c, t) => q.setColumn(t, cols[c].getColumn(0)));
      proj = q.mmul(pseudoInverse(q));
    }
    let best = -1;
    let bestNorm = -1;
    for (let i = 0; i < n; i++) {
      if (chosen.includes(i)) continue;
      const r = proj ? cols[i].clone().sub(proj.mmul(cols[i])) : cols[i];
      const norm = r.norm();
      if (norm > bestNorm + 1e-12) {
        bestNorm = norm;
        best = i;
      }
    }
    chosen.push(best);
  }
  return chosen;
}

describe('pivoted QR selection', () => {
  for (const [n, k, seed] of [
    [30, 3, 1],
    [120, 8, 2],
    [300, 12, 3],
  ] as const) {
    it(`picks what the brute-force Businger–Golub rule picks (n=${n}, k=${k})`, () => {
      const v = orthonormalBasis(n, k, seed);
      expect(pivotedQrIndices(v, n, k, k)).toEqual(bruteForcePivots(v, n, k));
    });
  }

  it('picks k distinct indices and the first is the row of largest norm', () => {
    const v = orthonormalBasis(80, 6, 5);
    const picks = pivotedQrIndices(v, 80, 6, 6);
    expect(new Set(picks).size).toBe(6);
    let best = 0;
    let bestNorm = -1;
    for (let i = 0; i < 80; i++) {
      let s = 0;
      for (let c = 0; c < 6; c++) s += v[i * 6 + c] ** 2;
      if (s > bestNorm) {
        bestNorm = s;
        best = i;
      }
    }
    expect(picks[0]).toBe(best);
  });

  it('stops when only copies of chosen rows remain', () => {
    // Every row is one of two directions: two pivots, then nothing is left.
    const v = new Float64Array(8 * 3);
    for (let i = 0; i < 8; i++) v.set(i % 2 === 0 ? [1, 0, 0] : [0, 0.5, 0.5], i * 3);
    expect(pivotedQrIndices(v, 8, 3, 3)).toEqual([0, 1]);
  });
});
