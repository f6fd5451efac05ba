/**
 * Reads and counts the terms of many files on the pool's worker threads. Files go out in batches
 * (a few in flight per worker, so no thread waits for the next); each worker counts against its
 * own vocabulary and sends its new terms in id order with each reply, so ids are translated to
 * the caller's Vocabulary here. The terms of a file do not depend on which worker read it, and
 * IndexBuilder renumbers the vocabulary by term before building, so the index is the same
 * whatever the timing.
 */
import { CancelledError } from '../../core/errors.js';
import type { DocTerms, Vocabulary } from '../../core/counting/termCounts.js';
import type { TokenizeOptions } from '../../core/text/tokenize.js';
import type { Language } from '../../core/text/languages.js';
import type { CountedSections } from '../../core/sections/sectionVectors.js';
import type { BatchDone, FromWorker, ToWorker } from './threadProtocol.js';
import type { WorkerPool } from './workerPool.js';
import { SECTION_COUNT_BIG } from './wordCounter.js';

export interface CountJob {
  readonly absPath: string;
  /** Size from the scan, to make batches of similar weight. */
  readonly size: number;
  /** The file's index key (needed to cut it into sections: CountOptions.sections). */
  readonly key?: string;
}

export type CountOutcome =
  | {
      readonly kind: 'text';
      readonly terms: DocTerms;
      /** The file's language when not English. */
      readonly language?: Language;
      /** The file's sections counted with it (countFilesSorted with sections), over the same ids. */
      readonly sections?: CountedSections;
    }
  | { readonly kind: 'binary' | 'too-large' | 'unreadable' };

export interface CountOptions {
  readonly tokenize: Partial<TokenizeOptions>;
  readonly maxFileBytes: number;
  readonly signal?: AbortSignal;
  /** Called with the number of files done so far. */
  readonly onProgress?: (done: number) => void;
  /** Threads keep the counts until asked for them (countFilesSorted). */
  readonly keepCounts?: boolean;
  /** Count each file's sections on the threads too (countFilesSorted only; jobs need their key). */
  readonly sections?: boolean;
  /**
   * countFilesSorted ends the pool's threads as soon as their counts are in: they hold nothing a
   * build needs any more, and their word tables, vocabularies and heaps (on the Linux tree about
   * as much memory as all the counts) would otherwise stay until the pool is closed.
   */
  readonly endThreads?: boolean;
  /** Called as countFilesSorted passes each of its steps (for the memory benchmark, bench/countMemory.ts). */
  readonly onStep?: (step: 'read' | 'merged' | 'finished') => void;
}

const BATCH_FILES = 48;
const BATCH_BYTES = 512 * 1024;
const IN_FLIGHT_PER_WORKER = 3;

/** Calls onFile(index, outcome) once per job, in completion order. */
export async function countFilesInParallel(
  pool: WorkerPool,
  jobs: readonly CountJob[],
  vocab: Vocabulary,
  options: CountOptions,
  onFile: (index: number, outcome: CountOutcome) => void,
): Promise<void> {
  const translate = pool.workers.map(() => new Int32Array(0));
  const known = pool.workers.map(() => 0);
  await runCountBatches(pool, jobs, options, (w, msg) => {
    // Translate the worker's new local ids to the caller's vocabulary.
    if (msg.newTerms.length > 0) {
      const need = known[w] + msg.newTerms.length;
      if (need > translate[w].length) {
        // Geometric growth: copying on every batch would be quadratic in the vocabulary.
        const grown = new Int32Array(Math.max(need, translate[w].length * 2, 1024));
        grown.set(translate[w].subarray(0, known[w]));
        translate[w] = grown;
      }
      const tr = translate[w];
      msg.newTerms.forEach((t, i) => (tr[known[w] + i] = vocab.add(t)));
      known[w] = need;
    }
    const tr = translate[w];
    for (const f of msg.files) {
      if (f.kind === 'kept') throw new Error('a tokenizing thread kept counts it was asked to send');
      if (f.kind !== 'text') onFile(f.index, { kind: f.kind });
      else {
        const terms = toDocTerms(f.ids, f.counts, f.length, tr);
        onFile(f.index, f.language === undefined ? { kind: 'text', terms } : { kind: 'text', terms, language: f.language });
      }
    }
  });
}

/**
 * Sends the jobs out in batches and calls onBatch(worker, reply) for each reply, in the order
 * each worker sent them. Resolves when every batch has come back.
 */
export function runCountBatches(
  pool: WorkerPool,
  jobs: readonly CountJob[],
  options: CountOptions,
  onBatch: (w: number, msg: BatchDone) => void,
): Promise<void> {
  const batches: number[][] = [];
  let current: number[] = [];
  let bytes = 0;
  jobs.forEach((j, i) => {
    current.push(i);
    bytes += j.size;
    if (current.length >= BATCH_FILES || bytes >= BATCH_BYTES) {
      batches.push(current);
      current = [];
      bytes = 0;
    }
  });
  if (current.length > 0) batches.push(current);
  const workers = pool.workers;
  const queue = new BatchQueue(batches.length, workers.length);
  let pending = 0;
  let done = 0;

  return new Promise<void>((resolve, reject) => {
    let failed = false;
    const cleanup = (): void => {
      workers.forEach((w) => {
        w.off('message', handlers.get(w)!);
        w.off('error', onError);
      });
    };
    const fail = (err: Error): void => {
      if (failed) return;
      failed = true;
      cleanup();
      reject(err);
    };
    const onError = (err: Error): void => fail(err);
    const send = (w: number): void => {
      const b = queue.next(w);
      if (b < 0) return;
      const msg: ToWorker = {
        type: 'tokenize',
        batch: b,
        files: batches[b].map((index) => ({ index, absPath: jobs[index].absPath, key: jobs[index].key })),
      };
      workers[w].postMessage(msg);
      pending++;
    };
    const handlers = new Map(
      workers.map((worker, w) => [
        worker,
        (msg: FromWorker): void => {
          if (failed) return;
          if (msg.type === 'error') return fail(new Error(`a tokenizing thread failed: ${msg.message}`));
          if (msg.type !== 'batch') return;
          pending--;
          try {
            onBatch(w, msg);
          } catch (err) {
            return fail(err as Error);
          }
          done += msg.files.length;
          options.onProgress?.(done);
          if (options.signal?.aborted) return fail(new CancelledError());
          send(w);
          if (pending === 0 && queue.empty) {
            cleanup();
            resolve();
          }
        },
      ]),
    );
    workers.forEach((worker) => {
      worker.on('message', handlers.get(worker)!);
      worker.on('error', onError);
      const setup: ToWorker = {
        type: 'setup',
        tokenize: options.tokenize,
        maxFileBytes: options.maxFileBytes,
        keepCounts: options.keepCounts,
        sections: options.keepCounts === true && options.sections === true,
      };
      worker.postMessage(setup);
    });
    for (let r = 0; r < IN_FLIGHT_PER_WORKER; r++) workers.forEach((_, w) => send(w));
    if (pending === 0) {
      cleanup();
      resolve();
    }
  });
}

/**
 * Hands out batches 0..count-1: each worker takes its own contiguous share front to back (files
 * that sit together in the tree share words, so each thread meets fewer new words than with
 * interleaved batches); a worker whose share is done takes from the back of the largest share
 * left, so all finish together.
 */
export class BatchQueue {
  private readonly front: Int32Array;
  private readonly back: Int32Array;
  private left: number;

  constructor(count: number, workers: number) {
    this.front = Int32Array.from({ length: workers }, (_, w) => Math.floor((w * count) / workers));
    this.back = Int32Array.from({ length: workers }, (_, w) => Math.floor(((w + 1) * count) / workers));
    this.left = count;
  }

  get empty(): boolean {
    return this.left === 0;
  }

  /** The next batch for worker w, or -1 when none is left. */
  next(w: number): number {
    if (this.left === 0) return -1;
    this.left--;
    if (this.front[w] < this.back[w]) return this.front[w]++;
    let most = 0;
    for (let v = 1; v < this.front.length; v++) if (this.back[v] - this.front[v] > this.back[most] - this.front[most]) most = v;
    return --this.back[most];
  }
}

/** Local (ids, counts) to DocTerms over the caller's ids, sorted ascending. */
export function toDocTerms(ids: Int32Array, counts: Int32Array, length: number, tr: Int32Array): DocTerms {
  const termIds = new Int32Array(ids.length);
  const out = new Float32Array(ids.length);
  translateRun(ids, counts, 0, ids.length, tr, termIds, out);
  return { termIds, counts: out, length };
}

const SHIFT = 2 ** 21;
/** Runs of at most this many terms are sorted by insertion (translateRun). */
const SHORT_RUN = 24;
let keys = new Float64Array(1024);
/** A run's counts, copied aside when they are translated in place. */
let runCounts = new Int32Array(1024);

/**
 * Translates ids[from, to) (local ids) by tr and writes them, sorted ascending, with their counts
 * to termIds / out at the same positions. termIds may be ids itself, and out a Float32Array over
 * the buffer of counts (in place: no second pair of arrays the size of the pack).
 */
export function translateRun(
  ids: Int32Array,
  counts: Int32Array,
  from: number,
  to: number,
  tr: Int32Array,
  termIds: Int32Array,
  out: Float32Array,
): void {
  sortRunKeys(ids, from, to, tr);
  const n = to - from;
  const k = keys;
  // Writing out in place overwrites counts still to be read: read them from a copy.
  let src = counts;
  let base = from;
  if (out.buffer === counts.buffer) {
    if (n > runCounts.length) runCounts = new Int32Array(Math.max(n, runCounts.length * 2));
    runCounts.set(counts.subarray(from, to));
    src = runCounts;
    base = 0;
  }
  for (let j = 0; j < n; j++) {
    const id = Math.floor(k[j] / SHIFT);
    termIds[from + j] = id;
    out[from + j] = src[base + k[j] - id * SHIFT];
  }
}

/**
 * translateRun of counts held as bytes, `big` the exact count at each position holding
 * SECTION_COUNT_BIG (WordCounter's section pack); out is a separate array.
 */
export function translateSmallRun(
  ids: Int32Array,
  counts: Uint8Array,
  big: ReadonlyMap<number, number>,
  from: number,
  to: number,
  tr: Int32Array,
  termIds: Int32Array,
  out: Float32Array,
): void {
  sortRunKeys(ids, from, to, tr);
  const n = to - from;
  const k = keys;
  for (let j = 0; j < n; j++) {
    const id = Math.floor(k[j] / SHIFT);
    const at = from + k[j] - id * SHIFT;
    const c = counts[at];
    termIds[from + j] = id;
    out[from + j] = c === SECTION_COUNT_BIG ? big.get(at)! : c;
  }
}

/** A run's byte counts, copied aside while rankSmallRun puts them in rank order. */
let runBytes = new Uint8Array(1024);

/**
 * The first half of translateSmallRun, done before the final ids are known: ids[from, to)
 * become their ranks (rank[id]: the term's place in the thread's own sorted order) in ascending
 * order, in place, their byte counts moved along (and `big`'s keys with them). A tokenizing thread
 * does this while the main thread merges the threads' sorted terms, when it would otherwise wait;
 * the final ids then map the ranks in increasing order (the merge keeps each thread's order), so
 * mapRankedRun gives each run sorted with no sort left, the same arrays as translateSmallRun.
 */
export function rankSmallRun(
  ids: Int32Array,
  counts: Uint8Array,
  big: Map<number, number>,
  from: number,
  to: number,
  rank: Int32Array,
): void {
  sortRunKeys(ids, from, to, rank);
  const n = to - from;
  if (n > runBytes.length) runBytes = new Uint8Array(Math.max(n, runBytes.length * 2));
  runBytes.set(counts.subarray(from, to));
  const k = keys;
  let moved: number[] | undefined;
  for (let j = 0; j < n; j++) {
    const r = Math.floor(k[j] / SHIFT);
    const i = k[j] - r * SHIFT;
    const c = runBytes[i];
    ids[from + j] = r;
    counts[from + j] = c;
    if (c === SECTION_COUNT_BIG) (moved ??= []).push(from + j, big.get(from + i)!);
  }
  if (!moved) return;
  // The large counts' keys are the run's positions: all old ones go before any new one is set.
  for (let i = 0; i < n; i++) if (runBytes[i] === SECTION_COUNT_BIG) big.delete(from + i);
  for (let m = 0; m < moved.length; m += 2) big.set(moved[m], moved[m + 1]);
}

/**
 * translateSmallRun of a run rankSmallRun has put in rank order: byRank (strictly increasing) gives
 * each rank's final id; each entry stays where it is.
 */
export function mapRankedRun(
  ids: Int32Array,
  counts: Uint8Array,
  big: ReadonlyMap<number, number>,
  from: number,
  to: number,
  byRank: Int32Array,
  termIds: Int32Array,
  out: Float32Array,
): void {
  for (let i = from; i < to; i++) {
    termIds[i] = byRank[ids[i]];
    const c = counts[i];
    out[i] = c === SECTION_COUNT_BIG ? big.get(i)! : c;
  }
}

/** Fills keys[0, to − from) with (new id, position) of ids[from, to), ascending. */
function sortRunKeys(ids: Int32Array, from: number, to: number, tr: Int32Array): void {
  const n = to - from;
  if (n > keys.length) keys = new Float64Array(Math.max(n, keys.length * 2));
  // Keys pack (new id, position): a file has fewer than 2^21 distinct terms (it is at most a few MB).
  const k = keys;
  for (let i = 0; i < n; i++) k[i] = tr[ids[from + i]] * SHIFT + i;
  // The keys are distinct, so any sort gives the same order: a short run (most sections, many
  // files) by insertion in place, cheaper than a native sort's call and a subarray per run.
  if (n > SHORT_RUN) k.subarray(0, n).sort();
  else
    for (let i = 1; i < n; i++) {
      const x = k[i];
      let j = i - 1;
      while (j >= 0 && k[j] > x) {
        k[j + 1] = k[j];
        j--;
      }
      k[j + 1] = x;
    }
}
