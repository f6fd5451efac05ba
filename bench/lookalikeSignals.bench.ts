/**
 * Which signals separate a natural retelling from a same-area neighbour, measured on
 * test/fixtures/lookalike-retellings (Debian 12 manual pages vs Texinfo "invocation" chapters; see
 * its README). No assertions: figures for choosing the "same content, other words" rule (retold.ts).
 * Run: npm run bench:lookalike-signals
 *
 * Candidates: each file's 3 nearest neighbours in the full term space (termSpace.ts, boilerplate
 * lines left out), neighbours sharing text (exact shingle Jaccard ≥ 0.3) collapsed, pairs with
 * Jaccard < 0.2. For each signal: retellings ranked above the 1st, 2nd, 3rd and 4th false pair
 * (a pair not in the key), and the "same content" pairs at the 3-false-pair level in the folder
 * without the retellings' Texinfo side. Then plain TF-IDF cosine as a baseline; leave-one-source-
 * out over both clauses of the rule (least cosine, margin; name-clause margin, names, share): the
 * grid point with the most retellings of one source, at ≤ 3 false pairs and ≤ 1 pair per 1,000
 * files without retellings, scored on the other source; last, the pairs the finder reports with
 * and without the name clause in the CMake reference (test/fixtures/cmake-doc). The name clause's
 * own constants (shared names, share, the shorter file's words) are calibrated against that CMake
 * reference in bench/lookalikeNameClause.bench.ts; this grid predates that floor on words.
 */
import { boilerplateLines, withoutBoilerplate } from '../src/core/lookalike/retold.js';
import { jaccardSorted, shingleSet } from '../src/core/lookalike/shingles.js';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import { rareNameIndex } from '../src/core/lookalike/rareNames.js';
import { buildTermSpace, rowCosine, termNeighbours, type TermSpace } from '../src/core/lookalike/termSpace.js';
import { jsonlFiles, pairKey, retellingsCorpus } from './lookalikeMaterial.js';

interface Corpus {
  files: { id: string; text: string }[];
  retellings: [string, string, string][];
}
interface Pair {
  label: string;
  cos: number;
  mutual: boolean;
  next: number;
  next2: number;
  meanA: number;
  meanB: number;
  rare: number;
  j: number;
  /** Rare names (rareNames.ts, df ≤ 10) both hold, and their share. */
  names: number;
  nameShare: number;
}

const corpus: Corpus = retellingsCorpus();
const key = pairKey;
const truth = new Map(corpus.retellings.map(([a, b, s]) => [key(a, b), s]));

function pairsOf(files: Corpus['files']): Pair[] {
  const n = files.length;
  const sets = files.map((f) => shingleSet(f.text, 5).hashes);
  const bp = boilerplateLines(
    files.map((f) => f.text),
    3,
  );
  const space = buildTermSpace(files.map((f) => withoutBoilerplate(f.text, bp)));
  const K = 20;
  const nb = termNeighbours(space, { k: K, candidates: 100, maxDf: Math.max(100, Math.floor(0.05 * n)) });
  const names = rareNameIndex(
    files.map((f) => f.text),
    10,
  );
  const lists = files.map((_, i) => {
    const kept: { d: number; c: number }[] = [];
    for (let r = 0; r < K; r++) {
      const d = nb.index[i * K + r];
      if (d < 0) break;
      if (jaccardSorted(sets[i], sets[d]) >= 0.3 || kept.some((e) => jaccardSorted(sets[e.d], sets[d]) >= 0.3)) continue;
      kept.push({ d, c: nb.cosine[i * K + r] });
    }
    return kept;
  });
  const others = (i: number, not: number) => lists[i].filter((x) => x.d !== not).map((x) => x.c);
  const mean = (v: number[]) => v.slice(0, 9).reduce((s, x) => s + x, 0) / Math.max(1, Math.min(9, v.length));
  const out: Pair[] = [];
  const seen = new Set<string>();
  for (let i = 0; i < n; i++) {
    for (const { d } of lists[i].slice(0, 3)) {
      const k = key(files[i].id, files[d].id);
      if (seen.has(k)) continue;
      seen.add(k);
      const j = jaccardSorted(sets[i], sets[d]);
      if (j >= 0.2) continue;
      const oi = others(i, d);
      const od = others(d, i);
      out.push({
        label: truth.get(k) ?? '',
        cos: rowCosine(space, i, d),
        mutual: lists[i][0]?.d === d && lists[d][0]?.d === i,
        next: Math.max(oi[0] ?? 0, od[0] ?? 0),
        next2: Math.max(oi[1] ?? 0, od[1] ?? 0),
        meanA: mean(oi),
        meanB: mean(od),
        rare: rareCosine(space, i, d, 20),
        j,
        names: names.pair(i, d).shared,
        nameShare: names.pair(i, d).share,
      });
    }
  }
  return out;
}

/** The part of the cosine carried by terms in at most maxDf files. */
function rareCosine(s: TermSpace, a: number, b: number, maxDf: number): number {
  let p = s.rowStart[a];
  let q = s.rowStart[b];
  let dot = 0;
  while (p < s.rowStart[a + 1] && q < s.rowStart[b + 1]) {
    const x = s.terms[p];
    const y = s.terms[q];
    if (x === y) {
      if (s.df[x] <= maxDf) dot += s.weights[p] * s.weights[q];
      p++;
      q++;
    } else if (x < y) p++;
    else q++;
  }
  return dot;
}

const all = pairsOf(corpus.files);
const infoSide = new Set(corpus.retellings.map((r) => r[1]));
const without = corpus.files.filter((f) => !infoSide.has(f.id));
const bare = pairsOf(without);

const signals: Record<string, (p: Pair) => number> = {
  cosine: (p) => p.cos,
  'margin over next neighbour': (p) => p.cos - p.next,
  'margin over 2nd next neighbour': (p) => p.cos - p.next2,
  'cosine / next neighbour': (p) => p.cos / Math.max(p.next, 1e-3),
  'margin over neighbourhood means (CSLS)': (p) => 2 * p.cos - p.meanA - p.meanB,
  'shared rare terms (df ≤ 20)': (p) => p.rare,
  'margin + shared rare terms': (p) => p.cos - p.next + p.rare,
  'shared rare names (share)': (p) => p.nameShare,
  'margin + shared rare names (share)': (p) => p.cos - p.next + p.nameShare,
};
console.log(`signals on ${corpus.files.length} files, ${truth.size} retellings (mutual nearest neighbours only):`);
for (const [name, f] of Object.entries(signals)) {
  const ranked = all.filter((p) => p.mutual).sort((x, y) => f(y) - f(x));
  const before: number[] = [];
  let tp = 0;
  let at3 = Infinity;
  for (const p of ranked) {
    if (p.label) tp++;
    else {
      before.push(tp);
      if (before.length === 4) {
        at3 = f(p);
        break;
      }
    }
  }
  const bareCount = bare.filter((p) => p.mutual && f(p) > at3).length;
  console.log(`  ${name.padEnd(40)} retellings before false pair 1–4: ${before.join(', ')}; without retellings ${bareCount} pairs`);
}

// Plain TF-IDF cosine in the full term space (no boilerplate removal, no neighbourhood): every
// file's 10 nearest neighbours, pairs sharing little text (Jaccard < 0.3), ranked by cosine.
function plainBaseline(files: Corpus['files']): { before: number[]; bare: number } {
  const sets = files.map((f) => shingleSet(f.text, 5).hashes);
  const space = buildTermSpace(files.map((f) => f.text));
  const K = 10;
  const nb = termNeighbours(space, { k: K, candidates: 50, maxDf: Math.max(100, Math.floor(0.05 * files.length)) });
  const seen = new Set<string>();
  const ranked: { label: string; cos: number }[] = [];
  for (let i = 0; i < files.length; i++)
    for (let r = 0; r < K; r++) {
      const d = nb.index[i * K + r];
      if (d < 0) break;
      const k = key(files[i].id, files[d].id);
      if (seen.has(k) || jaccardSorted(sets[i], sets[d]) >= 0.3) continue;
      seen.add(k);
      ranked.push({ label: truth.get(k) ?? '', cos: nb.cosine[i * K + r] });
    }
  ranked.sort((x, y) => y.cos - x.cos);
  const before: number[] = [];
  let tp = 0;
  let at3 = Infinity;
  for (const p of ranked) {
    if (p.label) tp++;
    else if (before.push(tp) === 4) {
      at3 = p.cos;
      break;
    }
  }
  return { before, bare: 0 * at3 };
}
const plain = plainBaseline(corpus.files);
console.log(
  `  plain TF-IDF cosine, pairs with J < 0.3 (baseline)   retellings before false pair 1–4: ${plain.before.join(', ')} ` +
    `(${((100 * plain.before[3]) / truth.size).toFixed(0)}% at ≤ 3 false pairs)`,
);

// Leave one source out over the rule's constants (retold.ts: clause a margin, clause b rare names).
interface Rule {
  c: number;
  g: number;
  ng: number;
  nn: number;
  ns: number;
}
const passes = (r: Rule, mj: number) => (p: Pair) =>
  p.mutual && p.j < mj && p.cos >= r.c && (p.cos - p.next >= r.g || (p.cos - p.next >= r.ng && p.names >= r.nn && p.nameShare >= r.ns));
const grid: (Rule & { hits: Record<string, number>; fp: number; bare: number })[] = [];
const mj = 0.2;
for (const c of [0.3, 0.4, 0.5])
  for (const g of [0.25, 0.3, 0.35, 0.4])
    for (const ng of [0, 0.05, 0.1, 0.15, 0.2])
      for (const nn of [1, 2, 3])
        for (const ns of [0.6, 0.7, 0.8, 0.9, 1.01]) {
          const r = { c, g, ng, nn, ns };
          const ok = passes(r, mj);
          const hits: Record<string, number> = {};
          let fp = 0;
          for (const p of all.filter(ok)) {
            if (p.label) hits[p.label] = (hits[p.label] ?? 0) + 1;
            else fp++;
          }
          grid.push({ ...r, hits, fp, bare: bare.filter(ok).length });
        }
const sources = [...new Set(corpus.retellings.map((r) => r[2]))];
const total = (s: string) => corpus.retellings.filter((r) => r[2] === s).length;
const describe = (r: Rule) =>
  `cosine ≥ ${r.c}, margin ≥ ${r.g}` + (r.ns <= 1 ? ` or (margin ≥ ${r.ng}, ≥ ${r.nn} rare names, share ≥ ${r.ns})` : ' (no name clause)');
for (const held of sources) {
  const train = sources.filter((s) => s !== held);
  const fits = grid.filter((r) => r.fp <= 3 && (1000 * r.bare) / without.length <= 1);
  const score = (r: (typeof grid)[number]) => train.reduce((s, t) => s + (r.hits[t] ?? 0), 0);
  // Most retellings of the training sources; ties to the stricter rule.
  const best = fits.sort((x, y) => score(y) - score(x) || y.g - x.g || y.ns - x.ns || y.ng - x.ng || y.nn - x.nn || y.c - x.c)[0];
  console.log(
    `  leave ${held} out: ${describe(best)}, Jaccard < ${mj} → ${train.map((t) => `${t} ${best.hits[t] ?? 0}/${total(t)}`).join(', ')} (chosen on); ` +
      `${held} ${best.hits[held] ?? 0}/${total(held)} (held out); ${best.fp} false pairs, ${best.bare} without retellings`,
  );
}

// A second real folder, not held out and without planted retellings: the CMake reference
// (test/fixtures/cmake-doc). Pairs the full finder reports with and without the name clause.
const cmake = jsonlFiles('test/fixtures/cmake-doc/docs.jsonl.gz');
for (const [label, o] of [
  ['margin only', { retoldNameMinGap: 1, retoldNamesDecide: false }],
  ['with the name clause (defaults)', {}],
] as const) {
  const r = findLookalikes({ files: cmake.map((d) => ({ id: d.id, text: d.text })) }, o);
  console.log(
    `  cmake-doc, ${label}: ${r.retoldPairs.length} "same content" pairs in ${cmake.length} files ` +
      `(${((1000 * r.retoldPairs.length) / cmake.length).toFixed(1)} per 1,000)`,
  );
}
