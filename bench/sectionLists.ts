/**
 * Recall and latency of the section lists (src/core/sections/sectionLists.ts) against the exact
 * ranking, and what 8-bit section vectors do to the exact ranking. Usage:
 *   npx esbuild bench/sectionLists.ts --bundle --platform=node --format=esm --outfile=dist/sectionLists.mjs \
 *     --banner:js="import { createRequire } from 'module'; const require = createRequire(import.meta.url);"
 *   node dist/sectionLists.mjs <index file | fixture:NAME[,NAME…]> [queries] [--probe 8,16,24,32] [--word-files 32] [--start sample|kmeans++] [--file-groups 2] [--codes]
 * fixture:NAME builds an index of test/fixtures/NAME/docs.jsonl.gz (public documentation and code)
 * in this process, with sections; several names make one collection.
 * Queries are the bench's kind (bench/sectionLatency.ts): files picked evenly (seeded by position),
 * the title of each one's middle section as a search, its middle section as a Nearby-at-cursor.
 * Recall@10: the share of the exhaustive top 10 (SectionStore.rankScreened, equal to the full pass) that the lists' top 10
 * holds, mean over queries. Latency per request (wall and this process's CPU), median and p95,
 * after the lists are trained (the training's own time is printed once).
 * --codes: every section vector replaced by its 8-bit decoding (per-row scale, as
 * src/core/index/search/conceptCodes.ts codes), and the exhaustive top 10 compared with the f32 one.
 */
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { gunzipSync } from 'node:zlib';
import { IndexBuilder } from '../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../src/core/index/lsiIndex.js';
import { nearbySections, searchSections } from '../src/core/sections/sectionSearch.js';
import type { SectionHit, SectionStore } from '../src/core/sections/sectionStore.js';
import { foldContextOf, foldSections } from '../src/core/sections/sectionVectors.js';
import { loadIndex } from '../src/node/persist.js';

const argv = process.argv.slice(2);
const flag = (name: string): string | undefined => {
  const i = argv.indexOf(name);
  return i >= 0 ? argv.splice(i, 2)[1] : undefined;
};
const probes = (flag('--probe') ?? '4,8,16,24,32,48').split(',').map(Number);
const wordFiles = (flag('--word-files') ?? '32').split(',').map(Number);
const start = flag('--start') as 'sample' | 'kmeans++' | undefined;
const fileGroups = flag('--file-groups');
const codes = argv.includes('--codes');
const [source, count = '100'] = argv.filter((a) => a !== '--codes');
if (!source) {
  console.error('usage: sectionLists.mjs <index file | fixture:NAME[,NAME…]> [queries] [--probe 8,16,24] [--codes]');
  process.exit(2);
}

async function open(): Promise<LsiIndex> {
  if (source.startsWith('fixture:')) {
    const docs = source
      .slice('fixture:'.length)
      .split(',')
      .flatMap((name) =>
        gunzipSync(readFileSync(new URL(`../test/fixtures/${name}/docs.jsonl.gz`, import.meta.url)))
          .toString('utf8')
          .split('\n')
          .filter((l) => l.trim())
          .map((l) => JSON.parse(l) as { id: string; text: string })
          .map((d) => ({ id: `${name}/${d.id}`, text: d.text })),
      );
    const builder = new IndexBuilder({});
    for (const d of docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    const index = builder.build();
    const ctx = foldContextOf(index);
    for (const d of docs) index.sections.set(d.id, foldSections(ctx, d.id, d.text));
    return index;
  }
  const got = await loadIndex(source);
  if (got.status !== 'ok') {
    console.error(`cannot load ${source}: ${got.status}`);
    process.exit(1);
  }
  return got.index;
}

const index = await open();
const store: SectionStore = index.sections;
const files = [...store.entries()];
const n = Math.min(Number(count), files.length);
const pick = Array.from({ length: n }, (_, i) => files[Math.floor(((i + 0.5) * files.length) / n)]);
console.log(`${index.size} files, ${store.count} sections, k=${index.k}; ${n} queries; load ${loadavg()[0].toFixed(1)}`);

const key = (h: SectionHit): string => `${h.path}#${h.index}`;
const overlap = (a: SectionHit[], b: SectionHit[]): number => {
  const want = new Set(a.slice(0, 10).map(key));
  if (want.size === 0) return 1;
  return b.slice(0, 10).filter((h) => want.has(key(h))).length / want.size;
};
const quantiles = (ms: number[]): string => {
  const s = [...ms].sort((a, b) => a - b);
  return `median ${s[Math.floor(s.length / 2)].toFixed(1)} p95 ${s[Math.floor(s.length * 0.95)].toFixed(1)}`;
};
const cpuMs = (from: NodeJS.CpuUsage): number => {
  const d = process.cpuUsage(from);
  return (d.user + d.system) / 1000;
};

interface Run {
  search: SectionHit[][];
  near: SectionHit[][];
  wall: number[];
  cpu: number[];
  searchCpu: number[];
  nearCpu: number[];
  products: number;
}
/** The bench's queries with store.rank as `rank` is. */
function run(words = 32): Run {
  const out: Run = { search: [], near: [], wall: [], cpu: [], searchCpu: [], nearCpu: [], products: 0 };
  for (const [path, f] of pick) {
    const title = f.titles[Math.floor(f.titles.length / 2)];
    let t = performance.now();
    let c = process.cpuUsage();
    try {
      out.search.push(searchSections(index, title, { top: 10, wordFiles: words }));
      out.products += store.lastExact;
    } catch {
      out.search.push([]); // a title without known words
    }
    out.wall.push(performance.now() - t);
    out.cpu.push(cpuMs(c));
    out.searchCpu.push(out.cpu[out.cpu.length - 1]);
    t = performance.now();
    c = process.cpuUsage();
    out.near.push(nearbySections(index, path, f.starts[Math.floor(f.starts.length / 2)], { top: 10 })?.hits ?? []);
    out.products += store.lastExact;
    out.wall.push(performance.now() - t);
    out.cpu.push(cpuMs(c));
    out.nearCpu.push(out.cpu[out.cpu.length - 1]);
  }
  return out;
}
const mean = (xs: number[]): number => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length);
const rank = store.rank.bind(store);

const rss = (): string => `${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MiB`;
console.log(`RSS after loading: ${rss()}`);
// The exact ranking: the 8-bit screen over all sections (equal to the full pass, sectionStore.test.ts).
store.rank = (q, top, accept, perFile) => store.rankScreened(q, top, accept, perFile);
const exact = run();
console.log(`RSS after the exact screen: ${rss()}`);
console.log(
  `exhaustive: ${quantiles(exact.wall)} ms wall, ${quantiles(exact.cpu)} ms CPU per request (search ${quantiles(exact.searchCpu)}, nearby ${quantiles(exact.nearCpu)} ms CPU)`,
);

if (codes) {
  const saved = new Map([...store.entries()].map(([p, f]) => [p, f]));
  for (const [p, f] of saved) store.set(p, { ...f, vectors: decode8(f.vectors, index.k) });
  const coded = run();
  for (const [p, f] of saved) store.set(p, f);
  console.log(
    `8-bit vectors, exhaustive: top-10 agreement with f32 search ${mean(exact.search.map((e, i) => overlap(e, coded.search[i]))).toFixed(3)}, nearby ${mean(exact.near.map((e, i) => overlap(e, coded.near[i]))).toFixed(3)}`,
  );
}

if (start || fileGroups) store.configureLists({ ...(start ? { start } : {}), ...(fileGroups ? { fileGroups: Number(fileGroups) } : {}) });
const t = performance.now();
const c = process.cpuUsage();
store.rankLists(pick[0][1].vectors.subarray(0, index.k), 1);
const lists = store.lists()!;
console.log(
  `lists: ${lists.lists}, trained, filed and coded in ${(performance.now() - t).toFixed(0)} ms wall, ${cpuMs(c).toFixed(0)} ms CPU; RSS ${rss()}`,
);
for (const probe of probes)
  for (const words of wordFiles) {
    store.rank = (q, top, accept, perFile, also) => store.rankLists(q, top, accept, perFile, also, probe);
    const got = run(words);
    const rs = mean(exact.search.map((e, i) => overlap(e, got.search[i])));
    const rn = mean(exact.near.map((e, i) => overlap(e, got.near[i])));
    console.log(
      `probe ${probe} wordFiles ${words}: recall@10 search ${rs.toFixed(3)}, nearby ${rn.toFixed(3)}; products/request ${(got.products / (2 * n)).toFixed(0)}; ${quantiles(got.wall)} ms wall, ${quantiles(got.cpu)} ms CPU (search ${quantiles(got.searchCpu)}, nearby ${quantiles(got.nearCpu)}); load ${loadavg()[0].toFixed(1)}`,
    );
  }
store.rank = rank;

/** Each k-long row coded as conceptCodes.ts does (c = round(v/s), s = max|v|/127) and decoded (s·c). */
function decode8(v: Float32Array, k: number): Float32Array {
  const out = new Float32Array(v.length);
  for (let at = 0; at < v.length; at += k) {
    let max = 0;
    for (let c = 0; c < k; c++) max = Math.max(max, Math.abs(v[at + c]));
    const s = max / 127;
    for (let c = 0; c < k; c++) out[at + c] = s > 0 ? s * Math.round(v[at + c] / s) : 0;
  }
  return out;
}
