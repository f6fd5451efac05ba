/**
 * Four more signals for "same content, other words" (retold.ts), measured before choosing the rule;
 * none was adopted. No assertions. Run: npm run bench:lookalike-ideas
 *
 * Folders: test/fixtures/lookalike-retellings (125 retellings, coreutils and gnu-other; see its
 * README), the same without the Texinfo side, the CMake reference test/fixtures/cmake-doc (no
 * planted retelling) and the demo workspace (demo/workspace, three planted paraphrase pairs in
 * demo/expectations.json). Each file's neighbours in the full term space as the finder makes them
 * (boilerplate lines out, copies collapsed by exact shingle Jaccard ≥ 0.3), mutual nearest
 * neighbours with Jaccard < 0.2, cosine ≥ 0.5 and the shorter file ≥ 50 words unless said.
 * 1. A discounted margin: a neighbour that is itself the mutual nearest neighbour of a third file,
 *    by at least δ more, is "taken" and not counted against the pair (one-to-one linking).
 * 2. A group-aware margin: 3 or 4 files that are each other's nearest 2 or 3, every pair with
 *    Jaccard < 0.2 and cosine ≥ c, standing a margin g above the best neighbour outside the group.
 * 3. Paragraph alignment: paragraphs (blank-line blocks, merged to ≥ 15 tokens) as TF-IDF vectors;
 *    the share of the shorter file's words in paragraphs whose best partner in the other file
 *    picks them back (one-to-one) at cosine ≥ 0.3, the smaller of the two directions.
 * 4. Length agreement (shorter / longer words) and the idf-weighted share of rare stems (df ≤ 10),
 *    as rareNames.ts does for names.
 * Retellings before the 1st–4th false pair when candidates are ranked by a signal, and quantiles.
 */
import { boilerplateLines, withoutBoilerplate } from '../src/core/lookalike/retold.js';
import { jaccardSorted, shingleSet } from '../src/core/lookalike/shingles.js';
import { buildTermSpace, termNeighbours, type TermSpace } from '../src/core/lookalike/termSpace.js';
import { tokenize } from '../src/core/text/tokenize.js';
import { demoFiles, demoParaphrases, jsonlFiles, pairKey, retellingsCorpus, type MaterialFile } from './lookalikeMaterial.js';

type F = MaterialFile;
const key = pairKey;
const corpus = retellingsCorpus();
const truth = new Map(corpus.retellings.map(([a, b, s]) => [key(a, b), s]));
const cmake = jsonlFiles('test/fixtures/cmake-doc/docs.jsonl.gz');
const demo = demoFiles();
const demoKey = new Map(demoParaphrases().map(([a, b]) => [key(a, b), 'demo']));

interface Folder {
  name: string;
  ids: string[];
  texts: string[];
  words: number[];
  lists: { d: number; c: number }[][];
  jac: (a: number, b: number) => number;
  space: TermSpace;
  label: (a: number, b: number) => string;
}

function folder(name: string, given: F[], labels: Map<string, string>): Folder {
  const seen = new Set<string>();
  const files = given.filter((f) => {
    const t = f.text.trim();
    if (!t || seen.has(t)) return false;
    seen.add(t);
    return true;
  });
  const sh = files.map((f) => shingleSet(f.text, 5));
  const keep = files.filter((_, i) => sh[i].hashes.length > 0);
  const sets = sh.filter((s) => s.hashes.length > 0).map((s) => s.hashes);
  const words = sh.filter((s) => s.hashes.length > 0).map((s) => s.tokens);
  const n = keep.length;
  const bp = boilerplateLines(
    keep.map((f) => f.text),
    3,
  );
  const space = buildTermSpace(keep.map((f) => withoutBoilerplate(f.text, bp)));
  const K = 10;
  const nb = termNeighbours(space, { k: K, candidates: 50, maxDf: Math.max(100, Math.floor(0.05 * n)) });
  const cache = new Map<number, number>();
  const jac = (x: number, y: number): number => {
    const [a, b] = x < y ? [x, y] : [y, x];
    let j = cache.get(a * n + b);
    if (j === undefined) cache.set(a * n + b, (j = jaccardSorted(sets[a], sets[b])));
    return j;
  };
  const lists = keep.map((_, i) => {
    const kept: { d: number; c: number }[] = [];
    for (let r = 0; r < K && kept.length < 6; r++) {
      const d = nb.index[i * K + r];
      if (d < 0) break;
      if (jac(i, d) >= 0.3 || kept.some((e) => jac(e.d, d) >= 0.3)) continue;
      kept.push({ d, c: nb.cosine[i * K + r] });
    }
    return kept;
  });
  const ids = keep.map((f) => f.id);
  return { name, ids, texts: keep.map((f) => f.text), words, lists, jac, space, label: (a, b) => labels.get(key(ids[a], ids[b])) ?? '' };
}

interface Cand {
  a: number;
  b: number;
  c: number;
  gap: number;
  label: string;
}
function mutualPairs(f: Folder, minCos = 0.5): Cand[] {
  const out: Cand[] = [];
  f.lists.forEach((l, i) => {
    const d = l[0]?.d;
    if (d === undefined || d <= i || f.lists[d][0]?.d !== i) return;
    if (l[0].c < minCos || f.jac(i, d) >= 0.2 || Math.min(f.words[i], f.words[d]) < 50) return;
    const gap = l[0].c - Math.max(l[1]?.c ?? 0, f.lists[d][1]?.c ?? 0);
    out.push({ a: i, b: d, c: l[0].c, gap, label: f.label(i, d) });
  });
  return out;
}
const summary = (f: Folder, pairs: { label: string }[]): string => {
  const hits = pairs.filter((p) => p.label).length;
  return f.name === 'retellings'
    ? `${hits} found, ${pairs.length - hits} false`
    : `${pairs.length} pairs${f.name === 'demo' ? ` (${hits} planted)` : ''}`;
};

const t0 = Date.now();
const infoSide = new Set(corpus.retellings.map((r) => r[1]));
const folders = [
  folder('retellings', corpus.files, truth),
  folder(
    'without retellings',
    corpus.files.filter((f) => !infoSide.has(f.id)),
    truth,
  ),
  folder('cmake', cmake, new Map()),
  folder('demo', demo, demoKey),
];
console.log(`folders ready: ${((Date.now() - t0) / 1000).toFixed(0)} s`);

// 1. Discounted margin.
console.log('\n1. discounted margin (a neighbour taken by a third file is not counted); rows: δ, margin');
for (const delta of [Infinity, 0, 0.05, 0.1, 0.2])
  for (const g of [0.3, 0.35]) {
    const cells = folders.map((f) => {
      const taken = (x: number, a: number, b: number, cx: number): boolean => {
        const y = f.lists[x][0];
        return y !== undefined && y.d !== a && y.d !== b && f.lists[y.d][0]?.d === x && y.c >= cx + delta;
      };
      const next = (x: number, o: number): number => f.lists[x].slice(1).find((e) => e.d !== o && !taken(e.d, x, o, e.c))?.c ?? 0;
      const pairs = mutualPairs(f).filter((p) => p.c - Math.max(next(p.a, p.b), next(p.b, p.a)) >= g);
      return `${f.name} ${summary(f, pairs)}`;
    });
    console.log(`  δ ${delta === Infinity ? 'off' : delta}, margin ${g}: ${cells.join(' | ')}`);
  }

// 2. Group-aware margin.
console.log('\n2. group-aware margin: groups of 3–4 mutual neighbours vs the best neighbour outside');
for (const size of [3, 4])
  for (const minCos of [0.4, 0.5])
    for (const g of [0.1, 0.2, 0.35]) {
      const cells = folders.map((f) => {
        const pairs: { label: string }[] = [];
        let groups = 0;
        f.lists.forEach((l, x) => {
          if (l.length < size - 1) return;
          const members = [x, ...l.slice(0, size - 1).map((e) => e.d)].sort((p, q) => p - q);
          if (members[0] !== x) return;
          let ok = true;
          let least = 1;
          let outside = 0;
          for (const y of members) {
            const ly = f.lists[y];
            const inner = ly.slice(0, size - 1);
            const want = members.filter((z) => z !== y);
            if (inner.length < size - 1 || !want.every((z) => inner.some((e) => e.d === z)) || f.words[y] < 50) ok = false;
            for (const e of inner) {
              if (f.jac(y, e.d) >= 0.2) ok = false;
              least = Math.min(least, e.c);
            }
            outside = Math.max(outside, ly[size - 1]?.c ?? 0);
          }
          if (!ok || least < minCos || least - outside < g) return;
          groups++;
          for (let p = 0; p < members.length; p++)
            for (let q = p + 1; q < members.length; q++) pairs.push({ label: f.label(members[p], members[q]) });
        });
        return `${f.name} ${groups} groups, ${summary(f, pairs)}`;
      });
      console.log(`  size ${size}, cosine ≥ ${minCos}, margin ${g}: ${cells.join(' | ')}`);
    }

// 3 and 4. Signals on the candidates (mutual pairs, cosine ≥ 0.3).
function paragraphs(text: string): string[][] {
  const out: string[][] = [];
  let cur: string[] = [];
  for (const b of text.split(/\n\s*\n/)) {
    cur = cur.concat(tokenize(b));
    if (cur.length >= 15) {
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
function alignment(f: Folder, a: number, b: number, df: Map<string, number>): number {
  const n = f.ids.length;
  const vec = (p: string[]) => {
    const c = new Map<string, number>();
    for (const t of p) c.set(t, (c.get(t) ?? 0) + 1);
    const v = new Map<string, number>();
    let norm = 0;
    for (const [t, x] of c) {
      const w = (1 + Math.log(x)) * (Math.log((1 + n) / (1 + (df.get(t) ?? 0))) + 1);
      v.set(t, w);
      norm += w * w;
    }
    for (const [t, w] of v) v.set(t, w / Math.sqrt(norm));
    return { v, len: p.length };
  };
  const A = paragraphs(f.texts[a]).map(vec);
  const B = paragraphs(f.texts[b]).map(vec);
  if (A.length === 0 || B.length === 0) return 0;
  const dot = (x: Map<string, number>, y: Map<string, number>) => {
    let s = 0;
    for (const [t, w] of x) s += w * (y.get(t) ?? 0);
    return s;
  };
  const M = A.map((p) => B.map((q) => dot(p.v, q.v)));
  const bestB = M.map((row) => row.indexOf(Math.max(...row)));
  const bestA = B.map((_, j) => M.map((row) => row[j]).indexOf(Math.max(...M.map((row) => row[j]))));
  const side = (units: { len: number }[], best: number[], back: number[], s: (i: number) => number) => {
    let tot = 0;
    let ok = 0;
    units.forEach((u, i) => {
      tot += u.len;
      if (back[best[i]] === i && s(i) >= 0.3) ok += u.len;
    });
    return ok / tot;
  };
  return Math.min(
    side(A, bestB, bestA, (i) => M[i][bestB[i]]),
    side(B, bestA, bestB, (j) => M[bestA[j]][j]),
  );
}
function rareStemShare(s: TermSpace, a: number, b: number): number {
  const w = (t: number) => (s.df[t] <= 10 ? Math.log(s.n / s.df[t]) : 0);
  let ta = 0;
  let tb = 0;
  let both = 0;
  const mine = new Set<number>();
  for (let p = s.rowStart[a]; p < s.rowStart[a + 1]; p++) {
    ta += w(s.terms[p]);
    mine.add(s.terms[p]);
  }
  for (let p = s.rowStart[b]; p < s.rowStart[b + 1]; p++) {
    tb += w(s.terms[p]);
    if (mine.has(s.terms[p])) both += w(s.terms[p]);
  }
  return ta > 0 && tb > 0 ? both / Math.sqrt(ta * tb) : 0;
}
const f0 = folders[0];
const df = new Map<string, number>();
for (const t of f0.texts) for (const w of new Set(tokenize(t))) df.set(w, (df.get(w) ?? 0) + 1);
const rows = mutualPairs(f0, 0.3).map((p) => ({
  ...p,
  align: alignment(f0, p.a, p.b, df),
  length: Math.min(f0.words[p.a], f0.words[p.b]) / Math.max(f0.words[p.a], f0.words[p.b]),
  stems: rareStemShare(f0.space, p.a, p.b),
}));
console.log(`\n3–4. ${rows.length} candidates on the retellings folder (${rows.filter((r) => r.label).length} retellings)`);
const q = (v: number[]) =>
  [0.1, 0.25, 0.5, 0.75, 0.9].map((x) => v.sort((p, r) => p - r)[Math.floor(x * (v.length - 1))]?.toFixed(2) ?? '-').join(' ');
for (const [name, sig] of [
  ['cosine', (r: (typeof rows)[number]) => r.c],
  ['margin', (r: (typeof rows)[number]) => r.gap],
  ['paragraph alignment', (r: (typeof rows)[number]) => r.align],
  ['alignment + margin', (r: (typeof rows)[number]) => r.align + r.gap],
  ['length agreement', (r: (typeof rows)[number]) => r.length],
  ['rare-stem share', (r: (typeof rows)[number]) => r.stems],
] as const) {
  const ranked = [...rows].sort((x, y) => sig(y) - sig(x));
  const before: number[] = [];
  let tp = 0;
  for (const r of ranked) {
    if (r.label) tp++;
    else if (before.push(tp) >= 4) break;
  }
  console.log(
    `  ${name}: retellings before the 1st–4th false pair ${before.join(' / ')}; quantiles 10/25/50/75/90 % retellings ${q(rows.filter((r) => r.label).map(sig))}, others ${q(rows.filter((r) => !r.label).map(sig))}`,
  );
}

// The demo's planted pairs in the term space.
const dm = folders[3];
console.log('\ndemo paraphrase pairs: cosine, and each file’s nearest neighbours');
for (const k of demoKey.keys()) {
  const [a, b] = k.split('|').map((id) => dm.ids.indexOf(id));
  const show = (x: number) =>
    dm.lists[x]
      .slice(0, 3)
      .map((e) => `${dm.ids[e.d]} ${e.c.toFixed(2)}`)
      .join(', ');
  console.log(`  ${dm.ids[a]}: ${show(a)}\n  ${dm.ids[b]}: ${show(b)}`);
}
