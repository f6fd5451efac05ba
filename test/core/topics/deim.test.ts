/**
 * DEIM index selection. References: (1) DEIM picks the same indices as Gaussian elimination with
 * partial (row) pivoting on the basis V (Sorensen & Embree 2016, SISC 38(3), §3 [M: equivalence
 * recalled from the paper]), checked against a brute-force LU written here; (2) the interpolation
 * constant η = ‖V(p,:)⁻¹‖₂ stays below √(nk/3)·2^k (Sorensen & Embree, Lemma 3.2 [M]), with the
 * norm computed by ml-matrix. DEIM on real text is exercised in cur.test.ts.
 */
import { inverse, Matrix, SingularValueDecomposition, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { deimIndices, solveSquare } from '../../../src/core/topics/deim.js';
import { orthonormalBasis } from './fixtures.js';

/** Row pivots of LU with partial pivoting on an n×k matrix (first k pivots). */
function luPivots(basis: Float64Array, n: number, k: number): number[] {
  const a = Float64Array.from(basis);
  const rows = Array.from({ length: n }, (_, i) => i);
  const pivots: number[] = [];
  for (let c = 0; c < k; c++) {
    let best = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[rows[r] * k + c]) > Math.abs(a[rows[best] * k + c])) best = r;
    [rows[c], rows[best]] = [rows[best], rows[c]];
    const p = rows[c];
    pivots.push(p);
    for (let r = c + 1; r < n; r++) {
      const i = rows[r];
      const f = a[i * k + c] / a[p * k + c];
      for (let t = c; t < k; t++) a[i * k + t] -= f * a[p * k + t];
    }
  }
  return pivots;
}

function eta(basis: Float64Array, k: number, picks: number[]): number {
  const sub = new Matrix(picks.map((p) => Array.from(basis.subarray(p * k, (p + 1) * k))));
  return new SingularValueDecomposition(inverse(sub)).norm2;
}

describe('DEIM index selection', () => {
  for (const [n, k, seed] of [
    [40, 4, 1],
    [200, 10, 2],
    [500, 20, 3],
  ] as const) {
    it(`equals partial-pivoting LU row order and keeps η below √(nk/3)·2^k (n=${n}, k=${k})`, () => {
      const v = orthonormalBasis(n, k, seed);
      const picks = deimIndices(v, n, k, k);
      expect(picks).toEqual(luPivots(v, n, k));
      expect(new Set(picks).size).toBe(k);
      expect(eta(v, k, picks)).toBeLessThan(Math.sqrt((n * k) / 3) * 2 ** k);
    });
  }

  it('is deterministic and reads only the first k columns of a wider basis', () => {
    const v = orthonormalBasis(60, 8, 9);
    const first = deimIndices(v, 60, 8, 5);
    expect(deimIndices(v, 60, 8, 5)).toEqual(first);
    const narrow = new Float64Array(60 * 5);
    for (let i = 0; i < 60; i++) for (let c = 0; c < 5; c++) narrow[i * 5 + c] = v[i * 8 + c];
    expect(deimIndices(narrow, 60, 5, 5)).toEqual(first);
  });

  it('stops early when the basis has fewer independent directions than k', () => {
    // Column 2 repeats column 1: only 2 independent vectors.
    const n = 10;
    const r = createRandom(4);
    const v = new Float64Array(n * 3);
    for (let i = 0; i < n; i++) {
      v[i * 3] = r.normal();
      v[i * 3 + 1] = r.normal();
      v[i * 3 + 2] = v[i * 3 + 1];
    }
    expect(deimIndices(v, n, 3, 3)).toHaveLength(2);
  });

  it('rejects k outside 1…min(n, columns)', () => {
    expect(() => deimIndices(new Float64Array(6), 3, 2, 3)).toThrow(/DEIM needs/);
  });

  it('solves small systems like ml-matrix and reports singular ones', () => {
    const a = Float64Array.from([2, 1, 0, 1, 3, 1, 0, 1, 4]);
    const b = Float64Array.from([1, 2, 3]);
    const x = solveSquare(a, b, 3)!;
    const ref = solve(
      new Matrix([
        [2, 1, 0],
        [1, 3, 1],
        [0, 1, 4],
      ]),
      Matrix.columnVector([1, 2, 3]),
    );
    for (let i = 0; i < 3; i++) expect(x[i]).toBeCloseTo(ref.get(i, 0), 12);
    expect(solveSquare(Float64Array.from([1, 2, 2, 4]), Float64Array.from([1, 1]), 2)).toBeNull();
  });
});
