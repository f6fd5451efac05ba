/**
 * A small pool of parallel worker threads (Node's worker_threads docs advise a pool over one
 * thread per task) for one indexing run: tokenizing files, then the SVD's matrix products.
 * Thread count defaults to the machine's available parallelism. The worker script is the bundled
 * dist/parallelWorker.js next to the running bundle, or UNDERTONE_PARALLEL_WORKER; without one
 * (for example when running from TypeScript sources) callers fall back to working serially.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { serialExecutor, type MatrixExecutor } from '../../core/matrix/executor.js';
import { kernelModule, WasmArena } from '../../core/matrix/wasm/wasmArena.js';
import type { ToWorker } from './threadProtocol.js';
import { ThreadExecutor } from './threadExecutor.js';

export interface PoolOptions {
  /** Threads to use in all, the calling thread included. @default os.availableParallelism() */
  threads?: number;
  /** Path of the bundled worker script. @default defaultWorkerScript() */
  workerScript?: string;
}

/** The bundled worker script, when it can be found. */
export function defaultWorkerScript(): string | undefined {
  const fromEnv = process.env.UNDERTONE_PARALLEL_WORKER;
  if (fromEnv) return existsSync(fromEnv) ? fromEnv : undefined;
  // In a CommonJS bundle (dist/*.js) __dirname is the bundle's folder.
  const here = typeof __dirname === 'string' ? __dirname : undefined;
  if (!here) return undefined;
  const candidate = join(here, 'parallelWorker.js');
  return existsSync(candidate) ? candidate : undefined;
}

/**
 * Young generation of each worker's heap, in MB (Node's resourceLimits.maxYoungGenerationSizeMb).
 * A tokenizing thread makes many short-lived strings and arrays; with V8's default (up to 48 MB
 * on 64-bit systems) each thread's nursery grows to its largest and stays resident, about 25 MB
 * more per thread at the end of counting on the kernel's Documentation folder (bench/countMemory.ts:
 * peak 285 MB against 233 MB with 12, 8 or 6 MB), with no more CPU time (bench/countCpu.ts).
 */
const YOUNG_GENERATION_MB = 12;

export class WorkerPool {
  private constructor(
    readonly workers: readonly Worker[],
    readonly threads: number,
  ) {}

  /**
   * Starts a pool, or returns undefined when one thread is all there is or no worker script exists.
   * `forProducts`: only the threads − 1 workers executor() uses (the calling thread is the last
   * one), not one per thread as tokenizing needs: an idle worker holds its own heap (about 25 MB).
   */
  static start(options: PoolOptions = {}, forProducts = false): WorkerPool | undefined {
    const threads = Math.max(1, Math.floor(options.threads ?? availableParallelism()));
    const script = options.workerScript ?? defaultWorkerScript();
    if (threads < 2 || !script) return undefined;
    const workers: Worker[] = [];
    for (let i = 0; i < (forProducts ? threads - 1 : threads); i++) {
      const w = new Worker(script, { name: `undertone-parallel-${i}`, resourceLimits: { maxYoungGenerationSizeMb: YOUNG_GENERATION_MB } });
      w.unref();
      workers.push(w);
    }
    return new WorkerPool(workers, threads);
  }

  /**
   * An executor using threads − 1 workers plus the calling thread, on a fresh shared memory
   * (serialExecutor where WebAssembly SIMD is unavailable).
   */
  executor(): MatrixExecutor {
    const module = kernelModule();
    if (!module) return serialExecutor;
    const arena = new WasmArena();
    const helpers = this.workers.slice(0, this.threads - 1);
    const init: ToWorker = { type: 'wasm-init', module, memory: arena.memory };
    for (const w of helpers) w.postMessage(init);
    return new ThreadExecutor(module, arena, helpers);
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
