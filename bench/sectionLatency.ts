/**
 * Latency of section search and Nearby at a section on a saved index (in process, after loading;
 * what the editor's worker pays per request). Usage:
 *   npx esbuild bench/sectionLatency.ts --bundle --platform=node --format=esm --outfile=dist/sectionLatency.mjs \
 *     --banner:js="import { createRequire } from 'module'; const require = createRequire(import.meta.url);"
 *   node dist/sectionLatency.mjs <index file> [queries] [--exact] [--cold] [--files]
 * RANKS=file.jsonl writes the top 20 of every timed request (path, position, score), one line each, to
 * compare rankings byte for byte between two builds.
 * FOCUS=p in the environment sets the search's query-word focus power (termFocus.ts; 0 = off).
 * NEARBY_TFIDF=ν[,words[,concept|match]] sets Nearby's TF-IDF share, how many of the page's words form its
 * query, and which part the share is taken from.
 * PROFILE=file.cpuprofile records a CPU profile of the timed requests only (after loading, prepare
 * and the first request), for Chrome DevTools or `node bench/profileTop.mjs file.cpuprofile`.
 * --exact ranks by the full pass (SectionStore.rankExact, the reference of the 8-bit screen and of
 * the probed lists that replace it from SECTION_LISTS_FROM sections on; recall: bench/sectionLists.ts).
 * --files also times the file-level search (LsiIndex.search) and Nearby of the file (LsiIndex.nearby)
 * for the same queries and files, after the section requests (so with the query words' focus cached).
 * Queries: the first words of sections' titles picked evenly over the index (seeded), so the run
 * needs nothing but the index. Prints median and 95th percentile in milliseconds, of the wall clock
 * and of this process's CPU time per request (user + system: the work itself, which a busy machine
 * stretches less than the wall clock).
 */
import { writeFileSync } from 'node:fs';
import { Session } from 'node:inspector/promises';
import { loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { loadIndex } from '../src/node/persist.js';
import { nearbySections, searchSections } from '../src/core/sections/sectionSearch.js';
import { SECTION_LISTS_FROM } from '../src/core/sections/sectionStore.js';

const args = process.argv.slice(2).filter((a) => a !== '--exact' && a !== '--cold' && a !== '--files');
const fileLevel = process.argv.includes('--files');
const exact = process.argv.includes('--exact');
const [file, count = '50'] = args;
if (!file) {
  console.error('usage: sectionLatency.mjs <index file> [queries]');
  process.exit(2);
}
const got = await loadIndex(file);
if (got.status !== 'ok') {
  console.error(`cannot load ${file}: ${got.status}`);
  process.exit(1);
}
const index = got.index;
if (process.env.FOCUS !== undefined) index.ranking = { ...index.ranking, termFocus: Number(process.env.FOCUS) };
// NEARBY_TFIDF=ν[,words[,concept|match]]: fusion.ts nearbyTfidfShare, nearbyTfidfTerms, nearbyTfidfFromConcept.
if (process.env.NEARBY_TFIDF !== undefined) {
  const [nu, words, from] = process.env.NEARBY_TFIDF.split(',');
  index.ranking = {
    ...index.ranking,
    nearbyTfidfShare: Number(nu),
    ...(words !== undefined ? { nearbyTfidfTerms: Number(words) } : {}),
    ...(from !== undefined ? { nearbyTfidfFromConcept: from === 'concept' } : {}),
  };
}
if (exact) index.sections.rank = index.sections.rankExact.bind(index.sections);
let products = 0;
const files = [...index.sections.entries()];
const n = Math.min(Number(count), files.length);
const pick = Array.from({ length: n }, (_, i) => files[Math.floor(((i + 0.5) * files.length) / n)]);
const quantiles = (ms: number[]): string => {
  ms.sort((a, b) => a - b);
  return `median ${ms[Math.floor(ms.length / 2)].toFixed(1)} ms, p95 ${ms[Math.floor(ms.length * 0.95)].toFixed(1)} ms`;
};
const search: number[] = [];
const near: number[] = [];
const searchCpu: number[] = [];
const nearCpu: number[] = [];
const planCpu: number[] = [];
const fileSearchCpu: number[] = [];
const fileNearCpu: number[] = [];
const fileSearch: number[] = [];
const fileNear: number[] = [];
const ranks: string[] = [];
const keep = (what: string, hits: readonly { path: string; score: number; index?: number }[]): void => {
  if (process.env.RANKS) ranks.push(JSON.stringify([what, hits.map((h) => [h.path, h.index ?? -1, h.score])]));
};
const cpuMs = (from: NodeJS.CpuUsage): number => {
  const d = process.cpuUsage(from);
  return (d.user + d.system) / 1000;
};
// What the editor's worker prepares in the background after a load (the word-match postings and
// the 8-bit file screen; src/node/worker/backgroundPrepare.ts), timed on its own; --cold skips it.
if (!process.argv.includes('--cold')) {
  const t = performance.now();
  const c = process.cpuUsage();
  await index.prepare();
  console.log(`prepare (as the worker does after loading): ${(performance.now() - t).toFixed(0)} ms wall, ${cpuMs(c).toFixed(0)} ms CPU`);
}
// The first request builds the screen (or trains and files the lists, from SECTION_LISTS_FROM
// sections on): timed on its own, outside the quantiles.
{
  const [path, f] = pick[0];
  const t = performance.now();
  const c = process.cpuUsage();
  nearbySections(index, path, f.starts[0], { top: 20 });
  console.log(
    `first request (builds the screen or the lists): ${(performance.now() - t).toFixed(0)} ms wall, ${cpuMs(c).toFixed(0)} ms CPU`,
  );
}
const profile = process.env.PROFILE ? new Session() : null;
if (profile) {
  profile.connect();
  await profile.post('Profiler.enable');
  await profile.post('Profiler.start');
}
for (const [path, f] of pick) {
  const title = f.titles[Math.floor(f.titles.length / 2)];
  let t = performance.now();
  let c = process.cpuUsage();
  try {
    keep(`search ${title}`, searchSections(index, title, { top: 20 }));
    search.push(performance.now() - t);
    searchCpu.push(cpuMs(c));
    products += index.sections.lastExact;
  } catch {
    /* a title without known words */
  }
  c = process.cpuUsage();
  try {
    index.searchPlan(title); // the file-level part alone (word matches, concept query), after the search
    planCpu.push(cpuMs(c));
  } catch {
    /* a title without known words */
  }
  t = performance.now();
  c = process.cpuUsage();
  keep(`nearby ${path}`, nearbySections(index, path, f.starts[Math.floor(f.starts.length / 2)], { top: 20 })?.hits ?? []);
  near.push(performance.now() - t);
  nearCpu.push(cpuMs(c));
  products += index.sections.lastExact;
  if (!fileLevel) continue;
  // The file-level features on the same index, for comparison (search by meaning, Nearby of the file).
  t = performance.now();
  c = process.cpuUsage();
  try {
    keep(`file search ${title}`, index.search(title, { top: 20 }));
    fileSearch.push(performance.now() - t);
    fileSearchCpu.push(cpuMs(c));
  } catch {
    /* a title without known words */
  }
  t = performance.now();
  c = process.cpuUsage();
  keep(`file nearby ${path}`, index.nearby(path, { top: 20 }));
  fileNear.push(performance.now() - t);
  fileNearCpu.push(cpuMs(c));
}
if (process.env.RANKS) writeFileSync(process.env.RANKS, ranks.join('\n') + '\n');
if (profile) {
  const { profile: recorded } = await profile.post('Profiler.stop');
  writeFileSync(process.env.PROFILE!, JSON.stringify(recorded));
  profile.disconnect();
}
const mode = exact ? 'full pass' : index.sections.count >= SECTION_LISTS_FROM ? 'probed lists' : '8-bit screen';
console.log(`${index.size} files, ${index.sections.count} sections, k=${index.k}, ${mode}`);
console.log(`RSS at the end: ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MiB`);
console.log(`exact section products per request: ${(products / (search.length + near.length)).toFixed(0)}`);
console.log(`search --sections: ${quantiles(search)} (${search.length} queries)`);
console.log(`nearby at a section: ${quantiles(near)} (${near.length} sections)`);
console.log(`CPU per request: search ${quantiles(searchCpu)}; nearby ${quantiles(nearCpu)}`);
if (fileLevel) {
  console.log(`file-level search: ${quantiles(fileSearch)}; Nearby of a file: ${quantiles(fileNear)}`);
  console.log(`CPU per request, file level: search ${quantiles(fileSearchCpu)}; Nearby ${quantiles(fileNearCpu)}`);
}
console.log(`CPU of the search plan alone (file-level word matches and concept query): ${quantiles(planCpu)}`);
console.log(`1-minute load average at the end: ${loadavg()[0].toFixed(1)}`);
