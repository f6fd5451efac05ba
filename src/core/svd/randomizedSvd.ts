/**
 * Truncated SVD of a sparse matrix by randomized subspace iteration (Halko, Martinsson & Tropp
 * 2011, SIAM Review 53(2), Algorithms 4.4 and 5.1), in visible steps. The basis Q lives on the
 * smaller side of M (S rows of A, where A is M or Mᵀ, so the dense work is S × l, never B × l):
 *   1. range finder: Y = AΩ with a seeded Gaussian Ω (B × l, drawn in fixed blocks of rows, each
 *      from its own seeded stream), l = k + oversampling, Q = orth(Y);
 *      q power iterations Z = AᵀQ, Y = AZ − αQ, Q = orth(Y), α the dynamic shift of
 *      dynamicShift.ts (0 in the first). Q is renormalised once per AAᵀ pair, as
 *      gensim's LSI does (Řehůřek 2011, from memory): with Q orthonormal, Z has condition number
 *      about σ₁/σ_l, so nothing below ε^{1/2}·σ₁ is lost; middle steps use one CholeskyQR pass,
 *      the last one two (CholeskyQR2), so the final Q is orthonormal to working precision.
 *      The two products of a power iteration run in single precision (f32 numbers and sums;
 *      scikit-learn's randomized_svd likewise keeps an f32 matrix in f32, from memory): their
 *      rounding, a relative 10⁻⁷ a step, only perturbs the basis being refined, and Q itself is
 *      kept and orthonormalised in f64 (on the Documentation matrix the worst of the 200 values
 *      against ARPACK stayed 0.851%, the mean 0.128%);
 *   2. Rayleigh–Ritz, in f64: Z = AᵀQ, G = ZᵀZ (or QᵀAZ, whichever is cheaper), G = WΛWᵀ, σ = √λ,
 *      small-side vectors QW, big-side vectors AᵀQWΣ⁻¹ (rayleighRitz.ts);
 *   3. sign fix: the largest-magnitude entry of each column-side vector is made positive
 *      (svd_flip with the decision on the column factor, as scikit-learn's TruncatedSVD does).
 * The large products run on a MatrixExecutor: WebAssembly SIMD kernels on this thread by default
 * (plain typed-array loops where WebAssembly SIMD is missing), or threads injected from src/node.
 * Every executor gives the same bits (same operation order, fixed reduction blocks).
 *
 * Defaults: oversampling max(10, ⌈k/2⌉, min(k, 100)) and 4 shifted power iterations (scikit-learn's
 * TruncatedSVD uses 5 iterations with 10 extra columns; Halko §4.2 suggests 5–10 extra columns for
 * fast-decaying spectra). Text spectra decay slowly near σ_k (Halko et al. 2011 §4.5 recommend
 * power iterations for such spectra): with 10–20 extra columns the tail of k = 200 on the linux-source-6.1 Documentation matrix
 * was 5% low against ARPACK. Measured there (worst of 200): q=4,p=20 5.0%; q=4,p=100 1.5%;
 * q=6,p=60 0.92%; q=5,p=100 0.83%; q=4,p=150 0.75%: q=5 with p=k/2 met 1% at the lowest cost in
 * products without shifts. With them (the default), q=4 with p=k/2 does: worst 0.756% against
 * ARPACK there (0.851% for 5 without), 0.596% on linux-source-6.1's drivers/net (100,000 terms ×
 * 5,691 files), 0.718% on CISI (0.818% for 5 without; test/core/svd/randomizedSvd.test.ts).
 * Small problems get p=k (cheap there; ADI at k=27 was 1.1% off with p=14).
 * Seed DEFAULT_SEED. Same input and seed give bit-identical factors (all loops and reductions run
 * in a fixed order).
 */
import { CancelledError, InvalidInputError } from '../errors.js';
import { choleskyQr } from '../matrix/choleskyQr.js';
import { leadingColumns } from '../matrix/dense.js';
import { copyColumnRun, serialExecutor, type FloatArray, type MatrixExecutor } from '../matrix/executor.js';
import { createWasmExecutor } from '../matrix/wasm/wasmExecutor.js';
import type { CsrMatrix } from '../matrix/sparse.js';
import { copyCsr, csrRows, transposeCsr } from '../matrix/sparse.js';
import type { ByteSpill, OpenSpill } from '../sections/types.js';
import { createRandom, DEFAULT_SEED, type RandomSource } from '../random.js';
import { nextShift, smallestSingularValue } from './dynamicShift.js';
import { repairWeakColumns, topEigenpairs, transposeScaled } from './rayleighRitz.js';
import { PARK_MATRIX_FROM_BYTES, readInRuns, writeInRuns } from '../matrix/parkedMatrix.js';

export interface RandomizedSvdOptions {
  /** Number of singular triplets wanted. */
  k: number;
  /** Extra sketch columns; undefined means max(10, ⌈k/2⌉, min(k, 100)). */
  oversampling?: number;
  /** @default 4 */
  powerIterations: number;
  /**
   * Shift each power iteration by α (AAᵀ − αI, α set after each iteration by the rule of
   * dynamicShift.ts): the same accuracy in fewer iterations. @default true
   */
  dynamicShifts: boolean;
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
  /** Budget in bytes of a big-side column block (default BIG_BLOCK_BYTES; tests set it low). */
  bigBlockBytes?: number;
  /**
   * Called once the matrix is in the executor's memory, before the passes: the passes read the
   * caller's arrays no more (finishSvd does: a caller may keep them elsewhere until then).
   */
  onCopied?: () => void;
  /**
   * Where the small-side vectors QW wait from the end of the passes to finishSvd (a scratch file
   * from src/node): written block by block as they are formed, so no f64 copy of them (181 MB on
   * the Linux tree) is held beside the passes' executor memory or beside finishSvd's. Without
   * one, below PARK_SMALL_FROM_BYTES, or where it gives null, they stay in memory.
   */
  spill?: OpenSpill;
  /** Bytes of QW from which the spill takes them (default PARK_SMALL_FROM_BYTES; tests set it low). */
  spillFromBytes?: number;
  /** Entries' bytes of a block of Aᵀ's rows in finishSvd (default BIG_SIDE_ENTRY_BYTES; tests set it low). */
  bigSideEntryBytes?: number;
}

export const DEFAULT_SVD_OPTIONS: Readonly<Omit<RandomizedSvdOptions, 'k'>> = Object.freeze({
  powerIterations: 4,
  dynamicShifts: true,
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
  const o = checkedOptions(m, options);
  const ex = o.executor ?? createWasmExecutor() ?? serialExecutor;
  const part = ex.scoped ? ex.scoped(() => smallSide(m, o, ex)) : smallSide(m, o, ex);
  return finishSvd(m, part, { executor: ex, factors: o.factors, bigSideEntryBytes: o.bigSideEntryBytes });
}

/** Executor memory for the big side's blocks of rows (our choice: small beside its B × k result). */
export const BIG_SIDE_SCRATCH_BYTES = 4 * 1024 * 1024;

function checkedOptions(m: CsrMatrix, options: Partial<RandomizedSvdOptions> & { k: number }): RandomizedSvdOptions {
  const o = { ...DEFAULT_SVD_OPTIONS, ...options };
  const maxRank = Math.min(m.rows, m.cols);
  if (maxRank === 0) throw new InvalidInputError('cannot decompose an empty matrix');
  if (!Number.isInteger(o.k) || o.k < 1) throw new InvalidInputError(`k must be a positive integer, got ${o.k}`);
  if (!Number.isInteger(o.powerIterations) || o.powerIterations < 0)
    throw new InvalidInputError(`powerIterations must be a whole number ≥ 0, got ${o.powerIterations}`);
  return o;
}

/**
 * The first part of randomizedSvd: the passes over the matrix and the Rayleigh–Ritz step, up to
 * the small-side vectors QW (f64, outside the executor's memory). finishSvd forms the big side
 * from it; a caller may give finishSvd another executor, so the working blocks of this part (in
 * executor memory, which never shrinks) can be let go before the big-side vectors are made. The
 * two parts give the same bits as randomizedSvd.
 */
export function randomizedSvdSmallSide(m: CsrMatrix, options: Partial<RandomizedSvdOptions> & { k: number }): SvdSmallSide {
  const o = checkedOptions(m, options);
  const ex = o.executor ?? createWasmExecutor() ?? serialExecutor;
  return ex.scoped ? ex.scoped(() => smallSide(m, o, ex)) : smallSide(m, o, ex);
}

/** What randomizedSvdSmallSide hands to finishSvd. */
export interface SvdSmallSide {
  readonly k: number;
  readonly s: Float64Array;
  /**
   * QW: S × k, row-major (S the smaller side of the matrix). finishSvd takes it (leaves an empty
   * array here once it is in the executor's memory: 181 MB of f64 on the kernel tree). Empty
   * while the numbers wait in `parked`.
   */
  small: Float64Array;
  /** Where QW's S × k f64 numbers wait (row-major, from byte 0), when a spill took them. */
  parked?: ByteSpill;
  /** The seeded stream, where the first part left it (the weak-column repair draws from it). */
  readonly random: RandomSource;
}

/** The big-side vectors Aᵀ(QW)Σ⁻¹ and the sign fix: the second part of randomizedSvd. */
export function finishSvd(
  m: CsrMatrix,
  part: SvdSmallSide,
  options: Pick<RandomizedSvdOptions, 'executor' | 'factors' | 'bigSideEntryBytes'> & { factors: 'f32' },
): SvdResult<Float32Array>;
export function finishSvd(
  m: CsrMatrix,
  part: SvdSmallSide,
  options?: Pick<RandomizedSvdOptions, 'executor' | 'factors' | 'bigSideEntryBytes'>,
): SvdResult<Float64Array | Float32Array>;
export function finishSvd(
  m: CsrMatrix,
  part: SvdSmallSide,
  options: Pick<RandomizedSvdOptions, 'executor' | 'factors' | 'bigSideEntryBytes'> = {},
): SvdResult<Float64Array | Float32Array> {
  const ex = options.executor ?? createWasmExecutor() ?? serialExecutor;
  const run = (): SvdResult<Float64Array | Float32Array> =>
    bigSide(m, part, options.factors ?? 'f64', ex, options.bigSideEntryBytes ?? BIG_SIDE_ENTRY_BYTES);
  return ex.scoped ? ex.scoped(run) : run();
}

/**
 * Columns of the big side held at once: all l when a B × l block fits in the budget, else the
 * width that splits l into the fewest nearly equal blocks that fit (at least 2 columns each).
 * The budget is fixed, not scaled with the S × l basis: a block wider than the budget only saves
 * passes over the sparse matrix, each of which reads it once, while every byte of the block stays
 * in the executor's memory (which never shrinks) for the rest of the build.
 * The power iterations and the Rayleigh–Ritz step act column by column (AAᵀ maps column c of Q
 * to column c of Y), so splitting the columns changes no arithmetic, only how much of Z is held
 * (and which seeded streams draw Ω: one per column block).
 */
export function bigSideBlockWidth(B: number, l: number, budgetBytes = BIG_BLOCK_BYTES): number {
  if (B * l * 8 <= budgetBytes) return l;
  const blocks = Math.ceil(l / Math.max(2, Math.floor(budgetBytes / (B * 8))));
  return Math.ceil(l / blocks);
}

/**
 * Budget of a big-side column block (our choice, measured on the linux-source-6.1 Documentation
 * matrix: see docs/speed-and-memory.md; small enough to matter, wide enough for SIMD rows).
 */
export const BIG_BLOCK_BYTES = 16 * 1024 * 1024;

function smallSide(m: CsrMatrix, o: RandomizedSvdOptions, ex: MatrixExecutor): SvdSmallSide {
  const maxRank = Math.min(m.rows, m.cols);
  const k = Math.min(o.k, maxRank);
  const l = Math.min(k + (o.oversampling ?? defaultOversampling(k)), maxRank);
  const random = createRandom(o.seed);
  // A has the smaller dimension as rows: Q (S × l) is the only block that is orthonormalised.
  const rowsSmall = m.rows <= m.cols;
  // The matrix in the executor's memory, stored entries as f32 (a relative change below 1e-7,
  // far inside the SVD's own accuracy) on every executor, so all of them give the same bits.
  const mCopy = copyCsr(m, ex, 'f32');
  const mt = transposeCsr(m, ex, 'f32');
  o.onCopied?.();
  const a = rowsSmall ? mCopy : mt;
  const at = rowsSmall ? mt : mCopy;
  const S = a.rows;
  const B = a.cols;
  const w = bigSideBlockWidth(B, l, o.bigBlockBytes);
  const totalPasses = 2 * o.powerIterations + 3;
  let passes = 0;
  const step = (): void => {
    if (o.signal?.aborted) throw new CancelledError();
    o.onProgress?.(++passes, totalPasses);
  };
  const blocks = columnBlocks(l, w);
  // Working blocks: Q (S × l), and per column block Z_c (B × w), Q_c and Y_c (S × w).
  const q = ex.float64(S * l);
  const z = ex.float64(B * w);
  const qc = w === l ? q : ex.float64(S * w);
  const yc = w === l ? q : ex.float64(S * w);
  // The power iterations' f32 blocks: Z_c in Z's memory, Q_c (then Y_c) in Y_c's (each unused
  // meanwhile), or an S × l block of its own when Q is one block.
  const z32 = new Float32Array(z.buffer, z.byteOffset, B * w);
  const q32 = w === l ? ex.float32(S * l) : new Float32Array(yc.buffer, yc.byteOffset, S * w);

  // 1. Range finder: Y = AΩ, one column block of Ω at a time (each block its own seeded stream).
  for (const [c0, cw] of blocks) {
    const zc = z.subarray(0, B * cw);
    ex.gaussian(zc, B, cw, blockSeed(o.seed, c0, w));
    ex.spmm(a, zc, cw, w === l ? q : yc.subarray(0, S * cw));
    if (w < l) columnBlock(q, yc, S, [l, c0, cw], 'scatter', ex);
  }
  step();
  orthonormalize(ex, q, S, l, o.powerIterations === 0 ? 2 : 1, random);
  // Power iterations Y = A(AᵀQ) − αQ (α from dynamicShift.ts, 0 in the first) with the products
  // in single precision, column block by column block, Q = orth(Y) in f64. Their rounding only
  // perturbs the basis being refined (a relative 10⁻⁷ a step, far inside the method's own
  // error); the Rayleigh–Ritz step below, which gives the singular values, works in f64 on
  // whatever basis they leave.
  let alpha = 0;
  for (let it = 0; it < o.powerIterations; it++) {
    for (const [c0, cw] of blocks) {
      if (o.signal?.aborted) throw new CancelledError();
      const qs = q32.subarray(0, S * cw);
      const zs = z32.subarray(0, B * cw);
      columnBlock(q, qs, S, [l, c0, cw], 'gather', ex);
      ex.spmmSingle(at, qs, cw, zs);
      ex.spmmSingle(a, zs, cw, qs);
      if (alpha > 0) scatterShifted(q, qs, S, [l, c0, cw], alpha);
      else columnBlock(q, qs, S, [l, c0, cw], 'scatter', ex);
    }
    step();
    step();
    const last = it === o.powerIterations - 1;
    let smallest = 0;
    const onFactor =
      o.dynamicShifts && !last ? (inverseT: Float64Array) => void (smallest = smallestSingularValue(inverseT, l)) : undefined;
    orthonormalize(ex, q, S, l, last ? 2 : 1, random, onFactor);
    alpha = nextShift(alpha, smallest);
  }

  // 2. Rayleigh–Ritz: G = Qᵀ(A(AᵀQ)), block by block: G[c', c] = Q_c'ᵀ Y_c.
  const g = new Float64Array(l * l);
  const yAll = w === l ? ex.float64(S * l) : yc;
  for (const [c0, cw] of blocks) {
    if (o.signal?.aborted) throw new CancelledError();
    const zc = z.subarray(0, B * cw);
    if (w < l) columnBlock(q, qc, S, [l, c0, cw], 'gather', ex);
    ex.spmm(at, w === l ? q : qc.subarray(0, S * cw), cw, zc);
    const y = yAll.subarray(0, S * cw);
    ex.spmm(a, zc, cw, y);
    for (const [d0, dw] of blocks) {
      let part: Float64Array;
      if (w === l) part = ex.cross(q, y, S, l);
      else {
        const qd = qc.subarray(0, S * dw);
        columnBlock(q, qd, S, [l, d0, dw], 'gather', ex);
        part = crossRect(ex, qd, dw, y, cw, S);
      }
      for (let i = 0; i < dw; i++) for (let j = 0; j < cw; j++) g[(d0 + i) * l + c0 + j] = part[i * cw + j];
    }
  }
  step();
  step();
  const pairs = topEigenpairs(g, l, k);
  const wt = transposeScaled(pairs.w, l, k);
  const spill = S * k * 8 >= (o.spillFromBytes ?? PARK_SMALL_FROM_BYTES) ? (o.spill?.() ?? null) : null;
  try {
    if (w === l || z.length >= S * k) {
      const small = w === l ? yAll.subarray(0, S * k) : z.subarray(0, S * k);
      ex.timesSmall(q, S, l, wt, k, false, small);
      if (!spill) return { k, s: pairs.s, small: Float64Array.from(small), random };
      writeInRuns(spill, small, 0);
      return { k, s: pairs.s, small: new Float64Array(0), parked: spill, random };
    }
    // QW block of rows by block of rows through Z's memory, straight into the result (or the
    // spill): an S × k block of executor memory (181 MB on the Linux tree) would stay for the
    // rest of the build. Each row of QW is its row of Q times W, whatever the blocks (starts
    // are multiples of 4).
    const small = new Float64Array(spill ? 0 : S * k);
    const rowsPer = Math.max(4, Math.floor(z.length / k / 4) * 4);
    const scratch = z.length >= rowsPer * k ? z : ex.float64(rowsPer * k);
    for (let r0 = 0; r0 < S; r0 += rowsPer) {
      const r1 = Math.min(S, r0 + rowsPer);
      const out = scratch.subarray(0, (r1 - r0) * k);
      ex.timesSmall(q.subarray(r0 * l, r1 * l), r1 - r0, l, wt, k, false, out);
      if (spill) writeInRuns(spill, out, r0 * k * 8);
      else small.set(out, r0 * k);
    }
    return { k, s: pairs.s, small, parked: spill ?? undefined, random };
  } catch (err) {
    spill?.close();
    throw err;
  }
}

/** Park QW in a spill from this many bytes on (as the weighted matrix's entries: parkedMatrix.ts). */
export const PARK_SMALL_FROM_BYTES = PARK_MATRIX_FROM_BYTES;

/** Gives the spill of a small side back without reading it (a failed or cancelled build). */
export function dropSmallSide(part: SvdSmallSide): void {
  part.parked?.close();
  part.parked = undefined;
}

/**
 * Big-side vectors Aᵀ(QW)Σ⁻¹, block of rows by block of rows, straight into the result type, then
 * the weak-column repair and the sign fix. Aᵀ goes to the executor's memory a block of its rows
 * at a time (about BIG_SIDE_ENTRY_BYTES of entries, stored as f32 as in the first part), not as
 * one copy (117 MB on the Linux tree). Each row of the big side is one sparse row times QW,
 * whatever the blocks, so the bits depend on neither the blocks nor the scratch's size.
 */
function bigSide(
  m: CsrMatrix,
  part: SvdSmallSide,
  factors: 'f64' | 'f32',
  ex: MatrixExecutor,
  entryBytes: number,
): SvdResult<Float64Array | Float32Array> {
  const { k, s, random } = part;
  const rowsSmall = m.rows <= m.cols;
  const S = rowsSmall ? m.rows : m.cols;
  const B = rowsSmall ? m.cols : m.rows;
  const small = ex.float64(S * k);
  try {
    if (part.parked) readInRuns(part.parked, small, 0);
    else small.set(part.small);
  } finally {
    dropSmallSide(part);
  }
  part.small = new Float64Array(0);
  const out = factors === 'f32' ? Float32Array : Float64Array;
  const big = new out(B * k);
  const scratch = ex.float64(Math.min(B, Math.max(1, Math.floor(BIG_SIDE_SCRATCH_BYTES / (8 * k)))) * k);
  const rows = bigSideRows(m, rowsSmall, entryBytes / 8);
  for (let r0 = 0; r0 < B;) {
    const r1 = rows.end(r0);
    const run = (): void => bigSideInBlocks(ex, rows.block(r0, r1, ex), small, k, s, big.subarray(r0 * k, r1 * k), scratch);
    if (ex.scoped) ex.scoped(run);
    else run();
    r0 = r1;
  }
  repairWeakColumns(big, B, k, s, random);
  // Sign fix on the column factor (decided on the values returned, row by row).
  const smallOut = out.from(small);
  const u = rowsSmall ? smallOut : big;
  const v = rowsSmall ? big : smallOut;
  flipSigns({ rows: m.rows, cols: k, data: u }, { rows: m.cols, cols: k, data: v });
  return { rows: m.rows, cols: m.cols, k, u, s, v };
}

/**
 * Entries of Aᵀ's blocks of rows (our choice: 16 MB of i32 indices and f32 values, some 2 M
 * entries, a few blocks on the Linux tree's 14.6 M).
 */
export const BIG_SIDE_ENTRY_BYTES = 16 * 1024 * 1024;

/**
 * Blocks of rows of Aᵀ (A the matrix with the smaller side as rows), each as a CSR matrix in the
 * executor's memory with f32 values, rows in order: end(r0) is where the block from r0 ends (at
 * least one row, about `entries` stored entries), block(r0, r1) makes it. When m's rows are the
 * smaller side, Aᵀ is m's transpose: block j0…j1 takes the entries of columns j0…j1 − 1 of
 * every row of m in row order (the order of transposeCsr), each row's cursor moving on from
 * block to block (blocks must come in order, each once).
 */
function bigSideRows(
  m: CsrMatrix,
  rowsSmall: boolean,
  entries: number,
): { end(r0: number): number; block(r0: number, r1: number, ex: MatrixExecutor): CsrMatrix } {
  const B = rowsSmall ? m.cols : m.rows;
  let count: Int32Array;
  if (rowsSmall) {
    count = new Int32Array(B);
    const nnz = m.indptr[m.rows];
    for (let p = 0; p < nnz; p++) count[m.indices[p]]++;
  } else count = Int32Array.from({ length: B }, (_, i) => m.indptr[i + 1] - m.indptr[i]);
  const cursor = rowsSmall ? m.indptr.slice(0, m.rows) : new Int32Array(0);
  return {
    end(r0: number): number {
      let r1 = r0 + 1;
      for (let n = count[r0]; r1 < B && n + count[r1] <= entries; r1++) n += count[r1];
      return r1;
    },
    block(r0: number, r1: number, ex: MatrixExecutor): CsrMatrix {
      if (!rowsSmall) return copyCsr(csrRows(m, r0, r1), ex, 'f32');
      const rows = r1 - r0;
      const indptr = ex.int32(rows + 1);
      for (let j = 0; j < rows; j++) indptr[j + 1] = indptr[j] + count[r0 + j];
      const nnz = indptr[rows];
      const indices = ex.int32(nnz);
      const values = ex.float32(nnz);
      const next = indptr.slice(0, rows);
      for (let i = 0; i < m.rows; i++) {
        const e = m.indptr[i + 1];
        let p = cursor[i];
        for (; p < e && m.indices[p] < r1; p++) {
          const q = next[m.indices[p] - r0]++;
          indices[q] = i;
          values[q] = m.values[p];
        }
        cursor[i] = p;
      }
      return { rows, cols: m.rows, indptr, indices, values };
    },
  };
}

/**
 * choleskyQr in place on q, with the executor memory it takes (the small factors it hands to the
 * kernels, its reduction scratch) given back afterwards instead of piling up pass after pass.
 */
function orthonormalize(
  ex: MatrixExecutor,
  q: Float64Array,
  S: number,
  l: number,
  passes: 1 | 2,
  random: RandomSource,
  onFirstFactor?: (inverseT: Float64Array) => void,
): void {
  const run = (): void => void choleskyQr(ex, q, S, l, passes, random, onFirstFactor);
  if (ex.scoped) ex.scoped(run);
  else run();
}

/**
 * columnBlock's scatter of a power iteration's product block Y_c (rows × w) with the shift:
 * basis columns c0 … c0 + w − 1 become Y_c − α·(those columns), in f64.
 */
function scatterShifted(
  basis: Float64Array,
  block: FloatArray,
  rows: number,
  [l, c0, w]: readonly [number, number, number],
  alpha: number,
): void {
  for (let i = 0, s = 0, d = c0; i < rows; i++, s += w, d += l)
    for (let j = 0; j < w; j++) basis[d + j] = block[s + j] - alpha * basis[d + j];
}

/** [first column, width] of each column block of an l-column block split into blocks of w. */
function columnBlocks(l: number, w: number): [number, number][] {
  const out: [number, number][] = [];
  for (let c0 = 0; c0 < l; c0 += w) out.push([c0, Math.min(w, l - c0)]);
  return out;
}

/** The seed of Ω's column block at c0: the seed itself when Ω is one block. */
function blockSeed(seed: number, c0: number, w: number): number {
  return c0 === 0 ? seed : (seed + Math.imul(c0 / w, 0x9e3779b1)) >>> 0;
}

/**
 * Columns c0 … c0 + w − 1 of a basis (rows × l) and a block (rows × w): gathered from the basis into
 * the block, or scattered from the block back into the basis, through the executor's copy where
 * it has one (on the Linux tree, 22 column blocks of a 434-wide basis over 78,301 rows: about 500
 * gathers, 10 s of a JavaScript loop).
 */
export function columnBlock(
  basis: Float64Array,
  block: FloatArray,
  rows: number,
  [l, c0, w]: readonly [number, number, number],
  way: 'gather' | 'scatter',
  ex?: MatrixExecutor,
): void {
  const wide = { a: basis, stride: l, at: c0 };
  const narrow = { a: block, stride: w, at: 0 };
  const [from, to] = way === 'gather' ? [wide, narrow] : [narrow, wide];
  copyColumnRun({ src: from.a, srcStride: from.stride, srcAt: from.at, dst: to.a, dstStride: to.stride, dstAt: to.at, w, rows }, ex);
}

/**
 * PᵀY (p × y, row-major) for P rows × p and Y rows × y: the executor's square cross product on
 * both blocks side by side would need a copy, so a square block is formed when p = y, and the
 * rectangle otherwise from the executor's cross of [P Y] with itself (only when p ≠ y: the last
 * column block).
 */
function crossRect(ex: MatrixExecutor, p: Float64Array, pw: number, y: Float64Array, yw: number, rows: number): Float64Array {
  if (pw === yw) return ex.cross(p, y, rows, pw);
  const wide = pw + yw;
  const run = (): Float64Array => {
    const both = ex.float64(rows * wide);
    for (let i = 0; i < rows; i++) {
      both.set(p.subarray(i * pw, i * pw + pw), i * wide);
      both.set(y.subarray(i * yw, i * yw + yw), i * wide + pw);
    }
    const g = ex.cross(both, both, rows, wide);
    const out = new Float64Array(pw * yw);
    for (let i = 0; i < pw; i++) for (let j = 0; j < yw; j++) out[i * yw + j] = g[i * wide + pw + j];
    return out;
  };
  // [P Y] is given back after each call (the last column block meets every other one twice).
  return ex.scoped ? ex.scoped(run) : run();
}

/** big (B × k) = Aᵀ small Σ⁻¹, computed over blocks of rows in `scratch` (executor memory). */
function bigSideInBlocks(
  ex: MatrixExecutor,
  at: CsrMatrix,
  small: Float64Array,
  k: number,
  s: Float64Array,
  big: Float64Array | Float32Array,
  scratch: Float64Array,
): void {
  const inv = Float64Array.from(s, (x) => (x > 0 ? 1 / x : 0));
  const rowsPer = Math.max(1, Math.floor(scratch.length / k));
  for (let r0 = 0; r0 < at.rows; r0 += rowsPer) {
    const r1 = Math.min(at.rows, r0 + rowsPer);
    const view: CsrMatrix = {
      rows: r1 - r0,
      cols: at.cols,
      indptr: at.indptr.subarray(r0, r1 + 1),
      indices: at.indices,
      values: at.values,
    };
    const y = scratch.subarray(0, (r1 - r0) * k);
    ex.spmm(view, small, k, y);
    for (let i = 0; i < r1 - r0; i++) {
      const o = (r0 + i) * k;
      for (let c = 0; c < k; c++) big[o + c] = y[i * k + c] * inv[c];
    }
  }
}

/** A dense row-major block of f64 or f32 numbers. */
export interface FactorBlock {
  readonly rows: number;
  readonly cols: number;
  readonly data: Float64Array | Float32Array;
}

/** Makes the largest-magnitude entry of each column of v positive, flipping u to match. */
export function flipSigns(u: FactorBlock, v: FactorBlock): void {
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
