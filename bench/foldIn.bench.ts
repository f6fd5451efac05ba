/**
 * Save-to-Nearby latency of the editor extension, measured through the real index worker on a
 * copy of the demo workspace (no assertions; figures only). One round = what the extension does
 * when a file is saved: an `update` request (stat, read, tokenize, fold in with the frozen model)
 * followed by a `nearby` request for that file, both over the worker's message channel.
 * Target (issue: the editor extension): under 100 ms from save to updated Nearby view.
 *
 * Run: npx esbuild bench/foldIn.bench.ts --bundle --platform=node --format=esm --packages=external \
 *        --outfile=out/bench/foldIn.mjs && node out/bench/foldIn.mjs [rounds=60]
 */
import { appendFileSync, cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { WorkerClient } from '../src/node/worker/client.js';
import { indexWorkerOptions } from '../src/node/worker/workerLimits.js';
import { bundleWorkerScripts } from './workerBundle.js';

const rounds = Number(process.argv[2] ?? 60);
const repo = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-foldin-'));
const workspace = join(tmp, 'ws');
cpSync(join(repo, 'demo', 'workspace'), workspace, { recursive: true });
const workerJs = await bundleWorkerScripts(repo, tmp);

const worker = new Worker(workerJs, indexWorkerOptions());
const client = new WorkerClient(worker);
await client.request('configure', {
  config: {
    roots: [{ name: 'ws', fsPath: workspace, exclude: [] }],
    indexFile: join(tmp, 'index.undertone'),
    settings: {},
    include: [],
    exclude: [],
    maxFileBytes: 1 << 20,
    honourGitignore: true,
  },
});
const built = await client.request('build', {});
console.log(`demo index: ${built.summary.files} files, k=${built.summary.k}, built in ${built.seconds.toFixed(2)} s`);

const targets = ['notes/timetables/winter-rotation-notes.md', 'src/ticketing/fareCalculator.ts', 'notes/crew/rest-hours-policy.md'];
const originals = targets.map((t) => readFileSync(join(workspace, t), 'utf8'));
const times: number[] = [];
const updateTimes: number[] = [];
for (let i = 0; i < rounds; i++) {
  const file = join(workspace, targets[i % targets.length]);
  appendFileSync(file, `\nEdit ${i}: the relief crew checked the mooring lines and the tide table before the crossing.\n`);
  const t0 = performance.now();
  const update = await client.request('update', { changes: [{ kind: 'changed', fsPath: file }] });
  updateTimes.push(performance.now() - t0);
  const near = await client.request('nearby', { fsPath: file, top: 10 });
  times.push(performance.now() - t0);
  if (update.folded.length !== 1 || !near || near.length === 0) throw new Error(`round ${i}: the edit was not folded in`);
}
targets.forEach((t, i) => writeFileSync(join(workspace, t), originals[i]));

const sorted = [...times].sort((a, b) => a - b);
const pct = (p: number) => sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))];
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
console.log(`save → Nearby (update + nearby through the worker), ${rounds} rounds:`);
console.log(
  `  median ${pct(0.5).toFixed(2)} ms · p95 ${pct(0.95).toFixed(2)} ms · max ${sorted.at(-1)!.toFixed(2)} ms · first ${times[0].toFixed(2)} ms (target < 100 ms)`,
);
console.log(
  `  of which the update (fold-in) median ${median(updateTimes).toFixed(2)} ms, the nearby query median ${median(times.map((t, i) => t - updateTimes[i])).toFixed(2)} ms`,
);
await worker.terminate();
rmSync(tmp, { recursive: true, force: true });
