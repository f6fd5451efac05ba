/**
 * Row-vector helpers shared by the map layouts: a checked view of n×dim row-major vectors, unit
 * normalisation (so Euclidean distance between rows is the cosine chord √(2−2·cos), which orders
 * neighbours exactly as cosine similarity does), and squared distances from precomputed norms.
 */
import { InvalidInputError } from '../errors.js';

/** n vectors of dim numbers, row-major. */
export interface RowVectors {
  readonly n: number;
  readonly dim: number;
  readonly data: Float32Array;
}

export function rowVectors(data: Float32Array, n: number, dim: number): RowVectors {
  if (!Number.isInteger(n) || n < 0 || !Number.isInteger(dim) || dim < 1) {
    throw new InvalidInputError(`row vectors need a whole count and a positive dimension, got n=${n}, dim=${dim}`);
  }
  if (data.length !== n * dim) {
    throw new InvalidInputError(`expected ${n}×${dim} = ${n * dim} numbers, got ${data.length}`);
  }
  for (let i = 0; i < data.length; i++) {
    if (!Number.isFinite(data[i])) throw new InvalidInputError(`vector entry ${i} is not a finite number`);
  }
  return { n, dim, data };
}

/**
 * Every row scaled to unit length. All-zero rows (files without indexed terms) stay zero, so they
 * sit at distance 1 from every unit row. Returns the input itself when every row is already unit
 * length (within 1e-4) or zero, as the index's concept vectors are, to avoid a second copy.
 */
export function normaliseRows(v: RowVectors): RowVectors {
  const { n, dim, data } = v;
  if (alreadyUnit(v)) return v;
  const out = new Float32Array(n * dim);
  for (let i = 0; i < n; i++) {
    const o = i * dim;
    let s = 0;
    for (let c = 0; c < dim; c++) s += data[o + c] * data[o + c];
    if (s === 0) continue;
    const inv = 1 / Math.sqrt(s);
    for (let c = 0; c < dim; c++) out[o + c] = data[o + c] * inv;
  }
  return { n, dim, data: out };
}

function alreadyUnit(v: RowVectors): boolean {
  const norms = rowSquaredNorms(v);
  for (let i = 0; i < v.n; i++) if (norms[i] !== 0 && Math.abs(norms[i] - 1) > 1e-4) return false;
  return true;
}

/** Squared Euclidean norm of every row. */
export function rowSquaredNorms(v: RowVectors): Float64Array {
  const { n, dim, data } = v;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const o = i * dim;
    let s = 0;
    for (let c = 0; c < dim; c++) s += data[o + c] * data[o + c];
    out[i] = s;
  }
  return out;
}

/** Euclidean distance between rows a and b, using precomputed squared norms. */
export function rowDistance(v: RowVectors, norms: Float64Array, a: number, b: number): number {
  const { dim, data } = v;
  const oa = a * dim;
  const ob = b * dim;
  let dot = 0;
  for (let c = 0; c < dim; c++) dot += data[oa + c] * data[ob + c];
  const d2 = norms[a] + norms[b] - 2 * dot;
  return d2 > 0 ? Math.sqrt(d2) : 0;
}

/** Euclidean distance from an outside vector q (squared norm qNorm) to row b. */
export function distanceToRow(v: RowVectors, norms: Float64Array, q: Float32Array | Float64Array, qNorm: number, b: number): number {
  const { dim, data } = v;
  const ob = b * dim;
  let dot = 0;
  for (let c = 0; c < dim; c++) dot += q[c] * data[ob + c];
  const d2 = qNorm + norms[b] - 2 * dot;
  return d2 > 0 ? Math.sqrt(d2) : 0;
}
