/**
 * BM25 lexical scoring (Robertson & Zaragoza 2009, "The Probabilistic Relevance Framework: BM25
 * and Beyond"), over the raw term counts of every indexed document (all terms, no pruning).
 * idf = ln(1 + (N − df + 0.5)/(df + 0.5)) (the non-negative form Lucene uses).
 * Defaults k1 = 1.2 and b = 0.75 (the values Robertson & Zaragoza report as common practice).
 *
 * Kept up to date incrementally: the inverted lists built from the documents at construction stay
 * as they are; a document set later (setDocument) marks its slot's original postings as void and
 * adds its own to small per-term side lists, and N, df and the total length are adjusted. Every
 * score is formed by the same operations as in a scorer built afresh from the current documents,
 * so both give the same bits. When the side lists outgrow a quarter of the main lists, everything
 * is rebuilt into main lists (amortised cost).
 */
import type { DocTerms } from './termCounts.js';

export interface Bm25Options {
  /** @default 1.2 */
  k1: number;
  /** @default 0.75 */
  b: number;
}

export const DEFAULT_BM25_OPTIONS: Readonly<Bm25Options> = Object.freeze({ k1: 1.2, b: 0.75 });

/** Side lists are folded into the main lists past this share of their size (common practice). */
const COMPACT_SHARE = 0.25;
const COMPACT_MIN = 1 << 16;
const NO_POSTINGS: readonly number[] = [];

// The loops live in small functions of their own, which the engine optimises whole.

/** One term's contributions from the main lists, postings [p0, p1), void slots skipped. */
function addMain(p0: number, p1: number, docs: Int32Array, tfs: Float32Array, dead: Uint8Array, norm: Float64Array, idf: number, k1: number, out: Float64Array): void {
  for (let p = p0; p < p1; p++) {
    const j = docs[p];
    if (dead[j]) continue;
    const tf = tfs[p];
    out[j] += (idf * tf * (k1 + 1)) / (tf + norm[j]);
  }
}

/** One term's contributions from a side list [slot, tf, slot, tf, …]. */
function addSide(list: readonly number[], norm: Float64Array, idf: number, k1: number, out: Float64Array): void {
  for (let p = 0; p < list.length; p += 2) {
    const j = list[p];
    const tf = list[p + 1];
    out[j] += (idf * tf * (k1 + 1)) / (tf + norm[j]);
  }
}

function lengthNorms(docs: readonly (DocTerms | null)[], lengths: Float64Array, avg: number, k1: number, b: number, out: Float64Array): void {
  for (let j = 0; j < docs.length; j++) out[j] = docs[j] !== null ? k1 * (1 - b + (b * lengths[j]) / Math.max(avg, 1e-9)) : 0;
}

export class Bm25Scorer {
  private readonly _opts: Bm25Options;
  private _docsOf: (DocTerms | null)[];
  private _start!: Int32Array;
  private _docs!: Int32Array;
  private _tf!: Float32Array;
  /** Slots whose postings in the main lists no longer count (replaced or removed since). */
  private _void!: Uint8Array;
  /** Term id → [slot, tf, slot, tf, …] of documents set after the main lists were built. */
  private _side = new Map<number, number[]>();
  private _sidePostings = 0;
  private _df!: Int32Array;
  private _n = 0;
  private _totalLength = 0;
  /** Tokens per slot (0 for empty slots), kept beside the documents for the length norm. */
  private _lengths = new Float64Array(0);
  private _lengthNorm = new Float64Array(0);
  private _normFresh = false;

  /** docs[i] may be null for a deleted slot (it then scores 0 and does not count in N). */
  constructor(docs: readonly (DocTerms | null)[], vocabSize: number, options: Partial<Bm25Options> = {}) {
    this._opts = { ...DEFAULT_BM25_OPTIONS, ...options };
    this._docsOf = docs.slice();
    this.rebuild(vocabSize);
  }

  /** Number of documents containing vocabulary term id. */
  docFrequency(termId: number): number {
    return termId < this._df.length ? this._df[termId] : 0;
  }

  idf(termId: number): number {
    const df = this.docFrequency(termId);
    return Math.log(1 + (this._n - df + 0.5) / (df + 0.5));
  }

  /** Replaces (or with null removes) the document of a slot; slots past the end are added. */
  setDocument(slot: number, terms: DocTerms | null): void {
    const old = slot < this._docsOf.length ? this._docsOf[slot] : null;
    while (this._docsOf.length <= slot) this._docsOf.push(null);
    if (old) {
      this._n--;
      this._totalLength -= old.length;
      for (let i = 0; i < old.termIds.length; i++) this._df[old.termIds[i]]--;
      if (slot < this._void.length && !this._void[slot]) this._void[slot] = 1;
      else this.dropSide(slot, old);
    } else if (slot < this._void.length) {
      this._void[slot] = 1;
    }
    if (terms) {
      this._n++;
      this._totalLength += terms.length;
      const ids = terms.termIds;
      if (ids.length > 0 && ids[ids.length - 1] >= this._df.length) this.growTerms(ids[ids.length - 1] + 1);
      for (let i = 0; i < ids.length; i++) {
        this._df[ids[i]]++;
        let list = this._side.get(ids[i]);
        if (!list) this._side.set(ids[i], (list = []));
        list.push(slot, terms.counts[i]);
      }
      this._sidePostings += ids.length;
    }
    this._docsOf[slot] = terms;
    if (slot >= this._lengths.length) {
      const grown = new Float64Array(Math.max(slot + 1, Math.ceil(this._lengths.length * 1.25)));
      grown.set(this._lengths);
      this._lengths = grown;
    }
    this._lengths[slot] = terms ? terms.length : 0;
    this._normFresh = false;
    if (this._sidePostings > Math.max(COMPACT_MIN, COMPACT_SHARE * this._docs.length)) this.rebuild(this._df.length);
  }

  /** Adds each document's BM25 score for the query terms (ids with their query counts) into out. */
  scoreInto(query: DocTerms, out: Float64Array): void {
    const k1 = this._opts.k1;
    const norm = this.lengthNorm();
    const mainTerms = this._start.length - 1;
    for (let i = 0; i < query.termIds.length; i++) {
      const t = query.termIds[i];
      if (this.docFrequency(t) === 0) continue;
      const idf = this.idf(t) * query.counts[i];
      if (t < mainTerms) addMain(this._start[t], this._start[t + 1], this._docs, this._tf, this._void, norm, idf, k1, out);
      addSide(this._side.get(t) ?? NO_POSTINGS, norm, idf, k1, out);
    }
  }

  /** BM25 contribution of one query term to one document (for explanations). */
  termScore(termId: number, queryCount: number, tf: number, slot: number): number {
    if (tf <= 0) return 0;
    const k1 = this._opts.k1;
    return (this.idf(termId) * queryCount * tf * (k1 + 1)) / (tf + this.lengthNorm()[slot]);
  }

  /** k1·(1 − b + b·|d|/avgdl) per slot (0 for empty slots), recomputed after changes. */
  private lengthNorm(): Float64Array {
    if (this._normFresh) return this._lengthNorm;
    const docs = this._docsOf;
    if (this._lengthNorm.length !== docs.length) this._lengthNorm = new Float64Array(docs.length);
    const avg = this._n > 0 ? this._totalLength / this._n : 1;
    const { k1, b } = this._opts;
    lengthNorms(docs, this._lengths, avg, k1, b, this._lengthNorm);
    this._normFresh = true;
    return this._lengthNorm;
  }

  private dropSide(slot: number, old: DocTerms): void {
    for (let i = 0; i < old.termIds.length; i++) {
      const list = this._side.get(old.termIds[i])!;
      for (let p = 0; p < list.length; p += 2) if (list[p] === slot) {
        list.splice(p, 2);
        break;
      }
      if (list.length === 0) this._side.delete(old.termIds[i]);
    }
    this._sidePostings -= old.termIds.length;
  }

  private growTerms(size: number): void {
    const df = new Int32Array(Math.max(size, Math.ceil(this._df.length * 1.25)));
    df.set(this._df);
    this._df = df;
  }

  /** Main lists from the current documents; side lists emptied. */
  private rebuild(vocabSize: number): void {
    const docs = this._docsOf;
    const start = new Int32Array(vocabSize + 1);
    let n = 0;
    let totalLength = 0;
    for (const d of docs) {
      if (!d) continue;
      n++;
      totalLength += d.length;
      for (let i = 0; i < d.termIds.length; i++) start[d.termIds[i] + 1]++;
    }
    this._df = new Int32Array(vocabSize);
    for (let t = 0; t < vocabSize; t++) {
      this._df[t] = start[t + 1];
      start[t + 1] += start[t];
    }
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
    this._void = new Uint8Array(docs.length);
    this._lengths = Float64Array.from(docs, (d) => (d ? d.length : 0));
    this._side = new Map();
    this._sidePostings = 0;
    this._n = n;
    this._totalLength = totalLength;
    this._normFresh = false;
  }
}
