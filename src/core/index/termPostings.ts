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
 */
import type { DocTerms } from './termCounts.js';

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
    for (let p = 0; p < side.length; p += 2) if (side[p] === slot) {
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
