/**
 * Speed of the topic tree (core/topics/topics.ts: first level, loose files, sub-topics, names,
 * folders) on large real folders. Figures only, no assertions. Run from the repository root:
 *   npm run build && npm run bench:topic-tree -- [mixed|kernel-doc|kernel|all]
 *   npm run bench:topic-tree -- file <index file>    (a saved index, loaded as is: no scan, no build)
 * Folders:
 *   mixed       every public collection in test/fixtures written out as one file per document
 *               (CMake and Django manuals, CISI, CACM, CRAN, ADI abstracts: about 8.6k files of
 *               real text, the size of the kernel's Documentation folder);
 *   kernel-doc  .cache/bench/linux-source-6.1/Documentation (scripts/bench-setup.sh unpacks it);
 *   kernel      .cache/bench/linux-source-6.1, the whole source tree (about 78k files).
 * The index is built once by the command line (`undertone index`, all cores, saved under
 * .cache/bench/index) and loaded; then findTopics runs RUNS times in this process, as the editor's
 * worker thread runs it, and the wall time of each run, their median and spread, the tree's shape
 * and the process's peak RSS are printed, with the CPU time of each run (on a shared machine the
 * wall time is mostly waiting for a core). Before each run a fixed reference loop (dot products of
 * 2000 × 195 numbers with 16 others, 20 times: 125 million multiply-adds, the shape of a k-means
 * pass) is timed in CPU too, so that figures taken on a loaded machine can be read against the
 * machine's speed at that moment; the load average is printed with them.
 * The whole kernel tree is indexed with --no-gitignore (its .gitignore leaves the scanner nothing).
 * OPTIONS='<JSON>' replaces some of findTopics' defaults (a partial TopicsOptions), to compare variants.
 * With `file`, the index file is loaded (persist.ts loadIndex, the load's wall and CPU time
 * printed) and the runs follow as above; for the figure a user meets (one process: load and one
 * tree, peak RSS) run it under /usr/bin/time -v with RUNS=1.
 * Measured 2026-12-03 on the shared 2-core machine (nice -n 5, others' jobs running; one run each
 * unless said; the whole-tree index in the current format, built by the CLI, copied and loaded):
 *   whole kernel tree (78,300 files, k = 289; 18 / 103 / 455 / 1566 topics per level): topic tree
 *   CPU 47.1, 49.0, 43.3 and 38.2 s in four runs (wall 72.4 s at load 7.3–10, 317.7 s at load
 *   15.6, 72.4 s at load 7.8, 87.9 s at load 6.9–8.2; reference loop 0.27, 0.22, 0.26, 0.30):
 *   the first before the SIMD Gram table, the last two with today's names, the last with the
 *   points in blocks; the process (load 17–38 s wall, then one tree) peaked at 3.72, 3.95, 4.07
 *   and 4.07 GiB RSS (/usr/bin/time -v; most of it the loaded index, not the products' copies).
 *   Later, on a quieter machine, main against this branch alternating (main, here, main, here):
 *   tree 37.3 s wall / 40.2 s CPU (load 3.2, reference 0.25), 32.8 / 32.4 s (load 2.7, 0.47),
 *   51.6 / 48.9 s (load 3.8, 0.24), 39.4 / 38.8 s (load 3.6, 0.26); the whole process (load and
 *   one tree) 43.8, 38.4, 58.9, 47.7 s wall and peak RSS 3.12, 3.35, 3.14, 3.43 GiB: the SIMD
 *   products cost about 0.25 GiB at the peak (their memories wait for the GC).
 *   Documentation (8,863 files, k = 195; 20 / 102 / 299 / 226 topics per level), main against
 *   this branch, alternating, three rounds of three runs at load 3.6–5.3 (reference loop
 *   0.21–0.35): CPU main 5.69–7.37, 4.86–5.58, 4.24–5.63 s, here 3.70–6.11, 4.55–4.65, 3.39–5.97 s
 *   (medians of the nine 5.53 and 4.64 s; the first run of each round, the JIT cold, 5.6–7.4 and
 *   5.5–6.1 s); wall medians 8.62, 5.57, 4.85 and 5.52, 4.68, 4.35 s; peak RSS 316–338 MiB and
 *   382–403 MiB (the kernels' memories, dropped with each product object, wait for the GC).
 *   With the first level's restarts refined by first variation (firstVariation.ts; OPTIONS='{"refine":false}'
 *   without), alternating, load 8–12: Documentation CPU 6.87, 4.33, 4.58 and 6.95, 5.25, 3.66 s
 *   (without: 5.92, 4.63, 4.76 and 4.94, 3.14, 3.51 s); whole tree (RUNS=1, /usr/bin/time -v) tree CPU
 *   40.9, 43.1, 35.5 s (wall 292 s at load 11–12, 43.1 and 38.5 s at load 4; process 50.7 and 45.5 s;
 *   18 / 110 / 499 / 1505 topics, 2642 loose), without 42.5, 39.2, 37.7 s (wall 90.8 s at load 9,
 *   54.1 and 53.7 s at load 4–5; 2065 loose), peak RSS 4.14–4.25 and 4.16–4.28 GB (2026-12-03).
 *   First-level restart variants (the screenRestarts options, at commit 8320fb1 only) on the
 *   Documentation folder (index built by main at 17:55, k = 200, `file` mode, two alternating rounds of three runs each, load 10–18): CPU the defaults 8.39,
 *   6.83, 5.50, 8.57, 6.46, 6.02 s against 20 restarts screened on a 500-file sample
 *   (OPTIONS='{"screenRestarts":20}') 8.66, 7.35, 6.35, 8.39, 5.88, 5.20 s and with one finalist
 *   8.19, 6.66, 6.16, 7.14, 5.15, 4.34 s; later the defaults 7.02, 4.91, 4.61, 6.59, 5.20, 4.36 s
 *   (median 5.1) against 20 unrefined restarts on every fitted file, the best 3 refined
 *   ('{"screenRestarts":20,"screenSample":100000}') 8.25, 6.67, 6.01, 10.11, 7.05, 7.53 s (7.3)
 *   and 20 refined restarts ('{"restarts":20}') 9.23, 8.33, 8.86, 10.71, 8.57, 7.98 s (8.7). A
 *   third round at load 2–6 (defaults, all files screened, 20 restarts, defaults): 7.55, 5.77,
 *   4.91; 10.22, 7.06, 7.15; 11.81, 10.65, 8.43; 8.63, 6.13, 6.48 s (the first run of each cold).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { loadavg } from 'node:os';
import { gunzipSync } from 'node:zlib';
import { indexFileFrom } from '../src/cli/context.js';
import { findTopics, walkTopics, type TopicsOptions } from '../src/core/topics/topics.js';
import { indexFolder } from '../src/node/folderIndexer.js';
import { loadIndex } from '../src/node/persist.js';
import type { LsiIndex } from '../src/core/index/lsiIndex.js';

const RUNS = Number(process.env.RUNS ?? 3);
/** Topic options to try instead of the defaults, as JSON (e.g. OPTIONS='{"refine":false}'). */
const OPTIONS = JSON.parse(process.env.OPTIONS ?? '{}') as Partial<TopicsOptions>;
const CACHE = resolve('.cache/bench');
const which = process.argv[2] ?? 'all';

function mixedFolder(): string {
  const root = join(CACHE, 'mixed');
  if (existsSync(join(root, '.written'))) return root;
  const put = (path: string, text: string) => {
    const p = join(root, path);
    mkdirSync(dirname(p), { recursive: true });
    writeFileSync(p, text);
  };
  for (const name of ['cmake', 'django']) {
    for (const line of gunzipSync(readFileSync(`test/fixtures/topic-trees/${name}.jsonl.gz`))
      .toString('utf8')
      .split('\n')) {
      if (!line.trim()) continue;
      const d = JSON.parse(line) as { path: string; text: string };
      put(join(name, d.path), d.text);
    }
  }
  for (const name of ['cisi', 'cacm', 'cran', 'adi']) {
    for (const line of readFileSync(`test/fixtures/corpora/${name}/docs.jsonl`, 'utf8').split('\n')) {
      if (!line.trim()) continue;
      const d = JSON.parse(line) as { id: string; text: string };
      put(join(name, `${d.id}.txt`), d.text);
    }
  }
  writeFileSync(join(root, '.written'), '');
  return root;
}

const folders: Record<string, () => string | null> = {
  mixed: mixedFolder,
  'kernel-doc': () => (existsSync(join(CACHE, 'linux-source-6.1/Documentation')) ? join(CACHE, 'linux-source-6.1/Documentation') : null),
  kernel: () => (existsSync(join(CACHE, 'linux-source-6.1')) ? join(CACHE, 'linux-source-6.1') : null),
};

/** CPU milliseconds of the reference loop (see the header), and its rate in multiply-adds per second. */
function referenceLoop(): { ms: number; rate: number } {
  const n = 2000;
  const d = 195;
  const k = 16;
  const p = new Float64Array(n * d).map((_, i) => Math.sin(i));
  const c = new Float64Array(k * d).map((_, i) => Math.cos(i));
  const s = new Float64Array(n * k);
  const c0 = process.cpuUsage();
  for (let r = 0; r < 20; r++) {
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < k; j++) {
        let v = 0;
        for (let t = 0; t < d; t++) v += p[i * d + t] * c[j * d + t];
        s[i * k + j] += v;
      }
    }
  }
  const c1 = process.cpuUsage(c0);
  const ms = (c1.user + c1.system) / 1000;
  return { ms, rate: (20 * n * k * d) / (ms / 1000) };
}

async function bench(name: string, folder: string): Promise<void> {
  const flags = { 'cache-dir': join(CACHE, 'index'), quiet: true };
  const t0 = performance.now();
  const extra = name === 'kernel' ? ['--no-gitignore'] : [];
  execFileSync(process.execPath, ['dist/cli.js', 'index', folder, '--cache-dir', flags['cache-dir'], '--quiet', ...extra], {
    stdio: 'inherit',
  });
  const built = performance.now() - t0;
  const { index } = await indexFolder(folder, {
    indexFile: indexFileFrom(folder, flags),
    parallel: false,
    ...(name === 'kernel' ? { scan: { honourGitignore: false } } : {}),
  });
  runTrees(`${name}: ${index.size} files, k=${index.k}; index (CLI, build or reuse) ${(built / 1000).toFixed(1)} s`, index);
}

async function benchFile(path: string): Promise<void> {
  const s = performance.now();
  const c0 = process.cpuUsage();
  const loaded = await loadIndex(path);
  const c1 = process.cpuUsage(c0);
  if (loaded.status !== 'ok') throw new Error(`${path}: ${loaded.status === 'damaged' ? loaded.reason : 'missing'}`);
  const index = loaded.index;
  runTrees(
    `${path}: ${index.size} files, k=${index.k}, ${(loaded.bytes / 2 ** 20).toFixed(0)} MiB; load ${((performance.now() - s) / 1000).toFixed(2)} s (CPU ${((c1.user + c1.system) / 1e6).toFixed(2)} s)`,
    index,
  );
}

function runTrees(title: string, index: LsiIndex): void {
  const times: number[] = [];
  const cpu: number[] = [];
  const reference: string[] = [];
  let shape = '';
  for (let r = 0; r < RUNS; r++) {
    const ref = referenceLoop();
    reference.push(`${(ref.rate / 1e9).toFixed(2)}`);
    const s = performance.now();
    const c0 = process.cpuUsage();
    const report = findTopics(index, { seed: index.settings.seed, ...OPTIONS });
    times.push(performance.now() - s);
    const c1 = process.cpuUsage(c0);
    cpu.push((c1.user + c1.system) / 1000);
    const all = [...walkTopics(report.topics)];
    const perLevel = Array.from({ length: report.levels }, (_, l) => all.filter((t) => t.level === l + 1).length);
    shape = `${report.topics.length} topics, ${report.levels} levels (${perLevel.join(' / ')} topics per level), ${report.loose.length} loose, ${report.unplaced.length} unplaced`;
  }
  times.sort((a, b) => a - b);
  const rss = process.resourceUsage().maxRSS / 1024;
  console.log(
    `${title}\n` +
      `  topic tree: median ${(times[Math.floor(RUNS / 2)] / 1000).toFixed(2)} s, runs ${times.map((t) => (t / 1000).toFixed(2)).join(', ')} s (CPU ${cpu.map((t) => (t / 1000).toFixed(2)).join(', ')} s, one thread); ${shape}; peak RSS ${rss.toFixed(0)} MiB\n` +
      `  reference loop before each run: ${reference.join(', ')} G multiply-adds per CPU second; load average ${loadavg()
        .map((l) => l.toFixed(1))
        .join(' ')}`,
  );
}

if (which === 'file') await benchFile(process.argv[3] ?? '');
for (const [name, locate] of Object.entries(folders)) {
  if (which !== 'all' && which !== name) continue; // 'file' matches none
  const folder = locate();
  if (!folder) {
    console.log(`${name}: skipped (run scripts/bench-setup.sh first)`);
    continue;
  }
  await bench(name, folder);
}
