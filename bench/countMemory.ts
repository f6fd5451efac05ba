/**
 * Peak memory of the build's counting stage alone (issue 13: on the whole Linux tree the end of
 * counting was as high as the SVD): scans a folder, counts every file (and its sections) on the
 * tokenizing threads as a build from scratch does (countFilesSorted), files the counts in an
 * IndexBuilder as the pipeline does, and stops. Prints the process's resident memory (all threads)
 * sampled every SAMPLE_MS and at each step, the peak, and CPU time; then a digest of the counts. Usage:
 *   node scripts/build.mjs   (dist/parallelWorker.js, the tokenizing threads' script)
 *   npx esbuild bench/countMemory.ts --bundle --platform=node --outfile=dist/countMemory.js
 *   node --expose-gc dist/countMemory.js <folder> [--include <pattern>]... [--threads N] [--no-sections] [--keep-threads]
 */
import { createHash } from 'node:crypto';
import { loadavg } from 'node:os';
import { IndexBuilder } from '../src/core/index/model/indexBuilder.js';
import { DEFAULT_INDEX_SETTINGS } from '../src/core/index/model/settings.js';
import { countFilesSorted } from '../src/node/parallel/sortedCount.js';
import { WorkerPool } from '../src/node/parallel/workerPool.js';
import { scanFolder } from '../src/node/scan.js';

const SAMPLE_MS = 100;
const args = process.argv.slice(2);
const folder = args.find((a, i) => !a.startsWith('--') && !args[i - 1]?.startsWith('--include') && !args[i - 1]?.startsWith('--threads'));
const include = args.flatMap((a, i) => (a === '--include' ? [args[i + 1]] : []));
const threadsAt = args.indexOf('--threads');
const threads = threadsAt >= 0 ? Number(args[threadsAt + 1]) : undefined;
if (!folder) {
  console.error('usage: countMemory.js <folder> [--include <pattern>]... [--threads N] [--no-sections] [--keep-threads]');
  process.exit(2);
}
const mb = (b: number): string => `${(b / 2 ** 20).toFixed(0)} MB`;
let peak = 0;
const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage.rss())), SAMPLE_MS);
const t0 = performance.now();
const cpu0 = process.cpuUsage();
const mark = (label: string): void => {
  const rss = process.memoryUsage.rss();
  peak = Math.max(peak, rss);
  const c = process.cpuUsage(cpu0);
  const m = process.memoryUsage();
  console.log(
    `${label.padEnd(34)} ${((performance.now() - t0) / 1000).toFixed(1).padStart(6)} s, CPU ${((c.user + c.system) / 1e6).toFixed(1).padStart(6)} s · ` +
      `RSS ${mb(rss).padStart(8)} (peak ${mb(peak)}) · main heap ${mb(m.heapUsed)}, array buffers ${mb(m.arrayBuffers)}`,
  );
};

async function main(): Promise<void> {
  const scan = await scanFolder(folder!, { include });
  mark(`scanned ${scan.files.length} files`);
  const pool = WorkerPool.start(threads === undefined ? {} : { threads });
  if (!pool) throw new Error('no thread pool (build dist/parallelWorker.js first: node scripts/build.mjs)');
  const jobs = scan.files.map((f) => ({ absPath: f.absPath, size: f.size, key: f.path }));
  const counted = await countFilesSorted(pool, jobs, {
    tokenize: DEFAULT_INDEX_SETTINGS.tokenize,
    maxFileBytes: 1 << 20,
    sections: !args.includes('--no-sections'),
    endThreads: !args.includes('--keep-threads'),
    onStep: (step) => mark(`step: ${step}`),
  });
  mark('counted');
  const builder = new IndexBuilder(DEFAULT_INDEX_SETTINGS, counted.vocab);
  let sections = 0;
  let fileEntries = 0;
  const sectionEntries = new Set<Int32Array>();
  counted.outcomes.forEach((got, i) => {
    const f = scan.files[i];
    if (got.kind !== 'text') return;
    builder.addCounted({ path: f.path, size: f.size, mtimeMs: f.mtimeMs }, got.terms);
    fileEntries += got.terms.termIds.length;
    sections += got.sections ? got.sections.starts.length : 0;
    if (got.sections) sectionEntries.add(got.sections.termIds);
  });
  const sectionTotal = [...sectionEntries].reduce((sum, ids) => sum + ids.length, 0);
  mark(`filed (${builder.size} files, ${sections} sections, ${counted.vocab.size} terms)`);
  console.log(
    `counts held: files ${fileEntries} entries, sections ${sectionTotal} entries (8 bytes each: ${mb(8 * (fileEntries + sectionTotal))})`,
  );
  await pool.close();
  (globalThis as { gc?: () => void }).gc?.();
  mark('threads ended');
  clearInterval(timer);
  console.log(
    `peak RSS ${mb(peak)}; load average ${loadavg()
      .map((x) => x.toFixed(1))
      .join(' ')}`,
  );
  // After the figures: a digest of everything counted (the vocabulary's bytes, each file's
  // outcome, counts and sections), so a change that should leave the counts alone can show it did.
  const hash = createHash('sha256');
  const bytes = (a: ArrayBufferView): void => void hash.update(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
  const v = counted.vocab.toBytes();
  bytes(v.bytes);
  bytes(v.starts);
  hash.update(`sorted ${v.sorted}`);
  for (const got of counted.outcomes) {
    hash.update(`|${got.kind}`);
    if (got.kind !== 'text') continue;
    hash.update(`${got.language ?? ''} ${got.terms.length}`);
    bytes(got.terms.termIds);
    bytes(got.terms.counts);
    const sec = got.sections;
    if (!sec) continue;
    bytes(sec.starts);
    bytes(sec.ends);
    hash.update(sec.titles.join('\0'));
    const a = sec.offsets[0];
    const b = sec.offsets[sec.offsets.length - 1];
    bytes(Int32Array.from(sec.offsets, (o) => o - a));
    bytes(sec.termIds.subarray(a, b));
    bytes(sec.counts.subarray(a, b));
  }
  console.log(`digest of the counts ${hash.digest('hex').slice(0, 16)}`);
}

void main().catch((err: unknown) => {
  console.error(err);
  process.exitCode = 1;
});
