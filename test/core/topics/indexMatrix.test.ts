/**
 * The index's weighted matrix and its leading factors. References: an exact dense SVD of the
 * same matrix by ml-matrix (singular values and vectors), and the index's own stored document
 * vectors (for α = 1 each is U_kᵀd̂ normalised, which must equal the normalised row of M·V_k).
 * Text: ADI abstracts from test/fixtures/corpora.
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { leadingFactors, weightedMatrix } from '../../../src/core/topics/indexMatrix.js';
import { loadCollection } from '../../helpers/shared.js';

const adi = loadCollection('adi');

describe('index matrix and leading factors', () => {
  const build = () => {
    const b = new IndexBuilder();
    for (const d of adi.docs) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    return b.build();
  };

  it('has unit rows whose squares add up to the model’s ‖A‖²_F, in the index’s path order', () => {
    const index = build();
    const im = weightedMatrix(index);
    expect(im.paths).toEqual(index.paths());
    let total = 0;
    for (let i = 0; i < im.matrix.rows; i++) {
      let ss = 0;
      for (let p = im.matrix.indptr[i]; p < im.matrix.indptr[i + 1]; p++) ss += im.matrix.values[p] ** 2;
      if (ss > 0) expect(ss).toBeCloseTo(1, 12);
      total += ss;
    }
    expect(total).toBeCloseTo(index.model.frobeniusSquared, 9);
  });

  it('takes the model’s factors when current, matching an exact SVD and the stored file vectors', () => {
    const index = build();
    const im = weightedMatrix(index);
    const k = 5;
    const f = leadingFactors(index, im, k, 1);
    const dense = new Matrix(im.matrix.rows, im.matrix.cols);
    for (let i = 0; i < im.matrix.rows; i++)
      for (let p = im.matrix.indptr[i]; p < im.matrix.indptr[i + 1]; p++) dense.set(i, im.matrix.indices[p], im.matrix.values[p]);
    const exact = new SingularValueDecomposition(dense.transpose()); // Mᵀ = V Σ Uᵀ: its left vectors are M's term side
    for (let c = 0; c < k; c++) {
      // The model's randomized SVD (5 power iterations) is a little low (about 0.1% here); the
      // project holds its leading singular values to 1% of exact (the accuracy target of the SVD).
      expect(f.s[c]).toBeLessThanOrEqual(exact.diagonal[c] * (1 + 1e-9));
      expect(f.s[c]).toBeGreaterThan(exact.diagonal[c] * (1 - 1e-2));
      let dotU = 0;
      for (let i = 0; i < im.matrix.rows; i++) dotU += f.u[i * k + c] * exact.rightSingularVectors.get(i, c);
      expect(Math.abs(dotU)).toBeGreaterThan(0.99);
    }
    // Stored vectors (α = 1): unit rows of U_kᵀd̂ over all of the model's k axes.
    const full = leadingFactors(index, im, index.k, 1);
    index.paths().forEach((path, i) => {
      const stored = index.vectorOf(path);
      let dot = 0;
      let ss = 0;
      for (let c = 0; c < index.k; c++) {
        const x = full.u[i * index.k + c] * full.s[c];
        dot += x * stored[c];
        ss += x * x;
      }
      if (ss > 0) expect(dot / Math.sqrt(ss)).toBeCloseTo(1, 5);
    });
  });

  it('computes fresh factors after edits, for the matrix as it now is', () => {
    const index = build();
    index.remove(index.paths()[0]);
    index.foldIn({ path: 'new.md', size: 10, mtimeMs: 1 }, 'information retrieval of documents by computer');
    const im = weightedMatrix(index);
    expect(im.matrix.rows).toBe(index.size);
    const f = leadingFactors(index, im, 4, 1);
    expect(f.rows).toBe(index.size);
    for (let p = 0; p < 4; p++)
      for (let q = 0; q < 4; q++) {
        let d = 0;
        for (let i = 0; i < f.rows; i++) d += f.u[i * 4 + p] * f.u[i * 4 + q];
        expect(d).toBeCloseTo(p === q ? 1 : 0, 6);
      }
  });
});
