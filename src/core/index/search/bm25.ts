/**
 * BM25 lexical scoring (Robertson & Zaragoza 2009, "The Probabilistic Relevance Framework: BM25
 * and Beyond"), over the raw term counts of every indexed document (all terms, no pruning).
 * idf = ln(1 + (N − df + 0.5)/(df + 0.5)) (the non-negative form Lucene uses).
 * Defaults k1 = 1.2 and b = 0.75 (the values Robertson & Zaragoza report as common practice).
 * With δ > 0 a document's term scores take BM25L's form (Lv & Zhai 2011, "When documents are very
 * long, BM25 fails!"): c = tf/(1 − b + b·|d|/avgdl), (k1 + 1)(c + δ)/(k1 + c + δ) for tf > 0.
 *
 * Postings are built lazily, per term, when a query first asks for the term: one pass over the
 * documents' sorted term arrays finds every missing term of the query (termPostings.ts), and the
 * lists are then kept. Building them for a whole vocabulary of millions of terms took seconds on
 * the first search after reopening an index; a query needs a handful. Only N, the lengths and
 * their total are kept for every document.
 *
 * Kept up to date incrementally: every setDocument stamps its slot with a new edit number. A
 * cached term's list holds the documents as they were when it was built; a slot stamped later
 * no longer counts there, and its new document (if it has the term) goes to the term's side list.
 * Terms not cached yet are built later from the documents current then. Every score is formed by
 * the same operations as in a scorer built afresh from the current documents (each document once
 * per term, terms in query order), so both give the same bits.
 *
 * prepare() builds every term's main list ahead of time in steps (termPostings.ts'
 * PostingsBuild, over a snapshot of the documents), compressed; a query decodes its terms' lists
 * from that block each time (the lists collectPostings would have made from the snapshot), and an
 * edit takes the lists of the terms it touches out of the block to keep them current.
 * Edits that land while the block is being built are replayed onto the terms they touch when it
 * is installed (old document out, new one into the side list, as setDocument does).
 */
import { PostingsBuild, TermPostings, collectPostings, type MainEntries, type PostingsBlock } from './termPostings.js';
import type { DocTerms } from '../../counting/termCounts.js';

export interface Bm25Options {
  /** @default 1.2 */
  k1: number;
  /** @default 0.75 */
  b: number;
}

export const DEFAULT_BM25_OPTIONS: Readonly<Bm25Options> = Object.freeze({ k1: 1.2, b: 0.75 });

// The loops live in small functions of their own, which the engine optimises whole.

const mainOf = (p: TermPostings): MainEntries => p.main();

/** One term's contributions from its main list, slots stamped after builtAt skipped. */
function addMain(list: MainEntries, stamp: Float64Array, norm: Float64Array, idf: number, k1: number, out: Float64Array): void {
  const { docs, tfs, n, builtAt } = list;
  for (let i = 0; i < n; i++) {
    const j = docs[i];
    if (stamp[j] > builtAt) continue;
    const tf = tfs[i];
    out[j] += (idf * tf * (k1 + 1)) / (tf + norm[j]);
  }
}

/**
 * BM25L's form of one term's contributions from its main list (Lv & Zhai 2011, "When documents are
 * very long, BM25 fails!"): c = tf/(1 − b + b·|d|/avgdl), (k1 + 1)(c + δ)/(k1 + c + δ), so a long
 * document's matches are not pushed towards zero; norm holds k1·(1 − b + b·|d|/avgdl).
 */
function addMainL(
  list: MainEntries,
  stamp: Float64Array,
  norm: Float64Array,
  idf: number,
  k1: number,
  delta: number,
  out: Float64Array,
): void {
  const { docs, tfs, n, builtAt } = list;
  for (let i = 0; i < n; i++) {
    const j = docs[i];
    if (stamp[j] > builtAt) continue;
    const c = (tfs[i] * k1) / norm[j] + delta;
    out[j] += (idf * c * (k1 + 1)) / (k1 + c);
  }
}

function addSideL(list: readonly number[], norm: Float64Array, idf: number, k1: number, delta: number, out: Float64Array): void {
  for (let p = 0; p < list.length; p += 2) {
    const j = list[p];
    const c = (list[p + 1] * k1) / norm[j] + delta;
    out[j] += (idf * c * (k1 + 1)) / (k1 + c);
  }
}

/** One term's contributions from its side list [slot, tf, slot, tf, …]. */
function addSide(list: readonly number[], norm: Float64Array, idf: number, k1: number, out: Float64Array): void {
  for (let p = 0; p < list.length; p += 2) {
    const j = list[p];
    const tf = list[p + 1];
    out[j] += (idf * tf * (k1 + 1)) / (tf + norm[j]);
  }
}

function lengthNorms(
  docs: readonly (DocTerms | null)[],
  lengths: Float64Array,
  avg: number,
  k1: number,
  b: number,
  out: Float64Array,
): void {
  for (let j = 0; j < docs.length; j++) out[j] = docs[j] !== null ? k1 * (1 - b + (b * lengths[j]) / Math.max(avg, 1e-9)) : 0;
}

function grown(a: Float64Array, size: number): Float64Array {
  if (size <= a.length) return a;
  const g = new Float64Array(Math.max(size, Math.ceil(a.length * 1.25)));
  g.set(a);
  return g;
}

export class Bm25Scorer {
  private readonly _opts: Bm25Options;
  private readonly _docsOf: (DocTerms | null)[];
  /** Term id → its postings, for every term asked about so far. */
  private readonly _terms = new Map<number, TermPostings>();
  /** Edit number of each slot's last setDocument (0: as at construction). */
  private _stamp: Float64Array;
  private _edits = 0;
  private _n = 0;
  private _totalLength = 0;
  /** Tokens per slot (0 for empty slots), kept beside the documents for the length norm. */
  private _lengths: Float64Array;
  /** k1·(1 − b + b·|d|/avgdl) per slot for each b asked for (nearby and search may differ); cleared on edits. */
  private readonly _norms = new Map<number, Float64Array>();
  /** Every term's main list, once prepare() has finished. */
  private _block: PostingsBlock | null = null;
  private _building: PostingsBuild | null = null;

  /** docs[i] may be null for a deleted slot (it then scores 0 and does not count in N). */
  constructor(docs: readonly (DocTerms | null)[], options: Partial<Bm25Options> = {}) {
    this._opts = { ...DEFAULT_BM25_OPTIONS, ...options };
    this._docsOf = docs.slice();
    this._stamp = new Float64Array(docs.length);
    this._lengths = new Float64Array(docs.length);
    for (let j = 0; j < docs.length; j++) {
      const d = docs[j];
      if (!d) continue;
      this._n++;
      this._totalLength += d.length;
      this._lengths[j] = d.length;
    }
  }

  /** Number of documents containing vocabulary term id. */
  docFrequency(termId: number): number {
    const b = this._block;
    if (b && termId < b.terms && !this._terms.has(termId)) return b.df(termId); // no need to decode
    return this.postings([termId])[0].df;
  }

  idf(termId: number): number {
    const df = this.docFrequency(termId);
    return Math.log(1 + (this._n - df + 0.5) / (df + 0.5));
  }

  /** Terms whose postings are held (for tests and memory accounting). */
  get cachedTerms(): number {
    return this._terms.size;
  }

  /** Kept terms whose main list has been decoded into arrays of their own (for tests and memory accounting). */
  get decodedTerms(): number {
    let n = 0;
    for (const p of this._terms.values()) if (p.decoded) n++;
    return n;
  }

  /** True once every term's postings are built (prepare() has finished). */
  get prepared(): boolean {
    return this._block !== null;
  }

  /**
   * Builds the postings of every term ahead of time, working while more() says so (at least one
   * chunk of documents); true when done. Cheap once done.
   */
  prepare(more: () => boolean = () => true): boolean {
    if (this._block) return true;
    this._building ??= new PostingsBuild(this._docsOf.slice(), this._edits);
    const block = this._building.run(more);
    if (!block) return false;
    const snapshot = this._building.docs;
    this._building = null;
    this.install(block, snapshot);
    return true;
  }

  /** Replaces (or with null removes) the document of a slot; slots past the end are added. */
  setDocument(slot: number, terms: DocTerms | null): void {
    const old = slot < this._docsOf.length ? this._docsOf[slot] : null;
    while (this._docsOf.length <= slot) this._docsOf.push(null);
    this._stamp = grown(this._stamp, slot + 1);
    this._lengths = grown(this._lengths, slot + 1);
    const was = this._stamp[slot];
    this._stamp[slot] = ++this._edits;
    if (old) {
      this._n--;
      this._totalLength -= old.length;
      for (let i = 0; i < old.termIds.length; i++) this.held(old.termIds[i])?.remove(slot, was);
    }
    if (terms) {
      this._n++;
      this._totalLength += terms.length;
      for (let i = 0; i < terms.termIds.length; i++) this.held(terms.termIds[i])?.add(slot, terms.counts[i], this._stamp, this._edits);
    }
    this._docsOf[slot] = terms;
    this._lengths[slot] = terms ? terms.length : 0;
    this._norms.clear();
  }

  /**
   * Adds each document's BM25 score for the query terms (ids with their query counts) into out,
   * with length normalisation b (the scorer's own unless given); δ > 0 scores in BM25L's form.
   */
  scoreInto(query: DocTerms, out: Float64Array, b: number = this._opts.b, delta = 0): void {
    const k1 = this._opts.k1;
    const norm = this.lengthNorm(b);
    const lists = this.lists(query.termIds);
    const block = this._block;
    for (let i = 0; i < query.termIds.length; i++) {
      const p = lists[i];
      if (p === null) {
        // In the prepared block: decoded into its scratch and scored from there.
        const n = block!.decode(query.termIds[i]);
        if (n === 0) continue;
        const idf = this.idfOf(n) * query.counts[i];
        const main = { docs: block!.slots, tfs: block!.tfs, n, builtAt: block!.builtAt };
        if (delta > 0) addMainL(main, this._stamp, norm, idf, k1, delta, out);
        else addMain(main, this._stamp, norm, idf, k1, out);
        continue;
      }
      if (p.df === 0) continue;
      const idf = this.idfOf(p.df) * query.counts[i];
      if (delta > 0) {
        addMainL(mainOf(p), this._stamp, norm, idf, k1, delta, out);
        addSideL(p.side, norm, idf, k1, delta, out);
      } else {
        addMain(mainOf(p), this._stamp, norm, idf, k1, out);
        addSide(p.side, norm, idf, k1, out);
      }
    }
  }

  /** Calls fn(slot, tf) for every current document holding the term. */
  forEachHolder(termId: number, fn: (slot: number, tf: number) => void): void {
    const p = this.postings([termId])[0];
    for (let i = 0; i < p.docs.length; i++) if (this._stamp[p.docs[i]] <= p.builtAt) fn(p.docs[i], p.tfs[i]);
    for (let q = 0; q < p.side.length; q += 2) fn(p.side[q], p.side[q + 1]);
  }

  /** BM25 contribution of one query term to one document (for explanations), b and δ as in scoreInto. */
  termScore(termId: number, queryCount: number, tf: number, slot: number, b: number = this._opts.b, delta = 0): number {
    if (tf <= 0) return 0;
    const k1 = this._opts.k1;
    const norm = this.lengthNorm(b)[slot];
    if (delta > 0) {
      const c = (tf * k1) / norm + delta;
      return (this.idf(termId) * queryCount * c * (k1 + 1)) / (k1 + c);
    }
    return (this.idf(termId) * queryCount * tf * (k1 + 1)) / (tf + norm);
  }

  private idfOf(df: number): number {
    return Math.log(1 + (this._n - df + 0.5) / (df + 0.5));
  }

  /** The postings of each term id (aligned), building all missing ones in one pass. */
  private postings(termIds: ArrayLike<number>): TermPostings[] {
    return this.lists(termIds).map((p, i) => p ?? this._block!.postings(termIds[i]));
  }

  /**
   * The postings of each term id (aligned), building all missing ones in one pass; null for a
   * term in the prepared block that no edit has touched: the block keeps it compressed, to be
   * decoded for each use (only lists that edits change are kept decoded).
   */
  private lists(termIds: ArrayLike<number>): (TermPostings | null)[] {
    const block = this._block;
    const lists = Array.from(termIds, (t) => this._terms.get(t) ?? (block && t < block.terms ? null : undefined));
    let missing: number[] | null = null;
    for (let i = 0; i < termIds.length; i++) if (lists[i] === undefined) (missing ??= []).push(termIds[i]);
    if (missing) {
      const want = Int32Array.from(new Set(missing)).sort();
      collectPostings(this._docsOf, want, this._edits).forEach((p, i) => this._terms.set(want[i], p));
    }
    return lists.map((p, i) => (p === undefined ? this._terms.get(termIds[i])! : p));
  }

  /** A term's postings if kept or in the prepared block (then taken from it and kept: an edit changes it), else undefined. */
  private held(t: number): TermPostings | undefined {
    const p = this._terms.get(t);
    if (p || !this._block || t >= this._block.terms) return p;
    const made = this._block.lazyPostings(t);
    this._terms.set(t, made);
    return made;
  }

  /**
   * Takes a block built from `snapshot` at edit number block.builtAt. Terms kept already are
   * current and stay; for slots edited since the snapshot, the block's lists of the terms of the
   * old and new documents are brought up to date as setDocument would have done.
   */
  private install(block: PostingsBlock, snapshot: readonly (DocTerms | null)[]): void {
    const fresh = new Map<number, TermPostings>();
    const take = (t: number): TermPostings | undefined => {
      if (this._terms.has(t) || t >= block.terms) return undefined;
      let p = fresh.get(t);
      if (!p) fresh.set(t, (p = block.lazyPostings(t)));
      return p;
    };
    for (let j = 0; j < this._docsOf.length; j++) {
      if (this._stamp[j] <= block.builtAt) continue;
      const [old, now] = [j < snapshot.length ? snapshot[j] : null, this._docsOf[j]];
      if (old) for (let i = 0; i < old.termIds.length; i++) take(old.termIds[i])?.remove(j, block.builtAt);
      if (now) for (let i = 0; i < now.termIds.length; i++) take(now.termIds[i])?.add(j, now.counts[i], this._stamp, this._edits);
    }
    for (const [t, p] of fresh) this._terms.set(t, p);
    this._block = block;
  }

  /** k1·(1 − b + b·|d|/avgdl) per slot (0 for empty slots), recomputed after changes. */
  private lengthNorm(b: number): Float64Array {
    const kept = this._norms.get(b);
    if (kept) return kept;
    const docs = this._docsOf;
    const norm = new Float64Array(docs.length);
    const avg = this._n > 0 ? this._totalLength / this._n : 1;
    lengthNorms(docs, this._lengths, avg, this._opts.k1, b, norm);
    this._norms.set(b, norm);
    return norm;
  }
}
