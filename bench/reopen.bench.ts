/**
 * Reopening a workspace in the editor: how long the index worker takes to load a saved index of
 * many files, and to check the folder for files changed meanwhile (no assertions; figures only).
 * Target (issue: the editor extension): loading under a second for 10 000 files.
 * Corpus: synthetic files of Zipf-distributed words from an invented 20 000-word vocabulary,
 * ~300 words each, in 100 folders (seeded, so every run writes the same files).
 *
 * Run: npx esbuild bench/reopen.bench.ts --bundle --platform=node --format=esm --packages=external \
 *        --outfile=out/bench/reopen.mjs && node out/bench/reopen.mjs [files=10000] [changed=50]
 */
import { mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { createRandom } from '../src/core/random.js';
import { WorkerClient } from '../src/node/worker/client.js';
import { indexWorkerOptions } from '../src/node/worker/workerLimits.js';
import type { WorkerConfig } from '../src/node/worker/workerProtocol.js';
import { bundleWorkerScripts } from './workerBundle.js';

const n = Number(process.argv[2] ?? 10_000);
const changed = Number(process.argv[3] ?? 50);
const repo = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-reopen-'));
const workspace = join(tmp, 'ws');
const workerJs = await bundleWorkerScripts(repo, tmp);

const rng = createRandom(11);
const syllables = ['ka', 'lo', 'mi', 'ren', 'tas', 'vo', 'dur', 'pel', 'sin', 'gra', 'ho', 'bex', 'nu', 'fal', 'quo', 'zet'];
const vocabulary = Array.from({ length: 20_000 }, (_, i) => {
  let w = '';
  for (let x = i + 17, parts = 2 + (i % 3); parts > 0; parts--, x = Math.floor(x / 16)) w += syllables[x % 16];
  return w;
});
const cumulative = new Float64Array(vocabulary.length);
let acc = 0;
for (let i = 0; i < vocabulary.length; i++) cumulative[i] = acc += 1 / (i + 1);
const word = (): string => {
  const u = rng.next() * acc;
  let lo = 0;
  let hi = cumulative.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cumulative[mid] < u) lo = mid + 1;
    else hi = mid;
  }
  return vocabulary[lo];
};
const text = (): string => Array.from({ length: 30 }, () => Array.from({ length: 10 }, word).join(' ')).join('\n');
const paths: string[] = [];
for (let i = 0; i < n; i++) {
  const dir = join(workspace, `area${i % 100}`);
  if (i < 100) mkdirSync(dir, { recursive: true });
  const p = join(dir, `note${i}.md`);
  writeFileSync(p, text());
  paths.push(p);
}

const config: WorkerConfig = {
  roots: [{ name: 'ws', fsPath: workspace, exclude: [] }],
  indexFile: join(tmp, 'storage', 'index.undertone'),
  settings: {},
  include: [],
  exclude: [],
  maxFileBytes: 1 << 20,
  honourGitignore: true,
};
const session = async <T>(work: (c: WorkerClient) => Promise<T>): Promise<T> => {
  const worker = new Worker(workerJs, indexWorkerOptions());
  try {
    return await work(new WorkerClient(worker));
  } finally {
    await worker.terminate();
  }
};

const built = await session(async (c) => {
  await c.request('configure', { config });
  return c.request('build', {});
});
const bytes = statSync(config.indexFile).size;
console.log(
  `${n} files: built in ${built.seconds.toFixed(1)} s, k=${built.summary.k}, ${built.summary.terms} terms, index file ${(bytes / 1048576).toFixed(1)} MB`,
);

const reopen = async (label: string) =>
  session(async (c) => {
    const t0 = performance.now();
    await c.request('configure', { config });
    const loaded = await c.request('load', {});
    const t1 = performance.now();
    const refreshed = await c.request('refresh', { maxFoldShare: 0.15 });
    const t2 = performance.now();
    const near = await c.request('nearby', { fsPath: paths[0], top: 10 });
    const t3 = performance.now();
    console.log(
      `${label}: load ${(t1 - t0).toFixed(0)} ms (${loaded.outcome}, file read + decode ${loaded.ms.toFixed(0)} ms) · ` +
        `check folder ${(t2 - t1).toFixed(0)} ms (${refreshed.changed} changed, folded in) · first nearby ${(t3 - t2).toFixed(1)} ms (${near?.length ?? 0} hits)`,
    );
  });
await reopen('reopen, nothing changed');
for (let i = 0; i < changed; i++) writeFileSync(paths[i * Math.floor(n / changed)], text());
await reopen(`reopen, ${changed} files changed`);
rmSync(tmp, { recursive: true, force: true });
