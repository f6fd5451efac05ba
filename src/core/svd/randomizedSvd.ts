/**
 * Truncated SVD of a sparse matrix by randomized subspace iteration (Halko, Martinsson & Tropp
 * 2011, SIAM Review 53(2), Algorithms 4.4 and 5.1), in visible steps. The basis Q lives on the
 * smaller side of M (S rows of A, where A is M or Mᵀ, so the dense work is S × l, never B × l):
 *   1. range finder: Y = AΩ with a seeded Gaussian Ω (B × l, drawn in fixed blocks of rows, each
 *      from its own seeded stream), l = k + oversampling, Q = orth(Y);
 *      q power iterations Z = AᵀQ, Y = AZ, Q = orth(Y). Q is renormalised once per AAᵀ pair, as
 *      gensim's LSI does (methods §1.4, §1.7): with Q orthonormal, Z has condition number about
 *      σ₁/σ_l, so nothing below ε^{1/2}·σ₁ is lost; middle steps use one CholeskyQR pass, the last
 *      one two (CholeskyQR2), so the final Q is orthonormal to working precision;
 *   2. Rayleigh–Ritz: Z = AᵀQ, G = ZᵀZ (or QᵀAZ, whichever is cheaper), G = WΛWᵀ, σ = √λ,
 *      small-side vectors QW, big-side vectors AᵀQWΣ⁻¹ (rayleighRitz.ts);
 *   3. sign fix: the largest-magnitude entry of each column-side vector is made positive
 *      (svd_flip with the decision on the column factor, as scikit-learn's TruncatedSVD does).
 * The large products run on a MatrixExecutor: WebAssembly SIMD kernels on this thread by default
 * (plain typed-array loops where WebAssembly SIMD is missing), or threads injected from src/node.
 * Every executor gives the same bits (same operation order, fixed reduction blocks).
 *
 * Defaults: oversampling max(10, ⌈k/2⌉, min(k, 100)) and 5 power iterations (scikit-learn's
 * TruncatedSVD uses 5 iterations with 10 extra columns; Halko §4.2 suggests 5–10 extra columns for
 * fast-decaying spectra). Text spectra decay slowly near σ_k (Halko et al. 2011 §4.5 recommend
 * power iterations for such spectra): with 10–20 extra columns the tail of k = 200 on the linux-source-6.1 Documentation matrix
 * was 5% low against ARPACK. Measured there (worst of 200): q=4,p=20 5.0%; q=4,p=100 1.5%;
 * q=6,p=60 0.92%; q=5,p=100 0.83%; q=4,p=150 0.75%: q=5 with p=k/2 meets 1% at the lowest cost in
 * products. Small problems get p=k (cheap there; ADI at k=27 was 1.1% off with p=14).
 * Seed DEFAULT_SEED. Same input and seed give bit-identical factors (all loops and reductions run
 * in a fixed order).
 */
import { CancelledError, InvalidInputError } from '../errors.js';
import { choleskyQr } from '../matrix/choleskyQr.js';
import { leadingColumns } from '../matrix/dense.js';
import { serialExecutor, type MatrixExecutor } from '../matrix/executor.js';
import { createWasmExecutor } from '../matrix/wasm/wasmExecutor.js';
import type { CsrMatrix, DenseBlock } from '../matrix/sparse.js';
import { copyCsr, transposeCsr } from '../matrix/sparse.js';
import { createRandom, DEFAULT_SEED } from '../random.js';
import { bigSideVectors, repairWeakColumns, topEigenpairs, transposeScaled } from './rayleighRitz.js';

export interface RandomizedSvdOptions {
  /** Number of singular triplets wanted. */
  k: number;
  /** Extra sketch columns; undefined means max(10, ⌈k/2⌉, min(k, 100)). */
  oversampling?: number;
  /** @default 5 */
  powerIterations: number;
  /** @default DEFAULT_SEED */
  seed: number;
  /** Called after each pass over the matrix with (done, total). */
  onProgress?: (done: number, total: number) => void;
  /** Checked between passes; throws CancelledError when aborted. */
  signal?: { readonly aborted: boolean };
  /** Runs the large products (default: serialExecutor, on this thread). */
  executor?: MatrixExecutor;
  /**
   * Element type of the returned u and v (default 'f64'). 'f32' rounds them once on the way out
   * of the executor's memory, halving the largest copy (a caller that stores f32 vectors anyway
   * saves that memory at the build's peak).
   */
  factors?: 'f64' | 'f32';
}

export const DEFAULT_SVD_OPTIONS: Readonly<Omit<RandomizedSvdOptions, 'k'>> = Object.freeze({
  powerIterations: 5,
  seed: DEFAULT_SEED,
});

/** M ≈ U diag(s) Vᵀ with U rows×k and V cols×k, both row-major with orthonormal columns. */
export interface SvdResult<F extends Float64Array | Float32Array = Float64Array> {
  readonly rows: number;
  readonly cols: number;
  readonly k: number;
  readonly u: F;
  readonly s: Float64Array;
  readonly v: F;
}

export function defaultOversampling(k: number): number {
  return Math.max(10, Math.ceil(k / 2), Math.min(k, 100));
}

export function randomizedSvd(m: CsrMatrix, options: Partial<RandomizedSvdOptions> & { k: number; factors?: 'f64' }): SvdResult;
export function randomizedSvd(
  m: CsrMatrix,
  options: Partial<RandomizedSvdOptions> & { k: number; factors: 'f32' },
): SvdResult<Float32Array>;
export function randomizedSvd(
  m: CsrMatrix,
  options: Partial<RandomizedSvdOptions> & { k: number },
): SvdResult<Float64Array | Float32Array> {
  const o = { ...DEFAULT_SVD_OPTIONS, ...options };
  const maxRank = Math.min(m.rows, m.cols);
  if (maxRank === 0) throw new InvalidInputError('cannot decompose an empty matrix');
  if (!Number.isInteger(o.k) || o.k < 1) throw new InvalidInputError(`k must be a positive integer, got ${o.k}`);
  if (!Number.isInteger(o.powerIterations) || o.powerIterations < 0)
    throw new InvalidInputError(`powerIterations must be a whole number ≥ 0, got ${o.powerIterations}`);
  const ex = o.executor ?? createWasmExecutor() ?? serialExecutor;
  return ex.scoped ? ex.scoped(() => decompose(m, o, ex)) : decompose(m, o, ex);
}

function decompose(m: CsrMatrix, o: RandomizedSvdOptions, ex: MatrixExecutor): SvdResult<Float64Array | Float32Array> {
  const maxRank = Math.min(m.rows, m.cols);
  const k = Math.min(o.k, maxRank);
  const l = Math.min(k + (o.oversampling ?? defaultOversampling(k)), maxRank);
  const random = createRandom(o.seed);
  const nnz = m.indptr[m.rows];
  // A has the smaller dimension as rows: Q (S × l) is the only block that is orthonormalised.
  const rowsSmall = m.rows <= m.cols;
  // The matrix in the executor's memory, stored entries as f32 (a relative change below 1e-7,
  // far inside the SVD's own accuracy) on every executor, so all of them give the same bits.
  const mCopy = copyCsr(m, ex, 'f32');
  const mt = transposeCsr(m, ex, 'f32');
  const a = rowsSmall ? mCopy : mt;
  const at = rowsSmall ? mt : mCopy;
  const S = a.rows;
  const B = a.cols;
  // G = ZᵀZ costs B·l²/2; G = Qᵀ(AZ) costs one more pass and S·l².
  const gramOnBigSide = B * l * l <= 2 * (nnz * l + S * l * l);
  const totalPasses = 2 * o.powerIterations + 2 + (gramOnBigSide ? 0 : 1);
  let passes = 0;
  const step = (): void => {
    if (o.signal?.aborted) throw new CancelledError();
    o.onProgress?.(++passes, totalPasses);
  };

  // 1. Range finder and power iterations.
  // One S × l block holds Y and, orthonormalised in place, Q; one B × l block holds Ω and Z.
  const z = ex.float64(B * l);
  ex.gaussian(z, B, l, o.seed);
  const q = ex.float64(S * l);
  ex.spmm(a, z, l, q);
  step();
  choleskyQr(ex, q, S, l, o.powerIterations === 0 ? 2 : 1, random);
  for (let it = 0; it < o.powerIterations; it++) {
    ex.spmm(at, q, l, z);
    step();
    ex.spmm(a, z, l, q);
    step();
    choleskyQr(ex, q, S, l, it === o.powerIterations - 1 ? 2 : 1, random);
  }
  // 2. Rayleigh–Ritz.
  ex.spmm(at, q, l, z);
  step();
  let g: Float64Array;
  let spare: Float64Array | undefined;
  if (gramOnBigSide) {
    g = ex.cross(z, z, B, l);
  } else {
    const az = ex.float64(S * l);
    ex.spmm(a, z, l, az);
    step();
    g = ex.cross(q, az, S, l);
    spare = az; // done with: its memory takes the small-side vectors (k ≤ l)
  }
  const pairs = topEigenpairs(g, l, k);
  const small = spare ? spare.subarray(0, S * k) : ex.float64(S * k);
  ex.timesSmall(q, S, l, transposeScaled(pairs.w, l, k), k, false, small);
  const big = bigSideVectors(ex, z, small, at, l, pairs, k);
  repairWeakColumns(big, B, k, pairs.s, random);
  // 3. Sign fix on the column factor, decided in f64 (in the executor's memory) before any rounding.
  const uIn = rowsSmall ? small : big;
  const vIn = rowsSmall ? big : small;
  flipSigns({ rows: m.rows, cols: k, data: uIn }, { rows: m.cols, cols: k, data: vIn });
  const out = o.factors === 'f32' ? Float32Array : Float64Array;
  const u = out.from(uIn);
  const v = out.from(vIn);
  return { rows: m.rows, cols: m.cols, k, u, s: pairs.s, v };
}

/** Makes the largest-magnitude entry of each column of v positive, flipping u to match. */
export function flipSigns(u: DenseBlock, v: DenseBlock): void {
  const k = v.cols;
  // Row by row (memory order): the first row holding each column's largest |entry| wins ties.
  const bestAbs = new Float64Array(k).fill(-1);
  const bestVal = new Float64Array(k);
  for (let i = 0; i < v.rows; i++) {
    const o = i * k;
    for (let c = 0; c < k; c++) {
      const x = Math.abs(v.data[o + c]);
      if (x > bestAbs[c]) {
        bestAbs[c] = x;
        bestVal[c] = v.data[o + c];
      }
    }
  }
  const sign = Float64Array.from(bestVal, (x) => (x < 0 ? -1 : 1));
  if (sign.every((x) => x === 1)) return;
  for (const m of [v, u]) {
    for (let i = 0; i < m.rows; i++) {
      const o = i * k;
      for (let c = 0; c < k; c++) if (sign[c] < 0) m.data[o + c] = -m.data[o + c];
    }
  }
}

export { leadingColumns };
