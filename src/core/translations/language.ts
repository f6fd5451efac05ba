/**
 * The language a document is written in, and how much a question reads like a given document.
 *
 * A document's language: character-trigram profiles (Cavnar & Trenkle 1994, "N-Gram-Based Text
 * Categorization") as implemented by the franc-min library (82 languages, ISO 639-3 codes), run
 * on the document's prose: markup, code and addresses removed first, and at most `sampleChars`
 * characters, since the first thousand or so characters decide the language of a page.
 * Trigram profiles compare letters, so a Chinese or Japanese page that keeps some English
 * sentences (partial translations are common) reads as English to them: one Han character is a
 * word, not a letter. Scripts written without spaces are therefore counted by character against
 * the words of the others first; when they make up at least `unspacedShare` of the units the
 * page is Japanese if kana are present, Thai for Thai script, Chinese otherwise.
 * A question is too short for trigram profiles ("suspend" alone matches many languages), so the
 * member of a translation group that fits a question is the one whose own words cover most of
 * the question's words (function words included: they carry the language), with characters
 * instead of words for scripts written without spaces. Both are common practice, not tuned.
 */
import { franc } from 'franc-min';
import { cleanLine } from '../text/passage.js';

/** Code for "could not tell" (too little prose), as franc returns it. */
export const UNDETERMINED = 'und';

export interface LanguageOptions {
  /** Prose characters looked at. @default 1500 */
  readonly sampleChars: number;
  /** Fewer prose characters than this: undetermined. @default 40 */
  readonly minChars: number;
  /** Share of units (words, or characters of unspaced scripts) above which an unspaced script decides. @default 0.3 */
  readonly unspacedShare: number;
}

export const DEFAULT_LANGUAGE_OPTIONS: LanguageOptions = { sampleChars: 1500, minChars: 40, unspacedShare: 0.3 };

const CODE_LIKE = /[A-Za-z_]\w*(?:(?:\.|::|->|\/)\w+)+|\b\w*_\w+|\b\w+\(\)|\b(?:https?|mailto):\S+|\S+@\S+\.\S+/g;

/** The prose of a text: lines cleaned of markup, code identifiers and addresses removed. */
export function proseOf(text: string, maxChars = DEFAULT_LANGUAGE_OPTIONS.sampleChars): string {
  const out: string[] = [];
  let n = 0;
  let inFence = false;
  for (const line of text.split(/\r?\n/)) {
    if (/^\s*(```|~~~)/.test(line)) {
      inFence = !inFence;
      continue;
    }
    if (inFence || /^\s{4,}|^\t/.test(line)) continue;
    const clean = cleanLine(line).replace(CODE_LIKE, ' ').replace(/\s+/g, ' ').trim();
    if (!/\p{L}/u.test(clean)) continue;
    out.push(clean);
    n += clean.length + 1;
    if (n >= maxChars) break;
  }
  return out.join(' ').slice(0, maxChars);
}

/** ISO 639-3 code of the text's language, or UNDETERMINED. */
export function languageOf(text: string, options: Partial<LanguageOptions> = {}): string {
  const o = { ...DEFAULT_LANGUAGE_OPTIONS, ...options };
  const prose = proseOf(text, o.sampleChars);
  if (prose.length < o.minChars) return UNDETERMINED;
  const unspaced = prose.match(UNSPACED_ALL)?.length ?? 0;
  const spaced = prose.replace(UNSPACED_ALL, ' ');
  const words = spaced.match(/[\p{L}\p{N}]+/gu)?.length ?? 0;
  if (unspaced > 0 && unspaced / (unspaced + words) >= o.unspacedShare) {
    const kana = prose.match(/[\p{Script=Hiragana}\p{Script=Katakana}]/gu)?.length ?? 0;
    if (kana >= 0.05 * unspaced) return 'jpn';
    const thai = prose.match(/\p{Script=Thai}/gu)?.length ?? 0;
    return thai > unspaced / 2 ? 'tha' : 'cmn';
  }
  return franc(spaced, { minLength: o.minChars });
}

/** Scripts written without spaces between words: compared by character. */
const UNSPACED = /[\p{Script=Han}\p{Script=Hiragana}\p{Script=Katakana}\p{Script=Thai}]/u;
const UNSPACED_ALL = new RegExp(UNSPACED.source, 'gu');

/** The units a question is compared in: lower-cased words, and single characters of unspaced scripts. */
export function questionUnits(text: string): string[] {
  const out: string[] = [];
  for (const m of text.toLowerCase().matchAll(/[\p{L}\p{N}]+/gu)) {
    if (UNSPACED.test(m[0])) for (const ch of m[0]) out.push(ch);
    else out.push(m[0]);
  }
  return out;
}

/** The units of a document, as a set (to look question units up in). */
export function documentUnits(text: string): Set<string> {
  return new Set(questionUnits(proseOf(text, 20_000)));
}

/** Share of the question's units found in the document (0 when the question has none). */
export function questionFit(question: readonly string[], document: ReadonlySet<string>): number {
  if (question.length === 0) return 0;
  let found = 0;
  for (const u of question) if (document.has(u)) found++;
  return found / question.length;
}

/** English names of the languages franc-min reports most often in documentation trees (others: the code). */
const NAMES: Record<string, string> = {
  eng: 'English',
  deu: 'German',
  fra: 'French',
  spa: 'Spanish',
  ita: 'Italian',
  por: 'Portuguese',
  nld: 'Dutch',
  swe: 'Swedish',
  pol: 'Polish',
  ces: 'Czech',
  hun: 'Hungarian',
  ron: 'Romanian',
  tur: 'Turkish',
  rus: 'Russian',
  ukr: 'Ukrainian',
  bul: 'Bulgarian',
  srp: 'Serbian',
  hrv: 'Croatian',
  ell: 'Greek',
  cmn: 'Chinese',
  jpn: 'Japanese',
  kor: 'Korean',
  arb: 'Arabic',
  pes: 'Persian',
  heb: 'Hebrew',
  hin: 'Hindi',
  mar: 'Marathi',
  ben: 'Bengali',
  tam: 'Tamil',
  tel: 'Telugu',
  kan: 'Kannada',
  guj: 'Gujarati',
  pan: 'Punjabi',
  vie: 'Vietnamese',
  ind: 'Indonesian',
  fin: 'Finnish',
  dan: 'Danish',
  nob: 'Norwegian',
  cat: 'Catalan',
  glg: 'Galician',
  lit: 'Lithuanian',
  lav: 'Latvian',
  slv: 'Slovenian',
  slk: 'Slovak',
  tha: 'Thai',
  zlm: 'Malay',
};

/** A language code as a person reads it ("Chinese"; the code itself when unnamed). */
export function languageName(code: string): string {
  return code === UNDETERMINED ? 'language not known' : (NAMES[code] ?? code);
}
