/**
 * Builds or refreshes the saved index of one folder: scan, reuse the term counts of files whose
 * size and modification time are unchanged, read and tokenize the rest, rebuild the concept model
 * when anything changed, and save atomically. A damaged or older saved index is rebuilt from the
 * files; on failure or cancel the previous saved index is left untouched.
 */
import { performance } from 'node:perf_hooks';
import { CancelledError, EmptyCorpusError } from '../core/errors.js';
import { IndexBuilder } from '../core/index/model/indexBuilder.js';
import type { DocMeta, LsiIndex } from '../core/index/lsiIndex.js';
import { modelSettingsKey, resolveSettings, type IndexSettings } from '../core/index/model/settings.js';
import { countTerms, Vocabulary } from '../core/counting/termCounts.js';
import { tokenize } from '../core/text/tokenize.js';
import { countFilesInParallel, type CountOutcome } from './parallel/parallelCount.js';
import { countFilesSorted } from './parallel/sortedCount.js';
import { WorkerPool, type PoolOptions } from './parallel/workerPool.js';
import { loadIndex, saveIndex } from './persist.js';
import { readIndexableText, scanFolder, type ScanOptions } from './scan.js';

export type IndexStage = 'load' | 'scan' | 'read' | 'matrix' | 'svd' | 'save';

/** Below this many files, starting worker threads costs more than it saves (our measurement). */
const PARALLEL_MIN_FILES = 200;

export interface IndexProgress {
  readonly stage: IndexStage;
  readonly done: number;
  readonly total: number;
}

export interface FolderIndexOptions {
  settings?: Partial<IndexSettings>;
  scan?: Partial<ScanOptions>;
  /** The index file to load and save. */
  indexFile: string;
  /** Rebuild even when nothing changed. */
  force?: boolean;
  onProgress?: (p: IndexProgress) => void;
  signal?: AbortSignal;
  /**
   * Worker threads for tokenizing and the SVD (false: work on this thread only). Without a
   * bundled worker script the work stays on this thread. @default {} (all available cores)
   */
  parallel?: PoolOptions | false;
}

export interface FolderIndexReport {
  readonly index: LsiIndex;
  /** 'fresh': no usable saved index; 'refreshed': rebuilt after changes; 'unchanged': loaded as is. */
  readonly outcome: 'fresh' | 'refreshed' | 'unchanged';
  /** Why a saved index could not be used, when it could not. */
  readonly savedIndexProblem?: string;
  readonly files: number;
  readonly reused: number;
  readonly read: number;
  readonly added: number;
  readonly changed: number;
  readonly removed: number;
  readonly bytesRead: number;
  readonly skipped: { readonly binary: number; readonly tooLarge: number; readonly unreadable: number; readonly other: number };
  readonly terms: number;
  readonly nonZeros: number;
  readonly k: number;
  readonly requestedK: number;
  readonly kClamped: boolean;
  readonly seconds: Record<IndexStage, number>;
  readonly totalSeconds: number;
}

export async function indexFolder(root: string, options: FolderIndexOptions): Promise<FolderIndexReport> {
  let pool: WorkerPool | undefined;
  const pools = {
    get: (): WorkerPool | undefined => (pool ??= options.parallel === false ? undefined : WorkerPool.start(options.parallel ?? {})),
    // Ending the tokenizing threads hands their word caches back before the SVD needs memory.
    release: async (): Promise<void> => {
      const p = pool;
      pool = undefined;
      await p?.close();
    },
  };
  try {
    return await indexWithPool(root, options, pools);
  } finally {
    await pools.release();
  }
}

async function indexWithPool(
  root: string,
  options: FolderIndexOptions,
  pools: { get: () => WorkerPool | undefined; release: () => Promise<void> },
): Promise<FolderIndexReport> {
  const t0 = performance.now();
  const seconds: Record<IndexStage, number> = { load: 0, scan: 0, read: 0, matrix: 0, svd: 0, save: 0 };
  let mark = performance.now();
  const lap = (stage: IndexStage): void => {
    const now = performance.now();
    seconds[stage] += (now - mark) / 1000;
    mark = now;
  };
  const progress = options.onProgress ?? (() => undefined);
  const settings = resolveSettings(options.settings);
  const check = (): void => {
    if (options.signal?.aborted) throw new CancelledError();
  };

  progress({ stage: 'load', done: 0, total: 1 });
  const loaded = options.force ? { status: 'missing' as const } : await loadIndex(options.indexFile);
  const previous = loaded.status === 'ok' ? loaded.index : undefined;
  const savedIndexProblem = loaded.status === 'damaged' ? loaded.reason : undefined;
  lap('load');
  check();

  progress({ stage: 'scan', done: 0, total: 1 });
  const scan = await scanFolder(root, options.scan, options.signal);
  lap('scan');
  const sameTokens = previous && JSON.stringify(previous.settings.tokenize) === JSON.stringify(settings.tokenize);
  const sameModel = previous && modelSettingsKey(previous.settings) === modelSettingsKey(settings);
  let vocab = sameTokens ? previous!.vocab : new Vocabulary();
  let builder = new IndexBuilder(settings, vocab);
  const skipped = { binary: 0, tooLarge: 0, unreadable: 0, other: 0 };
  for (const s of scan.skipped) {
    if (s.reason === 'too-large') skipped.tooLarge++;
    else if (s.reason === 'unreadable') skipped.unreadable++;
    else skipped.other++;
  }
  let reused = 0, read = 0, added = 0, changed = 0, bytesRead = 0;
  const maxBytes = options.scan?.maxFileBytes ?? 1_048_576;
  const toRead: typeof scan.files[number][] = [];
  for (const f of scan.files) {
    const old = sameTokens ? previous!.meta(f.path) : undefined;
    if (old && old.size === f.size && old.mtimeMs === f.mtimeMs) {
      builder.addCounted({ path: f.path, size: f.size, mtimeMs: f.mtimeMs }, previous!.termsOf(f.path));
      reused++;
    } else toRead.push(f);
  }
  const record = (f: (typeof toRead)[number], got: CountOutcome): void => {
    if (got.kind === 'text') {
      const meta: DocMeta = { path: f.path, size: f.size, mtimeMs: f.mtimeMs };
      builder.addCounted(meta, got.terms);
      bytesRead += f.size;
      read++;
      if (previous?.has(f.path)) changed++;
      else added++;
    } else if (got.kind === 'binary') skipped.binary++;
    else if (got.kind === 'too-large') skipped.tooLarge++;
    else skipped.unreadable++;
  };
  const total = scan.files.length;
  // Threads pay off only for more than a handful of files.
  const pool = toRead.length >= PARALLEL_MIN_FILES ? pools.get() : undefined;
  const countOptions = { tokenize: settings.tokenize, maxFileBytes: maxBytes, signal: options.signal, onProgress: (done: number) => progress({ stage: 'read', done: reused + done, total }) };
  if (pool && reused === 0 && vocab.size === 0) {
    // From scratch: counts come back over a vocabulary already in the builder's order.
    const counted = await countFilesSorted(pool, toRead.map((f) => ({ absPath: f.absPath, size: f.size })), countOptions);
    vocab = counted.vocab;
    builder = new IndexBuilder(settings, vocab);
    counted.outcomes.forEach((got, i) => record(toRead[i], got));
  } else if (pool) {
    await countFilesInParallel(
      pool,
      toRead.map((f) => ({ absPath: f.absPath, size: f.size })),
      vocab,
      countOptions,
      (i, got) => record(toRead[i], got),
    );
  } else {
    for (let i = 0; i < toRead.length; i++) {
      const f = toRead[i];
      const got = await readIndexableText(f.absPath, maxBytes);
      record(f, got.kind === 'text' ? { kind: 'text', terms: countTerms(tokenize(got.text, settings.tokenize), vocab, true) } : got);
      if (i % 256 === 0) {
        check();
        progress({ stage: 'read', done: reused + i, total });
      }
    }
  }
  check();
  progress({ stage: 'read', done: scan.files.length, total: scan.files.length });
  lap('read');
  const present = new Set(scan.files.map((f) => f.path));
  const removed = previous ? previous.paths().filter((p) => !present.has(p)).length : 0;
  if (builder.size === 0) throw new EmptyCorpusError(`Nothing indexable in ${scan.root}: no text files remain after excludes.`);

  const common = { files: builder.size, reused, read, added, changed, removed, bytesRead, skipped, savedIndexProblem };
  const unchanged = previous && sameModel && read === 0 && removed === 0 && previous.size === builder.size && !options.force && previous.staleness().changedFiles === 0;
  if (unchanged) {
    return report(previous!, 'unchanged', common, seconds, t0);
  }
  await pools.release();
  const buildPool = builder.size >= PARALLEL_MIN_FILES ? pools.get() : undefined;
  const index = builder.build({
    signal: options.signal,
    executor: buildPool?.executor(),
    onProgress: (stage, done, total) => {
      if (stage === 'weighting' && done === 1) lap('matrix');
      progress({ stage: stage === 'weighting' ? 'matrix' : 'svd', done, total });
    },
  });
  lap('svd');
  // The threads (and the shared memory of the SVD) are not needed to save.
  await pools.release();
  check();
  progress({ stage: 'save', done: 0, total: 1 });
  await saveIndex(options.indexFile, index);
  lap('save');
  return report(index, previous ? 'refreshed' : 'fresh', common, seconds, t0);
}

function report(
  index: LsiIndex,
  outcome: FolderIndexReport['outcome'],
  common: Omit<FolderIndexReport, 'index' | 'outcome' | 'terms' | 'nonZeros' | 'k' | 'requestedK' | 'kClamped' | 'seconds' | 'totalSeconds'>,
  seconds: Record<IndexStage, number>,
  t0: number,
): FolderIndexReport {
  return {
    ...common,
    index,
    outcome,
    terms: index.model.keptIds.length,
    nonZeros: index.model.nonZeros,
    k: index.k,
    requestedK: index.model.kChoice.requested,
    kClamped: index.model.kChoice.clamped,
    seconds,
    totalSeconds: (performance.now() - t0) / 1000,
  };
}
