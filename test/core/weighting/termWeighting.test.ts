import { describe, expect, it } from 'vitest';
import { countTerms, Vocabulary } from '../../../src/core/counting/termCounts.js';
import { pruneVocabulary } from '../../../src/core/weighting/prune.js';
import { globalWeights, localWeight, weightDocument } from '../../../src/core/weighting/termWeighting.js';

const corpus = [
  ['tide', 'tide', 'ferry', 'common'],
  ['ferry', 'ticket', 'common'],
  ['tide', 'ticket', 'common'],
  ['harbour', 'ferry', 'common', 'rare'],
];

function counted() {
  const vocab = new Vocabulary();
  const docs = corpus.map((t) => countTerms(t, vocab, true));
  return { vocab, docs };
}

describe('log-entropy weighting', () => {
  // Definition (Dumais 1991; gensim LogEntropyModel): g = 1 + Σ p log p / log(n + 1).
  it('gives a term spread evenly over all documents a global weight of 1 − log n / log(n+1)', () => {
    const { vocab, docs } = counted();
    const all = Int32Array.from({ length: vocab.size }, (_, i) => i);
    const g = globalWeights(docs, all, vocab.size, 'log-entropy');
    const n = 4;
    expect(g[vocab.idOf('common')!]).toBeCloseTo(1 - Math.log(n) / Math.log(n + 1), 12);
    expect(g[vocab.idOf('rare')!]).toBeCloseTo(1, 12);
    // tide: counts 2 and 1 → p = 2/3, 1/3.
    const p = [2 / 3, 1 / 3];
    expect(g[vocab.idOf('tide')!]).toBeCloseTo(1 + p.reduce((s, x) => s + x * Math.log(x), 0) / Math.log(5), 12);
  });

  it('weights documents by log(1 + tf) · g and normalises them to unit length', () => {
    const { vocab, docs } = counted();
    const all = Int32Array.from({ length: vocab.size }, (_, i) => i);
    const g = globalWeights(docs, all, vocab.size, 'log-entropy');
    const w = weightDocument(docs[0], all, g, 'log-entropy');
    const norm = Math.hypot(...w.values);
    expect(norm).toBeCloseTo(1, 12);
    const tide = vocab.idOf('tide')!;
    const ferry = vocab.idOf('ferry')!;
    const ratio = w.values[Array.from(w.columns).indexOf(tide)] / w.values[Array.from(w.columns).indexOf(ferry)];
    expect(ratio).toBeCloseTo((Math.log(3) * g[tide]) / (Math.log(2) * g[ferry]), 12);
  });
});

describe('sublinear TF-IDF weighting', () => {
  // Definition as scikit-learn's TfidfVectorizer(sublinear_tf=True, smooth_idf=True):
  // (1 + ln tf) · (ln((1 + n)/(1 + df)) + 1), then L2 normalisation.
  it('matches the smoothed-idf formula', () => {
    const { vocab, docs } = counted();
    const all = Int32Array.from({ length: vocab.size }, (_, i) => i);
    const g = globalWeights(docs, all, vocab.size, 'tfidf');
    expect(g[vocab.idOf('common')!]).toBeCloseTo(Math.log(5 / 5) + 1, 12);
    expect(g[vocab.idOf('rare')!]).toBeCloseTo(Math.log(5 / 2) + 1, 12);
  });
});

describe('localWeight', () => {
  it('gives log(1 + tf) and 1 + log(tf) exactly as Math computes them, looked up or not', () => {
    // Reference: the formulas themselves (log-entropy's local log(1 + tf), Dumais 1991, from memory; sublinear TF's 1 + log tf).
    const tfs = [...Array.from({ length: 300 }, (_, i) => i), 0.5, 2.25, 255.5, 1e6, 7 / 3];
    for (const tf of tfs) {
      expect(Object.is(localWeight(tf, 'log-entropy'), Math.log1p(tf))).toBe(true);
      expect(Object.is(localWeight(tf, 'tfidf'), 1 + Math.log(tf))).toBe(true);
    }
  });
});

describe('pruneVocabulary', () => {
  it('keeps terms in at least minDocs and at most maxDocFraction of documents', () => {
    const { vocab, docs } = counted();
    const p = pruneVocabulary(docs, vocab.size, { minDocs: 2, maxDocFraction: 0.5 });
    const kept = Array.from(p.keptIds, (id) => vocab.termOf(id)).sort();
    expect(kept).toEqual(['ticket', 'tide']); // ferry is in 3 of 4 (> 0.5), common in 4, rare/harbour in 1
    expect(p.columnOf[vocab.idOf('ferry')!]).toBe(-1);
  });

  it('relaxes the thresholds rather than leaving a tiny collection with no terms', () => {
    const vocab = new Vocabulary();
    const docs = [countTerms(['lonely', 'file'], vocab, true)];
    const p = pruneVocabulary(docs, vocab.size);
    expect(p.relaxed).toBe(true);
    expect(p.keptIds.length).toBe(2);
  });

  it('caps the vocabulary at maxTerms, keeping the most frequent', () => {
    const { vocab, docs } = counted();
    const p = pruneVocabulary(docs, vocab.size, { minDocs: 1, maxDocFraction: 1, maxTerms: 1 });
    expect(Array.from(p.keptIds, (id) => vocab.termOf(id))).toEqual(['common']);
  });
});
