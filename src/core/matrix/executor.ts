/**
 * Where the SVD's large products run. The core calls a MatrixExecutor; the default one runs the
 * row-range kernels (kernels.ts) here, in order. The node layer injects one that splits the same
 * work over worker threads on shared memory (src/node/parallel). Both split the work the same
 * way where it matters: products write disjoint output rows, and the Gram sums are formed per
 * fixed block of REDUCTION_BLOCK_ROWS rows and added in block order, so serial and threaded runs
 * give the same bits.
 */
import type { CsrMatrix } from './sparse.js';
import {
  crossRows,
  GAUSSIAN_BLOCK_ROWS,
  gaussianBlock,
  spmmRows,
  spmmSingleRows,
  timesSmallRows,
  unitRowsInto,
  type FloatArray,
} from './kernels.js';

export type { FloatArray } from './kernels.js';

/** Rows per partial sum in Gram products (fixed, so the summation order never depends on threads). */
export const REDUCTION_BLOCK_ROWS = 1024;

export interface MatrixExecutor {
  /** Threads doing the work (1 for the serial executor). */
  readonly threads: number;
  /** Arrays the executor's threads can all see (plain arrays for the serial executor). */
  float64(length: number): Float64Array;
  float32(length: number): Float32Array;
  int32(length: number): Int32Array;
  /**
   * Y = M X: M is rows × cols sparse, X is cols × l, Y is rows × l (row-major). With sequential,
   * each row adds its entries one at a time, in order (the arithmetic of a plain loop). X may be
   * f32 (each number promoted exactly): an f32 X in the executor's memory is read where it lies
   * (sequential, f64 stored values), the same bits as an f64 copy of it.
   */
  spmm(m: CsrMatrix, x: FloatArray, l: number, y: FloatArray, sequential?: boolean): void;
  /**
   * Y = M X in single precision: f32 stored values (an f64 M is rounded to f32 first), f32 X and
   * Y, f32 sums in spmm's grouped order (spmmSingleRows); the same bits on every executor.
   */
  spmmSingle(m: CsrMatrix, x: Float32Array, l: number, y: Float32Array): void;
  /** AᵀB for two rows × l blocks (l × l, row-major); symmetric and mirrored when a === b. */
  cross(a: FloatArray, b: FloatArray, rows: number, l: number): Float64Array;
  /** out = Y W for Y rows × l and W l × c given transposed (wt: c × l); W upper triangular if upper. */
  timesSmall(y: FloatArray, rows: number, l: number, wt: Float64Array, c: number, upper: boolean, out: FloatArray): void;
  /**
   * out (rows × k, f32) = each row of y (rows × k) times s elementwise, over its norm; a row whose
   * scaled norm is 0 comes out as zeros (unitRowsInto: the same bits on every executor).
   */
  unitRows(y: Float64Array, rows: number, k: number, s: Float64Array, out: Float32Array): void;
  /** Fills a rows × l block with seeded N(0, 1) numbers, block by block (gaussianBlock). */
  gaussian(out: Float64Array, rows: number, l: number, seed: number): void;
  /** Runs fn and then frees the executor memory it allocated (results must be copied out). */
  scoped?<T>(fn: () => T): T;
  /**
   * The list of each of n f32 rows (n × k) under a two-level coarse quantizer, into out[0 … n):
   * the file_rows kernel (wasm/assembly/fileRows.ts), the same bits whoever runs which rows.
   * Optional, and false where the executor cannot (no kernel, or an array outside its memory:
   * the caller then files them itself).
   */
  fileRows?(rows: Float32Array, n: number, k: number, quantizer: CoarseQuantizer, out: Int32Array): boolean;
  /**
   * Copies a block of columns (ColumnRun). Optional, and false where the executor cannot (the
   * caller then copies with a plain loop: a copy, so the bits are the same either way).
   * @throws RangeError when a row's run would fall outside either array.
   */
  copyColumns?(run: ColumnRun): boolean;
}

/** A two-level coarse quantizer as file_rows reads it (../sections/sectionLists.ts trains one). */
export interface CoarseQuantizer {
  /** g × k group centres. */
  readonly groups: Float32Array;
  /** lists × k centroids, group by group. */
  readonly centroids: Float32Array;
  /** Group c holds centroids starts[c] … starts[c + 1] − 1 (length g + 1). */
  readonly starts: Int32Array;
}

/**
 * For each row i < rows, the w numbers from src[i·srcStride + srcAt] on go to dst[i·dstStride + dstAt]
 * on (f64 numbers into an f32 array rounded to nearest, f32 into f64 exactly, as typed arrays store them).
 */
export interface ColumnRun {
  readonly src: FloatArray;
  readonly srcStride: number;
  readonly srcAt: number;
  readonly dst: FloatArray;
  readonly dstStride: number;
  readonly dstAt: number;
  readonly w: number;
  readonly rows: number;
}

/** Checks that a ColumnRun lies inside both arrays. @throws RangeError when it does not. */
export function checkColumnRun(run: ColumnRun): void {
  const { rows, w } = run;
  if (rows <= 0 || w <= 0) return;
  const inside = (a: FloatArray, stride: number, at: number): boolean => at >= 0 && stride >= w && (rows - 1) * stride + at + w <= a.length;
  if (!inside(run.src, run.srcStride, run.srcAt) || !inside(run.dst, run.dstStride, run.dstAt))
    throw new RangeError(`columns ${w} wide over ${rows} rows fall outside the arrays`);
}

/** Copies a ColumnRun with the executor's copy where it has one, else with a plain loop (the same bits). */
export function copyColumnRun(run: ColumnRun, ex?: MatrixExecutor): void {
  if (ex?.copyColumns?.(run)) return;
  const { src, srcStride, srcAt, dst, dstStride, dstAt, w, rows } = run;
  // A plain loop: a subarray per row (rows of a few dozen numbers) cost more than the copy.
  for (let i = 0, s = srcAt, d = dstAt; i < rows; i++, s += srcStride, d += dstStride) for (let j = 0; j < w; j++) dst[d + j] = src[s + j];
}

/** g += part (block partials are added in block order by every executor). */
export function addInto(g: Float64Array, part: Float64Array): void {
  for (let t = 0; t < g.length; t++) g[t] += part[t];
}

/** Copies the upper triangle of a square row-major matrix onto its lower triangle. */
export function mirrorUpper(g: Float64Array, l: number): Float64Array {
  for (let p = 0; p < l; p++) for (let q = 0; q < p; q++) g[p * l + q] = g[q * l + p];
  return g;
}

/** Number of fixed reduction blocks for a block of rows. */
export function reductionBlocks(rows: number): number {
  return Math.max(1, Math.ceil(rows / REDUCTION_BLOCK_ROWS));
}

/** Runs every kernel on the calling thread. */
export const serialExecutor: MatrixExecutor = Object.freeze({
  threads: 1,
  float64: (n: number) => new Float64Array(n),
  float32: (n: number) => new Float32Array(n),
  int32: (n: number) => new Int32Array(n),
  spmm(m: CsrMatrix, x: FloatArray, l: number, y: FloatArray, sequential = false): void {
    spmmRows(m.indptr, m.indices, m.values, x, l, y, 0, m.rows, !sequential);
  },
  spmmSingle(m: CsrMatrix, x: Float32Array, l: number, y: Float32Array): void {
    const values = m.values instanceof Float32Array ? m.values : Float32Array.from(m.values);
    spmmSingleRows(m.indptr, m.indices, values, x, l, y, 0, m.rows);
  },
  cross(a: FloatArray, b: FloatArray, rows: number, l: number): Float64Array {
    const g = new Float64Array(l * l);
    const part = new Float64Array(l * l);
    for (let t = 0; t < reductionBlocks(rows); t++) {
      crossRows(a, b, l, t * REDUCTION_BLOCK_ROWS, Math.min(rows, (t + 1) * REDUCTION_BLOCK_ROWS), part, a === b);
      addInto(g, part);
    }
    return a === b ? mirrorUpper(g, l) : g;
  },
  timesSmall(y: FloatArray, rows: number, l: number, wt: Float64Array, c: number, upper: boolean, out: FloatArray): void {
    timesSmallRows(y, l, wt, c, upper, out, 0, rows);
  },
  unitRows(y: Float64Array, rows: number, k: number, s: Float64Array, out: Float32Array): void {
    unitRowsInto(y, s, k, out, 0, rows);
  },
  gaussian(out: Float64Array, rows: number, l: number, seed: number): void {
    for (let b = 0; b * GAUSSIAN_BLOCK_ROWS < rows; b++) gaussianBlock(out, rows, l, seed, b);
  },
});

/**
 * Splits [0, rows) into at most `parts` ranges (boundaries, length ≤ parts + 1) whose starts are
 * multiples of 4: kernels treat rows in fours, so a row's arithmetic never depends on the split.
 */
export function splitRows(rows: number, parts: number): Int32Array {
  const per = Math.max(4, Math.ceil(rows / Math.max(1, parts) / 4) * 4);
  const bounds: number[] = [0];
  for (let r = per; r < rows; r += per) bounds.push(r);
  bounds.push(rows);
  return Int32Array.from(bounds);
}

/** Splits the rows of a CSR matrix into about `parts` ranges of similar stored-entry counts (starts multiples of 4). */
export function splitCsrRows(indptr: Int32Array, rows: number, parts: number): Int32Array {
  // A view of some rows of a larger matrix starts at indptr[0] > 0.
  const nnz = indptr[rows] - indptr[0];
  const target = Math.max(1, nnz / Math.max(1, parts));
  const bounds: number[] = [0];
  let next = indptr[0] + target;
  for (let r = 4; r < rows; r += 4) {
    if (indptr[r] >= next) {
      bounds.push(r);
      next = indptr[r] + target;
    }
  }
  bounds.push(rows);
  return Int32Array.from(bounds);
}
