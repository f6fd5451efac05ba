import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { repairWeakColumns, topEigenpairs, WEAK } from '../../../src/core/svd/rayleighRitz.js';

// References: ml-matrix's dense SVD (a general-purpose library) for the eigenpairs of a Gram
// matrix BBᵀ (σ(B)² are its eigenvalues), and the definition of orthonormal columns.
describe('Rayleigh–Ritz helpers', () => {
  const rnd = createRandom(9);

  it('topEigenpairs returns √λ of G = BBᵀ in descending order, as the singular values of B', () => {
    const l = 8,
      n = 30;
    const b = Array.from({ length: l }, () => Array.from({ length: n }, () => rnd.normal()));
    const g = new Float64Array(l * l);
    for (let i = 0; i < l; i++) for (let j = 0; j < l; j++) for (let t = 0; t < n; t++) g[i * l + j] += b[i][t] * b[j][t];
    const { s, w } = topEigenpairs(g, l, 5);
    const ref = new SingularValueDecomposition(new Matrix(b), { autoTranspose: true }).diagonal;
    for (let c = 0; c < 5; c++) expect(Math.abs(s[c] - ref[c]) / ref[c]).toBeLessThan(1e-12);
    // Columns of w are unit eigenvectors: G w = λ w.
    for (let c = 0; c < 5; c++)
      for (let i = 0; i < l; i++) {
        let gw = 0;
        for (let j = 0; j < l; j++) gw += g[i * l + j] * w[j * 5 + c];
        expect(Math.abs(gw - s[c] * s[c] * w[i * 5 + c])).toBeLessThan(1e-9);
      }
  });

  it('reports eigenvalues at rounding level as σ = 0', () => {
    const l = 4;
    const g = new Float64Array(l * l);
    g[0] = 9;
    g[5] = 1e-20;
    expect(Array.from(topEigenpairs(g, l, 3).s)).toEqual([3, 0, 0]);
  });

  it('repairWeakColumns makes weak columns orthonormal to the rest and leaves strong ones alone', () => {
    const rows = 50,
      k = 5;
    const v = new Float64Array(rows * k);
    // Strong columns 0–2: orthonormal coordinate vectors; column 3 nearly parallel to column 0; column 4 zero.
    for (let c = 0; c < 3; c++) v[c * k + c] = 1;
    for (let i = 0; i < rows; i++) v[i * k + 3] = i === 0 ? 1 : 1e-3 * rnd.normal();
    const s = Float64Array.from([10, 5, 2, 2 * WEAK * 1e-3, 0]);
    const before = Float64Array.from(v);
    expect(repairWeakColumns(v, rows, k, s, rnd)).toBe(2);
    for (let i = 0; i < rows; i++) for (let c = 0; c < 3; c++) expect(v[i * k + c]).toBe(before[i * k + c]);
    for (let p = 0; p < k; p++)
      for (let q = p; q < k; q++) {
        let dot = 0;
        for (let i = 0; i < rows; i++) dot += v[i * k + p] * v[i * k + q];
        expect(Math.abs(dot - (p === q ? 1 : 0))).toBeLessThan(1e-12);
      }
  });
});
