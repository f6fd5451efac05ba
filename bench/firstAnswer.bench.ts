/**
 * The first open of a workspace as a person meets it: the index worker (the real bundle, a worker
 * thread as the extension starts it) builds a folder's first index while a search is asked every
 * POLL_MS. Reports when the first word-match answer came (after counting; marked wordMatchOnly),
 * when the first answer by meaning came (the built index in use), and the build's own time, all
 * from the start of the build, with the load average beside them.
 *
 * Run: npm run bench:first-answer -- [docs|tree|<folder>] [--k N] [--runs N]
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { Worker } from 'node:worker_threads';
import { WorkerClient } from '../src/node/worker/client.js';
import { indexWorkerOptions } from '../src/node/worker/workerLimits.js';
import type { WorkerConfig } from '../src/node/worker/workerProtocol.js';
import { CORPORA, flag, honoursGitignore, REPO, type CorpusName } from './benchShared.js';
import { bundleWorkerScripts } from './workerBundle.js';

/** How often a search is asked during the build (a person typing a query now and then). */
const POLL_MS = 250;
const QUERY = 'memory allocation and power management';

const arg = process.argv[2] && !process.argv[2].startsWith('--') ? process.argv[2] : 'docs';
const named = arg in CORPORA ? (arg as CorpusName) : undefined;
const folder = named ? CORPORA[named] : resolve(arg);
const k = flag('k') ?? '200';
const runs = Number(flag('runs') ?? '1');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-first-answer-'));
const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));
const load = (): string =>
  loadavg()
    .map((x) => x.toFixed(2))
    .join(' ');

async function once(workerJs: string, run: number): Promise<void> {
  const config: WorkerConfig = {
    roots: [{ name: 'ws', fsPath: folder, exclude: [] }],
    indexFile: join(tmp, `storage-${run}`, 'index.undertone'),
    settings: { k: k === 'auto' ? 'auto' : Number(k) },
    include: [],
    exclude: [],
    maxFileBytes: 1 << 20,
    honourGitignore: named ? honoursGitignore(named) : true,
  };
  const worker = new Worker(workerJs, indexWorkerOptions());
  const c = new WorkerClient(worker);
  try {
    await c.request('configure', { config });
    const loadBefore = load();
    const t0 = performance.now();
    let counted: number | undefined;
    let wordMatch: { at: number; took: number; hits: number } | undefined;
    let concept: { at: number; took: number } | undefined;
    let built: number | undefined;
    const build = c
      .request('build', {}, { onProgress: (p) => (counted ??= p.wordMatch !== undefined ? performance.now() - t0 : undefined) })
      .then(() => (built = performance.now() - t0));
    while (concept === undefined) {
      const asked = performance.now();
      const hits = await c.request('search', { query: QUERY, top: 10 }).catch(() => null);
      const now = performance.now();
      if (hits && hits.length > 0 && hits[0].wordMatchOnly) wordMatch ??= { at: now - t0, took: now - asked, hits: hits.length };
      else if (hits && hits.length > 0) concept = { at: now - t0, took: now - asked };
      if (concept === undefined) await sleep(POLL_MS);
    }
    await build;
    const s = (ms: number | undefined): string => (ms === undefined ? 'never' : `${(ms / 1000).toFixed(1)} s`);
    console.log(
      `  run ${run}: counting done ${s(counted)} · first word-match answer ${s(wordMatch?.at)} (answered in ${wordMatch ? wordMatch.took.toFixed(0) : '-'} ms) · ` +
        `first answer by meaning ${s(concept.at)} · build request done ${s(built)} · load ${loadBefore} → ${load()}`,
    );
  } finally {
    await worker.terminate();
  }
}

async function main(): Promise<void> {
  try {
    const workerJs = await bundleWorkerScripts(REPO, tmp);
    console.log(`first answers during a first build, ${folder}, k=${k}, a search every ${POLL_MS} ms`);
    for (let run = 1; run <= runs; run++) await once(workerJs, run);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

void main().catch((err: unknown) => {
  console.error(err);
  process.exitCode = 1;
});
