/**
 * Term counting for a tokenizing thread, with the same result as
 * countTerms(tokenize(text, options), vocabulary, true) but far less work per token:
 *   - tokenize() treats every word (a maximal run of letters, digits, '_' and '$' of the
 *     NFKD-normalised, mark-free text) on its own, so the terms of a word are cached: a repeated
 *     word costs one map lookup instead of splitting, lowercasing, stop-word tests and stemming;
 *   - the cache maps a word straight to term ids of a thread-local vocabulary, and counts go to a
 *     reusable typed array instead of a Map per document.
 * The thread reports new terms in id order, so the receiver can translate local ids to its own.
 * test/node/parallel/wordCounter.test.ts checks the equality with tokenize + countTerms.
 */
import { tokenize, type TokenizeOptions } from '../../core/text/tokenize.js';

// The normalisation and word pattern of src/core/text/tokenize.ts (kept in step by the test).
const WORD = /[\p{L}\p{N}_$]+/gu;
const MARKS = /\p{M}+/gu;
/** Distinct words cached before the cache is cleared (bounds memory on huge trees). */
const WORD_CACHE_LIMIT = 1_000_000;
const NO_TERMS: readonly number[] = [];

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
  private cache = new Map<string, readonly number[] | number>();
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
    const normalised = text.normalize('NFKD').replace(MARKS, '');
    let length = 0;
    for (const m of normalised.matchAll(WORD)) {
      const word = m[0];
      let ids = this.cache.get(word);
      if (ids === undefined) {
        ids = this.wordTerms(word);
        if (this.cache.size >= WORD_CACHE_LIMIT) this.cache = new Map();
        this.cache.set(word, ids);
      }
      if (typeof ids === 'number') {
        this.bump(ids);
        length++;
      } else {
        for (let i = 0; i < ids.length; i++) this.bump(ids[i]);
        length += ids.length;
      }
    }
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

  private bump(id: number): void {
    if (this.tally[id]++ === 0) this.touched.push(id);
  }

  /** The local ids of a word's terms (a number when there is exactly one). */
  private wordTerms(word: string): readonly number[] | number {
    const tokens = tokenize(word, this.options);
    if (tokens.length === 0) return NO_TERMS;
    const ids = tokens.map((t) => this.add(t));
    return ids.length === 1 ? ids[0] : ids;
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
