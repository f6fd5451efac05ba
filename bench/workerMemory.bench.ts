/**
 * The editor's steady memory: the index worker (the real bundle, started as the extension starts
 * it: a worker thread of the host process) builds a folder's index, then a second worker reopens
 * the saved file. Each phase runs in a fresh process of its own (this bundle with --phase), as a
 * reopen happens in a new editor session: memory a finished build left in the allocator of the
 * same process would otherwise count against the reopen. The host does nothing else, so the
 * process's resident memory minus the host's own (measured before the worker starts) is the
 * worker's. Reported after the build and after the
 * reopen, each once the background preparation has settled (RSS unchanged for SETTLE_MS) and one
 * search and one nearby have run, then once a section search and a section Nearby have run (the
 * first trains and files the section lists on a large tree, src/core/sections/sectionLists.ts);
 * the peak during each phase is sampled every SAMPLE_MS.
 * Goals (issue 13): ≤ 250 MB for the linux-source-6.1 Documentation folder, ≤ 1 GB for the tree.
 *
 * Run: npm run bench:worker-memory -- [docs|tree|<folder>] [--k N] (docs: the linux-source-6.1
 * Documentation folder that scripts/bench-setup.sh unpacks). --same-process runs both phases in
 * one process, as this bench did before. --index <file> reopens a copy of that saved index (its
 * settings given with --k) instead of building one. --snapshot <prefix> writes the worker's V8 heap
 * snapshot at the end of each phase to <prefix>-<phase>.heapsnapshot (Worker.getHeapSnapshot), to
 * see what holds the memory.
 */
import { execFileSync } from 'node:child_process';
import { copyFileSync, createWriteStream, mkdirSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { Worker } from 'node:worker_threads';
import { WorkerClient } from '../src/node/worker/client.js';
import { indexWorkerOptions } from '../src/node/worker/workerLimits.js';
import type { WorkerConfig } from '../src/node/worker/workerProtocol.js';
import { CORPORA, flag, honoursGitignore, REPO, type CorpusName } from './benchShared.js';
import { bundleWorkerScripts } from './workerBundle.js';

const SAMPLE_MS = 200;
const SETTLE_MS = 3000;
const SETTLE_LIMIT_MS = 120_000;

const arg = process.argv[2] && !process.argv[2].startsWith('--') ? process.argv[2] : 'docs';
const named = arg in CORPORA ? (arg as CorpusName) : undefined;
const folder = named ? CORPORA[named] : resolve(arg);
const k = flag('k') ?? '200';
/** Set in the child processes: which phase to run, and the shared scratch folder. */
const only = flag('phase') as 'build' | 'reopen' | undefined;
const sameProcess = process.argv.includes('--same-process');
/** A saved index to reopen (copied first) instead of building one. */
const savedIndex = flag('index');
/** Where the worker's heap snapshots go (a path prefix), when asked. */
const snapshot = flag('snapshot');
const tmp = flag('tmp') ?? mkdtempSync(join(tmpdir(), 'undertone-worker-memory-'));
const mb = (b: number): string => `${(b / 1048576).toFixed(0)} MB`;
const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

/** RSS sampled in the background; peak() since the last reset. */
function sampler(): { peak: () => number; reset: () => void; stop: () => void } {
  let peak = 0;
  const tick = (): void => {
    peak = Math.max(peak, process.memoryUsage.rss());
  };
  const timer = setInterval(tick, SAMPLE_MS);
  return {
    peak: () => (tick(), peak),
    reset: () => (peak = 0),
    stop: () => clearInterval(timer),
  };
}

/** Waits until RSS has moved less than 2 MB over SETTLE_MS (or SETTLE_LIMIT_MS passed). */
async function settled(): Promise<number> {
  const t0 = Date.now();
  let last = process.memoryUsage.rss();
  let since = Date.now();
  while (Date.now() - t0 < SETTLE_LIMIT_MS) {
    await sleep(SAMPLE_MS);
    const now = process.memoryUsage.rss();
    if (Math.abs(now - last) > 2 * 1048576) {
      last = now;
      since = Date.now();
    } else if (Date.now() - since >= SETTLE_MS) break;
  }
  return process.memoryUsage.rss();
}

async function main(): Promise<void> {
  try {
    if (!only && !sameProcess) {
      // Each phase in a fresh process; the build leaves the index file for the reopen.
      await bundleWorkerScripts(REPO, tmp);
      if (savedIndex) {
        mkdirSync(join(tmp, 'storage'), { recursive: true });
        copyFileSync(savedIndex, join(tmp, 'storage', 'index.undertone'));
      }
      for (const phase of savedIndex ? ['reopen'] : ['build', 'reopen'])
        execFileSync(process.execPath, [process.argv[1], ...process.argv.slice(2), '--phase', phase, '--tmp', tmp], { stdio: 'inherit' });
      const [a, b, c] = loadavg();
      console.log(`load average ${a.toFixed(2)} ${b.toFixed(2)} ${c.toFixed(2)} on this machine (after the runs)`);
      return;
    }
    const workerJs = only ? join(tmp, 'indexWorker.js') : await bundleWorkerScripts(REPO, tmp);
    const config: WorkerConfig = {
      roots: [{ name: 'ws', fsPath: folder, exclude: [] }],
      indexFile: join(tmp, 'storage', 'index.undertone'),
      settings: { k: k === 'auto' ? 'auto' : Number(k) },
      include: [],
      exclude: [],
      maxFileBytes: 1 << 20,
      honourGitignore: named ? honoursGitignore(named) : true,
    };
    await sleep(500);
    const host = await settled();
    console.log(`worker memory, ${folder}, k=${k}; host process alone ${mb(host)}${only ? ` (a process for this phase)` : ''}`);
    const s = sampler();
    const phase = async (label: string, start: (c: WorkerClient) => Promise<string>): Promise<void> => {
      s.reset();
      const worker = new Worker(workerJs, indexWorkerOptions());
      const c = new WorkerClient(worker);
      try {
        const t0 = performance.now();
        const what = await start(c);
        const seconds = (performance.now() - t0) / 1000;
        const peak = s.peak();
        const steady = await settled();
        const hits = await c.request('search', { query: 'memory allocation and power management', top: 10 });
        if (hits.length > 0) await c.request('nearby', { fsPath: hits[0].fsPath, top: 10 });
        const afterQueries = await settled();
        const sections = await c.request('searchSections', { query: 'memory allocation and power management', top: 10 });
        if (sections.length > 0) await c.request('nearbySections', { fsPath: sections[0].fsPath, line: sections[0].start, top: 10 });
        const afterSections = await settled();
        console.log(
          `  ${label}: ${what} in ${seconds.toFixed(1)} s · worker RSS at the peak ${mb(peak - host)}, settled ${mb(steady - host)}, ` +
            `after a search and a nearby ${mb(afterQueries - host)} (process ${mb(afterQueries)}), ` +
            `then after a section search and a section Nearby ${mb(afterSections - host)}`,
        );
        if (snapshot) {
          const file = `${resolve(snapshot)}-${only ?? label.replace(/\W+/g, '-')}.heapsnapshot`;
          await pipeline(await worker.getHeapSnapshot(), createWriteStream(file));
          console.log(`  heap snapshot of the worker: ${file}`);
        }
      } finally {
        await worker.terminate();
      }
      await sleep(500);
    };
    if (only !== 'reopen')
      await phase('after a build', async (c) => {
        await c.request('configure', { config });
        const built = await c.request('build', {});
        return `built ${built.summary.files} files, ${built.summary.terms} terms, k=${built.summary.k}, index file ${mb(statSync(config.indexFile).size)}`;
      });
    if (only !== 'build')
      await phase('after reopening', async (c) => {
        await c.request('configure', { config });
        const loaded = await c.request('load', {});
        return `loaded (${loaded.outcome})`;
      });
    s.stop();
    if (only) return;
    const [a, b, c] = loadavg();
    console.log(`load average ${a.toFixed(2)} ${b.toFixed(2)} ${c.toFixed(2)} on this machine (after the runs)`);
  } finally {
    if (only !== 'build') rmSync(tmp, { recursive: true, force: true });
  }
}

void main().catch((err: unknown) => {
  console.error(err);
  process.exitCode = 1;
});
