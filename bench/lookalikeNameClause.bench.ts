/**
 * Calibrating clause b of the "same content, other words" rule (retold.ts: a pair a little clear
 * of its neighbourhood that holds the same rare names) so that it adds no pair on a real folder
 * without retellings. No assertions: figures for choosing options.ts's retold* defaults.
 * Run: npm run bench:lookalike-names
 *
 * The finder (findLookalikes) runs once per folder with clause b at its loosest (margin ≥ 0.1, ≥ 1
 * name, share ≥ 0.5); every pair it reports carries its margin, shared names and share, so each grid
 * point is a filter of that one run (clause a, margin ≥ retoldMinGap, always passes). Folders:
 * - test/fixtures/lookalike-retellings (Debian 12 manual pages vs Texinfo chapters, 125 retellings
 *   in two sources, coreutils and gnu-other), and the same folder without the Texinfo side;
 * - test/fixtures/cmake-doc (CMake reference manual, 1,906 pages, no planted retelling): a target
 *   property and the variable that sets its default are two pages of one setting, not retellings.
 * Grid: names ≥ 1, 2, 3; share ≥ 0.9, 0.95, 1; the shorter file's words (shingle tokens) ≥ 0, 100, 200, 400
 * (a stub page that only points to another has few words); margin ≥ 0.1, 0.15, 0.2.
 * Choice, leaving one fixture source out: among points whose CMake count does not exceed clause a's
 * alone and with at most 3 false pairs on the fixture and none more than clause a without the
 * retellings, the most retellings of the other source; ties to the stricter point.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { DEFAULT_LOOKALIKE_OPTIONS } from '../src/core/lookalike/options.js';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import { shingleTokens } from '../src/core/lookalike/shingles.js';
import type { LookalikeReport } from '../src/core/lookalike/types.js';

interface Corpus {
  files: { id: string; source: string; text: string }[];
  retellings: [string, string, string][];
}
interface Cand {
  a: string;
  b: string;
  gap: number;
  names: number;
  share: number;
  words: number;
  label: string;
}

const key = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`);
const corpus = JSON.parse(gunzipSync(readFileSync('test/fixtures/lookalike-retellings/corpus.json.gz')).toString('utf8')) as Corpus;
const truth = new Map(corpus.retellings.map(([a, b, s]) => [key(a, b), s]));
const cmake = gunzipSync(readFileSync('test/fixtures/cmake-doc/docs.jsonl.gz'))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.length > 0)
  .map((l) => JSON.parse(l) as { id: string; text: string });

const loose = { retoldNameMinGap: 0.1, retoldMinSharedNames: 1, retoldMinNameShare: 0.5, retoldNameMinWords: 0 };
const wordCount = (t: string): number => shingleTokens(t).length;

function candidates(files: { id: string; text: string }[]): Cand[] {
  const words = new Map(files.map((f) => [f.id, wordCount(f.text)]));
  const r: LookalikeReport = findLookalikes({ files }, loose);
  const copies = new Map<string, readonly string[]>();
  for (const g of r.exactGroups) for (const f of g.files) copies.set(f, g.files);
  return r.retoldPairs.map((p) => {
    const keys = (copies.get(p.a) ?? [p.a]).flatMap((x) => (copies.get(p.b) ?? [p.b]).map((y) => key(x, y)));
    const k = keys.find((x) => truth.has(x));
    return {
      a: p.a,
      b: p.b,
      gap: p.gap!,
      names: p.sharedNames ?? 0,
      share: p.nameShare ?? 0,
      words: Math.min(words.get(p.a)!, words.get(p.b)!),
      label: k ? truth.get(k)! : '',
    };
  });
}

const t0 = Date.now();
const full = candidates(corpus.files);
const infoSide = new Set(corpus.retellings.map((r) => r[1]));
const bare = candidates(corpus.files.filter((f) => !infoSide.has(f.id)));
const cm = candidates(cmake);
console.log(`finder runs: ${((Date.now() - t0) / 1000).toFixed(0)} s`);

interface Point {
  ng: number;
  nn: number;
  ns: number;
  minWords: number;
}
const clauseA = (c: Cand) => c.gap >= DEFAULT_LOOKALIKE_OPTIONS.retoldMinGap;
const passes = (p: Point | null) => (c: Cand) =>
  clauseA(c) || (p !== null && c.gap >= p.ng && c.names >= p.nn && c.share >= p.ns && c.words >= p.minWords);
const sources = [...new Set(corpus.retellings.map((r) => r[2]))];
const total = (s: string) => corpus.retellings.filter((r) => r[2] === s).length;
function measure(p: Point | null) {
  const ok = passes(p);
  const hits: Record<string, number> = {};
  let fp = 0;
  for (const c of full.filter(ok)) {
    if (c.label) hits[c.label] = (hits[c.label] ?? 0) + 1;
    else fp++;
  }
  return { p, hits, fp, bare: bare.filter(ok).length, cmake: cm.filter(ok).length };
}
const base = measure(null);
const rows = [base];
for (const ng of [0.1, 0.15, 0.2])
  for (const nn of [1, 2, 3])
    for (const ns of [0.9, 0.95, 1]) for (const minWords of [0, 100, 200, 400]) rows.push(measure({ ng, nn, ns, minWords }));

const describe = (p: Point | null) =>
  p === null ? 'clause a only (margin ≥ 0.35)' : `margin ≥ ${p.ng}, names ≥ ${p.nn}, share ≥ ${p.ns}, words ≥ ${p.minWords}`;
const recall = (r: (typeof rows)[number]) => sources.map((s) => `${s} ${r.hits[s] ?? 0}/${total(s)}`).join(', ');
console.log(`| clause b | fixture retellings | false pairs | without retellings (${bare.length === 0 ? 0 : ''}) | CMake pairs |`);
for (const r of rows) {
  if (r.p !== null && r.p.ng !== 0.1) continue;
  const n = sources.reduce((s, t) => s + (r.hits[t] ?? 0), 0);
  console.log(`| ${describe(r.p)} | ${n}/${truth.size} (${recall(r)}) | ${r.fp} | ${r.bare} | ${r.cmake} |`);
}
console.log('margins 0.15 and 0.2 (rows differing from 0.1 only):');
for (const r of rows) {
  if (r.p === null || r.p.ng === 0.1) continue;
  const same = rows.find((x) => x.p?.ng === 0.1 && x.p.nn === r.p!.nn && x.p.ns === r.p!.ns && x.p.minWords === r.p!.minWords)!;
  if (same.cmake === r.cmake && same.fp === r.fp && sources.every((s) => same.hits[s] === r.hits[s])) continue;
  console.log(`| ${describe(r.p)} | ${recall(r)} | ${r.fp} | ${r.bare} | ${r.cmake} |`);
}

// Leave one source out.
const strict = (x: (typeof rows)[number], y: (typeof rows)[number]) =>
  (y.p?.ng ?? 9) - (x.p?.ng ?? 9) ||
  (y.p?.nn ?? 9) - (x.p?.nn ?? 9) ||
  (y.p?.ns ?? 9) - (x.p?.ns ?? 9) ||
  (y.p?.minWords ?? 1e9) - (x.p?.minWords ?? 1e9);
for (const held of sources) {
  const train = sources.filter((s) => s !== held);
  const score = (r: (typeof rows)[number]) => train.reduce((s, t) => s + (r.hits[t] ?? 0), 0);
  const fits = rows.filter((r) => r.cmake <= base.cmake && r.fp <= 3 && r.bare <= base.bare);
  const best = fits.sort((x, y) => score(y) - score(x) || strict(x, y))[0];
  console.log(
    `leave ${held} out: ${describe(best.p)} → ${train.map((t) => `${t} ${best.hits[t] ?? 0}/${total(t)}`).join(', ')} (chosen on); ` +
      `${held} ${best.hits[held] ?? 0}/${total(held)} (held out); ${best.fp} false, ${best.bare} without retellings, CMake ${best.cmake} (clause a ${base.cmake})`,
  );
}

// A stub filter on both clauses: the shorter file's words ≥ W for every pair, clause b at the defaults.
console.log('the word floor on both clauses (clause b at the defaults):');
const d = DEFAULT_LOOKALIKE_OPTIONS;
for (const w of [0, 50, 100, 200]) {
  const ok = (c: Cand) =>
    c.words >= w &&
    (clauseA(c) ||
      (c.gap >= d.retoldNameMinGap &&
        c.names >= d.retoldMinSharedNames &&
        c.share >= d.retoldMinNameShare &&
        c.words >= d.retoldNameMinWords));
  const hits = full.filter((c) => ok(c) && c.label);
  console.log(
    `  words ≥ ${w}: fixture ${hits.length}/${truth.size} (${sources.map((s) => `${s} ${hits.filter((c) => c.label === s).length}`).join(', ')}), ` +
      `${full.filter((c) => ok(c) && !c.label).length} false, ${bare.filter(ok).length} without retellings, CMake ${cm.filter(ok).length}`,
  );
}

// The CMake pairs clause b adds at the loosest point, for reading.
console.log('CMake pairs only clause b passes (loosest), smaller word count, names, share, margin:');
for (const c of cm.filter((c) => !clauseA(c)).sort((x, y) => x.words - y.words))
  console.log(`  ${c.a} ~ ${c.b}  words ${c.words}, names ${c.names}, share ${c.share.toFixed(2)}, margin ${c.gap.toFixed(2)}`);
console.log('fixture retellings only clause b passes (loosest):');
for (const c of full.filter((c) => !clauseA(c) && c.label).sort((x, y) => x.words - y.words))
  console.log(`  ${c.a} ~ ${c.b}  words ${c.words}, names ${c.names}, share ${c.share.toFixed(2)}, margin ${c.gap.toFixed(2)}`);
console.log('fixture false pairs only clause b passes (loosest):');
for (const c of [...full.filter((c) => !clauseA(c) && !c.label), ...bare.filter((c) => !clauseA(c))])
  console.log(`  ${c.a} ~ ${c.b}  words ${c.words}, names ${c.names}, share ${c.share.toFixed(2)}, margin ${c.gap.toFixed(2)}`);
console.log('CMake pairs clause a passes (margin ≥ 0.35):');
for (const c of cm.filter(clauseA))
  console.log(`  ${c.a} ~ ${c.b}  words ${c.words}, names ${c.names}, share ${c.share.toFixed(2)}, margin ${c.gap.toFixed(2)}`);
const withDefaults = findLookalikes({ files: cmake });
console.log(`cmake-doc with the defaults: ${withDefaults.retoldPairs.length} "same content" pairs in ${cmake.length} files`);
