/**
 * Second views of a "same content, other words" candidate (retold.ts), measured before choosing
 * whether to adopt any. No assertions. Run: npm run bench:lookalike-views [-- out.jsonl]
 *
 * The finder runs once per folder at its loosest (every mutual nearest-neighbour pair with
 * J < 0.2, cosine ≥ 0.3, the shorter file ≥ 50 words); each candidate gets, beside the finder's
 * own margin and shared rare names:
 * 1. the rare-name overlap over the smaller file's rare-name weight (an overlap coefficient, Simpson
 *    1943 / Szymkiewicz 1934) and over the larger one's, against the finder's geometric mean;
 * 2. a second weighting: BM25 term weights (Robertson & Zaragoza 2009, k1 = 1.2, b = 0.75) as an
 *    L2-normalised row per file, each file's nearest neighbours there (copies collapsed the same
 *    way), and whether the pair is mutual nearest there too, with its margin;
 * 3. a per-file null of name overlaps: the best rare-name share each file reaches with its other
 *    term-space neighbours (its siblings of the same area), and the pair's share above it;
 * 4. section view: files cut at blank lines (and at a line end after 80 tokens) into blocks of
 *    ≥ 40 tokens; the share of each file's
 *    words in blocks whose best partner block (TF-IDF cosine) lies in the other file of the pair
 *    rather than in any of the file's other 5 neighbours.
 * Folders: test/fixtures/lookalike-retellings (125 retellings, two sources), the same without the
 * Texinfo side, test/fixtures/cmake-doc and test/fixtures/django-doc (no planted retellings), the
 * demo workspace (3 planted paraphrases). Prints summary quantiles per label; writes every
 * candidate as a JSON line to the path given (default /tmp/lookalike-views.jsonl), so that rules
 * over these columns can be tried without running the finder again. What was tried with it and
 * why retold.ts' clause c is off by default: test/fixtures/lookalike-retellings/README.md.
 */
import { writeFileSync } from 'node:fs';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import { namesOf } from '../src/core/lookalike/rareNames.js';
import { boilerplateLines, withoutBoilerplate } from '../src/core/lookalike/retold.js';
import { jaccardSorted, shingleSet } from '../src/core/lookalike/shingles.js';
import { rowCosine, termNeighbours, termSpaceFromCounts, type TermCountRow, type TermSpace } from '../src/core/lookalike/termSpace.js';
import { tokenize } from '../src/core/text/tokenize.js';
import { demoFiles, demoParaphrases, jsonlFiles, pairKey, retellingsCorpus, type MaterialFile } from './lookalikeMaterial.js';

type F = MaterialFile;
const key = pairKey;
const corpus = retellingsCorpus();
const jsonl = jsonlFiles;
const demo = demoFiles();
const demoPairs = demoParaphrases();

const loosest = {
  retoldMinCosine: 0.3,
  retoldMinGap: 0,
  retoldNameMinGap: 0,
  retoldMinSharedNames: 1,
  retoldMinNameShare: 1e-9,
  retoldNameMinWords: 0,
  retoldNamesDecide: false,
};

/** Per-folder views: term counts without boilerplate, rare names, shingle sets, blocks. */
function views(files: F[]) {
  const seen = new Set<string>();
  const keep = files.filter((f) => {
    const t = f.text.trim();
    if (!t || seen.has(f.text)) return false;
    seen.add(f.text);
    return shingleSet(f.text, 5).hashes.length > 0;
  });
  const n = keep.length;
  const at = new Map(keep.map((f, i) => [f.id, i]));
  const bp = boilerplateLines(
    keep.map((f) => f.text),
    3,
  );
  const clean = keep.map((f) => withoutBoilerplate(f.text, bp));
  const ids = new Map<string, number>();
  const counts = clean.map((t) => {
    const c = new Map<number, number>();
    for (const tok of tokenize(t)) {
      let id = ids.get(tok);
      if (id === undefined) ids.set(tok, (id = ids.size));
      c.set(id, (c.get(id) ?? 0) + 1);
    }
    return c;
  });
  const rows: TermCountRow[] = counts.map((c) => {
    const termIds = Int32Array.from(c.keys()).sort();
    return { termIds, counts: Float64Array.from(termIds, (t) => c.get(t) as number) };
  });
  const tfidf = termSpaceFromCounts(rows);
  const bm25 = bm25Space(rows, tfidf);
  const sets = keep.map((f) => shingleSet(f.text, 5).hashes);
  const jac = (a: number, b: number): number => jaccardSorted(sets[a], sets[b]);
  const lists = (s: TermSpace): { d: number; c: number }[][] => {
    const nb = termNeighbours(s, { k: 10, candidates: 50, maxDf: Math.max(100, Math.floor(0.05 * n)) });
    return keep.map((_, i) => {
      const kept: { d: number; c: number }[] = [];
      for (let r = 0; r < 10 && kept.length < 6; r++) {
        const d = nb.index[i * 10 + r];
        if (d < 0) break;
        if (jac(i, d) >= 0.3 || kept.some((e) => jac(e.d, d) >= 0.3)) continue;
        kept.push({ d, c: nb.cosine[i * 10 + r] });
      }
      return kept;
    });
  };
  // Rare names (rareNames.ts, maxDf 10) with their weights.
  const nameSets = keep.map((f) => namesOf(f.text));
  const df = new Map<string, number>();
  for (const s of nameSets) for (const w of s) df.set(w, (df.get(w) ?? 0) + 1);
  const rare = nameSets.map((s) => new Map(s.filter((w) => (df.get(w) ?? 0) <= 10).map((w) => [w, Math.log(n / (df.get(w) ?? 1))])));
  const total = rare.map((m) => [...m.values()].reduce((x, y) => x + y, 0));
  const names = (a: number, b: number) => {
    let w = 0;
    let shared = 0;
    for (const [name, x] of rare[a]) {
      if (!rare[b].has(name)) continue;
      w += x;
      shared++;
    }
    const geo = Math.sqrt(total[a] * total[b]);
    return {
      shared,
      geo: geo > 0 ? w / geo : 0,
      min: Math.min(total[a], total[b]) > 0 ? w / Math.min(total[a], total[b]) : 0,
      max: Math.max(total[a], total[b]) > 0 ? w / Math.max(total[a], total[b]) : 0,
    };
  };
  return { keep, at, tfidf, bm25, jac, termLists: lists(tfidf), bm25Lists: lists(bm25), names, total, rare, clean };
}

/** BM25 weights (k1 1.2, b 0.75, idf ln(1 + (n − df + 0.5)/(df + 0.5))) as L2-normalised rows. */
function bm25Space(rows: readonly TermCountRow[], like: TermSpace): TermSpace {
  const n = rows.length;
  const len = rows.map((r) => Array.from(r.counts as ArrayLike<number>).reduce((x, y) => x + y, 0));
  const avg = len.reduce((x, y) => x + y, 0) / Math.max(1, n);
  const weights = new Float32Array(like.weights.length);
  for (let i = 0; i < n; i++) {
    let norm = 0;
    const s = like.rowStart[i];
    const r = rows[i];
    for (let p = 0; p < r.termIds.length; p++) {
      const tf = r.counts[p];
      const d = like.df[r.termIds[p]];
      const w = (Math.log(1 + (n - d + 0.5) / (d + 0.5)) * tf * 2.2) / (tf + 1.2 * (0.25 + (0.75 * len[i]) / avg));
      weights[s + p] = w;
      norm += w * w;
    }
    norm = Math.sqrt(norm) || 1;
    for (let p = 0; p < r.termIds.length; p++) weights[s + p] /= norm;
  }
  return { ...like, weights };
}

/** Blocks of ≥ 40 tokens cut at blank lines, or at a line end once a block reaches 80 tokens (pages without blank lines). */
function blocks(text: string): string[][] {
  const out: string[][] = [];
  let cur: string[] = [];
  const pieces = text.split(/\n\s*\n/).flatMap((b) => {
    const lines: string[] = [];
    let acc = '';
    let n = 0;
    for (const l of b.split('\n')) {
      acc += l + '\n';
      n += tokenize(l).length;
      if (n >= 80) {
        lines.push(acc);
        acc = '';
        n = 0;
      }
    }
    if (acc) lines.push(acc);
    return lines;
  });
  for (const b of pieces) {
    cur = cur.concat(tokenize(b));
    if (cur.length >= 40) {
      out.push(cur);
      cur = [];
    }
  }
  if (cur.length > 0) {
    if (out.length > 0) out[out.length - 1] = out[out.length - 1].concat(cur);
    else out.push(cur);
  }
  return out;
}

/** Share of file x's tokens in blocks whose best block among x's partner and other neighbours lies in the partner. */
function sectionShare(v: ReturnType<typeof views>, x: number, partner: number, others: number[], idf: (t: string) => number): number {
  const vec = (toks: string[]) => {
    const c = new Map<string, number>();
    for (const t of toks) c.set(t, (c.get(t) ?? 0) + 1);
    const m = new Map<string, number>();
    let norm = 0;
    for (const [t, k] of c) {
      const w = (1 + Math.log(k)) * idf(t);
      m.set(t, w);
      norm += w * w;
    }
    norm = Math.sqrt(norm) || 1;
    for (const [t, w] of m) m.set(t, w / norm);
    return m;
  };
  const cos = (a: Map<string, number>, b: Map<string, number>) => {
    let d = 0;
    for (const [t, w] of a) d += w * (b.get(t) ?? 0);
    return d;
  };
  const mine = blocks(v.clean[x]);
  const theirs = [partner, ...others].map((y) => blocks(v.clean[y]).map(vec));
  let hit = 0;
  let all = 0;
  for (const b of mine) {
    const q = vec(b);
    let best = -1;
    let from = -1;
    theirs.forEach((list, k) => {
      for (const u of list) {
        const c = cos(q, u);
        if (c > best) {
          best = c;
          from = k;
        }
      }
    });
    all += b.length;
    if (from === 0 && best >= 0.2) hit += b.length;
  }
  return all > 0 ? hit / all : 0;
}

function candidates(name: string, files: F[], labels: Map<string, string>) {
  const r = findLookalikes({ files }, loosest);
  const v = views(files);
  const n = v.keep.length;
  const dfTok = new Map<string, number>();
  for (const t of v.clean) for (const w of new Set(tokenize(t))) dfTok.set(w, (dfTok.get(w) ?? 0) + 1);
  const idf = (t: string) => Math.log((1 + n) / (1 + (dfTok.get(t) ?? 0))) + 1;
  const copies = new Map<string, readonly string[]>();
  for (const g of r.exactGroups) for (const f of g.files) copies.set(f, g.files);
  const out = [];
  for (const p of r.retoldPairs) {
    const a = v.at.get(p.a);
    const b = v.at.get(p.b);
    if (a === undefined || b === undefined) continue;
    const keys = (copies.get(p.a) ?? [p.a]).flatMap((x) => (copies.get(p.b) ?? [p.b]).map((y) => key(x, y)));
    const label = keys.map((k) => labels.get(k)).find((l) => l !== undefined) ?? '';
    const nm = v.names(a, b);
    const rank = (lists: { d: number }[][], x: number, y: number) => lists[x].findIndex((e) => e.d === y);
    const bmA = rank(v.bm25Lists, a, b);
    const bmB = rank(v.bm25Lists, b, a);
    const bmCos = rowCosine(v.bm25, a, b);
    const bmNext = Math.max(v.bm25Lists[a].find((e) => e.d !== b)?.c ?? 0, v.bm25Lists[b].find((e) => e.d !== a)?.c ?? 0);
    const otherShare = (x: number, y: number) =>
      Math.max(
        0,
        ...v.termLists[x]
          .filter((e) => e.d !== y)
          .slice(0, 5)
          .map((e) => v.names(x, e.d).geo),
      );
    const othersOf = (x: number, y: number) =>
      v.termLists[x]
        .filter((e) => e.d !== y)
        .slice(0, 5)
        .map((e) => e.d);
    out.push({
      folder: name,
      a: p.a,
      b: p.b,
      label,
      cos: p.cosine,
      gap: p.gap,
      names: nm.shared,
      share: nm.geo,
      shareMin: nm.min,
      shareMax: nm.max,
      held: p.namesHeld,
      words: Math.min(p.words[0], p.words[1]),
      wordsMax: Math.max(p.words[0], p.words[1]),
      jaccard: p.jaccard,
      bmRank: Math.max(bmA, bmB),
      bmCos,
      bmGap: bmCos - bmNext,
      nameNull: Math.max(otherShare(a, b), otherShare(b, a)),
      section: Math.min(sectionShare(v, a, b, othersOf(a, b), idf), sectionShare(v, b, a, othersOf(b, a), idf)),
    });
  }
  return { n, out };
}

const t0 = Date.now();
const truth = new Map(corpus.retellings.map(([a, b, s]) => [key(a, b), s]));
const infoSide = new Set(corpus.retellings.map((r) => r[1]));
const runs = [
  candidates('retellings', corpus.files, truth),
  candidates(
    'without retellings',
    corpus.files.filter((f) => !infoSide.has(f.id)),
    truth,
  ),
  candidates('cmake', jsonl('test/fixtures/cmake-doc/docs.jsonl.gz'), new Map()),
  candidates('django', jsonl('test/fixtures/django-doc/docs.jsonl.gz'), new Map()),
  candidates('demo', demo, new Map(demoPairs.map(([a, b]) => [key(a, b), 'demo']))),
];
console.log(`candidates ready: ${((Date.now() - t0) / 1000).toFixed(0)} s`);
const rows = runs.flatMap((r) => r.out);
const outPath = process.argv[2] ?? '/tmp/lookalike-views.jsonl';
writeFileSync(outPath, rows.map((r) => JSON.stringify(r)).join('\n') + '\n');
const q = (xs: number[]) => {
  const s = [...xs].sort((x, y) => x - y);
  return [0.1, 0.5, 0.9].map((p) => (s.length ? s[Math.floor(p * (s.length - 1))].toFixed(2) : '-')).join('/');
};
for (const r of runs) {
  const groups = new Map<string, typeof r.out>();
  for (const c of r.out) groups.set(c.label ? 'true' : 'other', [...(groups.get(c.label ? 'true' : 'other') ?? []), c]);
  for (const [g, cs] of groups)
    console.log(
      `${r.out[0]?.folder ?? ''} (${r.n} files) ${g} ${cs.length}: share ${q(cs.map((c) => c.share))} shareMin ${q(cs.map((c) => c.shareMin))} bmRank ${q(cs.map((c) => c.bmRank))} bmGap ${q(cs.map((c) => c.bmGap))} nameNull ${q(cs.map((c) => c.nameNull))} section ${q(cs.map((c) => c.section))}`,
    );
}
console.log(`written ${rows.length} candidates to ${outPath}`);
