/**
 * Term weighting of the term-document matrix; each document vector is then L2-normalised.
 *
 * - 'log-entropy' (default; Dumais 1991, as implemented in gensim's LogEntropyModel):
 *   local log(1 + tf); global g = 1 + Σ_j p_j log p_j / log(n + 1), p_j = tf_j / gf.
 * - 'tfidf': sublinear tf (1 + ln tf) times smoothed idf ln((1 + n)/(1 + df)) + 1, as
 *   scikit-learn's TfidfVectorizer(sublinear_tf=True, smooth_idf=True).
 * Global weights are computed once per build and frozen: folded-in documents and queries reuse them.
 */
import type { DocTerms } from '../counting/termCounts.js';

export type WeightingScheme = 'log-entropy' | 'tfidf';
export const WEIGHTING_SCHEMES: readonly WeightingScheme[] = ['log-entropy', 'tfidf'];

/** Global weight per model column. */
export function globalWeights(docs: readonly DocTerms[], columnOf: Int32Array, columns: number, scheme: WeightingScheme): Float64Array {
  const n = docs.length;
  const g = new Float64Array(columns);
  if (scheme === 'tfidf') {
    const df = new Float64Array(columns);
    for (const d of docs)
      for (let i = 0; i < d.termIds.length; i++) {
        const c = columnOf[d.termIds[i]];
        if (c >= 0) df[c]++;
      }
    for (let c = 0; c < columns; c++) g[c] = Math.log((1 + n) / (1 + df[c])) + 1;
    return g;
  }
  const gf = new Float64Array(columns);
  for (const d of docs)
    for (let i = 0; i < d.termIds.length; i++) {
      const c = columnOf[d.termIds[i]];
      if (c >= 0) gf[c] += d.counts[i];
    }
  const plogp = new Float64Array(columns);
  for (const d of docs)
    for (let i = 0; i < d.termIds.length; i++) {
      const c = columnOf[d.termIds[i]];
      if (c >= 0) {
        const p = d.counts[i] / gf[c];
        plogp[c] += p * Math.log(p);
      }
    }
  const denom = Math.log(n + 1);
  for (let c = 0; c < columns; c++) g[c] = 1 + plogp[c] / denom;
  return g;
}

/**
 * Local weights of the whole counts below LOCAL_TABLE_SIZE, computed once by the same functions
 * (so the same numbers, looked up): counts are whole numbers and nearly all are small, and the
 * sections fold of a large tree weighs some 10⁸ of them.
 */
const LOCAL_TABLE_SIZE = 256;
const LOG1P_TABLE = Float64Array.from({ length: LOCAL_TABLE_SIZE }, (_, i) => Math.log1p(i));
const LOG_TABLE = Float64Array.from({ length: LOCAL_TABLE_SIZE }, (_, i) => 1 + Math.log(i));

export function localWeight(tf: number, scheme: WeightingScheme): number {
  const i = tf | 0;
  if (i === tf && i >>> 0 < LOCAL_TABLE_SIZE) return scheme === 'tfidf' ? LOG_TABLE[i] : LOG1P_TABLE[i];
  return scheme === 'tfidf' ? 1 + Math.log(tf) : Math.log1p(tf);
}

/**
 * A document's weighted row (local × global weight of each term with a model column, divided by
 * the row's norm; weightDocument) for the terms ids[from, to) with their counts, written from position
 * `at` of indices and values (a row of a CSR matrix: no arrays of its own); returns the position
 * after the last entry written, and puts the row's norm before normalisation in norm[0] when given.
 */
export function weightRowInto(
  ids: Int32Array,
  counts: Float32Array,
  from: number,
  to: number,
  columnOf: Int32Array,
  weights: Float64Array,
  scheme: WeightingScheme,
  indices: Int32Array,
  values: Float64Array,
  at: number,
  norm?: Float64Array,
): number {
  let p = at;
  let ss = 0;
  for (let t = from; t < to; t++) {
    const id = ids[t];
    const c = id < columnOf.length ? columnOf[id] : -1;
    if (c < 0) continue;
    const w = localWeight(counts[t], scheme) * weights[c];
    if (w === 0) continue;
    indices[p] = c;
    values[p++] = w;
    ss += w * w;
  }
  const n = Math.sqrt(ss);
  if (n > 0) for (let q = at; q < p; q++) values[q] /= n;
  if (norm) norm[0] = n;
  return p;
}

/** A weighted, L2-normalised sparse vector over model columns (ascending). */
export interface WeightedVector {
  readonly columns: Int32Array;
  readonly values: Float64Array;
  /** Norm before normalisation (0 when no known term). */
  readonly norm: number;
}

export function weightDocument(doc: DocTerms, columnOf: Int32Array, weights: Float64Array, scheme: WeightingScheme): WeightedVector {
  const n = doc.termIds.length;
  const [columns, values, norm] = [new Int32Array(n), new Float64Array(n), new Float64Array(1)];
  const end = weightRowInto(doc.termIds, doc.counts, 0, n, columnOf, weights, scheme, columns, values, 0, norm);
  // columnOf is monotone in vocabulary id, so columns come out ascending.
  return { columns: columns.slice(0, end), values: values.slice(0, end), norm: norm[0] };
}
