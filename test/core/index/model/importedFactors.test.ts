import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { modelMatrix } from '../../../../src/core/index/model/conceptModel.js';
import { modelFromFactors } from '../../../../src/core/index/model/importedFactors.js';
import { loadCollection } from '../../../helpers/shared.js';

// Reference: factors of the exported matrix A = Mᵀ (terms × files) from ml-matrix's dense SVD,
// a general-purpose library, standing in for a solver run elsewhere.
const adi = loadCollection('adi');

describe('modelFromFactors', () => {
  const builder = new IndexBuilder({ k: 12 });
  for (const d of adi?.docs ?? []) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = adi ? builder.build() : undefined;

  function exactFactors(k: number) {
    const m = modelMatrix(
      index!.model,
      index!.slots().map((s) => s!.terms),
    );
    const dense = Array.from({ length: m.cols }, () => new Array<number>(m.rows).fill(0)); // terms × files
    for (let i = 0; i < m.rows; i++) for (let p = m.indptr[i]; p < m.indptr[i + 1]; p++) dense[m.indices[p]][i] = m.values[p];
    const svd = new SingularValueDecomposition(new Matrix(dense), { autoTranspose: true });
    const u = new Float64Array(m.cols * k),
      v = new Float64Array(m.rows * k),
      s = new Float64Array(k);
    // Ascending order, as ARPACK returns them, and one column negated: both must be undone.
    for (let c = 0; c < k; c++) {
      const src = k - 1 - c;
      const sign = c === 0 ? -1 : 1;
      s[c] = svd.diagonal[src];
      for (let t = 0; t < m.cols; t++) u[t * k + c] = sign * svd.leftSingularVectors.get(t, src);
      for (let i = 0; i < m.rows; i++) v[i * k + c] = sign * svd.rightSingularVectors.get(i, src);
    }
    return { m, u, v, s };
  }

  it('accepts exact factors, sorts them by σ and matches our own leading singular values', () => {
    const { m, u, v, s } = exactFactors(12);
    const { model, report } = modelFromFactors(index!.model, m, { k: 12, u, s, v }, 1);
    expect(report.documentResidual).toBeLessThan(1e-10);
    expect(report.orthogonalityError).toBeLessThan(1e-10);
    for (let c = 1; c < 12; c++) expect(model.singularValues[c]).toBeLessThanOrEqual(model.singularValues[c - 1]);
    for (let c = 0; c < 6; c++)
      expect(Math.abs(model.singularValues[c] - index!.model.singularValues[c]) / model.singularValues[c]).toBeLessThan(0.01);
  });

  it('refuses factors whose rows are in another order, or whose U is not orthonormal', () => {
    const { m, u, v, s } = exactFactors(12);
    const k = 12;
    const shuffled = new Float64Array(v.length);
    for (let i = 0; i < m.rows; i++) shuffled.set(v.subarray(i * k, (i + 1) * k), ((i + 1) % m.rows) * k);
    const uShuffled = new Float64Array(u.length);
    for (let t = 0; t < m.cols; t++) uShuffled.set(u.subarray(t * k, (t + 1) * k), ((t + 7) % m.cols) * k);
    expect(() => modelFromFactors(index!.model, m, { k, u: uShuffled, s, v: shuffled }, 1)).toThrow(/do not fit/);
    const scaled = Float64Array.from(u, (x) => x * 2);
    expect(() => modelFromFactors(index!.model, m, { k, u: scaled, s, v }, 1)).toThrow(/not orthonormal/);
    expect(() => modelFromFactors(index!.model, m, { k, u, s: s.subarray(0, 11), v }, 1)).toThrow(/S holds 11/);
  });
});
