/**
 * Term counting for a tokenizing thread, with the same result as
 * countTerms(tokenize(text, options), vocabulary, true) but far less work per token:
 *   - the text becomes code units in one reusable buffer (textUnits.ts; ASCII files straight from
 *     their bytes, with no string at all), scanned by code unit into words;
 *   - tokenize() treats every word on its own, so a word's terms are cached in a table keyed by
 *     its code units (wordTable.ts): a repeated word costs a hash and a compare, no substring;
 *   - a new ASCII word is split by char code (asciiWord.ts) and each lowercase part looked up in
 *     a second table from token to term id, so a string is made and stemmed only for a token this
 *     thread has never seen; non-ASCII words go through tokenize() itself;
 *   - a text loaded from ASCII bytes is scanned by a loop for ASCII units alone (scanAscii);
 *   - ids are of a thread-local vocabulary; counts go to a reusable typed array.
 * The thread reports new terms in id order, so the receiver can translate local ids to its own.
 * Given the file's path, a prose file's language is detected first (detectLanguage.ts); a file
 * in another language than English is counted through tokenizeIn() (tokenizeLanguage.ts) itself.
 * test/node/parallel/wordCounter.test.ts checks the equality with tokenize + countTerms.
 */
import { STOP_WORDS } from '../../core/text/stopWords.js';
import { DEFAULT_TOKENIZE_OPTIONS, tokenize, wordTokens, type TokenizeOptions } from '../../core/text/tokenize.js';
import { allDigits, keepToken, lowerInto, MAX_TOKEN_LENGTH, partBounds, skipsWord } from '../../core/text/asciiWord.js';
import { porterStem } from '../../core/text/porterFast.js';
import { fileLanguage, fileLanguageAscii, isProsePath } from '../../core/text/detectLanguage.js';
import type { Language } from '../../core/text/languages.js';
import { tokenizeIn } from '../../core/text/tokenizeLanguage.js';
import { sortedUnitIds, unitsInOrder, type TermUnits } from './termOrder.js';
import { astralWordAt, caselessLetters, classify, CLASS, HIGH_SURROGATE, UnitBuffer, unitsToString, WORD } from './textUnits.js';
import { FNV_OFFSET, FNV_PRIME, grow32, grow8, WordTable } from './wordTable.js';

/**
 * Distinct words (and tokens) cached before a table is cleared (bounds memory on huge trees). On
 * the Linux tree 500,000 against 2 million: a few hundred MB less at the end of counting, and no
 * more CPU time measured (the words met again after a clear are mostly the frequent ones).
 */
const WORD_CACHE_LIMIT = 500_000;
/** A pack's count of this or more is kept apart (a pack's counts are bytes). */
export const SECTION_COUNT_BIG = 255;
/** Value of a cached word without terms; a word with several has -2 − (its offset in `multi`). */
const NO_TERMS = -1;

export interface LocalCounts {
  /** Local term ids, ascending. */
  readonly ids: Int32Array;
  readonly counts: Int32Array;
  /** Number of tokens (sum of counts). */
  readonly length: number;
}

/** Where packText put a file's counts: pack positions [at, at + terms). */
export interface PackedFile {
  readonly at: number;
  readonly terms: number;
  /** Number of tokens (sum of counts). */
  readonly length: number;
  /** The file's language when it is not English (packText and packAscii with a path). */
  readonly language?: Language;
}

export class WordCounter {
  /**
   * The thread's terms, code units → local id (entry e is term e: never cleared). Keys as units in
   * one pool, not a string each in a map: on the Linux tree a thread holds 2 million terms and
   * more, which as strings with a map took over 100 bytes a term.
   */
  private readonly termIds = new WordTable(Infinity, 1 << 15);
  private termUnits16 = new Uint16Array(64);
  private reported = 0;
  // Sized for a few ten thousand keys up front (a thread meets that many in its first files).
  private words = new WordTable(WORD_CACHE_LIMIT, 1 << 16);
  private tokens = new WordTable(WORD_CACHE_LIMIT, 1 << 15);
  /** Term lists of words with several terms: count, then the ids. */
  private multi = new Int32Array(1 << 12);
  private multiUsed = 0;
  private readonly text = new UnitBuffer();
  private tally = new Int32Array(1024);
  private touched = new Int32Array(1024);
  private nTouched = 0;
  private packIds = new Int32Array(1 << 14);
  /** Counts of one byte, as the section pack's (below); on the Linux tree the files' pack holds 21.6 million. */
  private packCounts = new Uint8Array(1 << 14);
  private packBig = new Map<number, number>();
  private packUsed = 0;
  /** The section pack: counts of line ranges of the text last counted (packSection), apart from the files'. */
  private sectionIds = new Int32Array(1 << 12);
  /**
   * A section's counts are small (most are 1 or 2): one byte each, SECTION_COUNT_BIG standing for
   * a count of that or more, kept exactly in sectionBig by pack position. On the Linux tree the
   * section pack holds 51 million counts, 150 MB less than as 32-bit integers.
   */
  private sectionCounts = new Uint8Array(1 << 12);
  private sectionBig = new Map<number, number>();
  private sectionUsed = 0;
  /**
   * Note each word with terms of a text as it is counted (its first unit and its table value),
   * so packSection counts a run of lines from the notes instead of scanning it again.
   */
  recordWords = false;
  private recording = false;
  private wordAt = new Int32Array(1 << 12);
  private wordValue = new Int32Array(1 << 12);
  private nWords = 0;
  /** Times the word table was cleared (a note's multi-term value is only good until then). */
  private clears = 0;
  private clearsAtLoad = 0;
  /** The loaded units came from ASCII bytes (packAscii): every unit is below 0x80. */
  private loadedAscii = false;
  // Scratch for a new word: its terms, its parts, its lowercase form.
  private found = new Int32Array(64);
  private nFound = 0;
  private bounds = new Int32Array(64);
  private lower = new Uint16Array(64);
  private readonly resolved: Readonly<TokenizeOptions>;
  private readonly scratchTokens: string[] = [];

  constructor(private readonly options: Partial<TokenizeOptions>) {
    this.resolved = { ...DEFAULT_TOKENIZE_OPTIONS, ...options };
  }

  /** Terms added since the last call, in id order (ids reported, reported + 1, …). */
  takeNewTerms(): string[] {
    const out: string[] = [];
    for (let id = this.reported; id < this.termIds.size; id++) out.push(this.termIds.keyString(id));
    this.reported = this.termIds.size;
    return out;
  }

  /**
   * Lets go of the caches of words and tokens (and the notes of the last text's words): what is
   * left is the terms and the packs. Counting goes on correctly after, from empty caches.
   */
  dropWordCaches(): void {
    this.words = new WordTable(WORD_CACHE_LIMIT, 1 << 8);
    this.tokens = new WordTable(WORD_CACHE_LIMIT, 1 << 8);
    this.multi = new Int32Array(1 << 12);
    this.multiUsed = 0;
    this.wordAt = new Int32Array(1 << 12);
    this.wordValue = new Int32Array(1 << 12);
    this.nWords = 0;
    this.clears++;
  }

  /**
   * All local term ids ordered by term (UTF-16 code unit order, as Array.prototype.sort gives),
   * and the terms in that order as code units.
   */
  sortedTerms(): { order: Int32Array; terms: TermUnits } {
    const keys = this.termIds.keys();
    const order = sortedUnitIds(keys);
    return { order, terms: unitsInOrder(keys, order) };
  }

  /** The counts of a text (fresh arrays; the worker packs a batch with packText instead). */
  count(text: string): LocalCounts {
    return this.copyOut(this.packText(text));
  }

  /** count() of text whose UTF-8 bytes are all ASCII (below 0x80), without decoding it. */
  countAscii(bytes: Uint8Array): LocalCounts {
    return this.copyOut(this.packAscii(bytes));
  }

  /** Counts a text into the current pack (see takePack); with its file's path, in the file's language. */
  packText(text: string, path?: string): PackedFile {
    if (path !== undefined && this.multilingual && isProsePath(path)) {
      const language = fileLanguage(path, text, this.resolved.languages);
      if (language !== 'en') return this.packIn(text, language);
    }
    this.text.loadText(text);
    this.loadedAscii = false;
    return this.finish(this.scanLoaded());
  }

  /** packText() of text whose UTF-8 bytes are all ASCII, without decoding it. */
  packAscii(bytes: Uint8Array, path?: string): PackedFile {
    if (path !== undefined && this.multilingual && isProsePath(path)) {
      const language = fileLanguageAscii(path, bytes, this.resolved.languages);
      if (language !== 'en') return this.packIn(asciiString(bytes), language);
    }
    this.text.loadAscii(bytes);
    this.loadedAscii = true;
    return this.finish(this.scanLoaded());
  }

  /** Scans the loaded text, noting its words for packSection when asked to (recordWords). */
  private scanLoaded(): number {
    this.nWords = 0;
    this.recording = this.recordWords;
    this.clearsAtLoad = this.clears;
    try {
      return this.loadedAscii ? this.scanAscii(this.text.units, this.text.length) : this.scan(this.text.units, this.text.length);
    } finally {
      this.recording = false;
    }
  }

  /** Counts a text in a language other than English through tokenizeIn() (notes, not hot paths). */
  private packIn(text: string, language: Exclude<Language, 'en'>): PackedFile {
    const tokens = tokenizeIn(text, this.options, language);
    for (const t of tokens) this.bump(this.add(t));
    return { ...this.finish(tokens.length), language };
  }

  /** True when the settings allow languages other than English. */
  private get multilingual(): boolean {
    const l = this.resolved.languages;
    return l !== undefined && (l === 'auto' || l.some((x) => x !== 'en'));
  }

  /**
   * The ids and counts of every file packed since the last call, in two arrays of exactly that
   * size (a batch's reply transfers just these two buffers); the next pack starts afresh.
   */
  takePack(): { ids: Int32Array; counts: Int32Array } {
    const { ids, counts, big } = this.drainSmallPack();
    return { ids: ids.slice(), counts: widen(counts, big) };
  }

  /** Everything packed since the last take (ids a view valid until the next pack), and a fresh start. */
  drainPack(): { ids: Int32Array; counts: Int32Array } {
    const { ids, counts, big } = this.drainSmallPack();
    return { ids, counts: widen(counts, big) };
  }

  /**
   * drainPack with the counts as packed: one byte each, SECTION_COUNT_BIG standing for the count
   * `big` holds at that position (views valid until the next pack; no 32-bit copy is made).
   */
  drainSmallPack(): { ids: Int32Array; counts: Uint8Array; big: Map<number, number> } {
    const out = { ids: this.packIds.subarray(0, this.packUsed), counts: this.packCounts.subarray(0, this.packUsed), big: this.packBig };
    this.packBig = new Map();
    this.packUsed = 0;
    return out;
  }

  /**
   * Counts the code units [from, to) of the text the last packText / packAscii loaded into the
   * section pack: a run of whole lines of a file counted in English is the same words as those
   * lines joined by "\n" (no word crosses a line break), so this equals packText(lines) without
   * loading them again. With recordWords, from the words noted while the text was counted (no
   * second scan); else by scanning the units again. Only for a file counted in English (packIn
   * loads no units).
   */
  packSection(from: number, to: number): PackedFile {
    // Without the words of the text noted (or with a word table cleared since), scan the units again.
    if (!this.recordWords || this.clears !== this.clearsAtLoad)
      return this.finish(this.loadedAscii ? this.scanAscii(this.text.units, to, from) : this.scan(this.text.units, to, from), true);
    const at = this.wordAt;
    let lo = 0;
    let hi = this.nWords;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (at[mid] < from) lo = mid + 1;
      else hi = mid;
    }
    let length = 0;
    for (let j = lo; j < this.nWords && at[j] < to; j++) length += this.bumpValue(this.wordValue[j]);
    return this.finish(length, true);
  }

  /** The code units loaded for the last text counted in English, and how many. */
  get loaded(): { readonly units: Uint16Array; readonly length: number } {
    return this.text;
  }

  /** Positions the next packSection writes to (sections are numbered by these). */
  get sectionPackUsed(): number {
    return this.sectionUsed;
  }

  /** Views of everything packSection packed since the last drain (valid until the next pack), and a fresh start. */
  drainSectionPack(): { ids: Int32Array; counts: Int32Array } {
    const { ids, counts, big } = this.drainSmallSectionPack();
    return { ids, counts: widen(counts, big) };
  }

  /**
   * drainSectionPack with the counts as packed: one byte each, SECTION_COUNT_BIG standing for the
   * count `big` holds at that position (no 32-bit copy of the counts is made).
   */
  drainSmallSectionPack(): { ids: Int32Array; counts: Uint8Array; big: Map<number, number> } {
    const out = {
      ids: this.sectionIds.subarray(0, this.sectionUsed),
      counts: this.sectionCounts.subarray(0, this.sectionUsed),
      big: this.sectionBig,
    };
    this.sectionBig = new Map();
    this.sectionUsed = 0;
    return out;
  }

  /** A packed file's counts in fresh arrays, ids ascending, and its place in the pack freed. */
  private copyOut(p: PackedFile): LocalCounts {
    const ids = this.packIds.slice(p.at, p.at + p.terms).sort();
    const counts = new Int32Array(p.terms);
    // The ids are distinct: through the (cleared) tally, each id's count lands at its sorted place.
    const tally = this.tally;
    for (let i = 0; i < p.terms; i++) {
      const c = this.packCounts[p.at + i];
      tally[this.packIds[p.at + i]] = c === SECTION_COUNT_BIG ? this.packBig.get(p.at + i)! : c;
    }
    for (let i = 0; i < p.terms; i++) {
      counts[i] = tally[ids[i]];
      tally[ids[i]] = 0;
    }
    this.packUsed = p.at;
    // Larger counts past the end are stale (a position written again gets its own when it needs one).
    if (p.at === 0) this.packBig.clear();
    return { ids, counts, length: p.length };
  }

  /**
   * Moves the tallied counts into the pack (or the section pack), ids in the order the text first
   * used them (whoever reads a pack sorts each run by its final ids: translateRun; copyOut sorts
   * by local id), and clears the tally.
   */
  private finish(length: number, section = false): PackedFile {
    const n = this.nTouched;
    if (section) {
      const at = this.sectionUsed;
      if (at + n > this.sectionIds.length) {
        this.sectionIds = grow32(this.sectionIds, at + n);
        this.sectionCounts = grow8(this.sectionCounts, this.sectionIds.length);
      }
      this.drainTally(this.sectionIds, this.sectionCounts, this.sectionBig, at);
      this.sectionUsed = at + n;
      return { at, terms: n, length };
    }
    const at = this.packUsed;
    if (at + n > this.packIds.length) {
      this.packIds = grow32(this.packIds, at + n);
      this.packCounts = grow8(this.packCounts, this.packIds.length);
    }
    this.drainTally(this.packIds, this.packCounts, this.packBig, at);
    this.packUsed = at + n;
    return { at, terms: n, length };
  }

  /**
   * Writes the tallied ids and their counts from position `at` of a pack (counts of one byte,
   * SECTION_COUNT_BIG standing for the exact count kept in `big`) and clears the tally.
   */
  private drainTally(ids: Int32Array, counts: Uint8Array, big: Map<number, number>, at: number): void {
    const n = this.nTouched;
    const touched = this.touched;
    const tally = this.tally;
    for (let i = 0; i < n; i++) {
      const id = touched[i];
      const c = tally[id];
      ids[at + i] = id;
      if (c < SECTION_COUNT_BIG) counts[at + i] = c;
      else {
        counts[at + i] = SECTION_COUNT_BIG;
        big.set(at + i, c);
      }
      tally[id] = 0;
    }
    this.nTouched = 0;
  }

  /** Counts the words of u[from, n); returns the number of tokens. */
  private scan(u: Uint16Array, n: number, from = 0): number {
    let length = 0;
    let i = from;
    while (i < n) {
      let c = u[i];
      let k = CLASS[c];
      if (k !== WORD) {
        if (k === 0) k = classify(c);
        if (k !== WORD && !(k === HIGH_SURROGATE && astralWordAt(u, i, n))) {
          i++;
          continue;
        }
      }
      const start = i;
      let h = FNV_OFFSET;
      let all = 0;
      for (; i < n; i++) {
        c = u[i];
        k = CLASS[c];
        if (k !== WORD) {
          if (k === 0) k = classify(c);
          if (k !== WORD) {
            if (!(k === HIGH_SURROGATE && astralWordAt(u, i, n))) break;
            h = Math.imul(h ^ c, FNV_PRIME);
            c = u[++i];
          }
        }
        h = Math.imul(h ^ c, FNV_PRIME);
        all |= c;
      }
      const e = this.words.find(u, start, i, h);
      length += this.countWord(e >= 0 ? this.words.value(e) : this.learn(u, start, i, h, all < 128), start);
    }
    return length;
  }

  /**
   * scan() of units that are all ASCII (below 0x80): a word is a run of [A-Za-z0-9_$] (what
   * CLASS gives WORD among ASCII units), with no surrogate or lazily classified unit to test for.
   */
  private scanAscii(u: Uint16Array, n: number, from = 0): number {
    const words = this.words;
    let length = 0;
    let i = from;
    while (i < n) {
      let c = u[i];
      if (ASCII_WORD[c] === 0) {
        i++;
        continue;
      }
      const start = i;
      let h = FNV_OFFSET;
      do {
        h = Math.imul(h ^ c, FNV_PRIME);
        if (++i === n) break;
        c = u[i];
      } while (ASCII_WORD[c] !== 0);
      const e = words.find(u, start, i, h);
      length += this.countWord(e >= 0 ? words.value(e) : this.learn(u, start, i, h, true), start);
    }
    return length;
  }

  /** Counts the value of the word at unit `start` (noting it when recording); returns its number of tokens. */
  private countWord(v: number, start: number): number {
    if (v === NO_TERMS) return 0;
    if (this.recording) this.noteWord(start, v);
    return this.bumpValue(v);
  }

  /** Counts a word's table value (its term, or its terms); returns the number of tokens. */
  private bumpValue(v: number): number {
    if (v >= 0) {
      this.bump(v);
      return 1;
    }
    const m = this.multi;
    const at = -2 - v;
    const terms = m[at];
    for (let j = 1; j <= terms; j++) this.bump(m[at + j]);
    return terms;
  }

  private noteWord(start: number, v: number): void {
    if (this.nWords === this.wordAt.length) {
      this.wordAt = grow32(this.wordAt, this.nWords + 1);
      this.wordValue = grow32(this.wordValue, this.nWords + 1);
    }
    this.wordAt[this.nWords] = start;
    this.wordValue[this.nWords++] = v;
  }

  private bump(id: number): void {
    if (this.tally[id]++ === 0) {
      if (this.nTouched === this.touched.length) this.touched = grow32(this.touched, this.nTouched + 1);
      this.touched[this.nTouched++] = id;
    }
  }

  /** Works out the terms of a new word u[start, end) and caches them; returns its table value. */
  private learn(u: Uint16Array, start: number, end: number, h: number, ascii: boolean): number {
    if (this.words.size >= WORD_CACHE_LIMIT) {
      this.words.clear();
      this.multiUsed = 0;
      this.clears++;
    }
    this.nFound = 0;
    if (!ascii) this.otherTerms(u, start, end);
    else if (!skipsWord(u, start, end)) this.asciiTerms(u, start, end);
    let value: number;
    if (this.nFound === 0) value = NO_TERMS;
    else if (this.nFound === 1) value = this.found[0];
    else {
      const at = this.multiUsed;
      if (at + 1 + this.nFound > this.multi.length) this.multi = grow32(this.multi, at + 1 + this.nFound);
      this.multi[at] = this.nFound;
      for (let j = 0; j < this.nFound; j++) this.multi[at + 1 + j] = this.found[j];
      this.multiUsed = at + 1 + this.nFound;
      value = -2 - at;
    }
    this.words.insert(u, start, end, h, value);
    return value;
  }

  /** The terms of a non-ASCII word: the word itself for caseless letters, else tokenize()'s. */
  private otherTerms(u: Uint16Array, start: number, end: number): void {
    if (caselessLetters(u, start, end)) {
      const n = end - start;
      if (n <= 1 || n > MAX_TOKEN_LENGTH) return;
      const t = unitsToString(u, start, end);
      if (!STOP_WORDS.has(t)) this.found1(this.add(t));
      return;
    }
    // The units are normalised as tokenize() normalises (textUnits.ts) and the word is one whole
    // match of its word pattern: its steps 3–5 alone give the same tokens (checked, in case
    // normalising it again would change it).
    const word = unitsToString(u, start, end);
    const tokens = this.scratchTokens;
    tokens.length = 0;
    // Stemmed by porterFast (natural's stems for lowercase tokens, ASCII or not: porterFast.test.ts).
    if (word.normalize('NFKD') === word) wordTokens(word, this.resolved, tokens, porterStem);
    else for (const t of tokenize(word, this.options)) tokens.push(t);
    for (const t of tokens) this.found1(this.add(t));
  }

  /** The terms of an ASCII word (tokenize's steps 3–5, as asciiWordTokens) into `found`. */
  private asciiTerms(u: Uint16Array, start: number, end: number): void {
    const len = end - start;
    if (this.bounds.length < 2 * len) this.bounds = new Int32Array(2 * len);
    if (this.lower.length < len) this.lower = new Uint16Array(len);
    const bounds = this.bounds;
    const parts = partBounds(u, start, end, bounds);
    let joined = 0;
    for (let p = 0; p < parts; p++) {
      const at = joined;
      joined = lowerInto(u, bounds[2 * p], bounds[2 * p + 1], this.lower, joined);
      this.token(at, joined);
    }
    if (this.resolved.keepCompounds && parts > 1 && joined <= MAX_TOKEN_LENGTH && !allDigits(this.lower, 0, joined)) this.token(0, joined);
  }

  /** The lowercase token lower[from, to): its term id (if kept) into `found`. */
  private token(from: number, to: number): void {
    const n = to - from;
    if (n <= 1 || n > MAX_TOKEN_LENGTH) return;
    const low = this.lower;
    let h = FNV_OFFSET;
    for (let i = from; i < to; i++) h = Math.imul(h ^ low[i], FNV_PRIME);
    const e = this.tokens.find(low, from, to, h);
    let id: number;
    if (e >= 0) id = this.tokens.value(e);
    else {
      const t = unitsToString(low, from, to);
      id = keepToken(t, low, from, to) ? this.add(this.resolved.stem ? porterStem(t) : t) : NO_TERMS;
      this.tokens.insert(low, from, to, h, id);
    }
    if (id >= 0) this.found1(id);
  }

  private found1(id: number): void {
    if (this.nFound === this.found.length) this.found = grow32(this.found, this.nFound + 1);
    this.found[this.nFound++] = id;
  }

  private add(term: string): number {
    const n = term.length;
    if (n > this.termUnits16.length) this.termUnits16 = new Uint16Array(Math.max(n, 2 * this.termUnits16.length));
    const u = this.termUnits16;
    let h = FNV_OFFSET;
    for (let i = 0; i < n; i++) {
      const c = term.charCodeAt(i);
      u[i] = c;
      h = Math.imul(h ^ c, FNV_PRIME);
    }
    const e = this.termIds.find(u, 0, n, h);
    if (e >= 0) return e;
    const id = this.termIds.size;
    this.termIds.insert(u, 0, n, h, id);
    if (id >= this.tally.length) this.tally = grow32(this.tally, id + 1);
    return id;
  }
}

/** Counts of one byte (SECTION_COUNT_BIG: the one `big` holds at that position) as 32-bit integers. */
function widen(counts: Uint8Array, big: ReadonlyMap<number, number>): Int32Array {
  const out = Int32Array.from(counts);
  for (const [at, c] of big) out[at] = c;
  return out;
}

/** 1 for the ASCII units CLASS holds WORD for (\p{L}, \p{N}, '_' and '$' below 0x80), else 0. */
const ASCII_WORD = new Uint8Array(128);
for (let c = 0; c < 128; c++) ASCII_WORD[c] = /[A-Za-z0-9_$]/.test(String.fromCharCode(c)) ? 1 : 0;

/** The string of ASCII bytes (Latin-1 decoding is the identity on them, and native). */
function asciiString(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('latin1');
}
