import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { topEigenpairs } from '../../../src/core/map/topEigen.js';
import { createRandom } from '../../../src/core/random.js';

function randomSymmetric(n: number, seed: number): Float64Array {
  const rng = createRandom(seed);
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const v = rng.normal();
      a[i * n + j] = v;
      a[j * n + i] = v;
    }
  }
  return a;
}

describe('topEigenpairs', () => {
  it('matches ml-matrix’s dense solver on an indefinite matrix through the Lanczos path', () => {
    const n = 150;
    const a = randomSymmetric(n, 4);
    const got = topEigenpairs(a, n, 3, { denseMaxN: 10 });
    const ref = new EigenvalueDecomposition(new Matrix(Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, (i + 1) * n)))), {
      assumeSymmetric: true,
    });
    const expected = [...ref.realEigenvalues].sort((x, y) => y - x).slice(0, 3);
    for (let r = 0; r < 3; r++) expect(got.values[r]).toBeCloseTo(expected[r], 8);
    // Each returned vector satisfies A·v = λ·v.
    for (let r = 0; r < 3; r++) {
      let res = 0;
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s += a[i * n + j] * got.vectors[r * n + j];
        res += (s - got.values[r] * got.vectors[r * n + i]) ** 2;
      }
      expect(Math.sqrt(res)).toBeLessThan(1e-6);
    }
  });

  it('finds the largest positive eigenvalues even when a negative one is larger in magnitude', () => {
    // diag(5, 3, −100, 1) rotated by a fixed orthogonal matrix: the answer is 5 then 3.
    const d = [5, 3, -100, 1, 0.5, -2, 0.1, 0, 0, 0, 0.2, 0.3];
    const n = d.length;
    // An orthogonal basis: the eigenvectors of a random symmetric matrix.
    const qr = new EigenvalueDecomposition(
      new Matrix(Array.from({ length: n }, (_, i) => Array.from(randomSymmetric(n, 1).subarray(i * n, (i + 1) * n)))),
      {
        assumeSymmetric: true,
      },
    ).eigenvectorMatrix;
    const a = qr.mmul(Matrix.diag(d)).mmul(qr.transpose());
    const flat = Float64Array.from(a.to1DArray());
    const got = topEigenpairs(flat, n, 2, { denseMaxN: 4 });
    expect(got.values[0]).toBeCloseTo(5, 9);
    expect(got.values[1]).toBeCloseTo(3, 9);
  });

  it('makes the largest-magnitude entry of each eigenvector positive', () => {
    const n = 80;
    const got = topEigenpairs(randomSymmetric(n, 7), n, 2);
    for (let r = 0; r < 2; r++) {
      const row = Array.from(got.vectors.subarray(r * n, (r + 1) * n));
      const big = row.reduce((m, v) => (Math.abs(v) > Math.abs(m) ? v : m), 0);
      expect(big).toBeGreaterThan(0);
    }
  });
});
