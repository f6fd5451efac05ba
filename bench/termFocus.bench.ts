/**
 * Cost of query-word focus (src/core/index/search/termFocus.ts) per search on a large saved index:
 * CPU time of LsiIndex.search with termFocus 0 and 1, alternating, each query first with a cold
 * focus cache (the index is edited-free, so the cache then holds its words), then warm. Reads the
 * index file itself (never writes next to it). Quality is not measured here.
 * Build and run from the root:
 *   npx esbuild bench/termFocus.bench.ts --bundle --platform=node --format=esm --outfile=out/bench/termFocus.mjs \
 *     --banner:js="import { createRequire } from 'module'; const require = createRequire(import.meta.url);"
 *   nice -n 5 node out/bench/termFocus.mjs INDEX_FILE [ROUNDS]
 */
import { readFileSync } from 'node:fs';
import { decodeIndex } from '../src/core/index/persistence/serialize.js';
import { DEFAULT_RANKING_OPTIONS } from '../src/core/index/search/fusion.js';

const QUERIES = [
  'how does the scheduler pick the next task to run',
  'where are network packets dropped when the receive queue is full',
  'free memory pages when the system runs low',
  'what happens when a usb device is unplugged',
  'read the temperature sensor over i2c',
  'mount a file system read only after an error',
];
const file = process.argv[2];
if (!file) throw new Error('usage: termFocus.mjs INDEX_FILE [ROUNDS]');
const rounds = Number(process.argv[3] ?? 3);
const t0 = process.cpuUsage();
const index = decodeIndex(readFileSync(file));
console.log(
  `loaded ${index.size} files, k=${index.k}, CPU ${((process.cpuUsage(t0).user + process.cpuUsage(t0).system) / 1e6).toFixed(1)} s`,
);
const cpu = (f: () => void): number => {
  const c = process.cpuUsage();
  f();
  const d = process.cpuUsage(c);
  return (d.user + d.system) / 1000;
};
index.ranking = { ...DEFAULT_RANKING_OPTIONS, termFocus: 0 };
for (const q of QUERIES) index.search(q); // postings of every query word built once, for both settings
const times: Record<string, number[]> = { off: [], cold: [], warm: [] };
for (let r = 0; r < rounds; r++) {
  for (const q of QUERIES) {
    index.ranking = { ...DEFAULT_RANKING_OPTIONS, termFocus: 0 };
    times.off.push(cpu(() => index.search(q)));
    index.ranking = { ...DEFAULT_RANKING_OPTIONS, termFocus: 1 };
    if (r === 0) times.cold.push(cpu(() => index.search(q)));
    else times.warm.push(cpu(() => index.search(q)));
  }
}
const stat = (xs: number[]): string => {
  const s = [...xs].sort((a, b) => a - b);
  return `median ${s[Math.floor(s.length / 2)].toFixed(1)} ms, min ${s[0].toFixed(1)}, max ${s[s.length - 1].toFixed(1)} (n=${s.length})`;
};
for (const [k, v] of Object.entries(times)) console.log(`search CPU, focus ${k}: ${stat(v)}`);
