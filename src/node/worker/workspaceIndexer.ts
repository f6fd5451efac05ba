/**
 * Scans and indexes every folder of a workspace into one index (keys from RootMap). Like
 * folderIndexer.ts for one folder: files whose size and modification time match the current
 * index reuse its term counts, the rest are read and tokenized, then the concept model is built.
 * Nothing is saved or swapped here; the caller does that once the build has finished, so a
 * cancelled or failed build leaves the current index as it was. Larger folders are tokenized and
 * decomposed on a pool of further threads (src/node/parallel) when its bundled script is present.
 */
import { performance } from 'node:perf_hooks';
import { CancelledError, EmptyCorpusError } from '../../core/errors.js';
import { IndexBuilder } from '../../core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { resolveSettings, type IndexSettings } from '../../core/index/model/settings.js';
import { Vocabulary } from '../../core/counting/termCounts.js';
import { countFilesInParallel } from '../parallel/parallelCount.js';
import { WorkerPool } from '../parallel/workerPool.js';
import { readIndexableText, scanFolder } from '../scan.js';
import type { Progress, WorkerConfig } from './workerProtocol.js';
import type { RootMap } from './rootMap.js';

export interface WorkspaceFile {
  readonly key: string;
  readonly absPath: string;
  readonly size: number;
  readonly mtimeMs: number;
}

export interface WorkspaceScan {
  readonly files: readonly WorkspaceFile[];
  /** Files left out as too large or unreadable by the scan. */
  readonly skipped: number;
}

/** Lists the indexable files of every folder. */
export async function scanWorkspace(roots: RootMap, config: WorkerConfig, signal?: AbortSignal): Promise<WorkspaceScan> {
  const files: WorkspaceFile[] = [];
  let skipped = 0;
  for (const root of roots.roots) {
    const scan = await scanFolder(
      root.path,
      {
        include: config.include,
        exclude: [...config.exclude, ...root.exclude],
        maxFileBytes: config.maxFileBytes,
        honourGitignore: config.honourGitignore,
      },
      signal,
    );
    const prefix = roots.prefixOf(root);
    for (const f of scan.files) files.push({ key: prefix + f.path, absPath: f.absPath, size: f.size, mtimeMs: f.mtimeMs });
    skipped += scan.skipped.filter((s) => s.reason === 'too-large' || s.reason === 'unreadable').length;
  }
  return { files, skipped };
}

export interface WorkspaceBuild {
  readonly index: LsiIndex;
  readonly read: number;
  readonly reused: number;
  readonly skipped: number;
  readonly seconds: number;
}

export interface WorkspaceBuildOptions {
  /** The index in use, whose unchanged files need not be read again. */
  readonly previous?: LsiIndex;
  readonly signal?: AbortSignal;
  /** Also polled during the synchronous SVD (see workerProtocol.ts, cancelFlag). */
  readonly isCancelled?: () => boolean;
  readonly onProgress?: (p: Progress) => void;
  /** Threads for tokenizing and the SVD, the worker's own included (false: none). @default all cores */
  readonly threads?: number | false;
}

/** Below this many files, starting threads costs more than it saves (the measurement behind folderIndexer.ts). */
const PARALLEL_MIN_FILES = 200;

export async function buildWorkspaceIndex(roots: RootMap, config: WorkerConfig, options: WorkspaceBuildOptions = {}): Promise<WorkspaceBuild> {
  const t0 = performance.now();
  const { signal, previous } = options;
  const progress = options.onProgress ?? (() => undefined);
  const cancelled = (): boolean => signal?.aborted === true || options.isCancelled?.() === true;
  const check = (): void => {
    if (cancelled()) throw new CancelledError();
  };
  const settings: IndexSettings = resolveSettings(config.settings);
  progress({ stage: 'scan', done: 0, total: 1 });
  const scan = await scanWorkspace(roots, config, signal);
  check();
  const sameTokens = previous !== undefined && JSON.stringify(previous.settings.tokenize) === JSON.stringify(settings.tokenize);
  const vocab = sameTokens ? previous.vocab : new Vocabulary();
  const builder = new IndexBuilder(settings, vocab);
  let read = 0;
  let reused = 0;
  let skipped = scan.skipped;
  const total = scan.files.length;
  const toRead: WorkspaceFile[] = [];
  for (const f of scan.files) {
    const old = sameTokens ? previous.meta(f.key) : undefined;
    if (old && old.size === f.size && old.mtimeMs === f.mtimeMs) {
      builder.addCounted({ path: f.key, size: f.size, mtimeMs: f.mtimeMs }, previous!.termsOf(f.key));
      reused++;
    } else toRead.push(f);
  }
  let pool: WorkerPool | undefined;
  const getPool = (): WorkerPool | undefined =>
    (pool ??= options.threads === false ? undefined : WorkerPool.start(options.threads === undefined ? {} : { threads: options.threads }));
  try {
    const parallel = toRead.length >= PARALLEL_MIN_FILES ? getPool() : undefined;
    if (parallel) {
      await countFilesInParallel(
        parallel,
        toRead.map((f) => ({ absPath: f.absPath, size: f.size })),
        vocab,
        { tokenize: settings.tokenize, maxFileBytes: config.maxFileBytes, signal, onProgress: (done) => progress({ stage: 'read', done: reused + done, total }) },
        (i, got) => {
          const f = toRead[i];
          if (got.kind === 'text') {
            builder.addCounted({ path: f.key, size: f.size, mtimeMs: f.mtimeMs }, got.terms);
            read++;
          } else skipped++;
        },
      );
    } else {
      for (let i = 0; i < toRead.length; i++) {
        const f = toRead[i];
        const got = await readIndexableText(f.absPath, config.maxFileBytes);
        if (got.kind === 'text') {
          builder.addText({ path: f.key, size: f.size, mtimeMs: f.mtimeMs }, got.text);
          read++;
        } else skipped++;
        if (i % 64 === 0) {
          check();
          progress({ stage: 'read', done: reused + i, total });
        }
      }
    }
    check();
    progress({ stage: 'read', done: total, total });
    if (builder.size === 0) throw new EmptyCorpusError('Nothing to index: no text files remain after the exclude settings.');
    const index = builder.build({
      signal: { get aborted() { return cancelled(); } },
      executor: builder.size >= PARALLEL_MIN_FILES ? getPool()?.executor() : undefined,
      onProgress: (stage, done, all) => progress({ stage: stage === 'weighting' ? 'matrix' : 'svd', done, total: all }),
    });
    check();
    return { index, read, reused, skipped, seconds: (performance.now() - t0) / 1000 };
  } finally {
    await pool?.close();
  }
}
