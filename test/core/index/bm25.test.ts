import { describe, expect, it } from 'vitest';
import { Bm25Scorer, DEFAULT_BM25_OPTIONS } from '../../../src/core/index/bm25.js';
import { countTerms, Vocabulary, type DocTerms } from '../../../src/core/index/termCounts.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { loadCollection, missingMessage } from '../../helpers/shared.js';

// Real text: CRAN (../shared/corpora/cran, 1400 aerodynamics abstracts and 225 queries).
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

const scoresOf = (scorer: Bm25Scorer, query: DocTerms, n: number): Float64Array => {
  const out = new Float64Array(n);
  scorer.scoreInto(query, out);
  return out;
};

describe.skipIf(!cran)(`Bm25Scorer ${cran ? '' : missingMessage('corpora/cran')}`, () => {
  const vocab = new Vocabulary();
  const texts = cran ? cran.docs.map((d) => d.text) : [];
  const all = texts.map((t) => countTerms(tokenize(t), vocab, true));
  const queries = cran ? cran.queries.slice(0, 25).map((q) => countTerms(tokenize(q.text), vocab, false)) : [];

  it('scores every document as the published formula computed term by term', () => {
    const docs: (DocTerms | null)[] = all.slice(0, 200).map((d, i) => (i % 17 === 3 ? null : d));
    const scorer = new Bm25Scorer(docs, vocab.size);
    for (const q of queries.slice(0, 5)) {
      const got = scoresOf(scorer, q, docs.length);
      const ref = referenceScores(docs, q);
      ref.forEach((r, j) => expect(got[j]).toBeCloseTo(r, 10));
    }
  });

  it('after replacing, removing and adding documents scores the same bits as a scorer built afresh', () => {
    const docs: (DocTerms | null)[] = all.slice(0, 600);
    const scorer = new Bm25Scorer(docs, vocab.size);
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
    // New words, beyond the vocabulary the scorer was built with.
    const novel = countTerms(tokenize('quuxification frobnicator shock quuxification'), vocab, true);
    set(700, novel);
    const expectSame = (): void => {
      const fresh = new Bm25Scorer(docs, vocab.size);
      for (const q of [...queries, novel]) {
        const a = scoresOf(scorer, q, docs.length);
        const b = scoresOf(fresh, q, docs.length);
        expect(Buffer.from(a.buffer).equals(Buffer.from(b.buffer))).toBe(true);
        for (const t of q.termIds) expect(scorer.docFrequency(t)).toBe(fresh.docFrequency(t));
      }
      expect(scorer.termScore(novel.termIds[0], 1, 2, 700)).toBe(fresh.termScore(novel.termIds[0], 1, 2, 700));
    };
    expectSame();
    // Enough changes to fold the side lists into the main lists, then more changes on top.
    // (1400 added documents of about 60 distinct terms each exceed the 65536-posting threshold.)
    for (let i = 0; i < 1400; i++) set(800 + i, all[(i * 3) % all.length]);
    set(3, null);
    set(750, all[4]);
    expectSame();
    const ref = referenceScores(docs, queries[0]);
    const got = scoresOf(scorer, queries[0], docs.length);
    ref.forEach((r, j) => expect(got[j]).toBeCloseTo(r, 10));
  });
});
