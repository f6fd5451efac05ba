/** Messages between the main thread and the parallel worker threads (parallelWorker.ts). */
import type { TokenizeOptions } from '../../core/text/tokenize.js';
import type { KernelJob } from './kernelTasks.js';

export interface KernelMessage {
  readonly type: 'kernel';
  readonly job: KernelJob;
  readonly ctrl: Int32Array;
}

export interface TokenizeSetup {
  readonly type: 'setup';
  readonly tokenize: Partial<TokenizeOptions>;
  readonly maxFileBytes: number;
}

export interface TokenizeBatch {
  readonly type: 'tokenize';
  readonly batch: number;
  readonly files: readonly { readonly index: number; readonly absPath: string }[];
}

/** Instantiates the kernel module on the shared memory (sent before any kernel message). */
export interface WasmInit {
  readonly type: 'wasm-init';
  readonly module: WebAssembly.Module;
  readonly memory: WebAssembly.Memory;
}

/** Asks for the worker's terms in sorted order (after its last batch). */
export interface SortTerms {
  readonly type: 'sort-terms';
}

export type ToWorker = KernelMessage | WasmInit | TokenizeSetup | TokenizeBatch | SortTerms;

/** The outcome of one file; ids are the worker's local term ids (see WordCounter). */
export type FileOutcome =
  | { readonly index: number; readonly kind: 'text'; readonly ids: Int32Array; readonly counts: Int32Array; readonly length: number }
  | { readonly index: number; readonly kind: 'binary' | 'too-large' | 'unreadable' };

export interface BatchDone {
  readonly type: 'batch';
  readonly batch: number;
  /** Terms new to this worker since its previous reply, in local id order. */
  readonly newTerms: readonly string[];
  readonly files: readonly FileOutcome[];
}

export interface WorkerFailure {
  readonly type: 'error';
  readonly message: string;
}

/** The worker's local term ids ordered by term (UTF-16 code unit order). */
export interface TermOrder {
  readonly type: 'term-order';
  readonly order: Int32Array;
}

export type FromWorker = BatchDone | WorkerFailure | TermOrder;
