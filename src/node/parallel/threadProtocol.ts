/** Messages between the main thread and the parallel worker threads (parallelWorker.ts). */
import type { TokenizeOptions } from '../../core/text/tokenize.js';
import type { KernelJob } from './kernelTasks.js';
import type { Language } from '../../core/text/languages.js';
import type { ThreadSections } from './threadSections.js';

export interface KernelMessage {
  readonly type: 'kernel';
  readonly job: KernelJob;
  readonly ctrl: Int32Array;
}

export interface TokenizeSetup {
  readonly type: 'setup';
  readonly tokenize: Partial<TokenizeOptions>;
  readonly maxFileBytes: number;
  /** Keep each file's counts in the thread until 'finish-counts' (countFilesSorted). */
  readonly keepCounts?: boolean;
  /** Also cut each file counted in English into sections and keep their counts (with keepCounts; threadSections.ts). */
  readonly sections?: boolean;
}

export interface TokenizeBatch {
  readonly type: 'tokenize';
  readonly batch: number;
  /** key: the file's index key, which picks how it is cut into sections (setup's sections). */
  readonly files: readonly { readonly index: number; readonly absPath: string; readonly key?: string }[];
}

/** Instantiates the kernel module on the shared memory (sent before any kernel message). */
export interface WasmInit {
  readonly type: 'wasm-init';
  readonly module: WebAssembly.Module;
  readonly memory: WebAssembly.Memory;
}

/** Asks for the worker's terms in sorted order (after its last batch; the worker then counts no more until setup). */
export interface SortTerms {
  readonly type: 'sort-terms';
}

/** Final term ids: the thread replies with every kept file's counts over them. */
export interface FinishCounts {
  readonly type: 'finish-counts';
  /** The final id of each of the thread's terms, in the order of its term-order reply. */
  readonly translate: Int32Array;
}

export type ToWorker = KernelMessage | WasmInit | TokenizeSetup | TokenizeBatch | SortTerms | FinishCounts;

/** The outcome of one file; ids are the worker's local term ids (see WordCounter). */
export type FileOutcome =
  | {
      readonly index: number;
      readonly kind: 'text';
      readonly ids: Int32Array;
      readonly counts: Int32Array;
      readonly length: number;
      /** The file's language when not English. */
      readonly language?: Language;
    }
  /** Counts kept in the thread (keepCounts): positions [at, at + terms) of its final-counts reply. */
  | {
      readonly index: number;
      readonly kind: 'kept';
      readonly at: number;
      readonly terms: number;
      readonly length: number;
      readonly language?: Language;
      /** The file's sections, their counts kept beside the file's (absent: not counted here). */
      readonly sections?: ThreadSections;
    }
  | { readonly index: number; readonly kind: 'binary' | 'too-large' | 'unreadable' };

export interface BatchDone {
  readonly type: 'batch';
  readonly batch: number;
  /** Terms new to this worker since its previous reply, in local id order (none with keepCounts: see TermOrder). */
  readonly newTerms: readonly string[];
  readonly files: readonly FileOutcome[];
}

export interface WorkerFailure {
  readonly type: 'error';
  readonly message: string;
}

/** Every term of the worker, ascending in UTF-16 code unit order, as code units (TermUnits). */
export interface TermOrder {
  readonly type: 'term-order';
  readonly units: Uint16Array;
  readonly starts: Int32Array;
}

/** Every kept file's counts, each file's run sorted by final term id. */
export interface FinalCounts {
  readonly type: 'final-counts';
  readonly termIds: Int32Array;
  readonly counts: Float32Array;
  /** Every kept section's counts (the positions of ThreadSections.offsets), each run sorted by final term id. */
  readonly sectionTermIds: Int32Array;
  readonly sectionCounts: Float32Array;
}

export type FromWorker = BatchDone | WorkerFailure | TermOrder | FinalCounts;
