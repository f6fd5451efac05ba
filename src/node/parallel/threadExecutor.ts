/**
 * A MatrixExecutor that shares each product between the calling thread and worker threads over
 * SharedArrayBuffer memory. The calling thread posts the job, works on it too, then blocks in
 * Atomics.wait until the workers have left it (the core's SVD is synchronous, so blocking the
 * calling thread is what it expects). Reductions use the core's fixed blocks and are summed here
 * in block order, so results are the same bits as the serial executor's.
 */
import type { Worker } from 'node:worker_threads';
import {
  addInto,
  mirrorUpper,
  REDUCTION_BLOCK_ROWS,
  splitCsrRows,
  splitRows,
  type FloatArray,
  type MatrixExecutor,
} from '../../core/matrix/executor.js';
import type { CsrMatrix } from '../../core/matrix/sparse.js';
import { CTRL_COMPLETED, CTRL_FAILED, CTRL_FINISHED, CTRL_WORDS, drainTasks, taskCount, type KernelJob } from './kernelTasks.js';

/** Tasks per thread in a product (several, so a slow thread does not hold the others up). */
const TASKS_PER_THREAD = 8;
/** A job that completes no task for this long means a worker thread died. */
const STALL_MS = 60_000;

export class ThreadExecutor implements MatrixExecutor {
  readonly threads: number;

  constructor(private readonly workers: readonly Worker[]) {
    this.threads = workers.length + 1;
  }

  float64(n: number): Float64Array {
    return new Float64Array(new SharedArrayBuffer(n * 8));
  }

  float32(n: number): Float32Array {
    return new Float32Array(new SharedArrayBuffer(n * 4));
  }

  int32(n: number): Int32Array {
    return new Int32Array(new SharedArrayBuffer(n * 4));
  }

  spmm(m: CsrMatrix, x: FloatArray, l: number, y: FloatArray): void {
    const bounds = splitCsrRows(m.indptr, m.rows, this.threads * TASKS_PER_THREAD);
    this.run({ op: 'spmm', indptr: this.shared(m.indptr), indices: this.shared(m.indices), values: this.shared(m.values), x: this.shared(x), y: this.writable(y), l, bounds });
  }

  cross(a: FloatArray, b: FloatArray, rows: number, l: number): Float64Array {
    const symmetric = a === b;
    const blocks = Math.max(1, Math.ceil(rows / REDUCTION_BLOCK_ROWS));
    const partials = this.float64(blocks * l * l);
    const sa = this.shared(a);
    this.run({ op: 'cross', a: sa, b: symmetric ? sa : this.shared(b), l, rows, blockRows: REDUCTION_BLOCK_ROWS, symmetric, partials });
    const g = new Float64Array(l * l);
    for (let t = 0; t < blocks; t++) addInto(g, partials.subarray(t * l * l, (t + 1) * l * l));
    return symmetric ? mirrorUpper(g, l) : g;
  }

  timesSmall(y: FloatArray, rows: number, l: number, wt: Float64Array, c: number, upper: boolean, out: FloatArray): void {
    const bounds = splitRows(rows, this.threads * TASKS_PER_THREAD);
    this.run({ op: 'timesSmall', y: this.shared(y), wt: this.shared(wt), out: this.writable(out), l, c, upper, bounds });
  }

  private run(job: KernelJob): void {
    const ctrl = new Int32Array(new SharedArrayBuffer(CTRL_WORDS * 4));
    const helpers = Math.min(this.workers.length, taskCount(job) - 1);
    for (let w = 0; w < helpers; w++) this.workers[w].postMessage({ type: 'kernel', job, ctrl });
    drainTasks(job, ctrl);
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

  /** The array itself when it already lives in shared memory, else a shared copy (read-only inputs). */
  private shared<T extends Int32Array | Float32Array | Float64Array>(a: T): T {
    if (a.buffer instanceof SharedArrayBuffer) return a;
    const copy = new (a.constructor as new (b: SharedArrayBuffer) => T)(new SharedArrayBuffer(a.byteLength));
    copy.set(a as never);
    return copy;
  }

  private writable<T extends Float32Array | Float64Array>(a: T): T {
    if (!(a.buffer instanceof SharedArrayBuffer)) throw new Error('output arrays of a threaded product must come from the executor');
    return a;
  }
}
