/**
 * Where a reopened index's memory goes, step by step, in one process (garbage collected before
 * each reading): resident set, V8 heap in use, and array buffers (typed arrays, the file's bytes).
 * Steps: the bare process; loaded (loadIndex, section rows left in the file unless --memory);
 * prepared as the editor's worker prepares it (word-match postings, 8-bit file screen); after a
 * file search and a file Nearby; after a section search and a section Nearby (the first trains and
 * files the section lists on a large tree; the lists are trained as a step of their own). Usage:
 *   npx esbuild bench/reopenMemory.ts --bundle --platform=node --format=esm --outfile=dist/reopenMemory.mjs \
 *     --banner:js="import { createRequire } from 'module'; const require = createRequire(import.meta.url);"
 *   node --expose-gc dist/reopenMemory.mjs <index file> [--memory]
 */
import { loadavg } from 'node:os';
import { loadIndex } from '../src/node/persist.js';
import { nearbySections, searchSections } from '../src/core/sections/sectionSearch.js';

const file = process.argv[2];
if (!file) {
  console.error('usage: reopenMemory.mjs <index file> [--memory]');
  process.exit(2);
}
const gc = (globalThis as { gc?: () => void }).gc;
if (!gc) console.warn('run with --expose-gc for readings after a full collection');
const mb = (b: number): string => `${(b / 2 ** 20).toFixed(0)} MB`;
const reading = (label: string): void => {
  gc?.();
  const m = process.memoryUsage();
  console.log(
    `${label.padEnd(44)} RSS ${mb(m.rss).padStart(8)} · heap used ${mb(m.heapUsed).padStart(7)} of ${mb(m.heapTotal).padStart(7)} · ` +
      `external ${mb(m.external).padStart(8)}, of which array buffers ${mb(m.arrayBuffers).padStart(8)}`,
  );
};
reading('bare process');
const t0 = performance.now();
const cpu0 = process.cpuUsage();
const got = await loadIndex(file, { sectionRows: process.argv.includes('--memory') ? 'memory' : 'file' });
if (got.status !== 'ok') {
  console.error(`cannot load ${file}: ${got.status}`);
  process.exit(1);
}
const index = got.index;
const loadMs = performance.now() - t0;
const cpu = process.cpuUsage(cpu0);
reading(`loaded (${(loadMs / 1000).toFixed(2)} s, CPU ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s)`);
await index.prepare();
reading('prepared (as the worker does)');
const query = 'memory allocation and power management';
const hits = index.search(query, { top: 10 });
if (hits.length > 0) index.nearby(hits[0].path, { top: 10 });
reading('after a file search and a Nearby');
{
  const t = performance.now();
  index.sections.lists();
  reading(`section lists trained (${((performance.now() - t) / 1000).toFixed(1)} s)`);
}
const sections = searchSections(index, query, { top: 10 });
reading('after a section search');
if (sections.length > 0) nearbySections(index, sections[0].path, sections[0].start, { top: 10 });
reading('after a section search and a section Nearby');
console.log(`${index.size} files, ${index.sections.count} sections, k=${index.k}; load average ${loadavg()[0].toFixed(1)}`);
