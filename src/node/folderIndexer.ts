/**
 * Builds or refreshes the saved index of one folder: scan, reuse the term counts of files whose
 * size and modification time are unchanged, read and tokenize the rest, rebuild the concept model
 * when anything changed, and save atomically. A damaged or older saved index is rebuilt from the
 * files; on failure or cancel the previous saved index is left untouched.
 */
import { performance } from 'node:perf_hooks';
import { CancelledError, EmptyCorpusError } from '../core/errors.js';
import { IndexBuilder } from '../core/index/indexBuilder.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import { modelSettingsKey, resolveSettings, type IndexSettings } from '../core/index/settings.js';
import { loadIndex, saveIndex } from './persist.js';
import { readIndexableText, scanFolder, type ScanOptions } from './scan.js';

export type IndexStage = 'load' | 'scan' | 'read' | 'matrix' | 'svd' | 'save';

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
  const builder = new IndexBuilder(settings, sameTokens ? previous!.vocab : undefined);
  const skipped = { binary: 0, tooLarge: 0, unreadable: 0, other: 0 };
  for (const s of scan.skipped) {
    if (s.reason === 'too-large') skipped.tooLarge++;
    else if (s.reason === 'unreadable') skipped.unreadable++;
    else skipped.other++;
  }
  let reused = 0, read = 0, added = 0, changed = 0, bytesRead = 0;
  const maxBytes = options.scan?.maxFileBytes ?? 1_048_576;
  for (let i = 0; i < scan.files.length; i++) {
    const f = scan.files[i];
    const meta = { path: f.path, size: f.size, mtimeMs: f.mtimeMs };
    const old = sameTokens ? previous!.meta(f.path) : undefined;
    if (old && old.size === f.size && old.mtimeMs === f.mtimeMs) {
      builder.addCounted(meta, previous!.termsOf(f.path));
      reused++;
    } else {
      const got = await readIndexableText(f.absPath, maxBytes);
      if (got.kind === 'text') {
        builder.addText(meta, got.text);
        bytesRead += f.size;
        read++;
        if (previous?.has(f.path)) changed++;
        else added++;
      } else if (got.kind === 'binary') skipped.binary++;
      else if (got.kind === 'too-large') skipped.tooLarge++;
      else skipped.unreadable++;
    }
    if (i % 256 === 0) {
      check();
      progress({ stage: 'read', done: i, total: scan.files.length });
    }
  }
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
  const index = builder.build({
    signal: options.signal,
    onProgress: (stage, done, total) => {
      if (stage === 'weighting' && done === 1) lap('matrix');
      progress({ stage: stage === 'weighting' ? 'matrix' : 'svd', done, total });
    },
  });
  lap('svd');
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
