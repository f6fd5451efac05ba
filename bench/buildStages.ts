/**
 * The build's stages after counting (weighting and pruning, the SVD, the files' projection, the
 * sections fold, the save), run from the raw counts of a saved index instead of counting a whole
 * tree again, with resident memory sampled every 250 ms and process.memoryUsage() logged at each
 * stage (issue 13: the kernel tree's build under 1.2 GB). No assertions; figures only.
 *
 *   npx esbuild bench/buildStages.ts --bundle --platform=node --format=esm --outfile=dist/buildStages.mjs \
 *     --banner:js="import { createRequire } from 'module'; const require = createRequire(import.meta.url);"
 *   node --max-semi-space-size=2 dist/buildStages.mjs <index file> [<folder the index was built from>]
 *
 * Bundled into dist/ beside parallelWorker.js (the build's threads are started from there). The
 * counts are copied out of the loaded index and the index let go before the build, so what is
 * resident at the start is about what counting leaves (vocabulary, each file's counts, metadata),
 * without the threads' section counts. As the pipeline does, the raw counts wait in a scratch file
 * from the weighting to the save (parkedCounts.ts) and the weighted matrix's entries during the
 * SVD's passes (parkedMatrix.ts); NO_PARK=1 keeps both in memory. With a folder, the sections fold
 * reads every file again (the command line folds the sections the counting threads kept instead:
 * same fold, more reading); without one the fold is skipped. The index is saved to a temporary
 * folder, removed afterwards. Note: freed memory the allocator keeps (small arrays, the
 * weighting's per-file rows) still counts in RSS here; the command line's own run
 * (`/usr/bin/time -v node dist/cli.js index <tree> --rebuild`) is the figure that counts.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { loadIndex, saveIndex } from '../src/node/persist.js';
import { IndexBuilder } from '../src/core/index/model/indexBuilder.js';
import type { DocMeta } from '../src/core/index/lsiIndex.js';
import type { MatrixExecutor } from '../src/core/matrix/executor.js';
import { WorkerPool } from '../src/node/parallel/workerPool.js';
import { collectGarbage } from '../src/node/collectGarbage.js';
import { foldFileSections } from '../src/node/sectionPass.js';
import { openSpillBeside } from '../src/node/sectionCodeFile.js';
import { ParkedCounts } from '../src/node/parkedCounts.js';

const file = process.argv[2];
const folder = process.argv[3];
if (!file) {
  console.error('usage: buildStages.mjs <index file> [<folder>]');
  process.exit(2);
}
/** Files per shared pair of count arrays (our choice: some 8 MB of ids a batch on the kernel tree). */
const BATCH_FILES = 1024;
const mb = (b: number): string => `${(b / 1048576).toFixed(0)}`;
let peak = 0;
let stagePeak = 0;
const sample = (): void => {
  const r = process.memoryUsage.rss();
  if (r > peak) peak = r;
  if (r > stagePeak) stagePeak = r;
};
const timer = setInterval(sample, 250);
const t0 = performance.now();
let c0 = process.cpuUsage();
let tMark = performance.now();
const log = (what: string): void => {
  sample();
  const m = process.memoryUsage();
  const c = process.cpuUsage(c0);
  c0 = process.cpuUsage();
  const now = performance.now();
  console.log(
    `${((now - t0) / 1000).toFixed(1).padStart(6)} s  ${what.padEnd(24)} rss ${mb(m.rss).padStart(5)}  stage peak ${mb(stagePeak).padStart(5)}  heap ${mb(m.heapUsed).padStart(5)}  external ${mb(m.external).padStart(5)}  arrayBuffers ${mb(m.arrayBuffers).padStart(5)}  cpu ${((c.user + c.system) / 1e6).toFixed(1)} s  wall ${((now - tMark) / 1000).toFixed(1)} s`,
  );
  tMark = now;
  stagePeak = 0;
};

const got = await loadIndex(file, { checkRows: 'later' });
if (got.status !== 'ok') {
  console.error(`cannot load ${file}: ${got.status}`);
  process.exit(1);
}
await got.termsFilled;
let loaded: typeof got.index | undefined = got.index;
const settings = loaded.settings;
const vocab = loaded.vocab;
const builder = new IndexBuilder(settings, vocab);
// Views of shared arrays, a batch of files each, as the counting threads hand them over
// (parallel/sortedCount.ts), not one small array per file.
const paths = loaded.paths();
for (let b0 = 0; b0 < paths.length; b0 += BATCH_FILES) {
  const batch = paths.slice(b0, b0 + BATCH_FILES);
  const terms = batch.map((p) => loaded!.termsOf(p));
  const total = terms.reduce((n, t) => n + t.termIds.length, 0);
  const ids = new Int32Array(total);
  const counts = new Float32Array(total);
  let at = 0;
  batch.forEach((path, i) => {
    const t = terms[i];
    ids.set(t.termIds, at);
    counts.set(t.counts, at);
    const n = t.termIds.length;
    const meta: DocMeta = { ...loaded!.meta(path)! };
    builder.addCounted(meta, { termIds: ids.subarray(at, at + n), counts: counts.subarray(at, at + n), length: t.length });
    at += n;
  });
}
loaded.sections.closeRows();
loaded = undefined;
await new Promise((r) => setTimeout(r, 100));
collectGarbage();
log(`counts (${builder.size} files)`);
const cpuStart = process.cpuUsage();
const wallStart = performance.now();

let pool = WorkerPool.start({}, true);
let executor: MatrixExecutor | undefined = pool?.executor();
const freshExecutor = (): MatrixExecutor | undefined => {
  executor = undefined;
  executor = pool?.executor();
  collectGarbage();
  return executor;
};
const scratchDir = mkdtempSync(join(tmpdir(), 'buildStages-'));
// As the pipeline does (indexPipeline.ts): the raw counts wait in a scratch file from the weighting to the save.
let parkedCounts: ParkedCounts | null = null;
let svdLogged = false;
const index = builder.build({
  get executor() {
    return executor;
  },
  freshExecutor: pool ? freshExecutor : undefined,
  spill: process.env.NO_PARK ? undefined : openSpillBeside(scratchDir, 'the bench scratch file'),
  onParked: collectGarbage, // as the pipeline does
  onWeighted: process.env.NO_PARK
    ? undefined
    : (docs) => (parkedCounts = ParkedCounts.park(docs, openSpillBeside(scratchDir, 'the bench scratch file'))),
  onProgress: (stage, done, all) => {
    if (stage === 'weighting' && done === 1) {
      log('weighted matrix');
      collectGarbage();
    }
    if (stage === 'svd' && done === all && !svdLogged) {
      svdLogged = true;
      log('svd passes');
    }
  },
});
log(`model and vectors (k ${index.model?.k ?? '?'})`);

if (folder) {
  freshExecutor();
  const files = index.paths().map((key) => ({ key, absPath: join(folder, key) }));
  const again = await foldFileSections(index, files, 16 * 1024 * 1024, {
    check: () => undefined,
    executor,
    spill: openSpillBeside(scratchDir, 'the bench scratch file'),
  });
  log(`sections (${again} read again)`);
}
// As the pipeline does: the threads and their memory go before the raw counts come back.
executor = undefined;
await pool?.close();
pool = undefined;
collectGarbage();
log('threads ended');
(parkedCounts as ParkedCounts | null)?.unpark();
log('counts back');
const bytes = await saveIndex(join(scratchDir, 'index.undertone'), index);
log(`saved (${mb(bytes)} MB)`);
clearInterval(timer);
const cpu = process.cpuUsage(cpuStart);
console.log(
  `build from counts: peak RSS ${mb(peak)} MB, CPU ${((cpu.user + cpu.system) / 1e6).toFixed(1)} s (this thread and its workers), wall ${((performance.now() - wallStart) / 1000).toFixed(1)} s, load ${loadavg()
    .map((x) => x.toFixed(2))
    .join(' ')}`,
);
rmSync(scratchDir, { recursive: true, force: true });
