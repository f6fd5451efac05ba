/** Shared option parsing for every command: index settings, scan options and the cache folder. */
import { resolve } from 'node:path';
import { InvalidInputError } from '../core/errors.js';
import type { IndexSettings } from '../core/index/model/settings.js';
import { WEIGHTING_SCHEMES, type WeightingScheme } from '../core/weighting/termWeighting.js';
import { defaultCacheBase, indexFileFor } from '../node/cacheDir.js';
import { indexFolder, type FolderIndexReport } from '../node/folderIndexer.js';
import type { ScanOptions } from '../node/scan.js';
import { formatBytes, formatCount, progressBar, type Io } from './output.js';

export type Flags = Record<string, string | boolean | string[] | undefined>;

/** Option definitions every command accepts (node:util parseArgs format). */
export const COMMON_OPTIONS = {
  k: { type: 'string' },
  weighting: { type: 'string' },
  top: { type: 'string' },
  json: { type: 'boolean' },
  'cache-dir': { type: 'string' },
  'max-file-size': { type: 'string' },
  'no-gitignore': { type: 'boolean' },
  exclude: { type: 'string', multiple: true },
  include: { type: 'string', multiple: true },
  seed: { type: 'string' },
  quiet: { type: 'boolean', short: 'q' },
} as const;

export function positiveInt(value: unknown, name: string): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 1) throw new InvalidInputError(`--${name} needs a positive whole number, got "${String(value)}"`);
  return n;
}

export function settingsFrom(flags: Flags): Partial<IndexSettings> {
  const s: { -readonly [K in keyof IndexSettings]?: IndexSettings[K] } = {};
  if (flags.k !== undefined) s.k = flags.k === 'auto' ? 'auto' : positiveInt(flags.k, 'k');
  if (flags.weighting !== undefined) {
    if (!WEIGHTING_SCHEMES.includes(flags.weighting as WeightingScheme)) {
      throw new InvalidInputError(`--weighting must be one of ${WEIGHTING_SCHEMES.join(', ')}, got "${String(flags.weighting)}"`);
    }
    s.weighting = flags.weighting as WeightingScheme;
  }
  if (flags.seed !== undefined) s.seed = positiveInt(flags.seed, 'seed');
  return s;
}

export function scanFrom(flags: Flags): Partial<ScanOptions> {
  const s: { -readonly [K in keyof ScanOptions]?: ScanOptions[K] } = {};
  const max = positiveInt(flags['max-file-size'], 'max-file-size');
  if (max !== undefined) s.maxFileBytes = max;
  if (flags['no-gitignore']) s.honourGitignore = false;
  if (Array.isArray(flags.exclude)) s.exclude = flags.exclude;
  if (Array.isArray(flags.include)) s.include = flags.include;
  return s;
}

export function indexFileFrom(folder: string, flags: Flags): string {
  const base = typeof flags['cache-dir'] === 'string' ? resolve(flags['cache-dir']) : defaultCacheBase();
  return indexFileFor(folder, base);
}

/** Brings the folder's saved index up to date (cheap when nothing changed) and prints notes. */
export async function ensureIndex(folder: string, flags: Flags, io: Io, opts: { force?: boolean; summary?: boolean } = {}): Promise<FolderIndexReport> {
  const bar = progressBar(io);
  let report: FolderIndexReport;
  try {
    report = await indexFolder(folder, {
      settings: settingsFrom(flags),
      scan: scanFrom(flags),
      indexFile: indexFileFrom(folder, flags),
      force: opts.force,
      onProgress: bar.update,
    });
  } finally {
    bar.done();
  }
  const quiet = Boolean(flags.quiet);
  if (report.savedIndexProblem && !quiet) io.err(`note: the saved index could not be used (${report.savedIndexProblem}); rebuilt it from the files.`);
  if (report.kClamped && !quiet) io.err(`note: k=${report.requestedK} is more than this collection allows; using k=${report.k}.`);
  if ((opts.summary || report.outcome !== 'unchanged') && !quiet) io.err(summaryLine(report));
  return report;
}

export function summaryLine(r: FolderIndexReport): string {
  const what =
    r.outcome === 'unchanged'
      ? 'index up to date'
      : r.outcome === 'fresh'
        ? `built index (read ${formatCount(r.read)} files, ${formatBytes(r.bytesRead)})`
        : `refreshed index (${formatCount(r.added)} added, ${formatCount(r.changed)} changed, ${formatCount(r.removed)} removed, ${formatCount(r.reused)} reused)`;
  const skipped = r.skipped.binary + r.skipped.tooLarge + r.skipped.unreadable;
  const skipNote = skipped > 0 ? `, skipped ${skipped} (${r.skipped.binary} binary, ${r.skipped.tooLarge} too large, ${r.skipped.unreadable} unreadable)` : '';
  return `${what}: ${formatCount(r.files)} files, ${formatCount(r.terms)} terms, ${formatCount(r.nonZeros)} non-zeros, k=${r.k}, ${r.totalSeconds.toFixed(2)} s${skipNote}`;
}
