/**
 * Dense kernels on row-major blocks for the tall-skinny work of the SVD (rows ≫ cols).
 * Small square factors (l×l) are row-major Float64Array of length l*l.
 */
import type { DenseBlock } from './sparse.js';
import { denseBlock } from './sparse.js';

/** G = YᵀY (l×l, symmetric), accumulated row by row so Y is read in memory order. */
export function gram(y: DenseBlock): Float64Array {
  const l = y.cols;
  const g = new Float64Array(l * l);
  const d = y.data;
  for (let i = 0; i < y.rows; i++) {
    const o = i * l;
    for (let a = 0; a < l; a++) {
      const va = d[o + a];
      if (va === 0) continue;
      const ga = a * l;
      for (let b = a; b < l; b++) g[ga + b] += va * d[o + b];
    }
  }
  for (let a = 0; a < l; a++) for (let b = 0; b < a; b++) g[a * l + b] = g[b * l + a];
  return g;
}

/**
 * Cholesky factor R (upper triangular, G = RᵀR) in place of a copy; null when G is not
 * numerically positive definite (a pivot below tol · max diagonal).
 */
export function cholesky(g: Float64Array, l: number): Float64Array | null {
  const r = new Float64Array(l * l);
  let maxDiag = 0;
  for (let i = 0; i < l; i++) maxDiag = Math.max(maxDiag, g[i * l + i]);
  const tol = maxDiag * l * Number.EPSILON * 16;
  for (let j = 0; j < l; j++) {
    let s = g[j * l + j];
    for (let k = 0; k < j; k++) s -= r[k * l + j] * r[k * l + j];
    if (!(s > tol)) return null;
    const rjj = Math.sqrt(s);
    r[j * l + j] = rjj;
    for (let i = j + 1; i < l; i++) {
      let t = g[j * l + i];
      for (let k = 0; k < j; k++) t -= r[k * l + j] * r[k * l + i];
      r[j * l + i] = t / rjj;
    }
  }
  return r;
}

/** Y ← Y R⁻¹ for upper-triangular R (each row solves xR = y by forward substitution). */
export function solveUpperRight(y: DenseBlock, r: Float64Array): void {
  const l = y.cols;
  const d = y.data;
  for (let i = 0; i < y.rows; i++) {
    const o = i * l;
    for (let j = 0; j < l; j++) {
      let s = d[o + j];
      for (let k = 0; k < j; k++) s -= d[o + k] * r[k * l + j];
      d[o + j] = s / r[j * l + j];
    }
  }
}

/** Returns Y · W where W is l×c row-major (a small right factor). */
export function timesSmall(y: DenseBlock, w: Float64Array, c: number): DenseBlock {
  const l = y.cols;
  const out = denseBlock(y.rows, c);
  const d = y.data;
  const o2 = out.data;
  for (let i = 0; i < y.rows; i++) {
    const o = i * l;
    const oo = i * c;
    for (let a = 0; a < l; a++) {
      const v = d[o + a];
      if (v === 0) continue;
      const wa = a * c;
      for (let b = 0; b < c; b++) o2[oo + b] += v * w[wa + b];
    }
  }
  return out;
}

/** C = A B for small row-major square-ish factors (a: p×q, b: q×r). */
export function multiplySmall(a: Float64Array, b: Float64Array, p: number, q: number, r: number): Float64Array {
  const c = new Float64Array(p * r);
  for (let i = 0; i < p; i++)
    for (let k = 0; k < q; k++) {
      const v = a[i * q + k];
      if (v === 0) continue;
      for (let j = 0; j < r; j++) c[i * r + j] += v * b[k * r + j];
    }
  return c;
}

/** Keeps the first k columns of a row-major block. */
export function leadingColumns(y: DenseBlock, k: number): DenseBlock {
  if (k === y.cols) return y;
  const out = denseBlock(y.rows, k);
  for (let i = 0; i < y.rows; i++) out.data.set(y.data.subarray(i * y.cols, i * y.cols + k), i * k);
  return out;
}
