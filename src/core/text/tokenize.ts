/**
 * Tokenizer for code and prose.
 *
 * Pipeline (each step drops or splits tokens, never reorders them):
 * 1. Unicode NFKD normalisation and removal of combining marks ("café" → "cafe").
 * 2. Words are maximal runs of letters, digits, '_' and '$'; everything else separates.
 * 3. Identifier splitting: '_' and '$' separate; camelCase / PascalCase / acronym boundaries
 *    ("HTTPServer" → "HTTP", "Server") and letter/digit boundaries split. When a word splits,
 *    the joined lowercase compound is kept as well (so an exact identifier still matches).
 * 4. Lowercase; drop stop words (English + programming keywords), 1-character tokens, digit
 *    runs longer than 4, hex-looking runs of 8+ characters, and tokens over 40 characters.
 * 5. Porter stemming (Porter 1980; porterFast.ts, the same stems as natural's PorterStemmer), memoised.
 *
 * Other languages: tokenizeLanguage.ts (apart, so the map page bundles no foreign stemmer).
 *
 * Defaults: stemming on, compounds on (both options of TokenizeOptions). The limits of step 4 are
 * in tokenRules.ts. Fast twins for the tokenizing threads give the same tokens for ASCII words
 * without regular expressions: asciiWord.ts (steps 2–4 on char codes) and porterFast.ts (step 5,
 * used here too); their tests hold them equal to this file, and porterFast to natural's stemmer.
 */
import { porterStem } from './porterFast.js';
import { STOP_WORDS } from './stopWords.js';
import type { LanguageSetting } from './detectLanguage.js';
import { MAX_DIGIT_RUN, MAX_TOKEN_LENGTH, MIN_HEXISH_LENGTH } from './tokenRules.js';

export interface TokenizeOptions {
  /** Porter-stem each token. @default true */
  stem: boolean;
  /** Keep the joined form of split identifiers ("getUserName" also yields "getusername"). @default true */
  keepCompounds: boolean;
  /**
   * Languages a file may be tokenized in (detectLanguage.ts): 'auto' for all, or a list.
   * Absent (indexes and shared models made before languages were detected): English only.
   * @default 'auto'
   */
  languages?: LanguageSetting;
}

export const DEFAULT_TOKENIZE_OPTIONS: Readonly<TokenizeOptions> = Object.freeze({ stem: true, keepCompounds: true, languages: 'auto' });

const WORD = /[\p{L}\p{N}_$]+/gu;
/** Combining marks, removed after NFKD normalisation. */
export const MARKS = /\p{M}+/gu;
// Splits inside an identifier: lower→Upper, Upper→Upper+lower, letter↔digit.
const CAMEL = /(?<=\p{Ll})(?=\p{Lu})|(?<=\p{Lu})(?=\p{Lu}\p{Ll})|(?<=\p{L})(?=\p{N})|(?<=\p{N})(?=\p{L})/u;
const LONG_DIGITS = new RegExp(`^\\p{N}{${MAX_DIGIT_RUN + 1},}$`, 'u');
const HEXISH = new RegExp(`^(?=.*\\d)[0-9a-f]{${MIN_HEXISH_LENGTH},}$`);
const HEX_LITERAL = /^0[xX][0-9a-fA-F]+$/;
const STEM_CACHE_LIMIT = 500_000;

const stemCache = new Map<string, string>();

/** Porter stem of a lowercase word, memoised (the cache is cleared when it grows past 500k words). */
export function stemWord(word: string): string {
  let s = stemCache.get(word);
  if (s === undefined) {
    s = porterStem(word);
    if (stemCache.size >= STEM_CACHE_LIMIT) stemCache.clear();
    stemCache.set(word, s);
  }
  return s;
}

function keep(token: string): boolean {
  return token.length > 1 && token.length <= MAX_TOKEN_LENGTH && !STOP_WORDS.has(token) && !LONG_DIGITS.test(token) && !HEXISH.test(token);
}

/** Splits an identifier into its parts (not lowercased). */
export function splitIdentifier(word: string): string[] {
  const parts: string[] = [];
  for (const piece of word.split(/[_$]+/)) {
    if (piece.length === 0) continue;
    for (const p of piece.split(CAMEL)) if (p.length > 0) parts.push(p);
  }
  return parts;
}

/** Text → index terms, in reading order (English; tokenizeLanguage.ts for the others). */
export function tokenize(text: string, options: Partial<TokenizeOptions> = {}): string[] {
  const opts = { ...DEFAULT_TOKENIZE_OPTIONS, ...options };
  const out: string[] = [];
  const normalised = text.normalize('NFKD').replace(MARKS, '');
  for (const m of normalised.matchAll(WORD)) wordTokens(m[0], opts, out);
  return out;
}

/**
 * Steps 3–5 for one word of step 2 (a whole match of WORD in normalised text, no marks), its
 * tokens appended to out: tokenize() of such a word without normalising and matching it again.
 */
export function wordTokens(word: string, opts: Readonly<TokenizeOptions>, out: string[], stem: (token: string) => string = stemWord): void {
  if (HEX_LITERAL.test(word) || HEXISH.test(word.toLowerCase())) return;
  const emit = (raw: string): void => {
    const t = raw.toLowerCase();
    if (!keep(t)) return;
    out.push(opts.stem ? stem(t) : t);
  };
  const parts = splitIdentifier(word);
  if (parts.length === 1 && parts[0] === word) {
    emit(word);
    return;
  }
  for (const p of parts) emit(p);
  if (opts.keepCompounds && parts.length > 1) {
    const compound = parts.join('');
    if (compound.length <= MAX_TOKEN_LENGTH && !/^\p{N}+$/u.test(compound)) emit(compound);
  }
}
