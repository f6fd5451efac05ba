/**
 * One description of a parallel matrix job, shared by the main thread and the worker threads:
 * the job names a row-range kernel of src/core/matrix/kernels.ts, its arrays (all on shared
 * memory) and its task split. Whoever claims task t (via an atomic counter) runs exactly the same
 * arithmetic on exactly the same rows, so the result does not depend on who ran what.
 */
import { crossRows, spmmRows, timesSmallRows, type FloatArray } from '../../core/matrix/kernels.js';

/** Control words of a job (Int32Array on a SharedArrayBuffer). */
export const CTRL_NEXT = 0; // next unclaimed task
export const CTRL_FINISHED = 1; // worker threads that have left the job
export const CTRL_FAILED = 2; // 1 when a thread failed
export const CTRL_COMPLETED = 3; // tasks completed (progress, for the stall check)
export const CTRL_WORDS = 4;

export type KernelJob =
  | {
      readonly op: 'spmm';
      readonly indptr: Int32Array;
      readonly indices: Int32Array;
      readonly values: FloatArray;
      readonly x: FloatArray;
      readonly y: FloatArray;
      readonly l: number;
      /** Row boundaries of the tasks. */
      readonly bounds: Int32Array;
    }
  | {
      readonly op: 'cross';
      readonly a: FloatArray;
      readonly b: FloatArray;
      readonly l: number;
      readonly rows: number;
      readonly blockRows: number;
      readonly symmetric: boolean;
      /** One l × l partial per block, block after block. */
      readonly partials: Float64Array;
    }
  | {
      readonly op: 'timesSmall';
      readonly y: FloatArray;
      readonly wt: Float64Array;
      readonly out: FloatArray;
      readonly l: number;
      readonly c: number;
      readonly upper: boolean;
      readonly bounds: Int32Array;
    };

export function taskCount(job: KernelJob): number {
  if (job.op === 'cross') return Math.max(1, Math.ceil(job.rows / job.blockRows));
  return job.bounds.length - 1;
}

export function runTask(job: KernelJob, t: number): void {
  switch (job.op) {
    case 'spmm':
      spmmRows(job.indptr, job.indices, job.values, job.x, job.l, job.y, job.bounds[t], job.bounds[t + 1]);
      return;
    case 'cross': {
      const size = job.l * job.l;
      const part = job.partials.subarray(t * size, (t + 1) * size);
      crossRows(job.a, job.b, job.l, t * job.blockRows, Math.min(job.rows, (t + 1) * job.blockRows), part, job.symmetric);
      return;
    }
    case 'timesSmall':
      timesSmallRows(job.y, job.l, job.wt, job.c, job.upper, job.out, job.bounds[t], job.bounds[t + 1]);
      return;
  }
}

/** Claims and runs tasks until none is left; returns how many this thread ran. */
export function drainTasks(job: KernelJob, ctrl: Int32Array): number {
  const total = taskCount(job);
  let ran = 0;
  for (;;) {
    const t = Atomics.add(ctrl, CTRL_NEXT, 1);
    if (t >= total) return ran;
    runTask(job, t);
    Atomics.add(ctrl, CTRL_COMPLETED, 1);
    ran++;
  }
}
