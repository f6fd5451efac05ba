/**
 * Bag-of-words counting: a growing vocabulary and per-document sorted (term id, count) vectors.
 * This is the raw, unpruned, unweighted layer; pruning and weighting work on top of it.
 *
 * A vocabulary reopened from a saved index keeps its terms as one UTF-8 buffer ('\0' between
 * terms) with start offsets, and decodes a term only when asked: turning millions of raw terms
 * into strings and a hash map took most of a reopen. Ids below `sorted` are in ascending byte
 * order (IndexBuilder numbers terms in code-unit order, which byte order matches for every term
 * without characters above U+FFFF), so idOf finds them by binary search on the bytes; the later
 * ids (terms added by fold-in, or any unsorted rest) live in a map built on first use, which also
 * remembers terms already found.
 */
import { InvalidInputError } from '../errors.js';

/** Term counts of one document: ids ascending, counts aligned. */
export interface DocTerms {
  readonly termIds: Int32Array;
  readonly counts: Float32Array;
  /** Total tokens (sum of counts). */
  readonly length: number;
}

export const EMPTY_DOC_TERMS: DocTerms = Object.freeze({ termIds: new Int32Array(0), counts: new Float32Array(0), length: 0 });

/** The count of a term in a document's terms (binary search: ids are ascending); 0 when absent. */
export function countOfTerm(d: DocTerms, termId: number): number {
  let lo = 0;
  let hi = d.termIds.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const v = d.termIds[mid];
    if (v === termId) return d.counts[mid];
    if (v < termId) lo = mid + 1;
    else hi = mid - 1;
  }
  return 0;
}

/**
 * A vocabulary as bytes: its terms in UTF-8 with '\0' between them, the start offset of each term
 * (one more entry than terms; the last is bytes.length + 1), and how many leading ids are in
 * ascending byte order.
 */
export interface VocabularyBytes {
  readonly bytes: Uint8Array;
  readonly starts: Int32Array;
  readonly sorted: number;
}

const encoder = new TextEncoder();
const decoder = new TextDecoder('utf-8');

/** Start offsets of the '\0'-separated terms of bytes, given how many there are. */
function termStarts(bytes: Uint8Array, count: number): Int32Array {
  const starts = new Int32Array(count + 1);
  let n = 1;
  for (let i = 0; i < bytes.length; i++) if (bytes[i] === 0) starts[n++] = i + 1;
  starts[count] = bytes.length + 1;
  return starts;
}

/** True when starts delimit starts.length − 1 '\0'-separated terms of bytes. */
function validStarts(bytes: Uint8Array, starts: Int32Array): boolean {
  const count = starts.length - 1;
  if (count === 0) return bytes.length === 0;
  if (starts[0] !== 0 || starts[count] !== bytes.length + 1) return false;
  for (let i = 1; i < count; i++) if (!(starts[i] > starts[i - 1] && bytes[starts[i] - 1] === 0)) return false;
  return starts[count] > starts[count - 1];
}

/** Byte-order comparison of term a (bytes[a0, a1)) with q[q0, q1). */
function compareBytes(bytes: Uint8Array, a0: number, a1: number, q: Uint8Array, q0: number, q1: number): number {
  const n = Math.min(a1 - a0, q1 - q0);
  for (let i = 0; i < n; i++) {
    const d = bytes[a0 + i] - q[q0 + i];
    if (d !== 0) return d;
  }
  return a1 - a0 - (q1 - q0);
}

/** Length of the leading run of terms in strictly ascending byte order, from a known run `from`. */
function sortedRun(bytes: Uint8Array, starts: Int32Array, count: number, from: number): number {
  let i = Math.max(from, 1);
  while (i < count && compareBytes(bytes, starts[i - 1], starts[i] - 1, bytes, starts[i], starts[i + 1] - 1) < 0) i++;
  return Math.min(i, count);
}

/** Term strings with stable integer ids (ids are never reused). */
export class Vocabulary {
  /** Terms of a saved file: ids below _base, decoded on demand. */
  private _bytes: Uint8Array = new Uint8Array(0);
  private _starts: Int32Array = new Int32Array(1);
  private _base = 0;
  /** Ids below this are in ascending byte order (binary search). */
  private _sorted = 0;
  /** Terms added since (ids from _base). */
  private readonly _added: string[] = [];
  /** Term → id for every id from _sorted on, plus sorted ids already looked up (null until needed). */
  private _ids: Map<string, number> | null = new Map();
  /** Every term by id, built on first use of `terms`, then kept in step with add. */
  private _all: string[] | null = null;
  private _query = new Uint8Array(64);

  constructor(terms: Iterable<string> = []) {
    for (const t of terms) this.add(t);
  }

  /**
   * A vocabulary over saved bytes (kept, not copied). Returns null when the offsets do not
   * delimit the terms of the bytes or `sorted` is out of range.
   */
  static fromBytes(saved: VocabularyBytes): Vocabulary | null {
    const { bytes, starts, sorted } = saved;
    const count = starts.length - 1;
    if (count < 0 || !Number.isInteger(sorted) || sorted < 0 || sorted > count || !validStarts(bytes, starts)) return null;
    const v = new Vocabulary();
    v._bytes = bytes;
    v._starts = starts;
    v._base = count;
    v._sorted = sorted;
    v._ids = null;
    return v;
  }

  /**
   * A vocabulary of distinct terms, ids in the given order, held as bytes as a reopened one is
   * (no string per term, no map): for a build's vocabulary, whose strings and map would stay on
   * the heap for as long as the index is open (about 15 MB for 200,000 terms). Lookups find
   * the byte-ordered leading ids by binary search, as for a reopened vocabulary.
   */
  static fromTerms(terms: readonly string[]): Vocabulary {
    const bytes = encoder.encode(terms.join('\0'));
    let separators = 0;
    for (let i = 0; i < bytes.length; i++) if (bytes[i] === 0) separators++;
    if (separators !== Math.max(0, terms.length - 1))
      throw new InvalidInputError('a term holds U+0000, the separator of a vocabulary held as bytes');
    const starts = termStarts(bytes, terms.length);
    return Vocabulary.fromBytes({ bytes, starts, sorted: sortedRun(bytes, starts, terms.length, 0) })!;
  }

  /**
   * fromTerms of terms already encoded as fromTerms encodes them (UTF-8, '\0' between terms, no
   * term holding U+0000) with their start offsets (the last entry bytes.length + 1): the same
   * vocabulary, without a string per term on the way. Null when the offsets do not delimit the bytes.
   */
  static fromEncoded(bytes: Uint8Array, starts: Int32Array): Vocabulary | null {
    const count = starts.length - 1;
    if (count < 0 || !validStarts(bytes, starts)) return null;
    return Vocabulary.fromBytes({ bytes, starts, sorted: sortedRun(bytes, starts, count, 0) });
  }

  /** The terms as bytes for saving (shares memory with a reopened vocabulary: do not modify). */
  toBytes(): VocabularyBytes {
    const count = this.size;
    if (this._added.length === 0) return { bytes: this._bytes, starts: this._starts, sorted: this._base === 0 ? 0 : this._sorted };
    const tail = encoder.encode(this._added.join('\0'));
    const bytes = new Uint8Array(this._bytes.length + (this._base > 0 ? 1 : 0) + tail.length);
    bytes.set(this._bytes);
    bytes.set(tail, bytes.length - tail.length);
    const starts = new Int32Array(count + 1);
    starts.set(this._starts.subarray(0, this._base));
    const offset = bytes.length - tail.length;
    const tailStarts = termStarts(tail, this._added.length);
    for (let i = 0; i < tailStarts.length; i++) starts[this._base + i] = tailStarts[i] + offset;
    const from = this._sorted === this._base ? this._sorted : count;
    return { bytes, starts, sorted: this._sorted < this._base ? this._sorted : sortedRun(bytes, starts, count, from) };
  }

  get size(): number {
    return this._base + this._added.length;
  }

  /** How many leading saved ids are known to be in ascending byte order (0 if none were saved). */
  get byteOrdered(): number {
    return this._sorted;
  }

  /** Every term by id (built on first use for a reopened vocabulary; grows with add). */
  get terms(): readonly string[] {
    if (this._base === 0) return this._added;
    if (!this._all) {
      const base = decoder.decode(this._bytes).split('\0');
      for (const t of this._added) base.push(t);
      this._all = base;
    }
    return this._all;
  }

  idOf(term: string): number | undefined {
    const ids = this._ids ?? this.buildIds();
    const known = ids.get(term);
    if (known !== undefined || this._sorted === 0) return known;
    const id = this.search(term);
    if (id >= 0) ids.set(term, id);
    return id >= 0 ? id : undefined;
  }

  termOf(id: number): string {
    if (this._all) return this._all[id];
    if (id >= this._base) return this._added[id - this._base];
    if (!(id >= 0)) return undefined as unknown as string;
    return decoder.decode(this._bytes.subarray(this._starts[id], this._starts[id + 1] - 1));
  }

  /** The id of term, adding it if new. */
  add(term: string): number {
    let id = this.idOf(term);
    if (id === undefined) {
      id = this.size;
      this._added.push(term);
      this._all?.push(term);
      this._ids!.set(term, id);
    }
    return id;
  }

  /** The map of every id from _sorted on (saved unsorted terms and added ones). */
  private buildIds(): Map<string, number> {
    const ids = new Map<string, number>();
    if (this._sorted < this._base) {
      const rest = decoder.decode(this._bytes.subarray(this._starts[this._sorted])).split('\0');
      rest.forEach((t, i) => ids.set(t, this._sorted + i));
    }
    this._added.forEach((t, i) => ids.set(t, this._base + i));
    this._ids = ids;
    return ids;
  }

  /** Binary search of the byte-ordered ids; -1 when absent. */
  private search(term: string): number {
    if (this._query.length < term.length * 3) this._query = new Uint8Array(term.length * 3);
    const qn = encoder.encodeInto(term, this._query).written;
    const q = this._query;
    const starts = this._starts;
    let lo = 0;
    let hi = this._sorted - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >>> 1;
      const c = compareBytes(this._bytes, starts[mid], starts[mid + 1] - 1, q, 0, qn);
      if (c < 0) lo = mid + 1;
      else if (c > 0) hi = mid - 1;
      else return mid;
    }
    return -1;
  }
}

/**
 * Counts tokens against a vocabulary. With grow = true unknown terms are added (in order of first
 * occurrence); otherwise they are dropped (folding a query into a frozen index). Each distinct
 * token is looked up once.
 */
export function countTerms(tokens: readonly string[], vocab: Vocabulary, grow: boolean): DocTerms {
  const tally = new Map<string, number>();
  for (const t of tokens) tally.set(t, (tally.get(t) ?? 0) + 1);
  const byId = new Map<number, number>();
  let length = 0;
  for (const [t, c] of tally) {
    const id = grow ? vocab.add(t) : vocab.idOf(t);
    if (id === undefined) continue;
    byId.set(id, c);
    length += c;
  }
  const termIds = Int32Array.from(byId.keys()).sort();
  const counts = new Float32Array(termIds.length);
  for (let i = 0; i < termIds.length; i++) counts[i] = byId.get(termIds[i])!;
  return { termIds, counts, length };
}

/**
 * countTerms for tokens already looked up: one term id per token (sorted in place) → ids ascending
 * with their counts. No maps, for the many short lists of the name field (a path's few words).
 */
export function countTermIds(ids: number[]): DocTerms {
  ids.sort((a, b) => a - b);
  let distinct = 0;
  for (let i = 0; i < ids.length; i++) if (i === 0 || ids[i] !== ids[i - 1]) distinct++;
  const termIds = new Int32Array(distinct);
  const counts = new Float32Array(distinct);
  for (let i = 0, d = -1; i < ids.length; i++) {
    if (i === 0 || ids[i] !== ids[i - 1]) termIds[++d] = ids[i];
    counts[d]++;
  }
  return { termIds, counts, length: ids.length };
}
