/**
 * The CUR factors for chosen columns and rows of a sparse matrix A: C (the chosen columns, each
 * scaled), R (the chosen rows, each scaled) and the Frobenius-optimal middle matrix
 * U = C⁺·A·R⁺ (Mahoney & Drineas 2009, PNAS; Stewart 1999), with the errors of the result.
 *
 * Nothing of the size of A is made dense: with G_C = CᵀC, G_R = RRᵀ and X = Cᵀ(A Rᵀ),
 *   C⁺ = G_C⁺Cᵀ and R⁺ = RᵀG_R⁺ (exact identities, rank-deficient C or R included), so
 *   U = G_C⁺ · X · G_R⁺;
 *   ‖A − CUR‖²_F = ‖A‖²_F − 2⟨X, U⟩ + trace(Uᵀ G_C U G_R);
 *   ‖A − CC⁺A‖²_F = ‖A‖²_F − trace(G_C⁺ (CᵀA)(CᵀA)ᵀ), and likewise for rows with Y = A Rᵀ.
 * These are exact (no sampling); only rounding separates them from a dense computation.
 * The small pseudo-inverses come from a symmetric eigen-decomposition (symmetricEigen.ts) with a relative
 * cut-off of 1e-10·size·λ_max on the Gram eigenvalues (singular values of C below ≈1e-5·√size of the
 * largest are treated as zero: our choice, since Gram matrices square the condition number).
 * Cost: O(nnz·r + (m + n)·(c² + r²)) time, (m·c + n·r) numbers.
 */
import { gram, multiplySmall } from '../matrix/dense.js';
import { symmetricEigen } from '../matrix/symmetricEigen.js';
import {
  csrFrobeniusSquared,
  csrTimesDense,
  csrTransposeTimesDense,
  denseBlock,
  type CsrMatrix,
  type DenseBlock,
} from '../matrix/sparse.js';
import type { Picks } from './leverage.js';

/** Relative cut-off passed to ml-matrix pseudoInverse for the c×c and r×r Gram matrices. */
export const GRAM_PINV_THRESHOLD = 1e-10;

export interface CurFactors {
  /** C: A's chosen columns, scaled (rows × c). */
  readonly c: DenseBlock;
  /** Rᵀ: A's chosen rows, scaled, stored transposed (cols × r). */
  readonly rt: DenseBlock;
  /** U = C⁺AR⁺ (c × r, row-major). */
  readonly middle: Float64Array;
  readonly frobeniusSquared: number;
  /** ‖A − CUR‖²_F. */
  readonly errorSquared: number;
  /** ‖A − CC⁺A‖²_F (columns alone; NaN when not asked for). */
  readonly columnErrorSquared: number;
  /** ‖A − AR⁺R‖²_F (rows alone). */
  readonly rowErrorSquared: number;
}

/**
 * withColumnError false skips ‖A − CC⁺A‖ (NaN then): it costs a terms × c product and its Gram
 * table, the largest part of the work when many columns are chosen.
 */
export function curFactors(a: CsrMatrix, columns: Picks, rows: Picks, withColumnError = true): CurFactors {
  const nc = columns.indices.length;
  const nr = rows.indices.length;
  const c = denseBlock(a.rows, nc);
  const rt = denseBlock(a.cols, nr);
  const slot = new Int32Array(a.cols).fill(-1);
  columns.indices.forEach((j, s) => (slot[j] = s));
  for (let i = 0; i < a.rows; i++) {
    for (let p = a.indptr[i]; p < a.indptr[i + 1]; p++) {
      const s = slot[a.indices[p]];
      if (s >= 0) c.data[i * nc + s] = a.values[p] * columns.scales[s];
    }
  }
  rows.indices.forEach((i, b) => {
    for (let p = a.indptr[i]; p < a.indptr[i + 1]; p++) rt.data[a.indices[p] * nr + b] = a.values[p] * rows.scales[b];
  });
  const frob = csrFrobeniusSquared(a);
  if (nc === 0 || nr === 0) {
    return {
      c,
      rt,
      middle: new Float64Array(nc * nr),
      frobeniusSquared: frob,
      errorSquared: frob,
      columnErrorSquared: nc === 0 ? frob : withColumnError ? columnError(a, c, frob) : NaN,
      rowErrorSquared: nr === 0 ? frob : rowError(a, rt, frob).error,
    };
  }
  const gc = gram(c);
  const gr = gram(rt);
  const gcPinv = symmetricPinv(gc, nc);
  const grPinv = symmetricPinv(gr, nr);
  const { y, error: rowErrorSquared } = rowError(a, rt, frob, grPinv);
  // X = Cᵀ Y (c × r).
  const x = new Float64Array(nc * nr);
  for (let i = 0; i < a.rows; i++) {
    for (let s = 0; s < nc; s++) {
      const v = c.data[i * nc + s];
      if (v === 0) continue;
      for (let b = 0; b < nr; b++) x[s * nr + b] += v * y.data[i * nr + b];
    }
  }
  const middle = multiplySmall(multiplySmall(gcPinv, x, nc, nc, nr), grPinv, nc, nr, nr);
  let cross = 0;
  for (let t = 0; t < x.length; t++) cross += x[t] * middle[t];
  const gcU = multiplySmall(gc, middle, nc, nc, nr);
  const uGr = multiplySmall(middle, gr, nc, nr, nr);
  let curSquared = 0;
  for (let t = 0; t < gcU.length; t++) curSquared += gcU[t] * uGr[t];
  return {
    c,
    rt,
    middle,
    frobeniusSquared: frob,
    errorSquared: Math.max(0, frob - 2 * cross + curSquared),
    columnErrorSquared: withColumnError ? columnError(a, c, frob, gcPinv) : NaN,
    rowErrorSquared,
  };
}

function columnError(a: CsrMatrix, c: DenseBlock, frob: number, gcPinv?: Float64Array): number {
  const nc = c.cols;
  const inv = gcPinv ?? symmetricPinv(gram(c), nc);
  const h = gram(csrTransposeTimesDense(a, c)); // (CᵀA)(CᵀA)ᵀ
  let t = 0;
  for (let i = 0; i < nc * nc; i++) t += inv[i] * h[i]; // both symmetric: trace(G⁺H)
  return Math.max(0, frob - t);
}

function rowError(a: CsrMatrix, rt: DenseBlock, frob: number, grPinv?: Float64Array): { y: DenseBlock; error: number } {
  const nr = rt.cols;
  const y = csrTimesDense(a, rt); // A Rᵀ
  const inv = grPinv ?? symmetricPinv(gram(rt), nr);
  const h = gram(y);
  let t = 0;
  for (let i = 0; i < nr * nr; i++) t += inv[i] * h[i];
  return { y, error: Math.max(0, frob - t) };
}

/**
 * Pseudo-inverse of a small symmetric positive semi-definite row-major matrix: the symmetric
 * eigen-decomposition G = WΛWᵀ (symmetricEigen.ts), then G⁺ = W·Λ⁺·Wᵀ (the same cut-off rule as ml-matrix
 * pseudoInverse, which runs a general SVD about 2.5× slower on these sizes).
 */
export function symmetricPinv(g: Float64Array, n: number): Float64Array {
  const { values: lambda, vectors: w } = symmetricEigen(g, n);
  let max = 0;
  for (const l of lambda) max = Math.max(max, Math.abs(l));
  const cutoff = GRAM_PINV_THRESHOLD * n * max;
  const out = new Float64Array(n * n);
  for (let e = 0; e < n; e++) {
    if (!(lambda[e] > cutoff)) continue;
    const inv = 1 / lambda[e];
    for (let i = 0; i < n; i++) {
      const wi = w[e * n + i] * inv;
      if (wi === 0) continue;
      for (let j = 0; j < n; j++) out[i * n + j] += wi * w[e * n + j];
    }
  }
  return out;
}
