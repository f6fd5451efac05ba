/**
 * tokenize() in a given language (chosen per file by detectLanguage.ts).
 *
 * English is tokenize() itself. In another language, a plain word (letters only, no identifier
 * boundary) is lowercased with its accents, checked against that language's stop words
 * (languages.ts), stemmed by its Snowball stemmer, and only then stripped of accents (the
 * stemmers' suffixes carry them: French "-ité", Russian "-ий"). Every other word (identifiers,
 * numbers) goes through tokenize()'s English steps, so code names stay the same terms whatever
 * the language of the note that mentions them. Stems are memoised per language.
 */
import { languageKit, type Language } from './languages.js';
import { DEFAULT_TOKENIZE_OPTIONS, MARKS, splitIdentifier, tokenize, type TokenizeOptions } from './tokenize.js';
import { MAX_TOKEN_LENGTH } from './tokenRules.js';

const STEM_CACHE_LIMIT = 500_000;

/** Text → index terms in reading order, for a text in `language`. */
export function tokenizeIn(text: string, options: Partial<TokenizeOptions>, language: Language): string[] {
  if (language === 'en') return tokenize(text, options);
  return tokenizeOther(language, text, { ...DEFAULT_TOKENIZE_OPTIONS, ...options });
}

const WORD_WITH_MARKS = /[\p{L}\p{M}\p{N}_$]+/gu;
const LETTERS = /^\p{L}+$/u;
const languageStems = new Map<Language, Map<string, string>>();

function stripMarks(s: string): string {
  return s.normalize('NFKD').replace(MARKS, '');
}

/**
 * Each word's terms, per language and options: a word's terms depend on nothing else, so a
 * repeated word costs one look-up instead of the normalisation, identifier split and stop-word
 * checks (cleared past STEM_CACHE_LIMIT words, as the stems).
 */
const languageWords = new Map<string, Map<string, readonly string[]>>();
const NO_TERMS: readonly string[] = [];

/** tokenizeIn() for a language other than English (see the header). */
function tokenizeOther(language: Exclude<Language, 'en'>, text: string, opts: TokenizeOptions): string[] {
  const key = `${language} ${opts.stem} ${opts.keepCompounds}`;
  let words = languageWords.get(key);
  if (words === undefined) languageWords.set(key, (words = new Map()));
  const out: string[] = [];
  for (const m of text.normalize('NFC').matchAll(WORD_WITH_MARKS)) {
    let terms = words.get(m[0]);
    if (terms === undefined) {
      terms = wordTerms(language, m[0], opts);
      if (words.size >= STEM_CACHE_LIMIT) words.clear();
      words.set(m[0], terms);
    }
    for (const t of terms) out.push(t);
  }
  return out;
}

/** The terms of one word (a match of WORD_WITH_MARKS in NFC text) in `language`. */
function wordTerms(language: Exclude<Language, 'en'>, word: string, opts: TokenizeOptions): readonly string[] {
  const plain = stripMarks(word);
  if (!LETTERS.test(plain) || splitIdentifier(plain).length !== 1) return tokenize(plain, opts);
  const kit = languageKit(language);
  const lower = word.toLowerCase();
  const bare = plain.toLowerCase();
  if (bare.length <= 1 || bare.length > MAX_TOKEN_LENGTH || kit.stop.has(lower) || kit.stop.has(bare)) return NO_TERMS;
  if (!opts.stem) return [bare];
  let cache = languageStems.get(language);
  if (cache === undefined) languageStems.set(language, (cache = new Map()));
  let stem = cache.get(lower);
  if (stem === undefined) {
    stem = stripMarks(kit.stem(lower));
    if (stem.length === 0) stem = bare;
    if (cache.size >= STEM_CACHE_LIMIT) cache.clear();
    cache.set(lower, stem);
  }
  return [stem];
}
