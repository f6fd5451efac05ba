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
 * The block keeps each list as gaps between slots and counts in variable-length bytes (gap
 * coding of inverted lists: Witten, Moffat & Bell 1999, "Managing Gigabytes", ch. 3; the bytes
 * are LEB128 varints, as in the DWARF standard), decoded per use.
 */
import type { DocTerms } from '../../counting/termCounts.js';

/** Side lists are merged into the main list past this share of its size (common practice). */
const COMPACT_SHARE = 0.25;
/** Side lists shorter than this many postings are never merged (common practice). */
const COMPACT_MIN = 256;

/** A term's main list as scored: entries 0 … n − 1 of docs and tfs, as of edit number builtAt. */
export interface MainEntries {
  readonly docs: Int32Array;
  readonly tfs: Float32Array;
  readonly n: number;
  readonly builtAt: number;
}

export class TermPostings {
  side: number[] = [];
  private _docs: Int32Array | null;
  private _tfs: Float32Array | null;

  /**
   * @param docs the main list's slots, or null when it stays compressed in `block` (term `term`)
   *   until first read: an edit then only counts and side-lists, and a query decodes it into the
   *   block's scratch as it does a list nobody edited (lazyPostings).
   */
  constructor(
    docs: Int32Array | null,
    tfs: Float32Array | null,
    /** Edit number the main list reflects: slots stamped later do not count in it. */
    public builtAt: number,
    /** Documents currently holding the term. */
    public df: number,
    private block: PostingsBlock | null = null,
    private readonly term = -1,
  ) {
    this._docs = docs;
    this._tfs = tfs;
  }

  /** The main list's slots (decoded from the block into arrays of its own on first read). */
  get docs(): Int32Array {
    if (!this._docs) this.decodeOwn();
    return this._docs!;
  }

  /** The main list's counts. */
  get tfs(): Float32Array {
    if (!this._tfs) this.decodeOwn();
    return this._tfs!;
  }

  /** True once the main list has arrays of its own (always, unless it was left in a block). */
  get decoded(): boolean {
    return this._docs !== null;
  }

  /** Entries of the main list, without decoding it. */
  get mainLength(): number {
    return this._docs ? this._docs.length : this.block!.df(this.term);
  }

  /** The main list to score now: its own arrays, or the block's scratch (valid until the block's next decode). */
  main(): MainEntries {
    if (this._docs) return { docs: this._docs, tfs: this._tfs!, n: this._docs.length, builtAt: this.builtAt };
    const n = this.block!.decode(this.term);
    return { docs: this.block!.slots, tfs: this.block!.tfs, n, builtAt: this.builtAt };
  }

  private decodeOwn(): void {
    const n = this.block!.decode(this.term);
    this._docs = this.block!.slots.slice(0, n);
    this._tfs = this.block!.tfs.slice(0, n);
    this.block = null;
  }

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
    if (this.side.length > 2 * Math.max(COMPACT_MIN, COMPACT_SHARE * this.mainLength)) this.compact(stamp, edits);
  }

  /** Main entries still current plus the side list, as one main list at edit number `edits`. */
  private compact(stamp: Float64Array, edits: number): void {
    const pairs: [number, number][] = [];
    const { docs, tfs } = this;
    for (let i = 0; i < docs.length; i++) if (stamp[docs[i]] <= this.builtAt) pairs.push([docs[i], tfs[i]]);
    for (let p = 0; p < this.side.length; p += 2) pairs.push([this.side[p], this.side[p + 1]]);
    pairs.sort((a, b) => a[0] - b[0]);
    this._docs = Int32Array.from(pairs, (e) => e[0]);
    this._tfs = Float32Array.from(pairs, (e) => e[1]);
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

/**
 * Every term's postings from one snapshot of the documents, compressed: each term's entries are
 * its slots as gaps from the previous slot (the first from −1) and its counts, both as LEB128
 * varints (slots ascending, so every gap is ≥ 1). A count that is not a whole number in
 * [1, 2^28) is written as the byte 0 and its four f32 bytes. A term's main list is decoded when
 * asked for and comes out bit for bit as stored. On the linux-source-6.1 tree (21.6 M postings)
 * this holds 53 MB where two plain arrays took 173 MB (the editor keeps the block all day).
 */
export class PostingsBlock {
  /** Decoded entries of the last term asked for (grown to the longest list decoded). */
  private _slots = new Int32Array(64);
  private _tfs = new Float32Array(64);

  constructor(
    /** offsets[t] … offsets[t + 1] − 1: the bytes of term t (terms ≥ terms have none here). */
    private readonly _offsets: Int32Array,
    private readonly _bytes: Uint8Array,
    /** Entries of each term's list (its document frequency), without decoding it. */
    private readonly _df: Int32Array,
    /** The edit number of the snapshot. */
    readonly builtAt: number,
  ) {}

  /** Term ids below this are covered. */
  get terms(): number {
    return this._offsets.length - 1;
  }

  /** Bytes held by the lists, their offsets and their lengths. */
  get byteLength(): number {
    return this._bytes.byteLength + this._offsets.byteLength + this._df.byteLength;
  }

  /** Entries of term t's main list. */
  df(t: number): number {
    return this._df[t];
  }

  /** Term t's main list, decoded into arrays of its own (a compaction replaces them). */
  postings(t: number): TermPostings {
    const n = this.decode(t);
    return new TermPostings(this._slots.slice(0, n), this._tfs.slice(0, n), this.builtAt, n);
  }

  /**
   * Term t's postings with the main list left here until something reads it whole: what an edit
   * keeps for the terms it touches (bm25.ts), so a save does not decode the long lists of common
   * words (about half of a fold-in's time on the Linux tree when each was decoded).
   */
  lazyPostings(t: number): TermPostings {
    return new TermPostings(null, null, this.builtAt, this._df[t], this, t);
  }

  /**
   * Decodes term t's main list into `slots` and `tfs` (entries 0 … n − 1, valid until the next
   * decode) and returns n: a query scores from there without arrays of its own.
   */
  decode(t: number): number {
    const [bytes, from, to] = [this._bytes, this._offsets[t], this._offsets[t + 1]];
    // At least 2 bytes an entry: at most (to − from) / 2 entries.
    if ((to - from) >> 1 > this._slots.length) {
      const size = Math.max((to - from) >> 1, 2 * this._slots.length);
      [this._slots, this._tfs] = [new Int32Array(size), new Float32Array(size)];
    }
    return decodeList(bytes, from, to, this._slots, this._tfs);
  }

  /** The slots of the last list decoded. */
  get slots(): Int32Array {
    return this._slots;
  }

  /** The counts of the last list decoded. */
  get tfs(): Float32Array {
    return this._tfs;
  }
}

/** Counts from here on (or below 1, or not whole) are written as raw f32 bytes after a 0 byte. */
const WHOLE_COUNT_LIMIT = 2 ** 28;
/** Raw f32 bytes of an escaped count (this process's byte order: the block is never saved). */
const rawCount = new Float32Array(1);
const rawCountBytes = new Uint8Array(rawCount.buffer);

/** Bytes of v ≥ 0 as an LEB128 varint. */
function varintBytes(v: number): number {
  return v < 0x80 ? 1 : v < 0x4000 ? 2 : v < 0x200000 ? 3 : v < 0x10000000 ? 4 : 5;
}

const isWholeCount = (tf: number): boolean => tf >= 1 && tf < WHOLE_COUNT_LIMIT && Math.floor(tf) === tf;

/** Bytes of a count as stored. */
function countBytes(tf: number): number {
  return isWholeCount(tf) ? varintBytes(tf) : 5;
}

/** Writes v ≥ 0 (below 2^31) at p; returns the position after it. */
function putVarint(out: Uint8Array, p: number, v: number): number {
  while (v >= 0x80) {
    out[p++] = (v & 0x7f) | 0x80;
    v >>>= 7;
  }
  out[p++] = v;
  return p;
}

function putCount(out: Uint8Array, p: number, tf: number): number {
  if (isWholeCount(tf)) return putVarint(out, p, tf);
  out[p++] = 0;
  rawCount[0] = tf;
  out.set(rawCountBytes, p);
  return p + 4;
}

/** Decodes bytes [from, to) of one term into slots and tfs (long enough); returns the number of entries. */
function decodeList(bytes: Uint8Array, from: number, to: number, slots: Int32Array, tfs: Float32Array): number {
  let n = 0;
  let slot = -1;
  for (let p = from; p < to; n++) {
    let b = bytes[p++];
    let gap = b & 0x7f;
    for (let shift = 7; b >= 0x80; shift += 7) {
      b = bytes[p++];
      gap += (b & 0x7f) * 2 ** shift;
    }
    slot += gap;
    slots[n] = slot;
    b = bytes[p++];
    if (b === 0) {
      for (let i = 0; i < 4; i++) rawCountBytes[i] = bytes[p++];
      tfs[n] = rawCount[0];
      continue;
    }
    let tf = b & 0x7f;
    for (let shift = 7; b >= 0x80; shift += 7) {
      b = bytes[p++];
      tf += (b & 0x7f) * 2 ** shift;
    }
    tfs[n] = tf;
  }
  return n;
}

/** Documents handled between two looks at the caller's budget. */
const STEP_DOCS = 32;
/** Terms handled by one step of prefix sums. */
const STEP_TERMS = 1 << 16;

/**
 * Builds a PostingsBlock in steps: counting each term's bytes, prefix sums, filling (slots in
 * ascending order, so each term's entries come in slot order and each gap is known).
 */
export class PostingsBuild {
  private _phase: 'count' | 'offsets' | 'allocate' | 'fill' | 'done' = 'count';
  private _total = 0;
  private _next = 0;
  /** Bytes of each term's list (counting), then its write position (filling). */
  private _count: Int32Array = new Int32Array(1024);
  /** The last slot seen holding each term (−1: none yet). */
  private _last: Int32Array = new Int32Array(1024).fill(-1);
  /** Entries of each term's list. */
  private _df: Int32Array = new Int32Array(1024);
  private _terms = 0;
  private _offsets = new Int32Array(0);
  private _bytes = new Uint8Array(0);
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
      if (top > this._count.length) {
        this._count = grownInt32(this._count, top, 0);
        this._last = grownInt32(this._last, this._count.length, -1);
        this._df = grownInt32(this._df, this._count.length, 0);
      }
      this._terms = Math.max(this._terms, top);
      countBytesOf(j, d.termIds, d.counts, this._count, this._last, this._df);
    }
    this._next = end;
    if (end < this.docs.length) return;
    this._offsets = new Int32Array(this._terms + 1);
    [this._phase, this._next] = ['offsets', 0];
  }

  /** Prefix sums of the byte counts, STEP_TERMS terms a step. */
  private offsetsStep(): void {
    const end = Math.min(this._terms, this._next + STEP_TERMS);
    this._total = prefixSums(this._count, this._offsets, this._next, end, this._total);
    this._next = end;
    if (end < this._terms) return;
    this._offsets[this._terms] = this._total;
    this._phase = 'allocate';
  }

  /** One buffer for every list; the byte counts become write positions, the last slots start again. */
  private allocate(): void {
    const total = this._total;
    if (total > 2 ** 31 - 1) throw new RangeError(`${total} bytes of postings are too many for one block`);
    this._bytes = new Uint8Array(total);
    this._count.set(this._offsets.subarray(0, this._terms));
    this._last.fill(-1);
    [this._phase, this._next] = ['fill', 0];
  }

  private fillStep(): void {
    const end = Math.min(this.docs.length, this._next + STEP_DOCS);
    for (let j = this._next; j < end; j++) {
      const d = this.docs[j];
      if (d !== null) fillIds(j, d.termIds, d.counts, this._count, this._last, this._bytes);
    }
    this._next = end;
    if (end < this.docs.length) return;
    this._block = new PostingsBlock(this._offsets, this._bytes, this._df.slice(0, this._terms), this.builtAt);
    this._phase = 'done';
    this._count = new Int32Array(0);
    this._last = new Int32Array(0);
    this._df = new Int32Array(0);
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

/** Adds the bytes slot's entry takes in each of its terms' lists. */
function countBytesOf(slot: number, ids: Int32Array, counts: Float32Array, bytes: Int32Array, last: Int32Array, df: Int32Array): void {
  for (let i = 0; i < ids.length; i++) {
    const t = ids[i];
    bytes[t] += varintBytes(slot - last[t]) + countBytes(counts[i]);
    last[t] = slot;
    df[t]++;
  }
}

/** Slots are filled in ascending order, so each term's list comes out in ascending slots. */
function fillIds(slot: number, ids: Int32Array, counts: Float32Array, at: Int32Array, last: Int32Array, out: Uint8Array): void {
  for (let i = 0; i < ids.length; i++) {
    const t = ids[i];
    at[t] = putCount(out, putVarint(out, at[t], slot - last[t]), counts[i]);
    last[t] = slot;
  }
}

function grownInt32(a: Int32Array, size: number, fill: number): Int32Array {
  const g = new Int32Array(Math.max(size, 2 * a.length)).fill(fill);
  g.set(a);
  return g;
}
