import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../../src/core/errors.js';
import { symmetricEigen } from '../../../src/core/matrix/symmetricEigen.js';
import { createRandom } from '../../../src/core/random.js';

// References: ml-matrix's EigenvalueDecomposition (a general-purpose library; the same EISPACK
// tred2/tql2 steps, so every bit must agree); Wilkinson's W₂₁⁺ matrix (Wilkinson 1965, The Algebraic
// Eigenvalue Problem, §5.45: its two largest eigenvalues agree to about 14 figures; the values below
// are numpy.linalg.eigvalsh's, LAPACK dsyevd, computed here when the test was written); the
// definition of an eigenpair (A v = λ v, V orthonormal) checked by brute-force products.

function randomSymmetric(n: number, seed: number): Float64Array {
  const rnd = createRandom(seed);
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      const v = rnd.normal();
      a[i * n + j] = v;
      a[j * n + i] = v;
    }
  return a;
}

function wilkinson21(): Float64Array {
  const n = 21;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    a[i * n + i] = Math.abs(i - 10);
    if (i + 1 < n) a[i * n + i + 1] = a[(i + 1) * n + i] = 1;
  }
  return a;
}

describe('symmetricEigen', () => {
  it.each([1, 2, 5, 40, 123])('gives ml-matrix EigenvalueDecomposition bit for bit (n = %i)', (n) => {
    const a = randomSymmetric(n, n);
    const rows = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));
    const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
    const ours = symmetricEigen(a, n);
    expect(Array.from(ours.values)).toEqual(evd.realEigenvalues);
    const v = evd.eigenvectorMatrix;
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) expect(Object.is(ours.vectors[j * n + i], v.get(i, j))).toBe(true);
  });

  it('reads an asymmetric input as ml-matrix does with assumeSymmetric', () => {
    const n = 9;
    const a = randomSymmetric(n, 7);
    a[1 * n + 4] += 1e-3;
    const rows = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));
    const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
    expect(Array.from(symmetricEigen(a, n).values)).toEqual(evd.realEigenvalues);
  });

  it("finds the close pair at the top of Wilkinson's W21+", () => {
    const { values } = symmetricEigen(wilkinson21(), 21);
    expect(values[20]).toBeCloseTo(10.746194182903393, 12);
    expect(values[19]).toBeCloseTo(10.746194182903322, 12);
    expect(values[18]).toBeCloseTo(9.210678647361332, 12);
    expect(values[0]).toBeCloseTo(-1.1254415221199854, 12);
  });

  it('returns ascending eigenvalues with orthonormal eigenvectors that satisfy A v = λ v', () => {
    const n = 60;
    const a = randomSymmetric(n, 11);
    const { values, vectors } = symmetricEigen(a, n);
    const scale = Math.max(...Array.from(values, Math.abs));
    for (let i = 1; i < n; i++) expect(values[i]).toBeGreaterThanOrEqual(values[i - 1]);
    let worstResidual = 0;
    let worstOrtho = 0;
    for (let e = 0; e < n; e++) {
      for (let r = 0; r < n; r++) {
        let s = 0;
        for (let c = 0; c < n; c++) s += a[r * n + c] * vectors[e * n + c];
        worstResidual = Math.max(worstResidual, Math.abs(s - values[e] * vectors[e * n + r]));
      }
      for (let f = 0; f < n; f++) {
        let dot = 0;
        for (let i = 0; i < n; i++) dot += vectors[e * n + i] * vectors[f * n + i];
        worstOrtho = Math.max(worstOrtho, Math.abs(dot - (e === f ? 1 : 0)));
      }
    }
    expect(worstResidual).toBeLessThan(1e-12 * scale);
    expect(worstOrtho).toBeLessThan(1e-12);
  });

  it('does not change its input', () => {
    const a = randomSymmetric(8, 5);
    const copy = a.slice();
    symmetricEigen(a, 8);
    expect(a).toEqual(copy);
  });

  it('rejects a size that is not a positive integer or does not match the entries', () => {
    expect(() => symmetricEigen(new Float64Array(4), 0)).toThrow(InvalidInputError);
    expect(() => symmetricEigen(new Float64Array(4), 1.5)).toThrow(InvalidInputError);
    expect(() => symmetricEigen(new Float64Array(3), 2)).toThrow(/needs 4 entries/);
  });
});
