/**
 * A single-threaded MatrixExecutor running the WebAssembly SIMD kernels (./assembly) on a
 * WasmArena. Inputs that do not live in the arena are copied in first. Reductions use the same
 * fixed blocks, in the same order, as every other executor, so the results are the same bits as
 * serialExecutor's.
 */
import {
  addInto,
  checkColumnRun,
  mirrorUpper,
  reductionBlocks,
  REDUCTION_BLOCK_ROWS,
  serialExecutor,
  type CoarseQuantizer,
  type ColumnRun,
  type FloatArray,
  type MatrixExecutor,
} from '../executor.js';
import { unitRowsInto } from '../kernels.js';
import type { CsrMatrix } from '../sparse.js';
import { instantiateKernels, kernelModule, WasmArena, type KernelExports } from './wasmArena.js';

/** A column copy's arguments: src, srcStride, dst, dstStride, w, cast (−1 none, 0 f32 → f64, 1 f64 → f32). */
export type CopyArgs = readonly [number, number, number, number, number, number];

export class WasmExecutor implements MatrixExecutor {
  readonly threads: number = 1;
  readonly arena: WasmArena;
  protected readonly kernels: KernelExports;

  /** Use createWasmExecutor(), which checks that WebAssembly SIMD is available. */
  constructor(module: WebAssembly.Module, arena = new WasmArena()) {
    this.arena = arena;
    this.kernels = instantiateKernels(module, arena.memory);
  }

  float64(n: number): Float64Array {
    return this.arena.float64(n);
  }

  float32(n: number): Float32Array {
    return this.arena.float32(n);
  }

  int32(n: number): Int32Array {
    return this.arena.int32(n);
  }

  private scratchArray: Float64Array | undefined;

  /** Frees the arena memory allocated while fn ran (results must be copied out before). */
  scoped<T>(fn: () => T): T {
    const mark = this.arena.mark();
    const scratch = this.scratchArray;
    try {
      return fn();
    } finally {
      this.arena.release(mark);
      this.scratchArray = scratch;
    }
  }

  /** A reusable arena array of at least n numbers (valid until the next call or scope end). */
  protected scratch(n: number): Float64Array {
    if (!this.scratchArray || this.scratchArray.length < n) this.scratchArray = this.arena.float64(n);
    return this.scratchArray.subarray(0, n);
  }

  spmm(m: CsrMatrix, x: FloatArray, l: number, y: FloatArray, sequential = false): void {
    const out = this.out(y);
    const x32 = this.x32(m, x, sequential);
    if (x32 >= 0) this.kernels.spmm_x32(this.ptr(m.indptr), this.ptr(m.indices), this.ptr(m.values), x32, l, out.ptr, 0, m.rows);
    else {
      const f32 = m.values instanceof Float32Array && this.arena.offsetOf(m.values) >= 0;
      const values = f32 ? m.values.byteOffset : this.ptr(m.values);
      const run = f32 ? this.kernels.spmm_f32 : this.kernels.spmm;
      run(this.ptr(m.indptr), this.ptr(m.indices), values, this.ptr(x), l, out.ptr, 0, m.rows, sequential ? 0 : 1);
    }
    out.done();
  }

  spmmSingle(m: CsrMatrix, x: Float32Array, l: number, y: Float32Array): void {
    const out = this.single(y, true);
    this.kernels.spmm_single(this.ptr(m.indptr), this.ptr(m.indices), this.singleValues(m), this.single(x).ptr, l, out.ptr, 0, m.rows);
    out.done();
  }

  cross(a: FloatArray, b: FloatArray, rows: number, l: number): Float64Array {
    const symmetric = a === b;
    const pa = this.ptr(a);
    const pb = symmetric ? pa : this.ptr(b);
    const g = new Float64Array(l * l);
    const part = this.scratch(l * l);
    for (let t = 0; t < reductionBlocks(rows); t++) {
      this.kernels.cross(
        pa,
        pb,
        l,
        t * REDUCTION_BLOCK_ROWS,
        Math.min(rows, (t + 1) * REDUCTION_BLOCK_ROWS),
        part.byteOffset,
        symmetric ? 1 : 0,
      );
      addInto(g, part);
    }
    return symmetric ? mirrorUpper(g, l) : g;
  }

  timesSmall(y: FloatArray, rows: number, l: number, wt: Float64Array, c: number, upper: boolean, out: FloatArray): void {
    const w = this.untransposed(wt, l, c);
    const o = this.out(out);
    this.kernels.times(this.ptr(y), l, w, c, upper ? 1 : 0, o.ptr, 0, rows);
    o.done();
  }

  /** The unit_rows kernel for rows that live in the arena; others where they lie, by the plain twin (the same bits). */
  unitRows(y: Float64Array, rows: number, k: number, s: Float64Array, out: Float32Array): void {
    // Copying rows in would only raise the arena's high mark, which it keeps.
    if (this.arena.offsetOf(y) < 0) return unitRowsInto(y, s, k, out, 0, rows);
    const o = this.single(out.subarray(0, rows * k), true);
    this.kernels.unit_rows(this.ptr(y), this.ptr(s), k, o.ptr, 0, rows);
    o.done();
  }

  /** file_rows on rows, quantizer and out that live in the arena; false otherwise (the caller files them). */
  fileRows(rows: Float32Array, n: number, k: number, quantizer: CoarseQuantizer, out: Int32Array): boolean {
    const at = this.fileRowsArgs(rows, n, k, quantizer, out);
    if (!at) return false;
    if (n <= 0) return true;
    const [pr, pg, g, pc, ps, po] = at;
    this.scoped(() => this.kernels.file_rows(pr, k, 0, n, pg, g, pc, ps, this.arena.float64(k).byteOffset, po));
    return true;
  }

  /**
   * Byte offsets of file_rows' arrays (rows, groups, g, centroids, starts, out) when every one
   * lives in the arena and is large enough, else null.
   * @throws RangeError when the quantizer's parts disagree in size.
   */
  protected fileRowsArgs(
    rows: Float32Array,
    n: number,
    k: number,
    quantizer: CoarseQuantizer,
    out: Int32Array,
  ): readonly [number, number, number, number, number, number] | null {
    const { groups, centroids, starts } = quantizer;
    const g = starts.length - 1;
    if (g < 1 || groups.length < g * k || centroids.length < starts[g] * k) throw new RangeError("the quantizer's parts disagree in size");
    if (rows.length < n * k || out.length < n) throw new RangeError(`file_rows: ${n} rows do not fit the arrays given`);
    const offsets = [rows, groups, centroids, starts, out].map((a) => this.arena.offsetOf(a));
    if (offsets.some((p) => p < 0)) return null;
    const [pr, pg, pc, ps, po] = offsets;
    return [pr, pg, g, pc, ps, po];
  }

  /**
   * The copy_columns kernel when both arrays live in the arena (assembly/copyColumns.ts), or
   * copy_columns_cast between an f64 and an f32 array; false for two f32 arrays.
   */
  copyColumns(run: ColumnRun): boolean {
    const [ps, pd] = [this.arena.offsetOf(run.src), this.arena.offsetOf(run.dst)];
    const [s32, d32] = [run.src instanceof Float32Array, run.dst instanceof Float32Array];
    if (ps < 0 || pd < 0 || (s32 && d32)) return false;
    checkColumnRun(run);
    if (run.rows <= 0 || run.w <= 0) return true;
    const src = ps + run.src.BYTES_PER_ELEMENT * run.srcAt;
    const dst = pd + run.dst.BYTES_PER_ELEMENT * run.dstAt;
    this.copyRows([src, run.srcStride, dst, run.dstStride, run.w, s32 ? 0 : d32 ? 1 : -1], run.rows);
    return true;
  }

  /**
   * Rows [0, rows) of a checked column copy: src, srcStride, dst, dstStride (byte offsets and
   * strides in numbers), w, and the cast (−1 none, 0 f32 into f64, 1 f64 into f32).
   */
  protected copyRows(args: CopyArgs, rows: number): void {
    const [src, srcStride, dst, dstStride, w, cast] = args;
    if (cast < 0) this.kernels.copy_columns(src, srcStride, dst, dstStride, w, 0, rows);
    else this.kernels.copy_columns_cast(src, srcStride, dst, dstStride, w, 0, rows, cast);
  }

  gaussian(out: Float64Array, rows: number, l: number, seed: number): void {
    serialExecutor.gaussian(out, rows, l, seed);
  }

  /** W (l × c) in the arena from its transpose wt (c × l); returns the byte offset. */
  protected untransposed(wt: Float64Array, l: number, c: number): number {
    const w = this.arena.float64(l * c);
    for (let b = 0; b < c; b++) for (let a = 0; a < l; a++) w[a * c + b] = wt[b * l + a];
    return w.byteOffset;
  }

  /**
   * Byte offset of an f32 X that spmm_x32 can read where it lies (in the arena, a sequential
   * product, f64 stored values), else −1 (X then goes through ptr: an f64 copy, the same bits).
   */
  protected x32(m: CsrMatrix, x: FloatArray, sequential: boolean): number {
    return sequential && x instanceof Float32Array && !(m.values instanceof Float32Array) ? this.arena.offsetOf(x) : -1;
  }

  /** Byte offset of M's stored values as f32 in the arena (copied, and rounded if f64, when needed). */
  protected singleValues(m: CsrMatrix): number {
    if (m.values instanceof Float32Array) return this.single(m.values).ptr;
    const copy = this.arena.float32(m.values.length);
    copy.set(m.values);
    return copy.byteOffset;
  }

  /**
   * An f32 array in the arena: where it lies, or a copy (copied back by done() for an output,
   * `out`; an input's copy is left to the scope).
   */
  protected single(a: Float32Array, out = false): { ptr: number; done: () => void } {
    const p = this.arena.offsetOf(a);
    if (p >= 0) return { ptr: p, done: () => undefined };
    const copy = this.arena.float32(a.length);
    if (!out) copy.set(a);
    return { ptr: copy.byteOffset, done: () => a.set(copy) };
  }

  /** Byte offset of an input array, copying it into the arena (as f64 for floats) if needed. */
  protected ptr(a: Int32Array | FloatArray): number {
    const p = a instanceof Float32Array ? -1 : this.arena.offsetOf(a);
    if (p >= 0) return p;
    const copy = a instanceof Int32Array ? this.arena.int32(a.length) : this.arena.float64(a.length);
    copy.set(a);
    return copy.byteOffset;
  }

  /** An output target in the arena, copied back to the caller's array when it lives elsewhere. */
  protected out(y: FloatArray): { ptr: number; done: () => void } {
    const p = y instanceof Float32Array ? -1 : this.arena.offsetOf(y);
    if (p >= 0) return { ptr: p, done: () => undefined };
    const tmp = this.arena.float64(y.length);
    return { ptr: tmp.byteOffset, done: () => y.set(tmp) };
  }
}

/** A WebAssembly SIMD executor, or undefined where the platform lacks SIMD or shared memory. */
export function createWasmExecutor(): WasmExecutor | undefined {
  const module = kernelModule();
  return module ? new WasmExecutor(module) : undefined;
}
