import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { NoKnownTermsError, NotIndexedError } from '../../../src/core/errors.js';
import { projectTerms } from '../../../src/core/index/model/conceptModel.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { decodeIndex, encodeIndex } from '../../../src/core/index/persistence/serialize.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { countTerms, type DocTerms } from '../../../src/core/counting/termCounts.js';
import { pathNameText } from '../../../src/core/index/search/nameField.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { loadRankingFixture } from '../../helpers/rankingChecks.js';
import { REPO_ROOT, loadCollection } from '../../helpers/shared.js';
import { bm25OverFields } from '../../helpers/bm25Fields.js';

// Real text: CRAN (test/fixtures/corpora/cran, 1400 aerodynamics abstracts).
const cran = loadCollection('cran');

describe('LsiIndex', () => {
  const docs = cran ? cran.docs.slice(0, 400) : [];
  const build = (list = docs) => {
    const b = new IndexBuilder();
    for (const d of list) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    return b.build();
  };

  it('gives the same index whatever the order files were added in', () => {
    const a = build();
    const b = build([...docs].reverse());
    expect(b.paths()).toEqual(a.paths());
    const bytes = (v: Float32Array): Buffer => Buffer.from(v.buffer, v.byteOffset, v.byteLength);
    expect(bytes(b.vectors()).equals(bytes(a.vectors()))).toBe(true);
  });

  it('folds an unchanged document back to the vector it had at build time', () => {
    const index = build();
    const before = Array.from(index.vectorOf(docs[10].id));
    index.foldIn({ path: docs[10].id, size: 1, mtimeMs: 1 }, docs[10].text);
    const after = Array.from(index.vectorOf(docs[10].id));
    after.forEach((v, i) => expect(v).toBeCloseTo(before[i], 5));
  });

  it('rehearses a fold-in without changing anything, and a fold-in after it gives the same bits', () => {
    const rehearsed = build();
    const plain = build();
    const text = `${docs[7].text} a previously unseen wordzzz`;
    const vocabBefore = rehearsed.vocab.size;
    rehearsed.rehearseFold({ path: docs[7].id, size: 1, mtimeMs: 1 }, text);
    rehearsed.rehearseFold({ path: 'new.txt', size: 1, mtimeMs: 1 }, text);
    expect(rehearsed.vocab.size).toBe(vocabBefore);
    expect(rehearsed.has('new.txt')).toBe(false);
    expect(rehearsed.staleness()).toEqual(plain.staleness());
    const bytes = (v: Float32Array): Buffer => Buffer.from(v.buffer, v.byteOffset, v.byteLength);
    expect(bytes(rehearsed.vectors()).equals(bytes(plain.vectors()))).toBe(true);
    for (const index of [rehearsed, plain]) index.foldIn({ path: docs[7].id, size: 2, mtimeMs: 2 }, text);
    expect(bytes(rehearsed.vectors()).equals(bytes(plain.vectors()))).toBe(true);
    expect(rehearsed.vocab.size).toBe(plain.vocab.size);
    expect(rehearsed.search('pressure distribution wordzzz', { top: 10 })).toEqual(
      plain.search('pressure distribution wordzzz', { top: 10 }),
    );
  });

  it('ranks a document first for its own title, and lists it nearest to an exact copy', () => {
    const index = build();
    const d = docs[42];
    expect(index.search(d.text.split(' . ')[0], { top: 3 }).map((h) => h.path)).toContain(d.id);
    index.foldIn({ path: 'copy', size: 1, mtimeMs: 1 }, d.text);
    const near = index.nearby('copy', { top: 1 });
    expect(near[0].path).toBe(d.id);
    expect(near[0].score).toBeGreaterThan(0.999);
  });

  it('forgets a removed document everywhere', () => {
    const index = build();
    const id = docs[5].id;
    index.remove(id);
    expect(index.has(id)).toBe(false);
    expect(() => index.nearby(id)).toThrow(NotIndexedError);
    expect(index.search(docs[5].text, { top: 400 }).map((h) => h.path)).not.toContain(id);
  });

  it('refuses a query with no known word instead of ranking noise', () => {
    expect(() => build().search('zzqx qqqv')).toThrow(NoKnownTermsError);
  });

  it('reports staleness: changed share and new vocabulary mass', () => {
    const index = build();
    index.foldIn({ path: 'new1', size: 1, mtimeMs: 1 }, 'quuxification frobnicator quuxification boundary layer');
    const s = index.staleness();
    expect(s.changedFiles).toBe(1);
    expect(s.changedShare).toBeCloseTo(1 / 401, 6);
    expect(s.newTermMass).toBeGreaterThan(0.3);
  });
});

/**
 * Reference ranking, computed the plain way: cosine as a left-to-right sum over the stored unit
 * vectors; BM25 term by term from the raw counts (Robertson & Zaragoza 2009, eq. 3.15, idf
 * ln(1 + (N − df + 0.5)/(df + 0.5)), k1 = 1.2, b = the ranking's lengthNorm for search and
 * nearbyLengthNorm for nearby); blended (1 − λ)·cosine + λ·BM25/max, λ of search from the spreads;
 * every occupied slot sorted by score, ties by slot.
 */
/** BM25 (k1 = 1.2, length normalisation b) of a query's terms in every slot, written out from the formula. */
/** BM25 (Robertson & Zaragoza 2009), or BM25L with δ > 0 (Lv & Zhai 2011: c = tf/(1 − b + b·|d|/avgdl), (k1 + 1)(c + δ)/(k1 + c + δ)). */
function plainBm25(index: LsiIndex, q: DocTerms, b: number, delta = 0): number[] {
  const slots = index.slots();
  const present = slots.filter((s) => s !== null).map((s) => s.terms);
  const avg = present.reduce((a, d) => a + d.length, 0) / present.length;
  const df = Array.from(q.termIds, (t) => present.filter((d) => tfOf(d, t) > 0).length);
  return slots.map((s) => {
    if (!s) return 0;
    let score = 0;
    q.termIds.forEach((t, i) => {
      const tf = tfOf(s.terms, t);
      if (tf === 0) return;
      const idf = Math.log(1 + (present.length - df[i] + 0.5) / (df[i] + 0.5));
      const norm = 1 - b + (b * s.terms.length) / avg;
      score +=
        delta > 0
          ? (q.counts[i] * idf * 2.2 * (tf / norm + delta)) / (1.2 + tf / norm + delta)
          : (q.counts[i] * idf * tf * 2.2) / (tf + 1.2 * norm);
    });
    return score;
  });
}

/**
 * TF-IDF cosine of a file's full term vector with every slot's, as scikit-learn's TfidfVectorizer
 * (sublinear_tf, smooth_idf, l2) computes it over the current documents: weights (1 + ln tf)·idf,
 * idf = ln((1 + n)/(1 + df)) + 1, each side divided by its norm.
 */
function plainTfidf(index: LsiIndex, d: DocTerms): number[] {
  const slots = index.slots();
  const present = slots.filter((s) => s !== null).map((s) => s.terms);
  const df = new Map<number, number>();
  for (const e of present) for (const t of e.termIds) df.set(t, (df.get(t) ?? 0) + 1);
  const idf = (t: number): number => Math.log((1 + present.length) / (1 + (df.get(t) ?? 0))) + 1;
  const weights = (e: DocTerms): Map<number, number> => new Map(Array.from(e.termIds, (t, i) => [t, (1 + Math.log(e.counts[i])) * idf(t)]));
  const norm = (w: Map<number, number>): number => Math.hypot(...w.values());
  const wq = weights(d);
  const nq = norm(wq);
  return slots.map((s) => {
    if (!s) return 0;
    const w = weights(s.terms);
    let dot = 0;
    for (const [t, x] of wq) dot += x * (w.get(t) ?? 0);
    const n = nq * norm(w);
    return n > 0 ? dot / n : 0;
  });
}

/**
 * The name field's BM25 (nameField.ts) written out: each slot's name = the words of its path
 * (folders, file name without extension; numbers left out; words the index knows), BM25 over the
 * names alone (test/helpers/bm25Fields.ts: df and N = slots with a name, average name length;
 * k1 = 1.2, b = 0.75; BM25L with δ).
 */
function plainNameTerms(index: LsiIndex): (DocTerms | null)[] {
  return index.slots().map((s) =>
    s
      ? countTerms(
          tokenize(pathNameText(s.meta.path)).filter((t) => !/^\p{N}+$/u.test(t)),
          index.vocab,
          false,
        )
      : null,
  );
}

function plainNames(index: LsiIndex, q: DocTerms, delta = 0): number[] {
  return bm25OverFields(plainNameTerms(index), q, delta);
}

/**
 * Search's name part as documented (nameField.ts, fusion.ts nameCoverage): code files' names only
 * (here .ts and .js), their BM25 divided by the best of those, times c^p with c the share of the
 * query's count × idf its name holds.
 */
function plainSearchNames(index: LsiIndex, q: DocTerms): number[] {
  const names = plainNameTerms(index);
  const code = index.slots().map((s) => !!s && /\.(?:ts|js)$/.test(s.meta.path));
  const scores = byMax(plainNames(index, q).map((x, j) => (code[j] ? x : 0)));
  const w = Array.from(q.termIds, (t, i) => q.counts[i] * index.bm25().idf(t));
  const total = w.reduce((a, x) => a + x, 0);
  const p = index.ranking.nameCoverage;
  return scores.map((x, j) => {
    const held = w.reduce((a, x2, i) => a + (names[j] && tfOf(names[j], q.termIds[i]) > 0 ? x2 : 0), 0);
    return p > 0 && x > 0 ? x * Math.min(1, held / total) ** p : x;
  });
}

/** x_j/max(x) (0 when no x is positive). */
function byMax(x: number[]): number[] {
  const max = Math.max(...x);
  return x.map((v) => (max > 0 ? v / max : 0));
}

function tfOf(d: DocTerms, t: number): number {
  const i = d.termIds.indexOf(t);
  return i < 0 ? 0 : d.counts[i];
}

/** Top of (1 − a)·cos(q, v_j) + a·lexical_j/max over slots (skip excluded; max 1 when the lexical scores are normalised already). */
function plainBlend(
  index: LsiIndex,
  q: Float32Array,
  wc: number,
  a: number,
  lexical: number[],
  top: number,
  skip = '',
  normalised = false,
): { path: string; score: number; slot: number }[] {
  const max = normalised ? 1 : Math.max(...lexical);
  const ranked: { path: string; score: number; slot: number }[] = [];
  index.slots().forEach((s, j) => {
    if (!s || s.meta.path === skip) return;
    const v = index.vectorOf(s.meta.path);
    let cos = 0;
    for (let c = 0; c < index.k; c++) cos += q[c] * v[c];
    ranked.push({ path: s.meta.path, slot: j, score: wc * cos + a * (max > 0 ? lexical[j] / max : 0) });
  });
  return ranked.sort((x, y) => y.score - x.score || x.slot - y.slot).slice(0, top);
}

/**
 * The share λ raised by the idf-weighted share u of the query's words the concept model does not
 * know (coverageBlend): λ + (1 − λ)·u, u = Σ_unknown tf·idf / Σ tf·idf.
 */
function coverageLambda(index: LsiIndex, q: DocTerms): number {
  const lambda = index.settings.lexicalBlend;
  if (!index.ranking.coverageBlend) return lambda;
  let all = 0;
  let unknown = 0;
  q.termIds.forEach((t, i) => {
    const w = q.counts[i] * index.bm25().idf(t);
    all += w;
    if (!(index.model.columnOf[t] >= 0)) unknown += w;
  });
  return all > 0 ? lambda + (1 - lambda) * (unknown / all) : lambda;
}

/** Search as documented: BM25 blend (at the coverage share, then the z-score share when spreadBlend is on), then Rocchio with the first pass's 5 best files (weight 0.25), share taken again. */
/**
 * Query-word focus as documented (termFocus.ts): r_t = ‖Σ v_j‖/m over the files holding t, over
 * √(1/m + (1 − 1/m)‖μ‖²), relative to the query's largest, to the power termFocus.
 */
function plainFocus(index: LsiIndex, q: DocTerms): Map<number, number> | null {
  const p = index.ranking.termFocus;
  if (p === 0 || q.termIds.length < 2) return null;
  const live = index.slots().filter((s) => s !== null);
  const k = index.k;
  const mu = new Float64Array(k);
  for (const s of live) index.vectorOf(s.meta.path).forEach((x, c) => (mu[c] += x / live.length));
  const mu2 = mu.reduce((a, x) => a + x * x, 0);
  const focus = Array.from(q.termIds, (t) => {
    const holders = live.filter((s) => tfOf(s.terms, t) > 0);
    const m = holders.length;
    if (m === 0) return 1;
    const sum = new Float64Array(k);
    for (const s of holders) index.vectorOf(s.meta.path).forEach((x, c) => (sum[c] += x));
    return Math.hypot(...sum) / m / Math.sqrt(1 / m + (1 - 1 / m) * mu2);
  });
  const max = Math.max(...focus);
  return new Map(Array.from(q.termIds, (t, i) => [t, (focus[i] / max) ** p]));
}

function plainSearch(index: LsiIndex, text: string, top: number): { path: string; score: number }[] {
  const q = index.queryTerms(text);
  const focus = plainFocus(index, q);
  const proj = projectTerms(index.model, q, focus ? (t) => focus.get(t)! : undefined);
  // The word match: BM25/max + η·(the name field's BM25)/max.
  const eta = index.ranking.nameWeight;
  const names = eta > 0 ? plainSearchNames(index, q) : [];
  const bm25 = byMax(plainBm25(index, q, index.ranking.lengthNorm)).map((x, j) => x + (eta > 0 ? eta * names[j] : 0));
  const base = coverageLambda(index, q);
  const share = (v: Float32Array): number => spreadLambda(index, v, bm25, base);
  let vector = proj.vector;
  if (proj.knownTerms > 0) {
    const lambda = share(vector);
    const first = plainBlend(index, vector, 1 - lambda, lambda, bm25, 5, '', true);
    const acc = Float64Array.from(vector);
    for (const f of first) {
      const v = index.vectorOf(f.path);
      for (let c = 0; c < acc.length; c++) acc[c] += (0.25 / first.length) * v[c];
    }
    const norm = Math.hypot(...acc);
    vector = Float32Array.from(acc, (x) => x / norm);
  }
  const lambda = proj.knownTerms > 0 ? share(vector) : base;
  return plainBlend(index, vector, proj.knownTerms > 0 ? 1 - lambda : 0, lambda, bm25, top, '', true);
}

/**
 * The lexical share for z-scored parts, λ_q = (λ/σ_lex)/((1 − λ)/σ_cos + λ/σ_lex), σ the
 * population standard deviations over every file (the index samples every ⌊n/2,048⌋-th file for
 * σ_cos, all of them in these test indexes).
 */
function spreadLambda(index: LsiIndex, q: Float32Array, lexical: number[], lambda: number): number {
  if (!index.ranking.spreadBlend) return lambda;
  const live = index.slots().flatMap((s, j) => (s ? [j] : []));
  const sd = (xs: number[]): number => {
    const m = xs.reduce((a, x) => a + x, 0) / xs.length;
    return Math.sqrt(xs.reduce((a, x) => a + (x - m) ** 2, 0) / xs.length);
  };
  const cos = live.map((j) => {
    const v = index.vectorOf(index.slots()[j]!.meta.path);
    let d = 0;
    for (let c = 0; c < index.k; c++) d += q[c] * v[c];
    return d;
  });
  const sl = sd(live.map((j) => lexical[j]));
  const sc = sd(cos);
  if (!(sl > 1e-12) || !(sc > 1e-12)) return lambda;
  return lambda / sl / ((1 - lambda) / sc + lambda / sl);
}

/**
 * Nearby as documented: ½ cosine + ½ word match, the word match (1 − ν)·BM25L (δ: the ranking
 * options' unless given) of the file's nearbyTerms most distinctive terms (log(1 + tf)·idf) / best other
 * file's + ν·TF-IDF of its nearbyTfidfTerms most distinctive terms (all when 0) against every file's
 * full term vector's norm / best other file's (ν: nearbyTfidfShare unless given).
 */
function plainNearby(
  index: LsiIndex,
  path: string,
  top: number,
  delta = index.ranking.nearbyDelta,
  nu = index.ranking.nearbyTfidfShare,
  eta = index.ranking.nearbyNameWeight,
): { path: string; score: number }[] {
  const d = index.termsOf(path);
  const idf = (t: number): number => index.bm25().idf(t);
  const order = Array.from(d.termIds.keys()).sort(
    (a, b) => Math.log1p(d.counts[b]) * idf(d.termIds[b]) - Math.log1p(d.counts[a]) * idf(d.termIds[a]) || a - b,
  );
  const topTerms = (count: number): DocTerms => {
    const kept = order.slice(0, count).sort((a, b) => a - b);
    return { termIds: Int32Array.from(kept, (i) => d.termIds[i]), counts: Float32Array.from(kept, (i) => d.counts[i]), length: 0 };
  };
  const query = topTerms(index.ranking.nearbyTerms);
  const self = index.slots().findIndex((s) => s?.meta.path === path);
  const bm25 = plainBm25(index, query, index.ranking.nearbyLengthNorm, delta);
  const words = index.ranking.nearbyTfidfTerms;
  const tfidf = plainTfidf(index, words > 0 ? topTerms(words) : d);
  // The name field both ways: the page's top words against the others' names, the page's own name words against the others' text.
  const names = eta > 0 ? plainNames(index, query, delta) : bm25.map(() => 0);
  const ownName = countTerms(
    tokenize(pathNameText(path)).filter((t) => !/^\p{N}+$/u.test(t)),
    index.vocab,
    false,
  );
  const own = eta > 0 && ownName.length > 0 ? plainBm25(index, ownName, index.ranking.nearbyLengthNorm, delta) : bm25.map(() => 0);
  for (const x of [bm25, tfidf, names, own]) x[self] = 0;
  const [nb, nn, no] = [byMax(bm25), byMax(names), byMax(own)];
  const word = nb.map((x, j) => x + eta * nn[j] + eta * no[j]);
  const maxT = Math.max(...tfidf);
  if (index.ranking.nearbyTfidfFromConcept && nu > 0) {
    // ν taken from the concept part: (1 − μ)(1 − ν)·cos + μ·word match + (1 − μ)ν·TF-IDF/max, μ = ½.
    const parts = word.map((x, j) => 0.5 * x + 0.5 * nu * (maxT > 0 ? tfidf[j] / maxT : 0));
    return plainBlend(index, index.vectorOf(path), 0.5 * (1 - nu), 1, parts, top, path, true);
  }
  const lexical = word.map((x, j) => (1 - nu) * x + nu * (maxT > 0 ? tfidf[j] / maxT : 0));
  return plainBlend(index, index.vectorOf(path), 0.5, 0.5, lexical, top, path, true);
}

describe('LsiIndex ranking against the plain formula', () => {
  it('ranks search and nearby hits exactly as the plain computation, before and after fold-ins and removals, and with the z-score blend', () => {
    const b = new IndexBuilder();
    for (const d of cran.docs.slice(0, 500)) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    const index = b.build();
    // The opt-in TF-IDF share of Nearby's word match (off by default), so both of its paths are checked.
    index.ranking = { ...index.ranking, nearbyTfidfShare: 0.1 };
    const compare = (): void => {
      for (const q of cran.queries.slice(0, 15)) {
        const got = index.search(q.text, { top: 15 });
        const ref = plainSearch(index, q.text, 15);
        expect(got.map((h) => h.path)).toEqual(ref.map((h) => h.path));
        got.forEach((h, i) => expect(h.score).toBeCloseTo(ref[i].score, 12));
      }
      for (const p of index.paths().filter((_, i) => i % 50 === 7)) {
        const got = index.nearby(p, { top: 15 });
        const ref = plainNearby(index, p, 15);
        expect(got.map((h) => h.path)).toEqual(ref.map((h) => h.path));
        got.forEach((h, i) => expect(h.score).toBeCloseTo(ref[i].score, 12));
        // A caller's own δ and TF-IDF share (the link suggestions pass 0 and 0: classic BM25) override the defaults.
        expect(index.ranking.nearbyTfidfShare).toBeGreaterThan(0);
        const classic = index.nearby(p, { top: 15, wordMatchDelta: 0, wordMatchTfidf: 0, wordMatchNames: 0 });
        const classicRef = plainNearby(index, p, 15, 0, 0, 0);
        expect(classic.map((h) => h.path)).toEqual(classicRef.map((h) => h.path));
        classic.forEach((h, i) => expect(h.score).toBeCloseTo(classicRef[i].score, 12));
      }
    };
    compare();
    // Replace two documents, add three (one with words the model has never seen), remove two.
    index.foldIn({ path: cran.docs[3].id, size: 1, mtimeMs: 1 }, cran.docs[900].text);
    index.foldIn({ path: cran.docs[4].id, size: 1, mtimeMs: 1 }, `${cran.docs[4].text} shock wave boundary layer`);
    for (let i = 0; i < 3; i++) index.foldIn({ path: `new${i}`, size: 1, mtimeMs: 1 }, `${cran.docs[950 + i].text} quuxified frobnicator`);
    index.remove(cran.docs[10].id);
    index.remove('new1');
    compare();
    // Nearby's TF-IDF share taken from the concept part, over the page's 80 top words (opt-in).
    index.ranking = { ...index.ranking, nearbyTfidfShare: 0.25, nearbyTfidfTerms: 80, nearbyTfidfFromConcept: true };
    compare();
    index.ranking = { ...index.ranking, nearbyTfidfShare: 0.1, nearbyTfidfTerms: 40, nearbyTfidfFromConcept: false };
    // The opt-in blend of standardised scores, with another length normalisation for search.
    index.ranking = { ...index.ranking, spreadBlend: true, lengthNorm: 0.5 };
    compare();
    expect(
      index
        .search('quuxified frobnicator', { top: 2 })
        .map((h) => h.path)
        .sort(),
    ).toEqual(['new0', 'new2']);
  });
});

describe('LsiIndex name field against the plain formula', () => {
  // Real paths, code and queries: rxjs 7.8.2 (test/fixtures/rxjs-src, provenance in its README).
  it('ranks search and nearby with the name field exactly as the plain computation, before and after edits that bring new words', () => {
    const rxjs = loadRankingFixture('rxjs-src');
    const b = new IndexBuilder();
    for (const d of rxjs.docs) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    const index = b.build();
    let named = 0;
    const compare = (extra: string[] = []): void => {
      for (const text of [...rxjs.queries.slice(0, 12).map((q) => q.text), ...extra]) {
        const got = index.search(text, { top: 10 });
        const ref = plainSearch(index, text, 10);
        expect(got.map((h) => h.path)).toEqual(ref.map((h) => h.path));
        got.forEach((h, i) => expect(h.score).toBeCloseTo(ref[i].score, 12));
        named += plainNames(index, index.queryTerms(text)).filter((x) => x > 0).length;
      }
      for (const p of index.paths().filter((_, i) => i % 40 === 3)) {
        const got = index.nearby(p, { top: 10 });
        const ref = plainNearby(index, p, 10);
        expect(got.map((h) => h.path)).toEqual(ref.map((h) => h.path));
        got.forEach((h, i) => expect(h.score).toBeCloseTo(ref[i].score, 12));
      }
    };
    // Both on by default (search's with the share of the query a name covers).
    expect(index.ranking.nameWeight).toBeGreaterThan(0);
    expect(index.ranking.nameCoverage).toBeGreaterThan(0);
    expect(index.ranking.nearbyNameWeight).toBeGreaterThan(0);
    compare();
    // A new file named by a word no text holds yet; then a file that brings the word (the first file's name
    // is complete from then on, as in an index built afresh); a file replaced; one removed.
    index.foldIn({ path: 'internal/operators/quuxify.ts', size: 1, mtimeMs: 1 }, 'export const apply = (x) => map(x);');
    index.foldIn({ path: 'internal/operators/frobnicate.ts', size: 1, mtimeMs: 1 }, 'export function frobnicate(x) { return quuxify(x); }');
    index.foldIn({ path: rxjs.docs[20].id, size: 1, mtimeMs: 1 }, rxjs.docs[30].text);
    index.remove(rxjs.docs[40].id);
    compare(['quuxify the values', 'frobnicate']);
    expect(index.search('quuxify', { top: 2 }).map((h) => h.path)).toContain('internal/operators/quuxify.ts');
    // Other weights apply as documented.
    index.ranking = { ...index.ranking, nameWeight: 1, nameCoverage: 2, nearbyNameWeight: 0.5 };
    compare();
    index.ranking = { ...index.ranking, nameCoverage: 0 };
    compare();
    // The name field did score (the comparisons above are not between zeros).
    expect(named).toBeGreaterThan(20);
  });
});

describe('LsiIndex.prepare', () => {
  it('gives the same bits as an index never prepared, with searches and edits between its slices and after it', async () => {
    const b = new IndexBuilder({ k: 30 });
    for (const d of cran.docs.slice(0, 600)) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    const saved = encodeIndex(b.build());
    const [prepared, lazy] = [decodeIndex(saved), decodeIndex(saved)];
    const both = (f: (x: LsiIndex) => void): void => [prepared, lazy].forEach(f);
    // With the opt-in TF-IDF share in Nearby, so prepare() builds its norms in slices too.
    both((x) => (x.ranking = { ...x.ranking, nearbyTfidfShare: 0.1 }));
    let q = 0;
    const compare = (count: number): void => {
      for (let i = 0; i < count; i++, q++) {
        const text = cran.queries[q % cran.queries.length].text;
        // Same hits, same scores to the last bit (toEqual compares numbers with Object.is).
        expect(prepared.search(text, { top: 12 })).toEqual(lazy.search(text, { top: 12 }));
      }
      const p = prepared.paths()[q % prepared.size];
      expect(prepared.nearby(p, { top: 8 })).toEqual(lazy.nearby(p, { top: 8 }));
    };
    // Slices of one chunk each (budget 0): a search and an edit after some of them.
    let slices = 0;
    while (!prepared.prepareSlice(0)) {
      if (++slices % 7 === 0) compare(1);
      if (slices === 9) both((x) => x.foldIn({ path: cran.docs[3].id, size: 1, mtimeMs: 1 }, cran.docs[900].text));
      if (slices === 20) both((x) => x.remove(cran.docs[10].id));
      if (slices === 30) both((x) => x.foldIn({ path: 'new/a', size: 1, mtimeMs: 1 }, `${cran.docs[901].text} quuxified frobnicator`));
    }
    expect(slices).toBeGreaterThan(30); // 600 documents in 32-document chunks: the edits landed mid-way
    expect(await prepared.prepare()).toBe(true);
    expect(prepared.tfidfPrepared).toBe(true);
    compare(15);
    both((x) => x.foldIn({ path: cran.docs[5].id, size: 1, mtimeMs: 1 }, cran.docs[902].text));
    expect(prepared.tfidfPrepared).toBe(false); // every norm depends on every idf: built again
    both((x) => x.foldIn({ path: 'new/b', size: 1, mtimeMs: 1 }, `${cran.docs[903].text} quuxified`));
    both((x) => x.remove('new/a'));
    compare(15);
    expect(prepared.search('quuxified frobnicator', { top: 1 })[0].path).toBe('new/b');
  });

  it('stops between slices once its signal is aborted, and finishes when asked again', async () => {
    const b = new IndexBuilder({ k: 10 });
    for (const d of cran.docs.slice(0, 300)) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    const index = b.build();
    const controller = new AbortController();
    let pauses = 0;
    const pause = async (): Promise<void> => {
      if (++pauses === 3) controller.abort();
    };
    expect(await index.prepare({ sliceMs: 0, signal: controller.signal, pause })).toBe(false);
    expect(pauses).toBe(3);
    expect(index.bm25().prepared).toBe(false);
    expect(await index.prepare({ sliceMs: 0, pause })).toBe(true);
    expect(index.bm25().prepared).toBe(true);
  });
});

describe('LsiIndex on tiny inputs', () => {
  it('indexes a single file', () => {
    const b = new IndexBuilder();
    b.addText({ path: 'only.md', size: 5, mtimeMs: 0 }, 'ferry timetable for the northern harbour');
    const index = b.build();
    expect(index.size).toBe(1);
    expect(index.search('timetable')[0].path).toBe('only.md');
  });
});

describe('LsiIndex languages through edits', () => {
  // Real text: CRAN abstracts (English) and Debian's German and French manual pages
  // (test/fixtures/languages/README.md). Reference: the definition over the live files in slot order
  // (the most common language, English on a tie, else the first to occur; the languages in the
  // order they first occur), recomputed from scratch after every edit.
  const pages = (lang: string): string[] =>
    readFileSync(join(REPO_ROOT, 'test/fixtures/languages/known-item', `${lang}.jsonl`), 'utf8')
      .split('\n')
      .filter((l) => l.length > 0)
      .slice(0, 3)
      .map((l) => (JSON.parse(l) as { text: string }).text);
  const definition = (index: LsiIndex): { main: string; present: string[] } => {
    const count = new Map<string, number>();
    for (const p of index.paths()) {
      const lang = index.meta(p)?.language ?? 'en';
      count.set(lang, (count.get(lang) ?? 0) + 1);
    }
    let main = 'en';
    for (const [lang, n] of count) if (n > (count.get(main) ?? 0)) main = lang;
    return { main, present: [...count.keys()] };
  };

  it('keeps the main language and the languages present as the definition gives them', () => {
    const [de, fr] = [pages('de'), pages('fr')];
    const en = (cran?.docs ?? []).slice(0, 3).map((d) => d.text);
    const b = new IndexBuilder();
    de.forEach((t, i) => b.addText({ path: `de/${i}.txt`, size: t.length, mtimeMs: 0 }, t));
    en.forEach((t, i) => b.addText({ path: `en/${i}.txt`, size: t.length, mtimeMs: 0 }, t));
    fr.slice(0, 2).forEach((t, i) => b.addText({ path: `fr/${i}.txt`, size: t.length, mtimeMs: 0 }, t));
    const index = b.build();
    const check = (main: string): void => {
      expect({ main: index.mainLanguage(), present: [...index.languagesPresent()] }).toEqual(definition(index));
      expect(index.mainLanguage()).toBe(main);
    };
    check('en'); // 3 German, 3 English, 2 French: English on the tie
    index.foldIn({ path: 'de/1.txt', size: 1, mtimeMs: 1 }, de[1]); // saved again, same language
    check('en');
    index.remove('en/0.txt');
    check('de');
    index.foldIn({ path: 'de/2.txt', size: 1, mtimeMs: 2 }, en[0]); // rewritten in English
    check('en');
    index.foldIn({ path: 'fr/9.txt', size: 1, mtimeMs: 3 }, fr[2]); // a new French file
    index.foldIn({ path: 'en/1.txt', size: 1, mtimeMs: 4 }, fr[0]); // and one rewritten in French
    check('fr');
    index.foldIn({ path: 'en/1.txt', size: 1, mtimeMs: 5 }, fr[0]); // saved again as it is
    check('fr');
  });
});
