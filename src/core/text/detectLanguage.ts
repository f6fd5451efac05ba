/**
 * The language of a file or a question, from its stop words.
 *
 * A stop-word profile (common practice in language identification; Grefenstette 1995, "Comparing
 * two language identification schemes", found short function words as reliable as character
 * trigrams once a text has a few dozen words): each word of a sample that is in the stop lists of
 * n candidate languages gives 1/n to each of them (a word of one list counts fully, "de" or "a"
 * little), and the language with the highest score wins when it has at least `minHits` and
 * `margin` times the runner-up's (the lists: languages.ts, ownStopWords). Files with source-code
 * extensions are English whatever their comments say (identifiers are never stemmed as another
 * language). A prose file where English leads without the margin but one other language is
 * clear of the rest (a partly translated page, a note quoting English) takes that language; a
 * file the profile cannot tell otherwise is English, as before languages were detected. A
 * question is too short for a margin: its language is the one with most distinctive stop words
 * among the languages the index has, else the workspace's main language. Thresholds are our choice (common practice), not fitted to the
 * evaluation collections.
 */
import { isLanguage, LANGUAGES, ownStopWords, type Language } from './languages.js';

/** The `undertone.languages` setting: detect among all languages, or among those listed. */
export type LanguageSetting = 'auto' | readonly Language[];

export interface DetectOptions {
  /** Words of the sample looked at. @default 600 */
  readonly sampleWords: number;
  /** Stop-word score needed to decide. @default 4 */
  readonly minHits: number;
  /** The winner needs this many times the runner-up's hits. @default 1.5 */
  readonly margin: number;
}

export const DEFAULT_DETECT_OPTIONS: DetectOptions = Object.freeze({ sampleWords: 600, minHits: 4, margin: 1.5 });

/** Extensions of prose files (the others are treated as code, always English). */
const PROSE_EXTENSIONS = new Set([
  '',
  'md',
  'markdown',
  'mdown',
  'mkd',
  'mdx',
  'txt',
  'text',
  'rst',
  'adoc',
  'asciidoc',
  'org',
  'tex',
  'html',
  'htm',
  'xhtml',
  'wiki',
  'textile',
  'rtf',
]);

/** True when a path (key or file name) has a prose extension, or none. */
export function isProsePath(path: string): boolean {
  const name = path.slice(path.lastIndexOf('/') + 1);
  const dot = name.lastIndexOf('.');
  return PROSE_EXTENSIONS.has(dot <= 0 ? '' : name.slice(dot + 1).toLowerCase());
}

/** The candidate languages of a setting (undefined: English only, as indexes made before the setting). */
export function candidateLanguages(setting: LanguageSetting | undefined): readonly Language[] {
  if (setting === undefined) return ['en'];
  if (setting === 'auto') return LANGUAGES;
  const list = setting.filter(isLanguage);
  return list.length > 0 ? list : ['en'];
}

const profiles = new Map<string, Map<string, Language[]>>();

/** Word → the candidate languages whose stop lists have it. */
function profile(candidates: readonly Language[]): Map<string, Language[]> {
  const key = candidates.join(',');
  let p = profiles.get(key);
  if (p === undefined) {
    p = new Map();
    for (const lang of candidates)
      for (const w of ownStopWords(lang)) {
        const langs = p.get(w);
        if (langs === undefined) p.set(w, [lang]);
        else if (!langs.includes(lang)) langs.push(lang);
      }
    profiles.set(key, p);
  }
  return p;
}

const WORD = /\p{L}+/gu;
const FENCE = /^\s*(```|~~~)/;
const INLINE_CODE = /`[^`\n]*`/g;
const NON_ASCII = /[\u0080-\uffff]/;

/** Adds a word's share to the scores (its candidates: the profile's entry, or undefined); true once the sample is complete. */
type Scorer = (langs: readonly Language[] | undefined) => boolean;

/** A scorer over `out` that stops at sampleWords words. */
function scorer(out: Map<Language, number>, sampleWords: number): Scorer {
  let words = 0;
  return (langs) => {
    if (langs !== undefined) for (const lang of langs) out.set(lang, (out.get(lang) ?? 0) + 1 / langs.length);
    return ++words >= sampleWords;
  };
}

/** Stop-word scores per candidate in the first `sampleWords` words of the prose. */
function hits(text: string, candidates: readonly Language[], sampleWords: number): Map<Language, number> {
  const p = profile(candidates);
  const out = new Map<Language, number>();
  const count = scorer(out, sampleWords);
  let inFence = false;
  // Line by line as text.split('\n') gives them, but only as far as the sample goes (most files
  // reach sampleWords in their first few kilobytes).
  for (let start = 0; start <= text.length;) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    const line = text.slice(start, end);
    start = end + 1;
    if (FENCE.test(line)) {
      inFence = !inFence;
      continue;
    }
    if (inFence) continue;
    const prose = line.includes('`') ? line.replace(INLINE_CODE, ' ') : line;
    if (NON_ASCII.test(prose)) {
      for (const m of prose.normalize('NFC').toLowerCase().matchAll(WORD)) if (count(p.get(m[0]))) return out;
      continue;
    }
    // ASCII: NFC changes nothing and the letters (\p{L}) are a–z once lower-cased; the same words
    // in the same order, without a match object per word.
    const low = prose.toLowerCase();
    for (let i = 0; i < low.length;) {
      let c = low.charCodeAt(i);
      if (c < 97 || c > 122) {
        i++;
        continue;
      }
      let j = i + 1;
      while (j < low.length && (c = low.charCodeAt(j)) >= 97 && c <= 122) j++;
      if (count(p.get(low.slice(i, j)))) return out;
      i = j;
    }
  }
  return out;
}

/**
 * The profile's words of letters a–z in a small open-addressing hash table (FNV-1a over the
 * letters; common practice): slot → the word's number + 1 (0: empty). Each word has its letters,
 * its candidates as numbers (positions in `candidates`) and 1 / their count. Words with other
 * characters cannot be a run of a–z, so an ASCII text never meets them.
 */
interface LetterTable {
  readonly slots: Int32Array;
  readonly words: readonly string[];
  readonly langs: readonly Int32Array[];
  readonly share: Float64Array;
}

const FNV_OFFSET = 0x811c9dc5 | 0;
const FNV_PRIME = 0x01000193;
const tables = new Map<string, LetterTable>();

function letterTable(candidates: readonly Language[]): LetterTable {
  const key = candidates.join(',');
  let t = tables.get(key);
  if (t === undefined) {
    const entries = [...profile(candidates)].filter(([w]) => /^[a-z]+$/.test(w));
    let size = 16;
    while (size < 4 * entries.length) size *= 2;
    const slots = new Int32Array(size);
    entries.forEach(([w], e) => {
      let h = FNV_OFFSET;
      for (let i = 0; i < w.length; i++) h = Math.imul(h ^ w.charCodeAt(i), FNV_PRIME);
      let s = h & (size - 1);
      while (slots[s] !== 0) s = (s + 1) & (size - 1);
      slots[s] = e + 1;
    });
    t = {
      slots,
      words: entries.map(([w]) => w),
      langs: entries.map(([, l]) => Int32Array.from(l, (x) => candidates.indexOf(x))),
      share: Float64Array.from(entries, ([, l]) => 1 / l.length),
    };
    tables.set(key, t);
  }
  return t;
}

/** The word number of the lowercase letters of u[from, to) (hash h), or -1. */
function findWord(t: LetterTable, u: Uint8Array, from: number, to: number, h: number): number {
  const mask = t.slots.length - 1;
  for (let s = h & mask; ; s = (s + 1) & mask) {
    const e = t.slots[s] - 1;
    if (e < 0) return -1;
    const w = t.words[e];
    if (w.length !== to - from) continue;
    let i = 0;
    while (i < w.length && w.charCodeAt(i) === (u[from + i] | 0x20)) i++;
    if (i === w.length) return e;
  }
}

/** True when line u[from, to) opens or closes a fence (FENCE on an ASCII line). */
function fenceAt(u: Uint8Array, from: number, to: number): boolean {
  let i = from;
  // \s on ASCII: space, \t, \n, \v, \f, \r.
  while (i < to && (u[i] === 32 || (u[i] >= 9 && u[i] <= 13))) i++;
  if (i + 3 > to) return false;
  const c = u[i];
  return (c === 96 || c === 126) && u[i + 1] === c && u[i + 2] === c;
}

/**
 * hits() of ASCII bytes (every byte below 0x80), read in place: the same lines, fences, inline
 * code and words (runs of a–z once A–Z are lowered), each looked up by its hash instead of as a
 * string. The scores are summed per candidate in the order hits() adds them, and the map is
 * filled in the order hits() first sets each language, so both give the same map.
 */
function asciiHits(u: Uint8Array, candidates: readonly Language[], sampleWords: number): Map<Language, number> {
  const t = letterTable(candidates);
  const score = new Float64Array(candidates.length);
  const order: number[] = [];
  const n = u.length;
  let words = 0;
  let inFence = false;
  scan: for (let start = 0; start <= n;) {
    let end = start;
    while (end < n && u[end] !== 10) end++;
    const from = start;
    start = end + 1;
    if (fenceAt(u, from, end)) {
      inFence = !inFence;
      continue;
    }
    if (inFence) continue;
    for (let i = from; i < end;) {
      let c = u[i];
      if (c === 96) {
        // Inline code: up to the next backtick of the line, if any (INLINE_CODE's matches, left to right).
        let close = i + 1;
        while (close < end && u[close] !== 96) close++;
        i = close < end ? close + 1 : i + 1;
        continue;
      }
      if (c >= 65 && c <= 90) c += 32;
      if (c < 97 || c > 122) {
        i++;
        continue;
      }
      const w = i;
      let h = Math.imul(FNV_OFFSET ^ c, FNV_PRIME);
      for (i++; i < end; i++) {
        c = u[i];
        if (c >= 65 && c <= 90) c += 32;
        if (c < 97 || c > 122) break;
        h = Math.imul(h ^ c, FNV_PRIME);
      }
      const e = findWord(t, u, w, i, h);
      if (e >= 0) {
        const langs = t.langs[e];
        for (let j = 0; j < langs.length; j++) {
          if (score[langs[j]] === 0) order.push(langs[j]);
          score[langs[j]] += t.share[e];
        }
      }
      if (++words >= sampleWords) break scan;
    }
  }
  return new Map(order.map((l) => [candidates[l], score[l]]));
}

function ranked(h: Map<Language, number>): [Language | undefined, number, number] {
  let best: Language | undefined;
  let first = 0;
  let second = 0;
  for (const [lang, n] of h) {
    if (n > first) {
      second = first;
      first = n;
      best = lang;
    } else if (n > second) second = n;
  }
  return [best, first, second];
}

/** The language of a text among the candidates, or undefined when the profile cannot tell. */
export function detectLanguage(text: string, candidates: readonly Language[], options: Partial<DetectOptions> = {}): Language | undefined {
  if (candidates.length === 1) return candidates[0];
  const o = { ...DEFAULT_DETECT_OPTIONS, ...options };
  const [best, first, second] = ranked(hits(text, candidates, o.sampleWords));
  return best !== undefined && first >= o.minHits && first >= o.margin * second ? best : undefined;
}

/**
 * The language a file is tokenized in: English for code (by extension) and for a file the
 * profile cannot tell; otherwise the detected one among the setting's candidates. A setting that
 * lists one language gives that language to every prose file.
 */
export function fileLanguage(
  path: string,
  text: string,
  setting: LanguageSetting | undefined,
  options: Partial<DetectOptions> = {},
): Language {
  return languageOf(path, setting, options, (candidates, sampleWords) => hits(text, candidates, sampleWords));
}

/** fileLanguage() of a text given as its bytes, every one of them ASCII (below 0x80), without decoding it. */
export function fileLanguageAscii(
  path: string,
  bytes: Uint8Array,
  setting: LanguageSetting | undefined,
  options: Partial<DetectOptions> = {},
): Language {
  return languageOf(path, setting, options, (candidates, sampleWords) => asciiHits(bytes, candidates, sampleWords));
}

function languageOf(
  path: string,
  setting: LanguageSetting | undefined,
  options: Partial<DetectOptions>,
  score: (candidates: readonly Language[], sampleWords: number) => Map<Language, number>,
): Language {
  const candidates = candidateLanguages(setting);
  if (candidates.length === 1 && candidates[0] === 'en') return 'en';
  if (!isProsePath(path)) return 'en';
  if (candidates.length === 1) return candidates[0];
  const o = { ...DEFAULT_DETECT_OPTIONS, ...options };
  const h = score(candidates, o.sampleWords);
  const [best, first, second] = ranked(h);
  if (best !== undefined && first >= o.minHits && first >= o.margin * second) return best;
  // A partly translated page or a note quoting English: the other language, when it is clear of
  // the other non-English candidates and English does not lead it by the margin, wins over English.
  const english = h.get('en') ?? 0;
  h.delete('en');
  const [other, otherFirst, otherSecond] = ranked(h);
  return other !== undefined && otherFirst >= o.minHits && otherFirst >= o.margin * otherSecond && o.margin * otherFirst >= english
    ? other
    : 'en';
}

/**
 * A question's language: the best stop-word score among the candidates, else the fallback. With
 * `present` (the languages the index's documents were tokenized in), only those compete: a
 * question is stemmed as some of its targets were, and a short Spanish question whose "de", "a",
 * "o" are also Portuguese or Italian stop words is not read as a language no note is in.
 */
export function queryLanguage(
  text: string,
  setting: LanguageSetting | undefined,
  fallback: Language,
  present?: readonly Language[],
): Language {
  const all = candidateLanguages(setting);
  const kept = present === undefined ? all : all.filter((l) => present.includes(l));
  const candidates = kept.length > 0 ? kept : all;
  if (candidates.length === 1) return candidates[0];
  const [best, first, second] = ranked(hits(text, candidates, 200));
  return best !== undefined && first > second ? best : fallback;
}

/** A document record with its language set when it is not English (English is the absent value). */
export function withLanguage<T extends { readonly language?: Language }>(meta: T, language: Language | undefined): T {
  const { language: _old, ...rest } = meta;
  return (language === undefined || language === 'en' ? rest : { ...rest, language }) as T;
}
