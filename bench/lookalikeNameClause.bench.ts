/**
 * Calibrating the "same content, other words" rule (retold.ts) so that it adds as few pairs as it
 * can on a real folder without retellings. No assertions: figures for choosing options.ts's
 * retold* defaults. Run: npm run bench:lookalike-names
 *
 * The finder (findLookalikes) runs once per folder at its loosest (margin clause a ≥ 0.3 and never
 * overruled by names; name clause b: mutual nearest neighbours, ≥ 1 name, share ≥ 0.5, any length);
 * every pair it reports carries its margin, shared names, share and the rare names each file holds,
 * so each grid point is a filter of that one run. Folders:
 * - test/fixtures/lookalike-retellings (Debian 12 manual pages vs Texinfo chapters, 125 retellings
 *   in two sources, coreutils and gnu-other), and the same folder without the Texinfo side;
 * - test/fixtures/cmake-doc (CMake reference manual, 1,906 pages, no planted retelling): a target
 *   property and the variable that sets its default are two pages of one setting, two Find modules
 *   of one template are two pages of one kind.
 * Grid: clause a's margin 0.3, 0.35, 0.4; names decide (when both files hold rare names clause a
 * does not apply), decide only when they differ (share < 0.9), or never; clause b's margin 0, 0.05, 0.1, names ≥ 1, 2, 3, share ≥ 0.8, 0.85, 0.9,
 * 0.95, the shorter file's words (shingle tokens) ≥ 100, 200.
 * Choice, leaving one fixture source out: among points with at most 3 false pairs on the fixture,
 * at most 1 pair per 1,000 files without the retellings, and no fewer retellings of the training
 * source than the earlier default, the fewest CMake pairs; then the most retellings of the training
 * source; ties to the stricter point. Scored on the other source.
 */
import { DEFAULT_LOOKALIKE_OPTIONS } from '../src/core/lookalike/options.js';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import { shingleTokens } from '../src/core/lookalike/shingles.js';
import type { LookalikeReport } from '../src/core/lookalike/types.js';
import { jsonlFiles, pairKey, retellingsCorpus } from './lookalikeMaterial.js';

interface Cand {
  a: string;
  b: string;
  gap: number;
  names: number;
  share: number;
  /** Rare names each file holds. */
  held: readonly [number, number];
  words: number;
  label: string;
}

const key = pairKey;
const corpus = retellingsCorpus();
const truth = new Map(corpus.retellings.map(([a, b, s]) => [key(a, b), s]));
const cmake = jsonlFiles('test/fixtures/cmake-doc/docs.jsonl.gz');

const loose = {
  retoldMinGap: 0.3,
  retoldNameMinGap: 0,
  retoldMinSharedNames: 1,
  retoldMinNameShare: 0.5,
  retoldNameMinWords: 0,
  retoldNamesDecide: false,
};
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
      held: p.namesHeld ?? [0, 0],
      words: Math.min(words.get(p.a)!, words.get(p.b)!),
      label: k ? truth.get(k)! : '',
    };
  });
}

const t0 = Date.now();
const full = candidates(corpus.files);
const infoSide = new Set(corpus.retellings.map((r) => r[1]));
const bareFiles = corpus.files.filter((f) => !infoSide.has(f.id));
const bare = candidates(bareFiles);
const cm = candidates(cmake);
console.log(`finder runs: ${((Date.now() - t0) / 1000).toFixed(0)} s`);

interface Point {
  /** Clause a's least margin, and when names decide for pairs whose files both hold some: 'always', 'differ' (share < 0.9) or 'never'. */
  ga: number;
  decide: 'always' | 'differ' | 'never';
  /** Clause b: least margin, names, share, shorter file's words. */
  gb: number;
  nn: number;
  ns: number;
  minWords: number;
}
const passes = (p: Point) => (c: Cand) =>
  (c.gap >= p.ga && !(c.held[0] > 0 && c.held[1] > 0 && (p.decide === 'always' || (p.decide === 'differ' && c.share < 0.9)))) ||
  (c.gap >= p.gb && c.names >= p.nn && c.share >= p.ns && c.words >= p.minWords);
const sources = [...new Set(corpus.retellings.map((r) => r[2]))];
const total = (s: string) => corpus.retellings.filter((r) => r[2] === s).length;
function measure(p: Point) {
  const ok = passes(p);
  const hits: Record<string, number> = {};
  let fp = 0;
  for (const c of full.filter(ok)) {
    if (c.label) hits[c.label] = (hits[c.label] ?? 0) + 1;
    else fp++;
  }
  return { p, hits, fp, bare: bare.filter(ok).length, cmake: cm.filter(ok).length };
}
type Row = ReturnType<typeof measure>;
const earlier: Point = { ga: 0.35, decide: 'never', gb: 0.1, nn: 3, ns: 0.9, minWords: 100 };
const d = DEFAULT_LOOKALIKE_OPTIONS;
const defaults: Point = {
  ga: d.retoldMinGap,
  decide: d.retoldNamesDecide ? 'always' : 'never',
  gb: d.retoldNameMinGap,
  nn: d.retoldMinSharedNames,
  ns: d.retoldMinNameShare,
  minWords: d.retoldNameMinWords,
};
const rows: Row[] = [];
for (const ga of [0.3, 0.35, 0.4])
  for (const decide of ['never', 'differ', 'always'] as const)
    for (const gb of [0, 0.05, 0.1])
      for (const nn of [1, 2, 3])
        for (const ns of [0.8, 0.85, 0.9, 0.95])
          for (const minWords of [100, 200]) rows.push(measure({ ga, decide, gb, nn, ns, minWords }));

const describe = (p: Point) =>
  `a: margin ≥ ${p.ga}${p.decide === 'always' ? ', names decide' : p.decide === 'differ' ? ', names decide when they differ' : ''}; b: margin ≥ ${p.gb}, names ≥ ${p.nn}, share ≥ ${p.ns}, words ≥ ${p.minWords}`;
const recall = (r: Row) => sources.map((s) => `${s} ${r.hits[s] ?? 0}/${total(s)}`).join(', ');
const line = (r: Row) =>
  `| ${describe(r.p)} | ${sources.reduce((s, t) => s + (r.hits[t] ?? 0), 0)}/${truth.size} (${recall(r)}) | ${r.fp} | ${r.bare} | ${r.cmake} |`;
console.log(`| rule | fixture retellings | false pairs | without retellings (${bareFiles.length} files) | CMake pairs |`);
const before = measure(earlier);
console.log(line(before) + ' (earlier default)');
console.log(line(measure(defaults)) + ' (default)');
console.log('every grid point with at most 3 false pairs and at most 1 per 1,000 files without the retellings, fewest CMake pairs first:');
for (const r of rows.filter((r) => r.fp <= 3 && r.bare <= bareFiles.length / 1000).sort((x, y) => x.cmake - y.cmake)) console.log(line(r));

// Leave one source out (and both sources together, which gives the default).
const order = (x: Point['decide']): number => ['never', 'differ', 'always'].indexOf(x);
const strict = (x: Row, y: Row) =>
  y.p.ga - x.p.ga ||
  order(y.p.decide) - order(x.p.decide) ||
  y.p.gb - x.p.gb ||
  y.p.nn - x.p.nn ||
  y.p.ns - x.p.ns ||
  y.p.minWords - x.p.minWords;
for (const held of [...sources, null]) {
  const train = sources.filter((s) => s !== held);
  const score = (r: Row) => train.reduce((s, t) => s + (r.hits[t] ?? 0), 0);
  const fits = rows.filter((r) => r.fp <= 3 && r.bare <= bareFiles.length / 1000 && score(r) >= score(before));
  const best = fits.sort((x, y) => x.cmake - y.cmake || score(y) - score(x) || strict(x, y))[0];
  console.log(
    `${held === null ? 'both sources' : `leave ${held} out`}: ${describe(best.p)} → ${train.map((t) => `${t} ${best.hits[t] ?? 0}/${total(t)}`).join(', ')} (chosen on)` +
      (held === null ? '' : `; ${held} ${best.hits[held] ?? 0}/${total(held)} (held out)`) +
      `; ${best.fp} false, ${best.bare} without retellings, CMake ${best.cmake} (earlier default ${before.cmake})`,
  );
}

const ok = passes(defaults);
console.log('pairs of the default rule outside the key (fixture, then without retellings, then CMake):');
for (const c of [...full.filter((c) => ok(c) && !c.label), ...bare.filter(ok), ...cm.filter(ok)])
  console.log(
    `  ${c.a} ~ ${c.b}  words ${c.words}, names ${c.names} (held ${c.held.join('/')}), share ${c.share.toFixed(2)}, margin ${c.gap.toFixed(2)}`,
  );
console.log('CMake pairs of the earlier default that names-decide drops:');
for (const c of cm.filter((c) => passes(earlier)(c) && !ok(c)))
  console.log(
    `  ${c.a} ~ ${c.b}  words ${c.words}, names ${c.names} (held ${c.held.join('/')}), share ${c.share.toFixed(2)}, margin ${c.gap.toFixed(2)}`,
  );
const withDefaults = findLookalikes({ files: cmake });
console.log(`cmake-doc with the defaults: ${withDefaults.retoldPairs.length} "same content" pairs in ${cmake.length} files`);
