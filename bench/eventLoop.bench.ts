/**
 * The extension host's event loop during a first build of a 10 000-file workspace: the host
 * side starts the index worker (as src/extension/workerHost.ts does), asks for a build and follows
 * its progress messages (as indexController.ts does), while this thread measures its own longest
 * pause (perf_hooks.monitorEventLoopDelay, plus a 1 ms timer whose largest gap is recorded).
 * Target (issue 9): the longest pause stays under 100 ms; the heavy work belongs in the worker.
 * No assertions: figures only, for several runs (each a first build into an empty storage folder).
 * Corpus: the abstracts of the four public test collections in test/fixtures/corpora (ADI, CACM,
 * CISI, CRAN: 6 146 documents), one file each, filled up to the file count with files that join
 * two consecutive abstracts (real text throughout), in 100 folders.
 *
 * Run: npm run bench:eventloop [-- files=10000 runs=3]
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { monitorEventLoopDelay, performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { WorkerClient } from '../src/node/worker/client.js';
import { indexWorkerOptions } from '../src/node/worker/workerLimits.js';
import type { WorkerConfig } from '../src/node/worker/workerProtocol.js';
import { bundleWorkerScripts } from './workerBundle.js';

const arg = (name: string, fallback: number): number =>
  Number(process.argv.find((a) => a.startsWith(`${name}=`))?.slice(name.length + 1) ?? fallback);
const files = arg('files', 10_000);
const runs = arg('runs', 3);
const repo = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-eventloop-'));
const workspace = join(tmp, 'ws');
const workerJs = await bundleWorkerScripts(repo, tmp);

const texts: string[] = [];
for (const name of ['adi', 'cacm', 'cisi', 'cran']) {
  for (const line of readFileSync(join(repo, 'test', 'fixtures', 'corpora', name, 'docs.jsonl'), 'utf8').split('\n')) {
    if (line.trim()) texts.push((JSON.parse(line) as { text: string }).text);
  }
}
for (let i = 0; i < files; i++) {
  const dir = join(workspace, `part${i % 100}`);
  if (i < 100) mkdirSync(dir, { recursive: true });
  const text = i < texts.length ? texts[i] : `${texts[i % texts.length]}\n\n${texts[(i + 1) % texts.length]}`;
  writeFileSync(join(dir, `doc${i}.txt`), text);
}

interface RunFigures {
  maxPauseMs: number;
  p99Ms: number;
  timerGapMs: number;
  buildSeconds: number;
  progressMessages: number;
}

async function oneRun(run: number): Promise<RunFigures> {
  const config: WorkerConfig = {
    roots: [{ name: 'ws', fsPath: workspace, exclude: [] }],
    indexFile: join(tmp, `storage-${run}`, 'index.undertone'),
    settings: {},
    include: [],
    exclude: [],
    maxFileBytes: 1 << 20,
    honourGitignore: true,
  };
  const histogram = monitorEventLoopDelay({ resolution: 1 });
  let last = performance.now();
  let gap = 0;
  const timer = setInterval(() => {
    const now = performance.now();
    gap = Math.max(gap, now - last);
    last = now;
  }, 1);
  const worker = new Worker(workerJs, indexWorkerOptions());
  const client = new WorkerClient(worker);
  let messages = 0;
  let percent = 0;
  try {
    histogram.enable();
    last = performance.now();
    const t0 = performance.now();
    await client.request('configure', { config });
    await client.request(
      'build',
      {},
      {
        onProgress: (p) => {
          messages++;
          percent = p.total > 0 ? Math.round((100 * p.done) / p.total) : percent;
        },
      },
    );
    const buildSeconds = (performance.now() - t0) / 1000;
    histogram.disable();
    return {
      maxPauseMs: histogram.max / 1e6,
      p99Ms: histogram.percentile(99) / 1e6,
      timerGapMs: gap,
      buildSeconds,
      progressMessages: messages,
    };
  } finally {
    clearInterval(timer);
    await worker.terminate();
  }
}

/** The same measures with no worker at all, for as long: the pauses the machine itself causes (other processes, the collector). */
async function baseline(seconds: number): Promise<{ maxPauseMs: number; timerGapMs: number }> {
  const histogram = monitorEventLoopDelay({ resolution: 1 });
  let last = performance.now();
  let gap = 0;
  const timer = setInterval(() => {
    const now = performance.now();
    gap = Math.max(gap, now - last);
    last = now;
  }, 1);
  histogram.enable();
  await new Promise((r) => setTimeout(r, seconds * 1000));
  histogram.disable();
  clearInterval(timer);
  return { maxPauseMs: histogram.max / 1e6, timerGapMs: gap };
}

const results: RunFigures[] = [];
for (let r = 0; r < runs; r++) {
  const f = await oneRun(r);
  results.push(f);
  console.log(
    `run ${r + 1}: longest event-loop pause ${f.maxPauseMs.toFixed(1)} ms (p99 ${f.p99Ms.toFixed(1)} ms; longest 1 ms-timer gap ${f.timerGapMs.toFixed(1)} ms), ` +
      `first build of ${files} files ${f.buildSeconds.toFixed(1)} s, ${f.progressMessages} progress messages`,
  );
}
const maxes = results.map((f) => Math.max(f.maxPauseMs, f.timerGapMs)).sort((a, b) => a - b);
console.log(
  `longest pause over ${runs} runs: min ${maxes[0].toFixed(1)} ms, median ${maxes[Math.floor(maxes.length / 2)].toFixed(1)} ms, max ${maxes[maxes.length - 1].toFixed(1)} ms (target < 100 ms)`,
);
const idleSeconds = Math.min(60, Math.round(results.reduce((a, f) => a + f.buildSeconds, 0) / results.length));
const idle = await baseline(idleSeconds);
console.log(
  `baseline, no worker, ${idleSeconds} s idle: longest pause ${Math.max(idle.maxPauseMs, idle.timerGapMs).toFixed(1)} ms (the machine's own pauses; compare with the runs above); load average ${(await import('node:os')).loadavg()[0].toFixed(1)}`,
);
rmSync(tmp, { recursive: true, force: true });
