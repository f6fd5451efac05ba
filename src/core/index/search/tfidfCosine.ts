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
 * Document frequencies and norms come from one pass over every document's terms; they are kept
 * until the documents change (the caller makes a new TfidfNorms then).
 */
import type { DocTerms } from '../../counting/termCounts.js';

export interface TfidfOptions {
  /** Pivoted normalisation slope s (1 = cosine). @default 1 */
  slope: number;
}

export const DEFAULT_TFIDF_OPTIONS: Readonly<TfidfOptions> = Object.freeze({ slope: 1 });

/** Calls fn(slot, tf) for every current document that holds the term. */
export type HolderVisitor = (termId: number, fn: (slot: number, tf: number) => void) => void;

/** 1 + ln c for the whole counts below this, looked up instead of computed (the same bits). */
const LOG_TABLE_SIZE = 1024;
const ONE_PLUS_LOG = Float64Array.from({ length: LOG_TABLE_SIZE }, (_, c) => (c > 0 ? 1 + Math.log(c) : 0));

/** 1 + ln c, from the table when c is a small whole number. */
function sublinear(c: number): number {
  return c < LOG_TABLE_SIZE && c === (c | 0) ? ONE_PLUS_LOG[c] : 1 + Math.log(c);
}

/** Documents visited per check of the time budget while building norms in slices (common practice). */
const DOCS_PER_STEP = 512;

/**
 * Builds a TfidfNorms in slices (prepare-time work that must not hold the thread): first the
 * document frequencies, then the norms, each a chunk of documents at a time; the result has the
 * same bits as building it at once.
 */
export class TfidfNormsBuilder {
  private readonly docs: readonly (DocTerms | null)[];
  private df: Int32Array | null = null;
  private idf: Float64Array | null = null;
  private norms: Float64Array | null = null;
  private next = 0;
  private documents = 0;
  private result: TfidfNorms | null = null;

  constructor(docs: readonly (DocTerms | null)[]) {
    this.docs = docs;
  }

  /** Works while more() says so (at least one chunk); the norms once complete, else null. */
  step(more: () => boolean): TfidfNorms | null {
    const docs = this.docs;
    do {
      if (this.result) return this.result;
      if (!this.df) {
        let maxTerm = -1;
        for (const d of docs) if (d) for (let i = 0; i < d.termIds.length; i++) if (d.termIds[i] > maxTerm) maxTerm = d.termIds[i];
        this.df = new Int32Array(maxTerm + 1);
        continue;
      }
      if (!this.idf) {
        const df = this.df;
        const end = Math.min(docs.length, this.next + DOCS_PER_STEP);
        for (let j = this.next; j < end; j++) {
          const d = docs[j];
          if (!d) continue;
          this.documents++;
          for (let i = 0; i < d.termIds.length; i++) df[d.termIds[i]]++;
        }
        this.next = end;
        if (end === docs.length) {
          const n = this.documents;
          this.idf = Float64Array.from(df, (f) => Math.log((1 + n) / (1 + f)) + 1);
          this.norms = new Float64Array(docs.length);
          this.next = 0;
        }
        continue;
      }
      const idf = this.idf;
      const out = this.norms!;
      const end = Math.min(docs.length, this.next + DOCS_PER_STEP);
      for (let j = this.next; j < end; j++) {
        const d = docs[j];
        if (!d) continue;
        let ss = 0;
        for (let i = 0; i < d.termIds.length; i++) {
          const w = sublinear(d.counts[i]) * idf[d.termIds[i]];
          ss += w * w;
        }
        out[j] = Math.sqrt(ss);
      }
      this.next = end;
      if (end === docs.length) {
        let sum = 0;
        for (let j = 0; j < docs.length; j++) if (docs[j]) sum += out[j];
        this.result = new TfidfNorms(this.documents, idf, out, this.documents > 0 ? sum / this.documents : 0);
      }
    } while (more());
    return this.result;
  }
}

/** Document frequencies, idf and norms of a set of documents (null slots are holes). */
export class TfidfNorms {
  /** Builds the norms of docs at once (TfidfNormsBuilder builds them in slices). */
  static of(docs: readonly (DocTerms | null)[]): TfidfNorms {
    return new TfidfNormsBuilder(docs).step(() => true)!;
  }

  constructor(
    readonly documents: number,
    readonly idf: Float64Array,
    readonly norms: Float64Array,
    readonly meanNorm: number,
  ) {}

  /** One query term's share of a document's score in scoreInto (0 when the document lacks it). */
  termScore(termId: number, queryCount: number, tf: number, slot: number, options: Partial<TfidfOptions> = {}): number {
    if (termId >= this.idf.length || !(queryCount > 0) || !(tf > 0)) return 0;
    const s = options.slope ?? DEFAULT_TFIDF_OPTIONS.slope;
    const denom = (1 - s) * this.meanNorm + s * this.norms[slot];
    const idf = this.idf[termId];
    return denom > 0 ? ((queryCount >= 1 ? 1 + Math.log(queryCount) : queryCount) * idf * idf * (1 + Math.log(tf))) / denom : 0;
  }

  /**
   * Adds each document's TF-IDF score for the query (term ids with their counts) into out:
   * Σ_t (1 + ln qtf)·idf_t · (1 + ln tf)·idf_t, divided by the document's (pivoted) norm.
   */
  scoreInto(query: DocTerms, holders: HolderVisitor, out: Float64Array, options: Partial<TfidfOptions> = {}): void {
    const s = options.slope ?? DEFAULT_TFIDF_OPTIONS.slope;
    const pivot = this.meanNorm;
    const norms = this.norms;
    for (let i = 0; i < query.termIds.length; i++) {
      const t = query.termIds[i];
      const c = query.counts[i];
      if (t >= this.idf.length || !(c > 0)) continue;
      const idf = this.idf[t];
      const qw = (c >= 1 ? 1 + Math.log(c) : c) * idf * idf;
      holders(t, (slot, tf) => {
        const denom = (1 - s) * pivot + s * norms[slot];
        if (denom > 0) out[slot] += (qw * (1 + Math.log(tf))) / denom;
      });
    }
  }
}
