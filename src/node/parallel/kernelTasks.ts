/**
 * One description of a parallel matrix job, shared by the main thread and the worker threads:
 * the job names a WebAssembly kernel (src/core/matrix/wasm/assembly), its arguments (byte
 * offsets into the shared memory, and sizes) and its task split. Whoever claims task t (via an
 * atomic counter) runs exactly the same arithmetic on exactly the same rows, so the result does
 * not depend on who ran what.
 */
import { GAUSSIAN_BLOCK_ROWS, gaussianBlock } from '../../core/matrix/kernels.js';
import type { KernelExports } from '../../core/matrix/wasm/wasmArena.js';
import type { CopyArgs } from '../../core/matrix/wasm/wasmExecutor.js';

/** Control words of a job (Int32Array on a SharedArrayBuffer). */
export const CTRL_NEXT = 0; // next unclaimed task
export const CTRL_FINISHED = 1; // worker threads that have left the job
export const CTRL_FAILED = 2; // 1 when a thread failed
export const CTRL_COMPLETED = 3; // tasks completed (progress, for the stall check)
export const CTRL_WORDS = 4;

export type KernelJob =
  | {
      /** spmm_f32: the stored values are f32. */
      readonly op: 'spmm' | 'spmm_f32';
      /** indptr, indices, values, x, l, y (offsets and the width), grouped (0/1). */
      readonly args: readonly [number, number, number, number, number, number, number];
      /** Row boundaries of the tasks. */
      readonly bounds: readonly number[];
    }
  | {
      /** spmm_x32: f64 stored values, an f32 dense block, one entry at a time. */
      readonly op: 'spmm_x32';
      /** indptr, indices, values, x, l, y (offsets and the width). */
      readonly args: readonly [number, number, number, number, number, number];
      readonly bounds: readonly number[];
    }
  | {
      /** spmm_single: f32 stored values, X, Y and sums (assembly/spmmSingle.ts). */
      readonly op: 'spmm_single';
      /** indptr, indices, values, x, l, y (offsets and the width). */
      readonly args: readonly [number, number, number, number, number, number];
      readonly bounds: readonly number[];
    }
  | {
      readonly op: 'cross';
      /** a, b, l, rows, partials (one l × l block per task), symmetric (0/1). */
      readonly args: readonly [number, number, number, number, number, number];
      readonly blockRows: number;
    }
  | {
      readonly op: 'gaussian';
      /** out (byte offset), rows, l, seed. */
      readonly args: readonly [number, number, number, number];
    }
  | {
      /** copy_columns (cast −1) or copy_columns_cast (cast 0: f32 into f64, 1: f64 into f32). */
      readonly op: 'copy_columns';
      /** src, srcStride, dst, dstStride, w, cast. */
      readonly args: CopyArgs;
      readonly bounds: readonly number[];
    }
  | {
      /** unit_rows (assembly/unitRows.ts). */
      readonly op: 'unit_rows';
      /** y, s, k, out. */
      readonly args: readonly [number, number, number, number];
      readonly bounds: readonly number[];
    }
  | {
      /** file_rows (assembly/fileRows.ts); task t promotes its rows into q + t·k·8. */
      readonly op: 'file_rows';
      /** rows, k, groups, g, centroids, starts, q, out. */
      readonly args: readonly [number, number, number, number, number, number, number, number];
      readonly bounds: readonly number[];
    }
  | {
      readonly op: 'times';
      /** y, l, w, c, upper (0/1), out. */
      readonly args: readonly [number, number, number, number, number, number];
      readonly bounds: readonly number[];
    };

export function taskCount(job: KernelJob): number {
  if (job.op === 'cross') return Math.max(1, Math.ceil(job.args[3] / job.blockRows));
  if (job.op === 'gaussian') return Math.max(1, Math.ceil(job.args[1] / GAUSSIAN_BLOCK_ROWS));
  return job.bounds.length - 1;
}

export function runTask(k: KernelExports, job: KernelJob, t: number, memory: WebAssembly.Memory): void {
  switch (job.op) {
    case 'gaussian': {
      const [out, rows, l, seed] = job.args;
      gaussianBlock(new Float64Array(memory.buffer, out, rows * l), rows, l, seed, t);
      return;
    }
    case 'spmm':
    case 'spmm_f32': {
      const [indptr, indices, values, x, l, y, grouped] = job.args;
      (job.op === 'spmm' ? k.spmm : k.spmm_f32)(indptr, indices, values, x, l, y, job.bounds[t], job.bounds[t + 1], grouped);
      return;
    }
    case 'spmm_x32': {
      const [indptr, indices, values, x, l, y] = job.args;
      k.spmm_x32(indptr, indices, values, x, l, y, job.bounds[t], job.bounds[t + 1]);
      return;
    }
    case 'spmm_single': {
      const [indptr, indices, values, x, l, y] = job.args;
      k.spmm_single(indptr, indices, values, x, l, y, job.bounds[t], job.bounds[t + 1]);
      return;
    }
    case 'cross': {
      const [a, b, l, rows, partials, symmetric] = job.args;
      k.cross(a, b, l, t * job.blockRows, Math.min(rows, (t + 1) * job.blockRows), partials + t * l * l * 8, symmetric);
      return;
    }
    case 'copy_columns': {
      const [src, srcStride, dst, dstStride, w, cast] = job.args;
      const [r0, r1] = [job.bounds[t], job.bounds[t + 1]];
      if (cast < 0) k.copy_columns(src, srcStride, dst, dstStride, w, r0, r1);
      else k.copy_columns_cast(src, srcStride, dst, dstStride, w, r0, r1, cast);
      return;
    }
    case 'unit_rows': {
      const [y, sc, kk, out] = job.args;
      k.unit_rows(y, sc, kk, out, job.bounds[t], job.bounds[t + 1]);
      return;
    }
    case 'file_rows': {
      const [rows, kk, groups, g, centroids, starts, q, out] = job.args;
      k.file_rows(rows, kk, job.bounds[t], job.bounds[t + 1], groups, g, centroids, starts, q + t * kk * 8, out);
      return;
    }
    case 'times': {
      const [y, l, w, c, upper, out] = job.args;
      k.times(y, l, w, c, upper, out, job.bounds[t], job.bounds[t + 1]);
      return;
    }
  }
}

/** Claims and runs tasks until none is left; returns how many this thread ran. */
export function drainTasks(k: KernelExports, job: KernelJob, ctrl: Int32Array, memory: WebAssembly.Memory): number {
  const total = taskCount(job);
  let ran = 0;
  for (;;) {
    const t = Atomics.add(ctrl, CTRL_NEXT, 1);
    if (t >= total) return ran;
    runTask(k, job, t, memory);
    Atomics.add(ctrl, CTRL_COMPLETED, 1);
    ran++;
  }
}
