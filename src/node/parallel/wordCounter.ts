/**
 * Term counting for a tokenizing thread, with the same result as
 * countTerms(tokenize(text, options), vocabulary, true) but far less work per token:
 *   - tokenize() treats every word (a maximal run of letters, digits, '_' and '$' of the
 *     NFKD-normalised, mark-free text) on its own, so the terms of a word are cached: a repeated
 *     word costs one map lookup instead of splitting, lowercasing, stop-word tests and stemming;
 *   - the cache maps a word straight to term ids of a thread-local vocabulary, and counts go to a
 *     reusable typed array instead of a Map per document;
 *   - ASCII text (most source files) is scanned by char code, and the cache is an open-addressing
 *     table probed by an FNV-1a hash of the word's char codes, so a repeated word costs no
 *     substring and no string hashing at all.
 * The thread reports new terms in id order, so the receiver can translate local ids to its own.
 * test/node/parallel/wordCounter.test.ts checks the equality with tokenize + countTerms.
 */
import { tokenize, type TokenizeOptions } from '../../core/text/tokenize.js';

// The normalisation and word pattern of src/core/text/tokenize.ts (kept in step by the test).
const WORD = /[\p{L}\p{N}_$]+/gu;
const MARKS = /\p{M}+/gu;
/** Distinct words cached before the cache is cleared (bounds memory on huge trees). */
const WORD_CACHE_LIMIT = 1_000_000;

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
  private tally = new Int32Array(1024);
  private readonly touched: number[] = [];

  constructor(private readonly options: Partial<TokenizeOptions>) {}

  /** Terms added since the last call, in id order (ids reported, reported + 1, …). */
  takeNewTerms(): string[] {
    const out = this.terms.slice(this.reported);
    this.reported = this.terms.length;
    return out;
  }

  count(text: string): LocalCounts {
    const length = NON_ASCII.test(text) ? this.countWords(text) : this.countAscii(text);
    const touched = this.touched;
    const idArr = Int32Array.from(touched).sort();
    const counts = new Int32Array(idArr.length);
    for (let i = 0; i < idArr.length; i++) {
      counts[i] = this.tally[idArr[i]];
      this.tally[idArr[i]] = 0;
    }
    touched.length = 0;
    return { ids: idArr, counts, length };
  }

  /** Any text: tokenize's normalisation and word pattern. */
  private countWords(text: string): number {
    const normalised = text.normalize('NFKD').replace(MARKS, '');
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
   * ASCII text (NFKD leaves it unchanged and it has no marks): words are runs of [A-Za-z0-9_$],
   * found and hashed by char code, so a repeated word needs no substring at all.
   */
  private countAscii(text: string): number {
    let length = 0;
    const n = text.length;
    let i = 0;
    while (i < n) {
      while (i < n && !ASCII_WORD[text.charCodeAt(i)]) i++;
      if (i >= n) break;
      const start = i;
      let h = FNV_OFFSET;
      for (; i < n; i++) {
        const c = text.charCodeAt(i);
        if (!ASCII_WORD[c]) break;
        h = Math.imul(h ^ c, FNV_PRIME);
      }
      length += this.emit(text, start, i, h);
    }
    return length;
  }

  /** Counts the terms of text[start, end) (a word with hash h); returns how many. */
  private emit(text: string, start: number, end: number, h: number): number {
    let entry = this.cache.find(text, start, end, h);
    if (entry < 0) entry = this.cache.insert(text.slice(start, end), h, this.wordTerms(text.slice(start, end)));
    const ids = this.cache.ids;
    const from = this.cache.start[entry];
    const stop = entry + 1 < this.cache.size ? this.cache.start[entry + 1] : this.cache.used;
    for (let p = from; p < stop; p++) {
      const id = ids[p];
      if (this.tally[id]++ === 0) this.touched.push(id);
    }
    return stop - from;
  }

  /** The local ids of a word's terms. */
  private wordTerms(word: string): number[] {
    return tokenize(word, this.options).map((t) => this.add(t));
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
const ASCII_WORD = new Uint8Array(65536);
for (let c = 0; c < 128; c++) {
  const ch = String.fromCharCode(c);
  if (/[A-Za-z0-9_$]/.test(ch)) ASCII_WORD[c] = 1;
}
const FNV_OFFSET = 0x811c9dc5 | 0;
const FNV_PRIME = 0x01000193;

/**
 * Open-addressing table from a word to its term ids (pooled in one Int32Array): lookups compare
 * char codes in place. Cleared when it holds WORD_CACHE_LIMIT words.
 */
class WordTable {
  words: string[] = [];
  hashes: number[] = [];
  /** start[e] is where entry e's ids begin in ids; entry e ends where e + 1 begins (or at used). */
  start: number[] = [];
  ids = new Int32Array(1 << 16);
  used = 0;
  private slots = new Int32Array(1 << 16).fill(-1);

  get size(): number {
    return this.words.length;
  }

  find(text: string, start: number, end: number, h: number): number {
    const mask = this.slots.length - 1;
    const len = end - start;
    for (let s = h & mask; ; s = (s + 1) & mask) {
      const e = this.slots[s];
      if (e < 0) return -1;
      if (this.hashes[e] !== h) continue;
      const w = this.words[e];
      if (w.length !== len) continue;
      let same = true;
      for (let i = 0; i < len; i++) {
        if (w.charCodeAt(i) !== text.charCodeAt(start + i)) {
          same = false;
          break;
        }
      }
      if (same) return e;
    }
  }

  insert(word: string, h: number, termIds: readonly number[]): number {
    if (this.words.length >= WORD_CACHE_LIMIT) this.clear();
    if ((this.words.length + 1) * 2 > this.slots.length) this.rehash(this.slots.length * 2);
    const e = this.words.length;
    this.words.push(word);
    this.hashes.push(h);
    this.start.push(this.used);
    if (this.used + termIds.length > this.ids.length) {
      const grown = new Int32Array(Math.max(this.ids.length * 2, this.used + termIds.length));
      grown.set(this.ids.subarray(0, this.used));
      this.ids = grown;
    }
    for (const id of termIds) this.ids[this.used++] = id;
    const mask = this.slots.length - 1;
    let s = h & mask;
    while (this.slots[s] >= 0) s = (s + 1) & mask;
    this.slots[s] = e;
    return e;
  }

  private rehash(size: number): void {
    this.slots = new Int32Array(size).fill(-1);
    const mask = size - 1;
    for (let e = 0; e < this.words.length; e++) {
      let s = this.hashes[e] & mask;
      while (this.slots[s] >= 0) s = (s + 1) & mask;
      this.slots[s] = e;
    }
  }

  private clear(): void {
    this.words = [];
    this.hashes = [];
    this.start = [];
    this.used = 0;
    this.slots = new Int32Array(1 << 16).fill(-1);
  }
}
