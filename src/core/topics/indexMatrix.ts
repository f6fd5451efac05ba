/**
 * The weighted document-term matrix of an index (rows = files in slot order without holes,
 * columns = model terms), rebuilt from the stored counts with the model's frozen weights
 * (the same unit rows the SVD saw at build time), and the leading singular
 * factors of that matrix.
 *
 * When nothing changed since the build, the model already holds V_k (termVectors) and Σ_k; the
 * file side follows as U_k = M·V_k·Σ_k⁻¹ (one pass over M), so no new SVD is needed. After edits
 * (folded, removed files) the matrix no longer matches the model, and a fresh randomized SVD of
 * the current matrix is computed instead.
 */
import type { LsiIndex } from '../index/lsiIndex.js';
import { csrTimesDense, denseBlock, type CsrMatrix } from '../matrix/sparse.js';
import { randomizedSvd, type SvdResult } from '../svd/randomizedSvd.js';
import type { DocTerms } from '../counting/termCounts.js';
import { weightedMatrix as modelWeightedMatrix } from '../index/model/conceptModel.js';

export interface IndexMatrix {
  /** files × model terms, unit rows (zero rows for files without model terms). */
  readonly matrix: CsrMatrix;
  /** Path of each row. */
  readonly paths: readonly string[];
  /** Index slot of each row. */
  readonly slots: Int32Array;
}

export function weightedMatrix(index: LsiIndex): IndexMatrix {
  const model = index.model;
  const paths: string[] = [];
  const slots: number[] = [];
  const docs: DocTerms[] = [];
  index.slots().forEach((s, i) => {
    if (!s) return;
    paths.push(s.meta.path);
    slots.push(i);
    docs.push(s.terms);
  });
  const { matrix } = modelWeightedMatrix(docs, model.columnOf, model.weights, model.scheme);
  return { matrix, paths, slots: Int32Array.from(slots) };
}

/** Leading k singular triplets of the index matrix: from the model when it is current, else computed. */
export function leadingFactors(index: LsiIndex, im: IndexMatrix, k: number, seed: number): SvdResult {
  const model = index.model;
  const kk = Math.max(1, Math.min(k, model.k));
  const current = index.staleness().changedFiles === 0 && im.matrix.rows === index.slots().length;
  if (!current) return randomizedSvd(im.matrix, { k: Math.min(kk, im.matrix.rows, im.matrix.cols), seed });
  const m = im.matrix.cols;
  const v = denseBlock(m, kk);
  for (let t = 0; t < m; t++) for (let c = 0; c < kk; c++) v.data[t * kk + c] = model.termVectors[t * model.k + c];
  const u = csrTimesDense(im.matrix, v);
  const s = model.singularValues.slice(0, kk);
  for (let i = 0; i < u.rows; i++) for (let c = 0; c < kk; c++) u.data[i * kk + c] = s[c] > 0 ? u.data[i * kk + c] / s[c] : 0;
  return { rows: im.matrix.rows, cols: m, k: kk, u: u.data, s, v: v.data };
}
