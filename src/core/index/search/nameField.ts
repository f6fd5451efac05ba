/**
 * The name field: the words of a file's path, its folders and its name without the extension
 * ("internal/operators/switchMap.ts" → internal, operators, switch, map, switchmap), tokenized as
 * the file's text is. A description of code tends to use the words of what the file declares, and
 * a file is named after it; a page of documentation tends to mention the pages it relates to by
 * their names. The field is scored as a collection of its own, by BM25 (Robertson & Zaragoza 2009)
 * with its own document frequencies, and fused with the body's score after each is divided by its
 * maximum: scoring fields apart and combining the scores is the simple multi-field form that
 * Robertson, Zaragoza & Taylor (2004, "Simple BM25 extension to multiple weighted fields") set
 * against BM25F; BM25F itself (one saturation over both fields, the body's idf) gained little
 * here, since a code file already repeats its own name in its body (docs/ranking-checks.md).
 * Numbers (all digits) are not names and are left out, and so is the extension (every file of a
 * kind shares it). No data beyond the paths: the field is made from them when first needed.
 * Defaults k1 = 1.2, b = 0.75 (BM25's common practice, bm25.ts).
 * In search, two guards keep a name from outweighing the text (fusion.ts, nameWeight): a name's
 * score counts by the share of the query it covers (the idf-weighted share of the query's words the
 * name holds: one word of a long question counts little, most of a short query a lot; coordination
 * level matching weighted by idf, common practice), and only code files' names count (their
 * extension names a programming language), as a code file is named after what it declares, while a
 * page's name is a title that may share a word with a question it does not answer.
 */
import { countOfTerm, type DocTerms } from '../../counting/termCounts.js';
import { asciiWordTokens, isAsciiWord } from '../../text/asciiWord.js';
import type { Language } from '../../text/languages.js';
import type { TokenizeOptions } from '../../text/tokenize.js';
import { tokenizeIn } from '../../text/tokenizeLanguage.js';
import { codeLanguageOf } from '../../sections/splitSections.js';
import { DEFAULT_BM25_OPTIONS, type Bm25Options } from './bm25.js';

/** Whether a path's name counts in search: a code file's (its extension names a programming language). */
export function declaringName(path: string): boolean {
  return codeLanguageOf(path) !== undefined;
}

/** The text of a path's name words: folders and the file name without its extension, separated by spaces. */
export function pathNameText(path: string): string {
  const slash = path.lastIndexOf('/');
  const file = path.slice(slash + 1);
  const dot = file.lastIndexOf('.');
  const stem = dot > 0 ? file.slice(0, dot) : file;
  return `${path.slice(0, slash + 1)}${stem}`.replace(/[/\\.]+/g, ' ');
}

const PATH_WORD = /[\p{L}\p{N}_$]+/gu;
const ALL_DIGITS = /^\p{N}+$/u;
/** Words remembered at most (the cache is cleared past it; common practice for a memo). */
const WORD_CACHE_LIMIT = 200_000;

/**
 * A path's name tokens (pathNameText, tokenized in the file's language, numbers left out), word by
 * word with each word's tokens remembered: folders repeat over a tree's files, so most words of a
 * path were met before. ASCII words of English files take the tokenizer's fast twin (asciiWord.ts,
 * held equal to tokenize() by its tests).
 */
export class PathNameTokens {
  private readonly _cache = new Map<string, readonly string[]>();
  private readonly _folders = new Map<string, string[]>();

  constructor(private readonly _options: TokenizeOptions) {}

  /** The name tokens of a path: its folders' (remembered per folder) and its file name's. */
  tokens(path: string, language: Language = 'en'): string[] {
    const slash = path.lastIndexOf('/');
    if (slash < 0) return this.words(pathNameText(path), language);
    const key = `${language}\0${path.slice(0, slash)}/`;
    let folder = this._folders.get(key);
    if (folder === undefined) {
      folder = this.words(path.slice(0, slash), language);
      if (this._folders.size >= WORD_CACHE_LIMIT) this._folders.clear();
      this._folders.set(key, folder);
    }
    return [...folder, ...this.words(pathNameText(path.slice(slash + 1)), language)];
  }

  private words(text: string, language: Language): string[] {
    const out: string[] = [];
    for (const m of text.matchAll(PATH_WORD)) {
      const key = language === 'en' ? m[0] : `${language}\0${m[0]}`;
      let t = this._cache.get(key);
      if (t === undefined) {
        const all =
          language === 'en' && isAsciiWord(m[0]) ? asciiWordTokens(m[0], this._options) : tokenizeIn(m[0], this._options, language);
        t = all.filter((x) => !ALL_DIGITS.test(x));
        if (this._cache.size >= WORD_CACHE_LIMIT) this._cache.clear();
        this._cache.set(key, t);
      }
      for (const x of t) out.push(x);
    }
    return out;
  }
}

/** The name terms of every slot and their postings (term → [slot, tf, slot, tf, …]), kept up to date by set(). */
export class NameField {
  private readonly _opts: Bm25Options;
  private readonly _names: (DocTerms | null)[] = [];
  /** Per slot: whether its name counts in search (declaringName). */
  private readonly _declares: boolean[] = [];
  private readonly _postings = new Map<number, number[]>();
  private _total = 0;
  private _n = 0;

  constructor(options: Partial<Bm25Options> = {}) {
    this._opts = { ...DEFAULT_BM25_OPTIONS, ...options };
  }

  /** Sets (or with null clears) a slot's name terms; `declares`: whether the name counts in search (declaringName). */
  set(slot: number, names: DocTerms | null, declares = true): void {
    while (this._names.length <= slot) this._names.push(null);
    while (this._declares.length <= slot) this._declares.push(false);
    this._declares[slot] = names !== null && declares;
    const old = this._names[slot];
    if (old) {
      this._n--;
      this._total -= old.length;
      for (const t of old.termIds) {
        const list = this._postings.get(t)!;
        for (let p = 0; p < list.length; p += 2)
          if (list[p] === slot) {
            list.splice(p, 2);
            break;
          }
        if (list.length === 0) this._postings.delete(t);
      }
    }
    const now = names && names.length > 0 ? names : null;
    this._names[slot] = now;
    if (now) {
      this._n++;
      this._total += now.length;
      for (let i = 0; i < now.termIds.length; i++) {
        const t = now.termIds[i];
        let list = this._postings.get(t);
        if (!list) this._postings.set(t, (list = []));
        list.push(slot, now.counts[i]);
      }
    }
  }

  /** A slot's name terms (null when it has none). */
  namesOf(slot: number): DocTerms | null {
    return this._names[slot] ?? null;
  }

  /** The idf of a term among the names: ln(1 + (N − df + 0.5)/(df + 0.5)), N the files with a name (0 when no name holds it). */
  idf(termId: number): number {
    const df = (this._postings.get(termId)?.length ?? 0) / 2;
    return df > 0 ? Math.log(1 + (this._n - df + 0.5) / (df + 0.5)) : 0;
  }

  /**
   * Adds each slot's BM25 score of the query (ids with their counts) over the name field into out;
   * δ > 0 in BM25L's form, as bm25.ts. `exclude` is a slot left out (nearby's own file).
   */
  scoreInto(query: DocTerms, out: Float64Array, delta = 0, exclude = -1): void {
    for (let i = 0; i < query.termIds.length; i++) {
      const list = this._postings.get(query.termIds[i]);
      if (!list) continue;
      const idf = this.idf(query.termIds[i]) * query.counts[i];
      for (let p = 0; p < list.length; p += 2) {
        const j = list[p];
        if (j !== exclude && j < out.length) out[j] += idf * this.saturated(list[p + 1], j, delta);
      }
    }
  }

  /**
   * Search's form of the field: each slot's score of the query (scoreInto, δ 0) divided by the best
   * (returned; the best among the slots whose names count), times c^power, c the weight(i)-weighted
   * share of the query's terms the slot's name holds; slots whose names do not count in search
   * (declaringName) get 0. Written into out (overwritten).
   */
  searchScoresInto(query: DocTerms, weight: (i: number) => number, power: number, out: Float64Array): number {
    out.fill(0);
    this.scoreInto(query, out);
    let max = 0;
    for (let j = 0; j < out.length; j++) {
      if (out[j] > 0 && !this._declares[j]) out[j] = 0;
      max = Math.max(max, out[j]);
    }
    if (max <= 0) return 0;
    for (let j = 0; j < out.length; j++) out[j] /= max;
    if (power > 0) {
      let total = 0;
      for (let i = 0; i < query.termIds.length; i++) total += weight(i);
      for (let j = 0; j < out.length; j++) if (out[j] > 0) out[j] *= Math.pow(this.coverage(query, weight, j, total), power);
    }
    return max;
  }

  /** The weight(i)-weighted share of the query's terms a slot's name holds (0…1; `total` is the weights' sum). */
  coverage(query: DocTerms, weight: (i: number) => number, slot: number, total: number): number {
    const names = this._names[slot];
    if (!names || !(total > 0)) return 0;
    let held = 0;
    for (let i = 0; i < query.termIds.length; i++) if (countOfTerm(names, query.termIds[i]) > 0) held += weight(i);
    return Math.min(1, held / total);
  }

  /** Whether a slot's name counts in search (declaringName). */
  declares(slot: number): boolean {
    return this._declares[slot] ?? false;
  }

  /** One query term's part of a slot's name score (for explanations), as scoreInto adds it. */
  termScore(termId: number, queryCount: number, slot: number, delta = 0): number {
    const names = this._names[slot];
    const tf = names ? countOfTerm(names, termId) : 0;
    return tf > 0 ? this.idf(termId) * queryCount * this.saturated(tf, slot, delta) : 0;
  }

  /** (k1 + 1)(c + δ)/(k1 + c + δ) with c = tf/(1 − b + b·len/avglen). */
  private saturated(tf: number, slot: number, delta: number): number {
    // The length norm worked out where it is used (not an array made again after every set()).
    const { k1, b } = this._opts;
    const d = this._names[slot];
    const norm = d ? 1 - b + (b * d.length) / (this._n > 0 ? this._total / this._n : 1) : 1;
    const x = tf / norm + delta;
    return ((k1 + 1) * x) / (k1 + x);
  }
}
