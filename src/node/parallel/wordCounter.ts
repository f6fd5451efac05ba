/**
 * Term counting for a tokenizing thread, with the same result as
 * countTerms(tokenize(text, options), vocabulary, true) but far less work per token:
 *   - tokenize() treats every word (a maximal run of letters, digits, '_' and '$' of the
 *     NFKD-normalised, mark-free text) on its own, so the terms of a word are cached: a repeated
 *     word costs one map lookup instead of splitting, lowercasing, stop-word tests and stemming;
 *   - the cache maps a word straight to term ids of a thread-local vocabulary, and counts go to a
 *     reusable typed array instead of a Map per document;
 *   - text is scanned by char code (word characters classified once per code unit), and the cache
 *     is an open-addressing table probed by an FNV-1a hash of the word's char codes, so a
 *     repeated word costs no substring and no string hashing at all.
 * The thread reports new terms in id order, so the receiver can translate local ids to its own.
 * test/node/parallel/wordCounter.test.ts checks the equality with tokenize + countTerms.
 */
import { DEFAULT_TOKENIZE_OPTIONS, tokenize, type TokenizeOptions } from '../../core/text/tokenize.js';
import { asciiWordLowerTokens, isAsciiWord } from './asciiWord.js';
import { porterStem } from './porterFast.js';

// The normalisation and word pattern of src/core/text/tokenize.ts (kept in step by the test).
const WORD = /[\p{L}\p{N}_$]+/gu;
const MARKS = /\p{M}+/gu;
/** Distinct words cached before the cache is cleared (bounds memory on huge trees). */
const WORD_CACHE_LIMIT = 2_000_000;

export interface LocalCounts {
  /** Local term ids, ascending. */
  readonly ids: Int32Array;
  readonly counts: Int32Array;
  /** Number of tokens (sum of counts). */
  readonly length: number;
}

export class WordCounter {
  private readonly idOf = new Map<string, number>();
  private readonly terms: string[] = [];
  private reported = 0;
  private readonly cache = new WordTable();
  private tokenIds = new Map<string, number>();
  private tally = new Int32Array(1024);
  private touched = new Int32Array(1024);
  private nTouched = 0;

  private readonly resolved: Readonly<TokenizeOptions>;

  constructor(private readonly options: Partial<TokenizeOptions>) {
    this.resolved = { ...DEFAULT_TOKENIZE_OPTIONS, ...options };
  }

  /** Terms added since the last call, in id order (ids reported, reported + 1, …). */
  takeNewTerms(): string[] {
    const out = this.terms.slice(this.reported);
    this.reported = this.terms.length;
    return out;
  }

  /** All local term ids, ordered by term (UTF-16 code unit order, as Array.prototype.sort gives). */
  sortedTermOrder(): Int32Array {
    const sorted = [...this.terms].sort();
    return Int32Array.from(sorted, (t) => this.idOf.get(t)!);
  }

  count(text: string): LocalCounts {
    let length: number;
    if (!NON_ASCII.test(text)) length = this.scan(text);
    else {
      // tokenize's normalisation; then the same scan, unless astral characters need the regex.
      const normalised = text.normalize('NFKD').replace(MARKS, '');
      length = SURROGATE.test(normalised) ? this.countWords(normalised) : this.scan(normalised);
    }
    const n = this.nTouched;
    const idArr = this.touched.slice(0, n).sort();
    const counts = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      counts[i] = this.tally[idArr[i]];
      this.tally[idArr[i]] = 0;
    }
    this.nTouched = 0;
    return { ids: idArr, counts, length };
  }

  /** Normalised text with astral characters: tokenize's own word pattern. */
  private countWords(normalised: string): number {
    let length = 0;
    for (const m of normalised.matchAll(WORD)) {
      const word = m[0];
      let h = FNV_OFFSET;
      for (let i = 0; i < word.length; i++) h = Math.imul(h ^ word.charCodeAt(i), FNV_PRIME);
      length += this.emit(word, 0, word.length, h);
    }
    return length;
  }

  /**
   * Normalised text without astral characters: words (runs of letters, digits, '_' and '$', as
   * tokenize's pattern) found and hashed by char code, so a repeated word needs no substring.
   */
  private scan(text: string): number {
    let length = 0;
    const n = text.length;
    let i = 0;
    while (i < n) {
      while (i < n && !isWordChar(text.charCodeAt(i))) i++;
      if (i >= n) break;
      const start = i;
      let h = FNV_OFFSET;
      for (; i < n; i++) {
        const c = text.charCodeAt(i);
        if (!isWordChar(c)) break;
        h = Math.imul(h ^ c, FNV_PRIME);
      }
      length += this.emit(text, start, i, h);
    }
    return length;
  }

  /** Counts the terms of text[start, end) (a word with hash h); returns how many. */
  private emit(text: string, start: number, end: number, h: number): number {
    let entry = this.cache.find(text, start, end, h);
    if (entry < 0) entry = this.cache.insert(text, start, end, h, this.wordTerms(text.slice(start, end)));
    const ids = this.cache.ids;
    const from = this.cache.start[entry];
    const stop = this.cache.start[entry + 1];
    for (let p = from; p < stop; p++) {
      const id = ids[p];
      if (this.tally[id]++ === 0) {
        if (this.nTouched === this.touched.length) this.touched = grow32(this.touched, this.nTouched + 1);
        this.touched[this.nTouched++] = id;
      }
    }
    return stop - from;
  }

  /** The local ids of a word's terms (ASCII words by the char-code path of asciiWord.ts). */
  private wordTerms(word: string): number[] {
    if (!isAsciiWord(word)) return tokenize(word, this.options).map((t) => this.add(t));
    const lower = asciiWordLowerTokens(word, this.resolved.keepCompounds);
    const ids = new Array<number>(lower.length);
    for (let i = 0; i < lower.length; i++) {
      // One map from a lowercase token to its term's id (stemming and lookup at once).
      let id = this.tokenIds.get(lower[i]);
      if (id === undefined) {
        id = this.add(this.resolved.stem ? porterStem(lower[i]) : lower[i]);
        if (this.tokenIds.size >= WORD_CACHE_LIMIT) this.tokenIds = new Map();
        this.tokenIds.set(lower[i], id);
      }
      ids[i] = id;
    }
    return ids;
  }

  private add(term: string): number {
    let id = this.idOf.get(term);
    if (id === undefined) {
      id = this.terms.length;
      this.terms.push(term);
      this.idOf.set(term, id);
      if (id >= this.tally.length) {
        const grown = new Int32Array(this.tally.length * 2);
        grown.set(this.tally);
        this.tally = grown;
      }
    }
    return id;
  }
}

const NON_ASCII = /[^\x00-\x7f]/;
const SURROGATE = /[\ud800-\udfff]/;
const WORD_CHAR = /^[\p{L}\p{N}_$]$/u;
/** Per UTF-16 unit of the basic plane: 0 not yet known, 1 word character, 2 not. */
const WORD_CLASS = new Uint8Array(65536);

/** A letter, digit, '_' or '$' (tokenize's word characters), for a unit outside the surrogates. */
function isWordChar(c: number): boolean {
  let k = WORD_CLASS[c];
  if (k === 0) {
    k = WORD_CHAR.test(String.fromCharCode(c)) ? 1 : 2;
    WORD_CLASS[c] = k;
  }
  return k === 1;
}
const FNV_OFFSET = 0x811c9dc5 | 0;
const FNV_PRIME = 0x01000193;

/**
 * Open-addressing table from a word to its term ids: the words' UTF-16 code units live in one
 * pooled array (no string per word, so no cached word keeps a file's text alive), their term ids
 * in another. Lookups hash and compare code units in place. Cleared when it holds
 * WORD_CACHE_LIMIT words.
 */
class WordTable {
  size = 0;
  /** Term ids of entry e: ids[start[e], start[e + 1]) (start[size] = used). */
  ids = new Int32Array(1 << 16);
  start = new Int32Array(1 << 12);
  private chars = new Uint16Array(1 << 18);
  private charStart = new Int32Array(1 << 12);
  private hashes = new Int32Array(1 << 12);
  private slots = new Int32Array(1 << 13).fill(-1);

  get used(): number {
    return this.start[this.size];
  }

  find(text: string, start: number, end: number, h: number): number {
    const mask = this.slots.length - 1;
    const len = end - start;
    const chars = this.chars;
    for (let s = h & mask; ; s = (s + 1) & mask) {
      const e = this.slots[s];
      if (e < 0) return -1;
      if (this.hashes[e] !== h) continue;
      const c0 = this.charStart[e];
      if (this.charStart[e + 1] - c0 !== len) continue;
      let i = 0;
      while (i < len && chars[c0 + i] === text.charCodeAt(start + i)) i++;
      if (i === len) return e;
    }
  }

  insert(text: string, start: number, end: number, h: number, termIds: readonly number[]): number {
    if (this.size >= WORD_CACHE_LIMIT) this.clear();
    if ((this.size + 1) * 2 > this.slots.length) this.rehash(this.slots.length * 2);
    const e = this.size;
    if (e + 2 > this.hashes.length) this.growEntries();
    const len = end - start;
    const c0 = this.charStart[e];
    if (c0 + len > this.chars.length) this.chars = grow16(this.chars, c0 + len);
    for (let i = 0; i < len; i++) this.chars[c0 + i] = text.charCodeAt(start + i);
    this.charStart[e + 1] = c0 + len;
    const p0 = this.start[e];
    if (p0 + termIds.length > this.ids.length) this.ids = grow32(this.ids, p0 + termIds.length);
    for (let i = 0; i < termIds.length; i++) this.ids[p0 + i] = termIds[i];
    this.start[e + 1] = p0 + termIds.length;
    this.hashes[e] = h;
    this.size = e + 1;
    const mask = this.slots.length - 1;
    let s = h & mask;
    while (this.slots[s] >= 0) s = (s + 1) & mask;
    this.slots[s] = e;
    return e;
  }

  private growEntries(): void {
    const n = this.hashes.length * 2;
    this.hashes = grow32(this.hashes, n);
    this.start = grow32(this.start, n);
    this.charStart = grow32(this.charStart, n);
  }

  private rehash(size: number): void {
    this.slots = new Int32Array(size).fill(-1);
    const mask = size - 1;
    for (let e = 0; e < this.size; e++) {
      let s = this.hashes[e] & mask;
      while (this.slots[s] >= 0) s = (s + 1) & mask;
      this.slots[s] = e;
    }
  }

  private clear(): void {
    this.size = 0;
    this.slots.fill(-1);
  }
}

function grow32(a: Int32Array<ArrayBuffer>, atLeast: number): Int32Array<ArrayBuffer> {
  const b = new Int32Array(Math.max(atLeast, a.length * 2));
  b.set(a);
  return b;
}

function grow16(a: Uint16Array<ArrayBuffer>, atLeast: number): Uint16Array<ArrayBuffer> {
  const b = new Uint16Array(Math.max(atLeast, a.length * 2));
  b.set(a);
  return b;
}
