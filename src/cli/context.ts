/** Shared option parsing for every command: index settings, scan options and the cache folder. */
import { statSync } from 'node:fs';
import { resolve } from 'node:path';
import { InvalidInputError } from '../core/errors.js';
import type { IndexSettings } from '../core/index/model/settings.js';
import { WEIGHTING_SCHEMES, type WeightingScheme } from '../core/weighting/termWeighting.js';
import { defaultCacheBase, indexFileFor } from '../node/cacheDir.js';
import { indexFolder, type FolderIndexReport } from '../node/folderIndexer.js';
import { readSavedSettings } from '../node/persist.js';
import type { ScanOptions } from '../node/scan.js';
import { formatBytes, formatCount, printable, progressBar, type Io } from './output.js';

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
  'follow-links': { type: 'boolean' },
  sections: { type: 'boolean' },
  'skip-sections': { type: 'boolean' },
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
  if (flags['follow-links']) s.followLinksOutside = true;
  return s;
}

export function indexFileFrom(folder: string, flags: Flags): string {
  if (typeof flags['cache-dir'] === 'string') {
    if (flags['cache-dir'].trim() === '') throw new InvalidInputError('--cache-dir needs a folder name, got an empty string');
    const base = resolve(flags['cache-dir']);
    const st = statSync(base, { throwIfNoEntry: false });
    if (st && !st.isDirectory()) throw new InvalidInputError(`--cache-dir ${base} is not a folder`);
    return indexFileFor(folder, base);
  }
  return indexFileFor(folder, defaultCacheBase());
}

/** The settings a user can give on the command line, which the saved index remembers. */
const REMEMBERED = ['k', 'weighting', 'seed'] as const;

/**
 * The settings for this run: the ones the folder's saved index was built with, overridden by
 * those given now, and a note for each given one that differs from the saved one (the index is
 * rebuilt with it, and later commands keep it).
 */
export async function effectiveSettings(indexFile: string, flags: Flags): Promise<{ settings: Partial<IndexSettings>; notes: string[] }> {
  const given = settingsFrom(flags);
  const saved = await readSavedSettings(indexFile);
  if (!saved) return { settings: given, notes: [] };
  const settings: { -readonly [K in keyof IndexSettings]?: IndexSettings[K] } = {};
  const notes: string[] = [];
  for (const key of REMEMBERED) {
    const now = given[key];
    (settings as Record<string, unknown>)[key] = now ?? saved[key];
    if (now !== undefined && now !== saved[key]) {
      notes.push(
        `note: --${key} ${String(now)} differs from the saved index's ${key}=${String(saved[key])}: rebuilding with ${key}=${String(now)}, which later commands keep.`,
      );
    }
  }
  return { settings, notes };
}

/** Brings the folder's saved index up to date (cheap when nothing changed) and prints notes. */
export async function ensureIndex(
  folder: string,
  flags: Flags,
  io: Io,
  opts: { force?: boolean; summary?: boolean } = {},
): Promise<FolderIndexReport> {
  const indexFile = indexFileFrom(folder, flags);
  const { settings, notes } = await effectiveSettings(indexFile, flags);
  const quiet = Boolean(flags.quiet);
  if (!quiet) notes.forEach((n) => io.err(n));
  const bar = progressBar(io);
  let report: FolderIndexReport;
  try {
    report = await indexFolder(folder, {
      settings,
      scan: scanFrom(flags),
      indexFile,
      force: opts.force,
      ...(flags['skip-sections'] ? { sections: false } : {}),
      sharedModel: typeof flags.model === 'string' ? (flags.model === 'none' ? null : flags.model) : undefined,
      onProgress: bar.update,
    });
  } finally {
    bar.done();
  }
  if (report.savedIndexProblem && !quiet)
    io.err(`note: the saved index could not be used (${printable(report.savedIndexProblem)}); rebuilt it from the files.`);
  // Only a k the user asked for (now or when the index was built) is worth a note when clamped.
  if (report.kClamped && typeof settings.k === 'number' && !quiet)
    io.err(`note: k=${report.requestedK} is more than this collection allows; using k=${report.k}.`);
  if (report.saveProblem && !quiet && !opts.summary)
    io.err(`note: the index could not be saved (${printable(report.saveProblem)}); answering from the index built in memory.`);
  if (!quiet) for (const line of skippedNotes(report)) io.err(line);
  if ((opts.summary || report.outcome !== 'unchanged') && !quiet) io.err(summaryLine(report));
  return report;
}

/** Notes naming what the scan left out for reasons a user may want to act on (up to 5 each). */
function skippedNotes(r: FolderIndexReport): string[] {
  const groups: [string, string][] = [
    ['outside-folder', 'links to files outside the folder, not read (--follow-links reads them)'],
    ['bad-name', 'file names that are not valid UTF-8, not indexed'],
    ['not-a-file', 'devices, FIFOs, sockets or system pseudo-files, never read'],
  ];
  const lines: string[] = [];
  for (const [reason, what] of groups) {
    const paths = r.scanSkipped.filter((s) => s.reason === reason).map((s) => printable(s.path));
    if (paths.length === 0) continue;
    const shown = paths.slice(0, 5).join(', ');
    lines.push(`note: ${paths.length} ${what}: ${shown}${paths.length > 5 ? `, and ${paths.length - 5} more` : ''}`);
  }
  return lines;
}

export function summaryLine(r: FolderIndexReport): string {
  const what =
    r.outcome === 'unchanged'
      ? 'index up to date'
      : r.outcome === 'fresh'
        ? `built index (read ${formatCount(r.read)} files, ${formatBytes(r.bytesRead)})`
        : `refreshed index (${formatCount(r.added)} added, ${formatCount(r.changed)} changed, ${formatCount(r.removed)} removed, ${formatCount(r.reused)} reused)`;
  const other = r.scanSkipped.filter((s) => s.reason === 'outside-folder' || s.reason === 'bad-name' || s.reason === 'not-a-file').length;
  const skipped = r.skipped.binary + r.skipped.tooLarge + r.skipped.unreadable + other;
  const skipNote =
    skipped > 0
      ? `, skipped ${skipped} (${r.skipped.binary} binary, ${r.skipped.tooLarge} too large, ${r.skipped.unreadable} unreadable${other > 0 ? `, ${other} other` : ''})`
      : '';
  return `${what}: ${formatCount(r.files)} files, ${formatCount(r.terms)} terms, ${formatCount(r.nonZeros)} non-zeros, k=${r.k}, ${r.totalSeconds.toFixed(2)} s${skipNote}`;
}
