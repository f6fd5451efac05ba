/**
 * TF-IDF cosine over the full term space, as a third signal for search beside the concept cosine
 * and BM25: each weight is (1 + ln tf)·idf with the smoothed idf ln((1 + N)/(1 + df)) + 1 (the
 * "ltc" weighting of Salton & Buckley 1988, "Term-weighting approaches in automatic text
 * retrieval"; the idf and sublinear tf are scikit-learn's TfidfVectorizer with sublinear_tf and
 * smooth_idf, the plain baseline of the ranking checks).
 *
 * A document's score is divided by its norm, or with pivoted normalisation (Singhal, Buckley &
 * Mitra 1996, "Pivoted document length normalization") by (1 − s)·pivot + s·‖d‖, the pivot being
 * the mean norm over the documents: s = 1 is the cosine, a smaller slope favours short documents
 * less. The query's own norm is left out (it scales every score of a query alike).
 *
 * Document frequencies and norms come from one pass over every document's terms. After that the
 * idf is frozen, as the concept model's weights are between builds: an edited document's norm is
 * recomputed with it (update()), a word first seen after the pass weighs as a word of one document
 * then (ln((1 + N)/2) + 1), and every other norm stays, so an edit costs its own document's terms,
 * not a pass over all.
 */
import type { DocTerms } from '../../counting/termCounts.js';

export interface TfidfOptions {
  /** Pivoted normalisation slope s (1 = cosine). @default 1 */
  slope: number;
}

export const DEFAULT_TFIDF_OPTIONS: Readonly<TfidfOptions> = Object.freeze({ slope: 1 });

/** Calls fn(slot, tf) for every current document that holds the term. */
export type HolderVisitor = (termId: number, fn: (slot: number, tf: number) => void) => void;

function countFrequencies(docs: readonly (DocTerms | null)[], df: Int32Array): void {
  for (const d of docs) if (d) for (let i = 0; i < d.termIds.length; i++) df[d.termIds[i]]++;
}

function normOf(d: DocTerms, idf: Float64Array, unseen: number): number {
  let ss = 0;
  for (let i = 0; i < d.termIds.length; i++) {
    const t = d.termIds[i];
    const w = (1 + Math.log(d.counts[i])) * (t < idf.length ? idf[t] : unseen);
    ss += w * w;
  }
  return Math.sqrt(ss);
}

function squaredNorms(docs: readonly (DocTerms | null)[], idf: Float64Array, out: Float64Array): void {
  for (let j = 0; j < docs.length; j++) {
    const d = docs[j];
    if (d) out[j] = normOf(d, idf, 0);
  }
}

/** Document frequencies, idf and norms of a set of documents (null slots are holes). */
export class TfidfNorms {
  /** Documents at the pass (N of the frozen idf). */
  readonly documents: number;
  readonly idf: Float64Array;
  /** The idf of a word first seen after the pass: as in one document of N. */
  readonly unseenIdf: number;
  private _norms: Float64Array;
  private _present: Uint8Array;
  private _sum = 0;
  private _count = 0;

  constructor(docs: readonly (DocTerms | null)[]) {
    let maxTerm = -1;
    let n = 0;
    for (const d of docs) {
      if (!d) continue;
      n++;
      for (let i = 0; i < d.termIds.length; i++) maxTerm = Math.max(maxTerm, d.termIds[i]);
    }
    const df = new Int32Array(maxTerm + 1);
    countFrequencies(docs, df);
    this.documents = n;
    this.idf = Float64Array.from(df, (f) => Math.log((1 + n) / (1 + f)) + 1);
    this.unseenIdf = Math.log((1 + n) / 2) + 1;
    this._norms = new Float64Array(docs.length);
    this._present = Uint8Array.from(docs, (d) => (d ? 1 : 0));
    squaredNorms(docs, this.idf, this._norms);
    for (let j = 0; j < docs.length; j++) if (docs[j]) this._sum += this._norms[j];
    this._count = n;
  }

  /** Each slot's norm (0 for holes). */
  get norms(): Float64Array {
    return this._norms;
  }

  /** The mean norm over the current documents (the pivot). */
  get meanNorm(): number {
    return this._count > 0 ? this._sum / this._count : 0;
  }

  /** A slot's document replaced (or with null removed; slots past the end are added), the idf as frozen. */
  update(slot: number, terms: DocTerms | null): void {
    if (slot >= this._norms.length) {
      const size = Math.max(slot + 1, Math.ceil(this._norms.length * 1.25));
      const norms = new Float64Array(size);
      norms.set(this._norms);
      const present = new Uint8Array(size);
      present.set(this._present);
      [this._norms, this._present] = [norms, present];
    }
    if (this._present[slot]) {
      this._sum -= this._norms[slot];
      this._count--;
    }
    this._norms[slot] = terms ? normOf(terms, this.idf, this.unseenIdf) : 0;
    this._present[slot] = terms ? 1 : 0;
    if (terms) {
      this._sum += this._norms[slot];
      this._count++;
    }
  }

  private idfOf(t: number): number {
    return t < this.idf.length ? this.idf[t] : this.unseenIdf;
  }

  /** One query term's share of a document's score in scoreInto (0 when the document lacks it). */
  termScore(termId: number, queryCount: number, tf: number, slot: number, options: Partial<TfidfOptions> = {}): number {
    if (!(queryCount > 0) || !(tf > 0)) return 0;
    const s = options.slope ?? DEFAULT_TFIDF_OPTIONS.slope;
    const denom = (1 - s) * this.meanNorm + s * this._norms[slot];
    const idf = this.idfOf(termId);
    return denom > 0 ? ((queryCount >= 1 ? 1 + Math.log(queryCount) : queryCount) * idf * idf * (1 + Math.log(tf))) / denom : 0;
  }

  /**
   * Adds each document's TF-IDF score for the query (term ids with their counts) into out:
   * Σ_t (1 + ln qtf)·idf_t · (1 + ln tf)·idf_t, divided by the document's (pivoted) norm.
   */
  scoreInto(query: DocTerms, holders: HolderVisitor, out: Float64Array, options: Partial<TfidfOptions> = {}): void {
    const s = options.slope ?? DEFAULT_TFIDF_OPTIONS.slope;
    const pivot = this.meanNorm;
    const norms = this._norms;
    for (let i = 0; i < query.termIds.length; i++) {
      const t = query.termIds[i];
      const c = query.counts[i];
      if (!(c > 0)) continue;
      const idf = this.idfOf(t);
      const qw = (c >= 1 ? 1 + Math.log(c) : c) * idf * idf;
      holders(t, (slot, tf) => {
        const denom = (1 - s) * pivot + s * norms[slot];
        if (denom > 0) out[slot] += (qw * (1 + Math.log(tf))) / denom;
      });
    }
  }
}
