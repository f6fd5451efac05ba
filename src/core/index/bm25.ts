/**
 * BM25 lexical scoring (Robertson & Zaragoza 2009, "The Probabilistic Relevance Framework: BM25
 * and Beyond"), over the raw term counts of every indexed document (all terms, no pruning).
 * idf = ln(1 + (N − df + 0.5)/(df + 0.5)) (the non-negative form Lucene uses).
 * Defaults k1 = 1.2 and b = 0.75 (the values Robertson & Zaragoza report as common practice).
 * The inverted lists are built once from the documents and rebuilt after any change.
 */
import type { DocTerms } from './termCounts.js';

export interface Bm25Options {
  /** @default 1.2 */
  k1: number;
  /** @default 0.75 */
  b: number;
}

export const DEFAULT_BM25_OPTIONS: Readonly<Bm25Options> = Object.freeze({ k1: 1.2, b: 0.75 });

export class Bm25Scorer {
  private readonly _start: Int32Array;
  private readonly _docs: Int32Array;
  private readonly _tf: Float32Array;
  private readonly _lengthNorm: Float64Array;
  private readonly _n: number;
  private readonly _opts: Bm25Options;

  /** docs[i] may be null for a deleted slot (it then scores 0 and does not count in N). */
  constructor(docs: readonly (DocTerms | null)[], vocabSize: number, options: Partial<Bm25Options> = {}) {
    this._opts = { ...DEFAULT_BM25_OPTIONS, ...options };
    const start = new Int32Array(vocabSize + 1);
    let n = 0;
    let totalLength = 0;
    for (const d of docs) {
      if (!d) continue;
      n++;
      totalLength += d.length;
      for (let i = 0; i < d.termIds.length; i++) start[d.termIds[i] + 1]++;
    }
    for (let t = 0; t < vocabSize; t++) start[t + 1] += start[t];
    const next = start.slice(0, vocabSize);
    const postings = start[vocabSize];
    this._docs = new Int32Array(postings);
    this._tf = new Float32Array(postings);
    for (let j = 0; j < docs.length; j++) {
      const d = docs[j];
      if (!d) continue;
      for (let i = 0; i < d.termIds.length; i++) {
        const p = next[d.termIds[i]]++;
        this._docs[p] = j;
        this._tf[p] = d.counts[i];
      }
    }
    this._start = start;
    this._n = n;
    const avg = n > 0 ? totalLength / n : 1;
    const { k1, b } = this._opts;
    this._lengthNorm = Float64Array.from(docs, (d) => (d ? k1 * (1 - b + (b * d.length) / Math.max(avg, 1e-9)) : 0));
  }

  /** Number of documents containing vocabulary term id. */
  docFrequency(termId: number): number {
    return termId + 1 < this._start.length ? this._start[termId + 1] - this._start[termId] : 0;
  }

  idf(termId: number): number {
    const df = this.docFrequency(termId);
    return Math.log(1 + (this._n - df + 0.5) / (df + 0.5));
  }

  /** Adds each document's BM25 score for the query terms (ids with their query counts) into out. */
  scoreInto(query: DocTerms, out: Float64Array): void {
    const k1 = this._opts.k1;
    for (let i = 0; i < query.termIds.length; i++) {
      const t = query.termIds[i];
      if (t + 1 >= this._start.length) continue;
      const idf = this.idf(t) * query.counts[i];
      for (let p = this._start[t]; p < this._start[t + 1]; p++) {
        const tf = this._tf[p];
        const j = this._docs[p];
        out[j] += (idf * tf * (k1 + 1)) / (tf + this._lengthNorm[j]);
      }
    }
  }

  /** BM25 contribution of one query term to one document (for explanations). */
  termScore(termId: number, queryCount: number, tf: number, slot: number): number {
    if (tf <= 0) return 0;
    const k1 = this._opts.k1;
    return (this.idf(termId) * queryCount * tf * (k1 + 1)) / (tf + this._lengthNorm[slot]);
  }
}
