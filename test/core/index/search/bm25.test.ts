import { describe, expect, it } from 'vitest';
import { Bm25Scorer, DEFAULT_BM25_OPTIONS } from '../../../../src/core/index/search/bm25.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { decodeIndex, encodeIndex } from '../../../../src/core/index/persistence/serialize.js';
import { countTerms, Vocabulary, type DocTerms } from '../../../../src/core/counting/termCounts.js';
import { tokenize } from '../../../../src/core/text/tokenize.js';
import { loadCollection } from '../../../helpers/shared.js';

// Real text: CRAN (test/fixtures/corpora/cran, 1400 aerodynamics abstracts and 225 queries).
const cran = loadCollection('cran');

/**
 * Reference: Robertson & Zaragoza 2009, eq. 3.15 with the non-negative idf
 * ln(1 + (N − df + 0.5)/(df + 0.5)), computed term by term from the raw counts of the documents
 * present (df and the average length counted afresh), query terms weighted by their counts.
 */
function referenceScores(docs: readonly (DocTerms | null)[], query: DocTerms): number[] {
  const { k1, b } = DEFAULT_BM25_OPTIONS;
  const present = docs.filter((d): d is DocTerms => d !== null);
  const n = present.length;
  const avg = present.reduce((s, d) => s + d.length, 0) / n;
  const tfOf = (d: DocTerms, t: number): number => {
    const i = d.termIds.indexOf(t);
    return i < 0 ? 0 : d.counts[i];
  };
  return docs.map((d) => {
    if (!d) return 0;
    let score = 0;
    query.termIds.forEach((t, i) => {
      const df = present.filter((e) => tfOf(e, t) > 0).length;
      const tf = tfOf(d, t);
      if (tf === 0) return;
      const idf = Math.log(1 + (n - df + 0.5) / (df + 0.5));
      score += (query.counts[i] * idf * tf * (k1 + 1)) / (tf + k1 * (1 - b + (b * d.length) / avg));
    });
    return score;
  });
}

/**
 * The same published formula (Robertson & Zaragoza 2009, eq. 3.15, non-negative idf), brute force
 * from the current documents, written in the scorer's order of operations so that the two agree
 * bit for bit: norm_j = k1·(1 − b + b·|d_j|/avgdl), per query term in query order
 * out_j += (idf·qtf)·tf·(k1 + 1) / (tf + norm_j).
 */
function exactScores(docs: readonly (DocTerms | null)[], query: DocTerms, b = DEFAULT_BM25_OPTIONS.b): Float64Array {
  const { k1 } = DEFAULT_BM25_OPTIONS;
  const present = docs.filter((d): d is DocTerms => d !== null);
  const n = present.length;
  const avg = n > 0 ? present.reduce((s, d) => s + d.length, 0) / n : 1;
  const out = new Float64Array(docs.length);
  query.termIds.forEach((t, i) => {
    const df = present.filter((d) => d.termIds.includes(t)).length;
    if (df === 0) return;
    const w = Math.log(1 + (n - df + 0.5) / (df + 0.5)) * query.counts[i];
    docs.forEach((d, j) => {
      const at = d ? d.termIds.indexOf(t) : -1;
      if (!d || at < 0) return;
      const tf = d.counts[at];
      out[j] += (w * tf * (k1 + 1)) / (tf + k1 * (1 - b + (b * d.length) / Math.max(avg, 1e-9)));
    });
  });
  return out;
}

const scoresOf = (scorer: Bm25Scorer, query: DocTerms, n: number, b?: number): Float64Array => {
  const out = new Float64Array(n);
  scorer.scoreInto(query, out, b);
  return out;
};

const sameBits = (a: Float64Array, b: Float64Array): boolean =>
  a.length === b.length && Buffer.from(a.buffer).equals(Buffer.from(b.buffer));

describe('Bm25Scorer', () => {
  const vocab = new Vocabulary();
  const texts = cran ? cran.docs.map((d) => d.text) : [];
  const all = texts.map((t) => countTerms(tokenize(t), vocab, true));
  const queries = cran ? cran.queries.slice(0, 25).map((q) => countTerms(tokenize(q.text), vocab, false)) : [];

  it('scores every document as the published formula computed term by term', () => {
    const docs: (DocTerms | null)[] = all.slice(0, 200).map((d, i) => (i % 17 === 3 ? null : d));
    const scorer = new Bm25Scorer(docs);
    for (const q of queries.slice(0, 5)) {
      const got = scoresOf(scorer, q, docs.length);
      const ref = referenceScores(docs, q);
      ref.forEach((r, j) => expect(got[j]).toBeCloseTo(r, 10));
      expect(sameBits(got, exactScores(docs, q))).toBe(true);
    }
  });

  it('scores with a length normalisation b given per call as a scorer made with that b, also after an edit', () => {
    const docs: (DocTerms | null)[] = all.slice(0, 150);
    const scorer = new Bm25Scorer(docs);
    const at03 = new Bm25Scorer(docs, { b: 0.3 });
    for (const q of queries.slice(0, 4)) {
      expect(sameBits(scoresOf(scorer, q, docs.length, 0.3), exactScores(docs, q, 0.3))).toBe(true);
      expect(sameBits(scoresOf(scorer, q, docs.length, 0.3), scoresOf(at03, q, docs.length))).toBe(true);
      expect(sameBits(scoresOf(scorer, q, docs.length), exactScores(docs, q))).toBe(true);
    }
    const edited = docs.slice();
    edited[5] = all[400];
    for (const x of [scorer, at03]) x.setDocument(5, all[400]);
    expect(sameBits(scoresOf(scorer, queries[0], docs.length, 0.3), exactScores(edited, queries[0], 0.3))).toBe(true);
  });

  it("scores in BM25L's form with δ > 0 as Lv & Zhai 2011's formula computed term by term, and explains each term's part alike", () => {
    // Lv & Zhai 2011, "When documents are very long, BM25 fails!", BM25L: c = tf/(1 − b + b·|d|/avgdl),
    // score += idf·(k1 + 1)(c + δ)/(k1 + c + δ) for every query term the document holds.
    const docs: (DocTerms | null)[] = all.slice(0, 120).map((d, i) => (i % 13 === 4 ? null : d));
    const scorer = new Bm25Scorer(docs);
    const { k1 } = DEFAULT_BM25_OPTIONS;
    const [b, delta] = [0.3, 0.5];
    const present = docs.filter((d): d is DocTerms => d !== null);
    const avg = present.reduce((s, d) => s + d.length, 0) / present.length;
    for (const q of queries.slice(0, 4)) {
      const got = new Float64Array(docs.length);
      scorer.scoreInto(q, got, b, delta);
      docs.forEach((d, j) => {
        let ref = 0;
        let parts = 0;
        if (d)
          q.termIds.forEach((t, i) => {
            const at = d.termIds.indexOf(t);
            if (at < 0) return;
            const df = present.filter((e) => e.termIds.includes(t)).length;
            const idf = Math.log(1 + (present.length - df + 0.5) / (df + 0.5));
            const c = d.counts[at] / (1 - b + (b * d.length) / avg);
            ref += (q.counts[i] * idf * (k1 + 1) * (c + delta)) / (k1 + c + delta);
            parts += scorer.termScore(t, q.counts[i], d.counts[at], j, b, delta);
          });
        expect(got[j]).toBeCloseTo(ref, 10);
        expect(parts).toBeCloseTo(ref, 10);
      });
    }
  });

  it('visits every current holder of a term once, with its count, after edits', () => {
    const docs: (DocTerms | null)[] = all.slice(0, 80);
    const scorer = new Bm25Scorer(docs);
    const t = queries[0].termIds[0];
    scorer.docFrequency(t);
    scorer.setDocument(3, null);
    scorer.setDocument(90, all[500]);
    docs[3] = null;
    docs[90] = all[500];
    const seen = new Map<number, number>();
    scorer.forEachHolder(t, (slot, tf) => seen.set(slot, (seen.get(slot) ?? 0) + tf));
    const want = new Map<number, number>();
    docs.forEach((d, j) => {
      const at = d ? d.termIds.indexOf(t) : -1;
      if (d && at >= 0) want.set(j, d.counts[at]);
    });
    expect(seen).toEqual(want);
    expect(seen.size).toBe(scorer.docFrequency(t));
  });

  it('after replacing, removing and adding documents scores the same bits as a scorer built afresh, for terms first asked before and after the changes', () => {
    const docs: (DocTerms | null)[] = all.slice(0, 600);
    const scorer = new Bm25Scorer(docs);
    // Queries 0–9 build their terms' postings now; 10–24 only after the changes below.
    for (const q of queries.slice(0, 10)) scoresOf(scorer, q, docs.length);
    const cachedBefore = scorer.cachedTerms;
    expect(cachedBefore).toBeGreaterThan(0);
    const set = (slot: number, d: DocTerms | null): void => {
      scorer.setDocument(slot, d);
      while (docs.length <= slot) docs.push(null);
      docs[slot] = d;
    };
    for (let i = 0; i < 30; i++) set(i * 7, all[900 + i]); // replace documents present at construction
    for (let i = 0; i < 10; i++) set(5 + i * 11, null); // remove some
    for (let i = 0; i < 40; i++) set(600 + i, all[1000 + i]); // add new slots
    set(7, all[1200]); // replace a replaced document
    set(601, null); // remove an added one
    set(16, all[1201]); // refill a removed slot
    // New words, beyond the vocabulary the documents were counted with.
    const novel = countTerms(tokenize('quuxification frobnicator shock quuxification'), vocab, true);
    set(700, novel);
    const expectSame = (): void => {
      const fresh = new Bm25Scorer(docs);
      [...queries, novel].forEach((q, i) => {
        const a = scoresOf(scorer, q, docs.length);
        expect(sameBits(a, scoresOf(fresh, q, docs.length))).toBe(true);
        if (i % 4 === 0 || q === novel) expect(sameBits(a, exactScores(docs, q))).toBe(true); // brute force is slow: a sample
        for (const t of q.termIds) expect(scorer.docFrequency(t)).toBe(fresh.docFrequency(t));
      });
      expect(scorer.termScore(novel.termIds[0], 1, 2, 700)).toBe(fresh.termScore(novel.termIds[0], 1, 2, 700));
    };
    expectSame();
    expect(scorer.cachedTerms).toBeGreaterThan(cachedBefore);
    // Enough changes for common terms' side lists to be merged into their main lists (past 256
    // postings and a quarter of the list), then more changes on top.
    for (let i = 0; i < 1400; i++) set(800 + i, all[(i * 3) % all.length]);
    for (let i = 0; i < 300; i++) set(i * 2, all[(i * 5 + 1) % all.length]);
    set(3, null);
    set(750, all[4]);
    expectSame();
    const ref = referenceScores(docs, queries[0]);
    const got = scoresOf(scorer, queries[0], docs.length);
    ref.forEach((r, j) => expect(got[j]).toBeCloseTo(r, 10));
  });

  it('gives a reopened index the same scores, bit for bit, as the index it was saved from, before and after edits', () => {
    const builder = new IndexBuilder({ k: 20 });
    texts.slice(0, 400).forEach((t, i) => builder.addText({ path: `cran/${i}.txt`, size: t.length, mtimeMs: 0 }, t));
    const index = builder.build();
    const copy = decodeIndex(encodeIndex(index));
    const qs = cran.queries.slice(0, 12).map((q) => q.text);
    const docsOf = (x: typeof index): (DocTerms | null)[] => x.slots().map((s) => s?.terms ?? null);
    const expectSame = (): void => {
      for (const text of qs) {
        const q = index.queryTerms(text);
        const a = scoresOf(index.bm25(), q, index.slots().length);
        expect(sameBits(a, scoresOf(copy.bm25(), copy.queryTerms(text), copy.slots().length))).toBe(true);
        expect(sameBits(a, exactScores(docsOf(index), q, index.ranking.lengthNorm))).toBe(true);
      }
    };
    for (const text of qs.slice(0, 6)) copy.search(text); // some terms cached before the edits
    expectSame();
    for (const x of [index, copy]) {
      x.foldIn({ path: 'cran/3.txt', size: 1, mtimeMs: 1 }, texts[900]);
      x.foldIn({ path: 'cran/new.txt', size: 1, mtimeMs: 1 }, `${texts[901]} quuxification`);
      x.remove('cran/10.txt');
    }
    expectSame();
  });

  it('scores the same bits after prepare() as a lazy scorer and the brute-force formula, with edits before, during and after the build', () => {
    const docs: (DocTerms | null)[] = all.slice(0, 500);
    const lazy = new Bm25Scorer(docs);
    const prepared = new Bm25Scorer(docs);
    const set = (slot: number, d: DocTerms | null): void => {
      for (const x of [lazy, prepared]) x.setDocument(slot, d);
      while (docs.length <= slot) docs.push(null);
      docs[slot] = d;
    };
    const expectSame = (qs: readonly DocTerms[]): void => {
      qs.forEach((q, i) => {
        const a = scoresOf(prepared, q, docs.length);
        expect(sameBits(a, scoresOf(lazy, q, docs.length))).toBe(true);
        if (i % 5 === 0) expect(sameBits(a, exactScores(docs, q))).toBe(true); // brute force is slow: a sample
        for (const t of q.termIds) expect(prepared.docFrequency(t)).toBe(lazy.docFrequency(t));
      });
    };
    scoresOf(prepared, queries[0], docs.length); // a term list made lazily before preparing
    set(4, all[800]); // an edit before the build starts
    // A few steps of the build, then edits it did not see (replace, remove, add, refill), then the rest.
    for (let i = 0; i < 5; i++) expect(prepared.prepare(() => false)).toBe(false);
    set(9, all[801]);
    set(12, null);
    set(500, all[802]);
    set(501, all[803]);
    set(501, all[804]);
    scoresOf(prepared, queries[1], docs.length); // a lazy list made during the build
    while (!prepared.prepare(() => false));
    expect(prepared.prepared).toBe(true);
    expect(prepared.prepare()).toBe(true); // cheap once done
    expectSame(queries.slice(0, 12));
    // Edits after the build: terms taken from the block for the first time only now.
    set(20, all[805]);
    set(21, null);
    set(502, countTerms(tokenize('quuxification shock layer'), vocab, true));
    for (let i = 0; i < 400; i++) set(600 + i, all[(i * 3) % all.length]); // enough to merge side lists
    expectSame([...queries.slice(10), countTerms(tokenize('quuxification shock'), vocab, false)]);
  });

  it('keeps a prepared block compressed: read-only queries decode their lists without keeping them, edits keep only the lists they touch', () => {
    const scorer = new Bm25Scorer(all);
    while (!scorer.prepare(() => false));
    expect(scorer.cachedTerms).toBe(0);
    for (const q of queries.slice(0, 50)) scoresOf(scorer, q, all.length);
    expect(scorer.cachedTerms).toBe(0);
    const edited = all[3]!;
    scorer.setDocument(3, all[900]);
    const touched = new Set([...edited.termIds, ...all[900]!.termIds]);
    expect(scorer.cachedTerms).toBe(touched.size);
    // The touched terms' main lists stay compressed: an edit counts and side-lists, a query decodes
    // them into the block's scratch (the scores are checked against a fresh scorer above).
    expect(scorer.decodedTerms).toBe(0);
    for (const q of queries.slice(0, 50)) scoresOf(scorer, q, all.length);
    expect(scorer.cachedTerms).toBe(touched.size);
    expect(scorer.decodedTerms).toBe(0);
    // Visiting a touched term's holders reads its list whole: then (only then) it is decoded.
    scorer.forEachHolder(edited.termIds[0], () => undefined);
    expect(scorer.decodedTerms).toBe(1);
  });
});
