/**
 * Truncated SVD of a sparse matrix by randomized subspace iteration (Halko, Martinsson & Tropp
 * 2011, SIAM Review 53(2), Algorithms 4.3/4.4 and 5.1), in visible steps:
 *   1. range finder: Y = MΩ with a seeded Gaussian Ω (cols × l), l = k + oversampling;
 *      q power iterations Z = MᵀQ, Y = MZ, orthonormalising after every product (Halko §4.5;
 *      without it the tail below ε^{1/(2q+1)}·σ₁ is lost);
 *   2. projection: Bᵀ = MᵀQ, orthonormalised as Bᵀ = Q₂R (a final orthonormalisation);
 *   3. small dense SVD of R (l×l) with ml-matrix: R = Ũ Σ Ṽᵀ, so M ≈ (QṼ) Σ (Q₂Ũ)ᵀ;
 *   4. sign fix: the largest-magnitude entry of each column-side vector is made positive
 *      (svd_flip with the decision on the column factor, as scikit-learn's TruncatedSVD does).
 *
 * Defaults: oversampling max(10, ⌈k/10⌉) (Halko §4.2 suggests 5–10; scikit-learn uses 10), power
 * iterations 4 (text spectra decay slowly; scikit-learn's TruncatedSVD uses 5, see
 * ../shared/notes/methods.md §1.2 and §8.4), seed DEFAULT_SEED. Same input and seed give
 * bit-identical factors (all loops run in a fixed order).
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { CancelledError, InvalidInputError } from '../errors.js';
import { leadingColumns, timesSmall } from '../matrix/dense.js';
import { orthonormalize } from '../matrix/orthonormalize.js';
import type { CsrMatrix, DenseBlock } from '../matrix/sparse.js';
import { csrTimesDense, csrTransposeTimesDense, denseBlock } from '../matrix/sparse.js';
import { createRandom, DEFAULT_SEED } from '../random.js';

export interface RandomizedSvdOptions {
  /** Number of singular triplets wanted. */
  k: number;
  /** Extra sketch columns; undefined means max(10, ⌈k/10⌉). */
  oversampling?: number;
  /** @default 4 */
  powerIterations: number;
  /** @default DEFAULT_SEED */
  seed: number;
  /** Called after each pass over the matrix with (done, total). */
  onProgress?: (done: number, total: number) => void;
  /** Checked between passes; throws CancelledError when aborted. */
  signal?: { readonly aborted: boolean };
}

export const DEFAULT_SVD_OPTIONS: Readonly<Omit<RandomizedSvdOptions, 'k'>> = Object.freeze({
  powerIterations: 4,
  seed: DEFAULT_SEED,
});

/** M ≈ U diag(s) Vᵀ with U rows×k and V cols×k, both row-major with orthonormal columns. */
export interface SvdResult {
  readonly rows: number;
  readonly cols: number;
  readonly k: number;
  readonly u: Float64Array;
  readonly s: Float64Array;
  readonly v: Float64Array;
}

export function defaultOversampling(k: number): number {
  return Math.max(10, Math.ceil(k / 10));
}

export function randomizedSvd(m: CsrMatrix, options: Partial<RandomizedSvdOptions> & { k: number }): SvdResult {
  const o = { ...DEFAULT_SVD_OPTIONS, ...options };
  const maxRank = Math.min(m.rows, m.cols);
  if (maxRank === 0) throw new InvalidInputError('cannot decompose an empty matrix');
  if (!Number.isInteger(o.k) || o.k < 1) throw new InvalidInputError(`k must be a positive integer, got ${o.k}`);
  const k = Math.min(o.k, maxRank);
  const l = Math.min(k + (o.oversampling ?? defaultOversampling(k)), maxRank);
  const random = createRandom(o.seed);
  const totalPasses = 2 * o.powerIterations + 2;
  let passes = 0;
  const step = (): void => {
    if (o.signal?.aborted) throw new CancelledError();
    o.onProgress?.(++passes, totalPasses);
  };

  // 1. Range finder.
  const omega = denseBlock(m.cols, l);
  for (let i = 0; i < omega.data.length; i++) omega.data[i] = random.normal();
  let q = orthonormalize(csrTimesDense(m, omega), random).q;
  step();
  let z: DenseBlock = omega;
  for (let it = 0; it < o.powerIterations; it++) {
    z = orthonormalize(csrTransposeTimesDense(m, q, z), random).q;
    step();
    q = orthonormalize(csrTimesDense(m, z), random).q;
    step();
  }
  // 2. Projection and final orthonormalisation.
  const bt = orthonormalize(csrTransposeTimesDense(m, q), random);
  step();
  // 3. Small dense SVD of R (l×l).
  const rRows: number[][] = [];
  for (let i = 0; i < l; i++) rRows.push(Array.from(bt.r.subarray(i * l, (i + 1) * l)));
  const svd = new SingularValueDecomposition(new Matrix(rRows), { autoTranspose: true });
  const ut = svd.leftSingularVectors;
  const vt = svd.rightSingularVectors;
  const sAll = svd.diagonal;
  const order = Array.from({ length: l }, (_, i) => i).sort((a, b) => sAll[b] - sAll[a] || a - b).slice(0, k);
  const uSmall = new Float64Array(l * k); // Ṽ columns → row factor
  const vSmall = new Float64Array(l * k); // Ũ columns → column factor
  for (let c = 0; c < k; c++) {
    const src = order[c];
    for (let i = 0; i < l; i++) {
      uSmall[i * k + c] = vt.get(i, src);
      vSmall[i * k + c] = ut.get(i, src);
    }
  }
  const uBlock = timesSmall(q, uSmall, k);
  const vBlock = timesSmall(bt.q, vSmall, k);
  const s = Float64Array.from(order, (i) => Math.max(0, sAll[i]));
  // 4. Sign fix on the column factor.
  flipSigns(uBlock, vBlock);
  return { rows: m.rows, cols: m.cols, k, u: uBlock.data, s, v: vBlock.data };
}

/** Makes the largest-magnitude entry of each column of v positive, flipping u to match. */
export function flipSigns(u: DenseBlock, v: DenseBlock): void {
  const k = v.cols;
  for (let c = 0; c < k; c++) {
    let best = 0;
    let bestAbs = -1;
    for (let i = 0; i < v.rows; i++) {
      const a = Math.abs(v.data[i * k + c]);
      if (a > bestAbs) {
        bestAbs = a;
        best = i;
      }
    }
    if (v.data[best * k + c] < 0) {
      for (let i = 0; i < v.rows; i++) v.data[i * k + c] = -v.data[i * k + c];
      for (let i = 0; i < u.rows; i++) u.data[i * k + c] = -u.data[i * k + c];
    }
  }
}

export { leadingColumns };
