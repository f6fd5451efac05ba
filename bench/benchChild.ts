/**
 * One measured build, run in its own process (so peak RSS belongs to that build alone):
 * index a folder from scratch with the CLI's defaults (threads, WebAssembly kernels), then reopen
 * the saved index, time searches and nearest-file lookups, and fold in one changed file.
 * Prints one JSON line (ChildResult) on stdout.
 */
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { mkdtemp } from 'node:fs/promises';
import { availableParallelism, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';
import { NoKnownTermsError } from '../src/core/errors.js';
import type { LsiIndex } from '../src/core/index/lsiIndex.js';
import { indexFolder } from '../src/node/folderIndexer.js';
import { loadIndex } from '../src/node/persist.js';
import { writeExport } from '../src/cli/commands/exportCommand.js';
import { rehearseFolds } from '../src/node/worker/backgroundPrepare.js';

export interface ChildResult {
  readonly folder: string;
  readonly files: number;
  readonly bytes: number;
  readonly terms: number;
  readonly nonZeros: number;
  readonly k: number;
  readonly threads: number;
  /** Seconds: scan, tokenize (read + tokenize + count), matrix, svd (SVD + document vectors), save. */
  readonly stages: { scan: number; tokenize: number; matrix: number; svd: number; save: number };
  /** scan + tokenize + matrix + svd (the build, without saving). */
  readonly buildSeconds: number;
  readonly totalSeconds: number;
  /** Peak RSS when the build (scan, read, tokenize, matrix, SVD, save) ends: what the reference measures. */
  readonly buildPeakRssBytes: number;
  /** Peak RSS at the end, after the reopen (a second copy of the index) and the queries. */
  readonly peakRssBytes: number;
  /** CPU seconds (user + system, all threads) of the build, save included. */
  readonly cpuSeconds: number;
  readonly reopenSeconds: number;
  readonly indexBytes: number;
  /** Milliseconds, median and worst over the queries / files tried. */
  /** The first search after reopening the saved index (before prepare). */
  readonly firstSearchMs: number;
  /** LsiIndex.prepare() after that (the editor's worker runs it in the background). */
  readonly prepareSeconds: number;
  readonly searchMs: { median: number; max: number; count: number };
  readonly nearbyMs: { median: number; max: number; count: number };
  /**
   * Folding in a changed file (its text plus one new line), one after another for the files Nearby
   * was asked about, with the saved index's term vectors in memory as the editor's worker has them
   * by then (it prepares once they are filled); the first includes the session's one-off costs.
   */
  readonly foldInMs: { first: number; median: number; max: number; count: number };
  /** The search right after each fold-in (the words' focus and the mean row added again where the edit touched them). */
  readonly searchAfterFoldInMs: { median: number; max: number; count: number };
}

/** Plain-language queries: general software topics (invented wording; unknown words are skipped). */
export const QUERIES = [
  'how to allocate and free memory',
  'power management suspend and resume',
  'network driver interrupt handling',
  'file system journaling and recovery',
  'scheduler priority and processor affinity',
  'debugging with trace points and logs',
  'timetable changes for the summer ferry season',
  'refund when a trip is cancelled',
  'configuration file format and defaults',
  'security checks for user permissions',
];

function stats(ms: number[]): { median: number; max: number; count: number } {
  if (ms.length === 0) return { median: NaN, max: NaN, count: 0 };
  const s = [...ms].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)], max: s[s.length - 1], count: s.length };
}

function timeIt(f: () => void): number {
  const t = performance.now();
  f();
  return performance.now() - t;
}

/**
 * @param exportDir when given, afterwards (outside the measured part) writes the indexed files'
 * absolute paths to <exportDir>/paths.txt and the Matrix Market export (writeExport) there.
 */
export async function runChild(folder: string, k: number | 'auto', exportDir?: string, honourGitignore = true): Promise<ChildResult> {
  const dir = await mkdtemp(join(tmpdir(), 'undertone-bench-'));
  const indexFile = join(dir, 'index.undertone');
  const cpu0 = process.cpuUsage();
  const report = await indexFolder(folder, { indexFile, force: true, settings: { k }, scan: { honourGitignore } });
  const cpu = process.cpuUsage(cpu0);
  const buildPeakRssBytes = process.resourceUsage().maxRSS * 1024;
  const s = report.seconds;
  const stages = { scan: s.scan, tokenize: s.read, matrix: s.matrix, svd: s.svd, save: s.save };
  // Reopen from disk (a fresh load, as a new editor session or CLI call does).
  const t0 = performance.now();
  const loaded = await loadIndex(indexFile);
  const reopenSeconds = (performance.now() - t0) / 1000;
  if (loaded.status !== 'ok') throw new Error(`could not reopen the saved index: ${loaded.status}`);
  const index: LsiIndex = loaded.index;
  // The first search after reopening builds what searching needs on first use.
  const firstSearchMs = timeIt(() => index.search(QUERIES[0], { top: 10 }));
  // The editor's worker then prepares the index in the background (the CLI, one question per run, does not).
  const t1 = performance.now();
  await index.prepare({ sliceMs: 1000, pause: async () => undefined });
  const prepareSeconds = (performance.now() - t1) / 1000;
  // Then each question once: words not asked before, as a person's next questions would be.
  const searchMs: number[] = [];
  for (const q of QUERIES.slice(1)) {
    try {
      searchMs.push(timeIt(() => index.search(q, { top: 10 })));
    } catch (err) {
      if (!(err instanceof NoKnownTermsError)) throw err;
    }
  }
  const paths = index.paths();
  const picks = Array.from({ length: Math.min(10, paths.length) }, (_, i) => paths[Math.floor((i * paths.length) / 10)]);
  const nearbyMs = picks.map((p) => timeIt(() => index.nearby(p, { top: 10 })));
  await loaded.termsFilled; // the editor's worker prepares once they are in (indexService.ts)
  // As the worker's background preparation ends (backgroundPrepare.ts): rehearsed fold-ins of a few files.
  await rehearseFolds(index, async (p) => readFileSync(join(folder, p), 'utf8'));
  // Fold in changed files, as saves in the editor: each one's text plus one new line, then a search.
  const foldMs: number[] = [];
  const afterMs: number[] = [];
  for (const [i, victim] of picks.entries()) {
    const text = `${readFileSync(join(folder, victim), 'utf8')}\nA new closing line about memory.\n`;
    const meta = { path: victim, size: text.length, mtimeMs: Date.now() };
    foldMs.push(timeIt(() => index.foldIn(meta, text)));
    try {
      afterMs.push(timeIt(() => index.search(QUERIES[i % QUERIES.length], { top: 10 })));
    } catch (err) {
      if (!(err instanceof NoKnownTermsError)) throw err;
    }
  }
  const bytes = readFileSync(indexFile).length;
  const peakRssBytes = process.resourceUsage().maxRSS * 1024;
  if (exportDir) {
    const built = report.index;
    await writeExport(built, exportDir);
    writeFileSync(
      join(exportDir, 'paths.txt'),
      `${built
        .paths()
        .map((p) => join(resolve(folder), p))
        .join('\n')}\n`,
    );
  }
  rmSync(dir, { recursive: true, force: true });
  return {
    folder,
    files: report.files,
    bytes: report.bytesRead,
    terms: report.terms,
    nonZeros: report.nonZeros,
    k: report.k,
    threads: availableParallelism(),
    stages,
    buildSeconds: stages.scan + stages.tokenize + stages.matrix + stages.svd,
    totalSeconds: report.totalSeconds,
    buildPeakRssBytes,
    peakRssBytes,
    cpuSeconds: (cpu.user + cpu.system) / 1e6,
    reopenSeconds,
    indexBytes: bytes,
    firstSearchMs,
    prepareSeconds,
    searchMs: stats(searchMs),
    nearbyMs: stats(nearbyMs),
    foldInMs: { first: foldMs[0] ?? NaN, ...stats(foldMs) },
    searchAfterFoldInMs: stats(afterMs),
  };
}
