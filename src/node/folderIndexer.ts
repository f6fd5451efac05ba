/**
 * Builds or refreshes the saved index of one folder (the command line's adapter over
 * indexPipeline.ts): load the saved index, run the pipeline over the folder's files (keys are the
 * folder-relative paths), and save atomically when anything changed. A damaged or older saved
 * index is rebuilt from the files; on failure or cancel the previous saved index is left untouched.
 */
import { existsSync } from 'node:fs';
import { rmdir } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { CancelledError } from '../core/errors.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import { resolveSettings, type IndexSettings } from '../core/index/model/settings.js';
import { runIndexPipeline, tallySkipped, type PipelineResult, type PipelineStage } from './indexPipeline.js';
import type { PoolOptions } from './parallel/workerPool.js';
import { sharedModelSetting } from './conceptModelFile.js';
import { ensureFolder, loadIndex, trySaveIndex } from './persist.js';
import { openSpillBeside } from './sectionCodeFile.js';
import { DEFAULT_SCAN_OPTIONS, gitignoreHint, scanFolder, type ScanOptions, type SkippedPath } from './scan.js';

export type IndexStage = 'load' | PipelineStage;

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
  /**
   * A shared concept model file to fold the files into instead of a local SVD (a path), null for
   * a local SVD, undefined to keep what the saved index used.
   */
  sharedModel?: string | null;
  /** Fold each file's sections into the model (src/core/sections). @default true */
  sections?: boolean;
}

export interface FolderIndexReport {
  readonly index: LsiIndex;
  /** 'fresh': no usable saved index; 'refreshed': rebuilt after changes; 'unchanged': loaded as is. */
  readonly outcome: 'fresh' | 'refreshed' | 'unchanged';
  /** Why a saved index could not be used, when it could not. */
  readonly savedIndexProblem?: string;
  /** Why the new index could not be saved (it is still returned, in memory), when it could not. */
  readonly saveProblem?: string;
  /** What the scan left out and why (links outside the folder, special files, bad names, …). */
  readonly scanSkipped: readonly SkippedPath[];
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
  /** CPU seconds (user + system, all threads) of the pipeline's stages. */
  readonly cpuSeconds: PipelineResult['cpuSeconds'];
  readonly totalSeconds: number;
}

/** Indexes one folder: its saved index is loaded first and the result saved in its place. */
export async function indexFolder(root: string, options: FolderIndexOptions): Promise<FolderIndexReport> {
  const t0 = performance.now();
  const progress = options.onProgress ?? (() => undefined);
  progress({ stage: 'load', done: 0, total: 1 });
  const loaded = options.force ? { status: 'missing' as const } : await loadIndex(options.indexFile);
  const previous = loaded.status === 'ok' ? loaded.index : undefined;
  const savedIndexProblem = loaded.status === 'damaged' ? loaded.reason : undefined;
  const loadSeconds = (performance.now() - t0) / 1000;
  if (options.signal?.aborted) throw new CancelledError();

  const sharedPath = options.sharedModel === undefined ? previous?.settings.sharedModel?.path : (options.sharedModel ?? undefined);
  const settings = resolveSettings(options.settings);
  if (sharedPath) settings.sharedModel = sharedModelSetting(sharedPath);
  let scanSkipped: readonly SkippedPath[] = [];
  let gitIgnored = 0;
  let saveProblem: string | undefined;
  // The index's folder first, so a large build's scratch files can live beside the index (on its
  // disk); where it cannot be made they stay in memory, and the save reports why. A folder made
  // here is removed again when the run ends without an index in it (failure, cancel, no save).
  const folder = dirname(resolve(options.indexFile));
  const madeFolder = !existsSync(folder);
  const scratch = await ensureFolder(folder).then(
    () => openSpillBeside(folder, "the build's scratch file"),
    () => undefined,
  );
  const result = await runIndexPipeline({
    settings,
    scan: async () => {
      const scan = await scanFolder(root, options.scan, options.signal);
      scanSkipped = scan.skipped;
      gitIgnored = scan.gitIgnored;
      return {
        files: scan.files.map((f) => ({ key: f.path, absPath: f.absPath, size: f.size, mtimeMs: f.mtimeMs })),
        skipped: tallySkipped(scan.skipped),
      };
    },
    maxFileBytes: options.scan?.maxFileBytes ?? DEFAULT_SCAN_OPTIONS.maxFileBytes,
    previous,
    keepUnchanged: !options.force,
    save: async (index, termLists) => {
      saveProblem = await trySaveIndex(options.indexFile, index, termLists);
    },
    emptyMessage: () =>
      `Nothing indexable in ${resolve(root)}: no text files remain after excludes.${gitignoreHint(gitIgnored, '--no-gitignore')}`,
    signal: options.signal,
    onProgress: progress,
    threads: options.parallel ?? {},
    sections: options.sections,
    scratch,
    // A command line process: after the save the raw counts come back only for a command that reads them.
    countsOnUse: true,
  }).finally(async () => {
    if (madeFolder && !existsSync(options.indexFile)) await rmdir(folder).catch(() => undefined);
  });
  const outcome = result.unchanged ? 'unchanged' : previous ? 'refreshed' : 'fresh';
  return { ...report(result, outcome, savedIndexProblem, { load: loadSeconds, ...result.seconds }, t0), saveProblem, scanSkipped };
}

function report(
  r: PipelineResult,
  outcome: FolderIndexReport['outcome'],
  savedIndexProblem: string | undefined,
  seconds: Record<IndexStage, number>,
  t0: number,
): Omit<FolderIndexReport, 'saveProblem' | 'scanSkipped'> {
  const { index } = r;
  return {
    index,
    outcome,
    savedIndexProblem,
    files: r.files,
    reused: r.reused,
    read: r.read,
    added: r.added,
    changed: r.changed,
    removed: r.removed,
    bytesRead: r.bytesRead,
    skipped: r.skipped,
    terms: index.model.keptIds.length,
    nonZeros: index.model.nonZeros,
    k: index.k,
    requestedK: index.model.kChoice.requested,
    kClamped: index.model.kChoice.clamped,
    seconds,
    cpuSeconds: r.cpuSeconds,
    totalSeconds: (performance.now() - t0) / 1000,
  };
}
