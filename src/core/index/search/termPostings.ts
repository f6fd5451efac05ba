/**
 * Inverted lists for a few terms at a time, built on demand for the BM25 scorer (bm25.ts) and
 * kept up to date there. collectPostings makes one pass over the documents' term arrays (ids
 * ascending) and finds the wanted ids (ascending too) in each by binary search, each search
 * starting past the previous find: cost ~ documents × wanted terms × log(terms per document),
 * not the size of the vocabulary or of all postings.
 *
 * A term's lists: the main list (slots in ascending order with their counts) of the documents as
 * they were at edit number `builtAt`; a slot re-stamped since then no longer counts there. Its
 * current document, if it has the term, is in the side list [slot, tf, slot, tf, …]. When the
 * side list outgrows a quarter of the main list (common practice), both are merged into a new
 * main list at the current edit number.
 *
 * PostingsBuild makes every term's main list at once, ahead of any query, as one block in
 * compressed-row form (a counting pass, prefix sums, a filling pass: common practice), run in
 * steps so a caller can stop between chunks of documents. It reads a snapshot of the documents
 * taken at its start; each list comes out as collectPostings would make it from that snapshot.
 */
import type { DocTerms } from '../../counting/termCounts.js';

/** Side lists are merged into the main list past this share of its size (common practice). */
const COMPACT_SHARE = 0.25;
/** Side lists shorter than this many postings are never merged (common practice). */
const COMPACT_MIN = 256;

export class TermPostings {
  side: number[] = [];

  constructor(
    public docs: Int32Array,
    public tfs: Float32Array,
    /** Edit number the main list reflects: slots stamped later do not count in it. */
    public builtAt: number,
    /** Documents currently holding the term. */
    public df: number,
  ) {}

  /** The document of slot, last stamped `was`, held the term and is gone. */
  remove(slot: number, was: number): void {
    this.df--;
    if (was <= this.builtAt) return; // in the main list, where its new stamp voids it
    const side = this.side;
    for (let p = 0; p < side.length; p += 2)
      if (side[p] === slot) {
        side.splice(p, 2);
        return;
      }
  }

  /** Slot (already stamped `edits`) now holds a document with tf of the term. */
  add(slot: number, tf: number, stamp: Float64Array, edits: number): void {
    this.df++;
    this.side.push(slot, tf);
    if (this.side.length > 2 * Math.max(COMPACT_MIN, COMPACT_SHARE * this.docs.length)) this.compact(stamp, edits);
  }

  /** Main entries still current plus the side list, as one main list at edit number `edits`. */
  private compact(stamp: Float64Array, edits: number): void {
    const pairs: [number, number][] = [];
    for (let i = 0; i < this.docs.length; i++) if (stamp[this.docs[i]] <= this.builtAt) pairs.push([this.docs[i], this.tfs[i]]);
    for (let p = 0; p < this.side.length; p += 2) pairs.push([this.side[p], this.side[p + 1]]);
    pairs.sort((a, b) => a[0] - b[0]);
    this.docs = Int32Array.from(pairs, (e) => e[0]);
    this.tfs = Float32Array.from(pairs, (e) => e[1]);
    this.side = [];
    this.builtAt = edits;
  }
}

/** Growable (slot, tf, wanted-term index) triples found by the pass. */
class Found {
  n = 0;
  slots = new Int32Array(1 << 12);
  tfs = new Float32Array(1 << 12);
  which = new Int32Array(1 << 12);

  push(slot: number, tf: number, w: number): void {
    if (this.n === this.slots.length) this.grow();
    this.slots[this.n] = slot;
    this.tfs[this.n] = tf;
    this.which[this.n++] = w;
  }

  private grow(): void {
    const size = this.slots.length * 2;
    const [s, t, w] = [new Int32Array(size), new Float32Array(size), new Int32Array(size)];
    s.set(this.slots);
    t.set(this.tfs);
    w.set(this.which);
    [this.slots, this.tfs, this.which] = [s, t, w];
  }
}

/** Index of the first ids[i] ≥ t in [lo, hi). */
function lowerBound(ids: Int32Array, t: number, lo: number, hi: number): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (ids[mid] < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function scan(docs: readonly (DocTerms | null)[], want: Int32Array, found: Found): void {
  const last = want[want.length - 1];
  for (let j = 0; j < docs.length; j++) {
    const d = docs[j];
    if (d === null) continue;
    const ids = d.termIds;
    const hi = ids.length;
    if (hi === 0 || ids[0] > last || ids[hi - 1] < want[0]) continue;
    let lo = 0;
    for (let w = 0; w < want.length && lo < hi; w++) {
      lo = lowerBound(ids, want[w], lo, hi);
      if (lo < hi && ids[lo] === want[w]) found.push(j, d.counts[lo++], w);
    }
  }
}

/** Postings of each wanted term id (ascending, distinct) over the current documents. */
export function collectPostings(docs: readonly (DocTerms | null)[], want: Int32Array, builtAt: number): TermPostings[] {
  if (want.length === 0) return [];
  const found = new Found();
  scan(docs, want, found);
  const df = new Int32Array(want.length);
  for (let i = 0; i < found.n; i++) df[found.which[i]]++;
  const lists = Array.from(df, (n) => ({ docs: new Int32Array(n), tfs: new Float32Array(n), fill: 0 }));
  // Found in slot order, so each term's list comes out in ascending slots.
  for (let i = 0; i < found.n; i++) {
    const l = lists[found.which[i]];
    l.docs[l.fill] = found.slots[i];
    l.tfs[l.fill++] = found.tfs[i];
  }
  return lists.map((l, w) => new TermPostings(l.docs, l.tfs, builtAt, df[w]));
}

/** Every term's postings from one snapshot of the documents, as ranges of two shared arrays. */
export class PostingsBlock {
  constructor(
    /** offsets[t] … offsets[t + 1] − 1: the entries of term t (terms ≥ terms have none here). */
    private readonly _offsets: Int32Array,
    private readonly _docs: Int32Array,
    private readonly _tfs: Float32Array,
    /** The edit number of the snapshot. */
    readonly builtAt: number,
  ) {}

  /** Term ids below this are covered. */
  get terms(): number {
    return this._offsets.length - 1;
  }

  /** Term t's main list (views into the block; a compaction replaces them, never writes them). */
  postings(t: number): TermPostings {
    const [a, b] = [this._offsets[t], this._offsets[t + 1]];
    return new TermPostings(this._docs.subarray(a, b), this._tfs.subarray(a, b), this.builtAt, b - a);
  }
}

/** Documents handled between two looks at the caller's budget. */
const STEP_DOCS = 32;
/** Terms handled by one step of prefix sums. */
const STEP_TERMS = 1 << 16;

/** Builds a PostingsBlock in steps: counting, prefix sums, filling. */
export class PostingsBuild {
  private _phase: 'count' | 'offsets' | 'allocate' | 'fill' | 'done' = 'count';
  private _total = 0;
  private _next = 0;
  private _count: Int32Array = new Int32Array(1024);
  private _terms = 0;
  private _offsets = new Int32Array(0);
  private _docsOut = new Int32Array(0);
  private _tfsOut = new Float32Array(0);
  private _block: PostingsBlock | null = null;

  /** docs is kept as given: pass a copy that later edits do not change. */
  constructor(
    readonly docs: readonly (DocTerms | null)[],
    readonly builtAt: number,
  ) {}

  /** Works while more() says so (at least one step); the block once complete, else null. */
  run(more: () => boolean): PostingsBlock | null {
    do {
      if (this._phase === 'count') this.countStep();
      else if (this._phase === 'offsets') this.offsetsStep();
      else if (this._phase === 'allocate') this.allocate();
      else if (this._phase === 'fill') this.fillStep();
      if (this._block) return this._block;
    } while (more());
    return null;
  }

  private countStep(): void {
    const end = Math.min(this.docs.length, this._next + STEP_DOCS);
    for (let j = this._next; j < end; j++) {
      const d = this.docs[j];
      if (d === null || d.termIds.length === 0) continue;
      const top = d.termIds[d.termIds.length - 1] + 1; // ids ascending: the last is the largest
      if (top > this._count.length) this._count = grownInt32(this._count, top);
      this._terms = Math.max(this._terms, top);
      countIds(d.termIds, this._count);
    }
    this._next = end;
    if (end < this.docs.length) return;
    this._offsets = new Int32Array(this._terms + 1);
    [this._phase, this._next] = ['offsets', 0];
  }

  /** Prefix sums of the counts, STEP_TERMS terms a step. */
  private offsetsStep(): void {
    const end = Math.min(this._terms, this._next + STEP_TERMS);
    this._total = prefixSums(this._count, this._offsets, this._next, end, this._total);
    this._next = end;
    if (end < this._terms) return;
    this._offsets[this._terms] = this._total;
    this._phase = 'allocate';
  }

  /** One buffer for both arrays (one large allocation); the counts become fill positions. */
  private allocate(): void {
    const total = this._total;
    if (2 * total > 2 ** 31 - 1) throw new RangeError(`${total} postings are too many for one block`);
    const buffer = new ArrayBuffer(8 * total);
    this._docsOut = new Int32Array(buffer, 0, total);
    this._tfsOut = new Float32Array(buffer, 4 * total, total);
    this._count.set(this._offsets.subarray(0, this._terms));
    [this._phase, this._next] = ['fill', 0];
  }

  private fillStep(): void {
    const end = Math.min(this.docs.length, this._next + STEP_DOCS);
    for (let j = this._next; j < end; j++) {
      const d = this.docs[j];
      if (d !== null) fillIds(j, d.termIds, d.counts, this._count, this._docsOut, this._tfsOut);
    }
    this._next = end;
    if (end < this.docs.length) return;
    this._block = new PostingsBlock(this._offsets, this._docsOut, this._tfsOut, this.builtAt);
    this._phase = 'done';
    this._count = new Int32Array(0);
  }
}

/** offsets[t] = running total before term t, for t in [from, to); returns the new total. */
function prefixSums(count: Int32Array, offsets: Int32Array, from: number, to: number, total: number): number {
  for (let t = from; t < to; t++) {
    offsets[t] = total;
    total += count[t];
  }
  return total;
}

function countIds(ids: Int32Array, count: Int32Array): void {
  for (let i = 0; i < ids.length; i++) count[ids[i]]++;
}

/** Slots are filled in ascending order, so each term's list comes out in ascending slots. */
function fillIds(slot: number, ids: Int32Array, counts: Float32Array, at: Int32Array, docs: Int32Array, tfs: Float32Array): void {
  for (let i = 0; i < ids.length; i++) {
    const p = at[ids[i]]++;
    docs[p] = slot;
    tfs[p] = counts[i];
  }
}

function grownInt32(a: Int32Array, size: number): Int32Array {
  const g = new Int32Array(Math.max(size, 2 * a.length));
  g.set(a);
  return g;
}
