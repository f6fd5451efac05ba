/**
 * The WebAssembly SIMD executor (core/matrix/wasm) with each product shared between the calling
 * thread and worker threads that instantiated the same kernel module on the same shared memory.
 * The calling thread posts the job, works on it too, then blocks in Atomics.wait until the
 * workers have left it (the core's SVD is synchronous, so blocking is what it expects).
 * Reductions use the core's fixed blocks and are summed here in block order, so the results are
 * the same bits as the serial executors'.
 */
import type { Worker } from 'node:worker_threads';
import {
  addInto,
  mirrorUpper,
  REDUCTION_BLOCK_ROWS,
  splitCsrRows,
  splitRows,
  type CoarseQuantizer,
  type FloatArray,
} from '../../core/matrix/executor.js';
import type { CsrMatrix } from '../../core/matrix/sparse.js';
import type { WasmArena } from '../../core/matrix/wasm/wasmArena.js';
import { WasmExecutor, type CopyArgs } from '../../core/matrix/wasm/wasmExecutor.js';
import { CTRL_COMPLETED, CTRL_FAILED, CTRL_FINISHED, CTRL_WORDS, drainTasks, taskCount, type KernelJob } from './kernelTasks.js';

/** Tasks per thread in a product (several, so a slow thread does not hold the others up). */
const TASKS_PER_THREAD = 8;
/** Tasks per thread in a column copy (a copy is short: fewer, larger tasks than a product's). */
const COPY_TASKS_PER_THREAD = 2;
/** Numbers from which a column copy is shared out (our choice: below, a copy takes tens of µs). */
const COPY_SHARED_FROM = 1 << 16;
/** A job that completes no task for this long means a worker thread died. */
const STALL_MS = 60_000;
/** Reduction blocks of a Gram product per thread and job (bounds its partials; our choice, not tuned). */
const CROSS_BLOCKS_PER_THREAD = 4;

export class ThreadExecutor extends WasmExecutor {
  override readonly threads: number;

  /** The workers must have been sent { type: 'wasm-init', module, memory: arena.memory } first. */
  constructor(
    module: WebAssembly.Module,
    arena: WasmArena,
    private readonly workers: readonly Worker[],
  ) {
    super(module, arena);
    this.threads = workers.length + 1;
  }

  override spmm(m: CsrMatrix, x: FloatArray, l: number, y: FloatArray, sequential = false): void {
    const out = this.out(y);
    const bounds = Array.from(splitCsrRows(m.indptr, m.rows, this.threads * TASKS_PER_THREAD));
    const x32 = this.x32(m, x, sequential);
    if (x32 >= 0) {
      this.run({ op: 'spmm_x32', args: [this.ptr(m.indptr), this.ptr(m.indices), this.ptr(m.values), x32, l, out.ptr], bounds });
      out.done();
      return;
    }
    const f32 = m.values instanceof Float32Array && this.arena.offsetOf(m.values) >= 0;
    const values = f32 ? m.values.byteOffset : this.ptr(m.values);
    this.run({
      op: f32 ? 'spmm_f32' : 'spmm',
      args: [this.ptr(m.indptr), this.ptr(m.indices), values, this.ptr(x), l, out.ptr, sequential ? 0 : 1],
      bounds,
    });
    out.done();
  }

  override spmmSingle(m: CsrMatrix, x: Float32Array, l: number, y: Float32Array): void {
    const out = this.single(y, true);
    const bounds = Array.from(splitCsrRows(m.indptr, m.rows, this.threads * TASKS_PER_THREAD));
    this.run({
      op: 'spmm_single',
      args: [this.ptr(m.indptr), this.ptr(m.indices), this.singleValues(m), this.single(x).ptr, l, out.ptr],
      bounds,
    });
    out.done();
  }

  override cross(a: FloatArray, b: FloatArray, rows: number, l: number): Float64Array {
    const symmetric = a === b;
    const pa = this.ptr(a);
    const pb = symmetric ? pa : this.ptr(b);
    const blocks = Math.max(1, Math.ceil(rows / REDUCTION_BLOCK_ROWS));
    // A few reduction blocks per job, not all of them at once: one l × l partial per block in
    // flight (at l = 434 on 78,300 rows, all 77 took 116 MB of executor memory, which never
    // shrinks). Each block covers the same rows and is added in the same order: the same bits.
    const perJob = Math.min(blocks, CROSS_BLOCKS_PER_THREAD * this.threads);
    const partials = this.scratch(perJob * l * l);
    const g = new Float64Array(l * l);
    for (let b0 = 0; b0 < blocks; b0 += perJob) {
      const r0 = b0 * REDUCTION_BLOCK_ROWS;
      const n = Math.min(rows, r0 + perJob * REDUCTION_BLOCK_ROWS) - r0;
      const at = r0 * l * 8;
      this.run({
        op: 'cross',
        args: [pa + at, pb + at, l, n, partials.byteOffset, symmetric ? 1 : 0],
        blockRows: REDUCTION_BLOCK_ROWS,
      });
      for (let t = 0; t * REDUCTION_BLOCK_ROWS < n; t++) addInto(g, partials.subarray(t * l * l, (t + 1) * l * l));
    }
    return symmetric ? mirrorUpper(g, l) : g;
  }

  override timesSmall(y: FloatArray, rows: number, l: number, wt: Float64Array, c: number, upper: boolean, out: FloatArray): void {
    const w = this.untransposed(wt, l, c);
    const o = this.out(out);
    const bounds = Array.from(splitRows(rows, this.threads * TASKS_PER_THREAD));
    this.run({ op: 'times', args: [this.ptr(y), l, w, c, upper ? 1 : 0, o.ptr], bounds });
    o.done();
  }

  /** unit_rows shared out by rows (a row's arithmetic does not depend on who runs it); small blocks, and rows outside the arena, here. */
  override unitRows(y: Float64Array, rows: number, k: number, s: Float64Array, out: Float32Array): void {
    if (rows * k < COPY_SHARED_FROM || this.arena.offsetOf(y) < 0) return super.unitRows(y, rows, k, s, out);
    const o = this.single(out.subarray(0, rows * k), true);
    const bounds = Array.from(splitRows(rows, this.threads * TASKS_PER_THREAD));
    this.run({ op: 'unit_rows', args: [this.ptr(y), this.ptr(s), k, o.ptr], bounds });
    o.done();
  }

  /** file_rows shared out by rows (each row is filed on its own: the same lists whoever files it); few rows here. */
  override fileRows(rows: Float32Array, n: number, k: number, quantizer: CoarseQuantizer, out: Int32Array): boolean {
    if (n * k < COPY_SHARED_FROM) return super.fileRows(rows, n, k, quantizer, out);
    const at = this.fileRowsArgs(rows, n, k, quantizer, out);
    if (!at) return false;
    const [pr, pg, g, pc, ps, po] = at;
    const bounds = Array.from(splitRows(n, this.threads * TASKS_PER_THREAD));
    // One f64 row per task, where its rows are promoted one at a time.
    this.scoped(() => {
      const q = this.arena.float64((bounds.length - 1) * k);
      this.run({ op: 'file_rows', args: [pr, k, pg, g, pc, ps, q.byteOffset, po], bounds });
    });
    return true;
  }

  /**
   * A column copy shared out by rows (copies: the same bits whoever copies which rows); one that
   * moves fewer than COPY_SHARED_FROM numbers is done here (posting it would cost more).
   */
  protected override copyRows(args: CopyArgs, rows: number): void {
    if (rows * args[4] < COPY_SHARED_FROM) return super.copyRows(args, rows);
    this.run({ op: 'copy_columns', args, bounds: Array.from(splitRows(rows, this.threads * COPY_TASKS_PER_THREAD)) });
  }

  override gaussian(out: Float64Array, rows: number, l: number, seed: number): void {
    const o = this.out(out);
    this.run({ op: 'gaussian', args: [o.ptr, rows, l, seed] });
    o.done();
  }

  private run(job: KernelJob): void {
    const ctrl = new Int32Array(new SharedArrayBuffer(CTRL_WORDS * 4));
    const helpers = Math.min(this.workers.length, taskCount(job) - 1);
    for (let w = 0; w < helpers; w++) this.workers[w].postMessage({ type: 'kernel', job, ctrl });
    drainTasks(this.kernels, job, ctrl, this.arena.memory);
    let seen = Atomics.load(ctrl, CTRL_COMPLETED);
    let since = Date.now();
    for (;;) {
      const finished = Atomics.load(ctrl, CTRL_FINISHED);
      if (finished >= helpers) break;
      Atomics.wait(ctrl, CTRL_FINISHED, finished, 200);
      const completed = Atomics.load(ctrl, CTRL_COMPLETED);
      if (completed !== seen) {
        seen = completed;
        since = Date.now();
      } else if (Date.now() - since > STALL_MS) {
        throw new Error('a worker thread stopped responding during a matrix product');
      }
    }
    if (Atomics.load(ctrl, CTRL_FAILED) !== 0) throw new Error(`a worker thread failed during a matrix product (${job.op})`);
  }
}
