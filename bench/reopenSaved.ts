/**
 * Reopening a saved index as the editor's worker does (loadIndex, in process): wall clock and CPU
 * seconds until the index answers, then the first file search and the first section search
 * (which waits for the check of the section rows and codes when it has not finished), and the
 * resident memory after each. No assertions; figures only (issue 13: reopen under 2 s).
 *
 *   npx esbuild bench/reopenSaved.ts --bundle --platform=node --format=esm --outfile=dist/reopenSaved.mjs \
 *     --banner:js="import { createRequire } from 'module'; const require = createRequire(import.meta.url);"
 *   node dist/reopenSaved.mjs <index file> [--wait-check]
 * (Bundled whole, as bench/reopenMemory.ts: with --packages=external Node 20 refuses the stop-word
 * list's JSON import from an ES module.)
 * --wait-check waits for the background check of the whole file before the first request.
 */
import { loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { loadIndex } from '../src/node/persist.js';
import { searchSections } from '../src/core/sections/sectionSearch.js';

const file = process.argv[2];
if (!file) {
  console.error('usage: reopenSaved.mjs <index file> [--wait-check]');
  process.exit(2);
}
const mb = (b: number): string => `${(b / 1048576).toFixed(0)} MB`;
const cpu = (from: NodeJS.CpuUsage): number => {
  const c = process.cpuUsage(from);
  return (c.user + c.system) / 1e6;
};
const c0 = process.cpuUsage();
const t0 = performance.now();
const got = await loadIndex(file, { checkRows: 'later' }); // as the editor's worker loads
const loadWall = (performance.now() - t0) / 1000;
const loadCpu = cpu(c0);
if (got.status !== 'ok') {
  console.error(`cannot load ${file}: ${got.status}${got.status === 'damaged' ? ` (${got.reason})` : ''}`);
  process.exit(1);
}
const index = got.index;
console.log(`load: ${loadWall.toFixed(2)} s wall, ${loadCpu.toFixed(2)} s CPU, RSS ${mb(process.memoryUsage.rss())}`);
// LOAD_ONLY=1: stop here (for a CPU profile of the load alone).
if (process.env.LOAD_ONLY) process.exit(0);
const checked = got.checked;
if (process.argv.includes('--wait-check') && checked) {
  const c1 = process.cpuUsage();
  const t1 = performance.now();
  await checked;
  console.log(`background check: ${((performance.now() - t1) / 1000).toFixed(2)} s wall, ${cpu(c1).toFixed(2)} s CPU`);
}
const query = 'memory allocation page table';
let c1 = process.cpuUsage();
let t1 = performance.now();
const hits = index.search(query, { top: 10 });
console.log(
  `first file search: ${(performance.now() - t1).toFixed(0)} ms wall, ${(cpu(c1) * 1000).toFixed(0)} ms CPU (${hits.length} hits), RSS ${mb(process.memoryUsage.rss())}`,
);
c1 = process.cpuUsage();
t1 = performance.now();
const sectionHits = searchSections(index, query, { top: 10 });
console.log(
  `first section search: ${(performance.now() - t1).toFixed(0)} ms wall, ${(cpu(c1) * 1000).toFixed(0)} ms CPU (${sectionHits.length} hits), RSS ${mb(process.memoryUsage.rss())}`,
);
console.log(
  `total CPU ${cpu(c0).toFixed(2)} s; load average ${loadavg()
    .map((x) => x.toFixed(2))
    .join(' ')}`,
);
index.sections.closeRows();
