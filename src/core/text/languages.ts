/**
 * The languages the tokenizer stems, with their stemmers and stop words.
 *
 * Stemmers: the Snowball algorithms (Porter 2001, "Snowball: A language for stemming
 * algorithms"; per-language descriptions on the Snowball site) as natural 8 implements them,
 * imported module by module (natural/lib/natural/stemmers/porter_stemmer_<code>.js; the package
 * root would pull in natural's database clients). English keeps the original Porter (1980)
 * stemmer of tokenize.ts, so English indexes are unchanged.
 * Stop words: natural's lists (util/stopwords_<code>.js) for Spanish, French, Italian, Dutch,
 * Portuguese, Russian and Swedish; German has none in natural, so stopwords-iso 1.1.0's German
 * list, the one natural's own German stemmer module loads. Each non-English list is joined with
 * the English list and the programming keywords of stopWords.ts (notes in any language quote
 * English and code). Detection (detectLanguage.ts) uses stopwords-iso's lists for every language;
 * the build keeps only these nine languages of that package (scripts/build.mjs).
 */
import German from 'natural/lib/natural/stemmers/porter_stemmer_de.js';
import Spanish from 'natural/lib/natural/stemmers/porter_stemmer_es.js';
import French from 'natural/lib/natural/stemmers/porter_stemmer_fr.js';
import Italian from 'natural/lib/natural/stemmers/porter_stemmer_it.js';
import Dutch from 'natural/lib/natural/stemmers/porter_stemmer_nl.js';
import Portuguese from 'natural/lib/natural/stemmers/porter_stemmer_pt.js';
import Russian from 'natural/lib/natural/stemmers/porter_stemmer_ru.js';
import Swedish from 'natural/lib/natural/stemmers/porter_stemmer_sv.js';
import { words as esStop } from 'natural/lib/natural/util/stopwords_es.js';
import { words as frStop } from 'natural/lib/natural/util/stopwords_fr.js';
import { words as itStop } from 'natural/lib/natural/util/stopwords_it.js';
import { words as nlStop } from 'natural/lib/natural/util/stopwords_nl.js';
import { words as ptStop } from 'natural/lib/natural/util/stopwords_pt.js';
import { words as ruStop } from 'natural/lib/natural/util/stopwords_ru.js';
import { words as svStop } from 'natural/lib/natural/util/stopwords_sv.js';
import isoStopWords from 'stopwords-iso';
import { STOP_WORDS } from './stopWords.js';
import type { Language } from './languageCodes.js';

export { isLanguage, LANGUAGE_NAMES, LANGUAGES, type Language } from './languageCodes.js';

interface LanguageKit {
  /** The language's own stop words (lowercase, accents kept), for detection. */
  readonly own: ReadonlySet<string>;
  /** Every word dropped from a text in this language. */
  readonly stop: ReadonlySet<string>;
  readonly stem: (word: string) => string;
}

const OWN: Record<Exclude<Language, 'en'>, readonly string[]> = {
  de: isoStopWords.de ?? [],
  fr: frStop,
  es: esStop,
  it: itStop,
  pt: ptStop,
  nl: nlStop,
  sv: svStop,
  ru: ruStop,
};
const STEMMERS: Record<Exclude<Language, 'en'>, { stem(word: string): string }> = {
  de: German,
  fr: French,
  es: Spanish,
  it: Italian,
  pt: Portuguese,
  nl: Dutch,
  sv: Swedish,
  ru: Russian,
};

const kits = new Map<Language, LanguageKit>();

/** Stop words and stemmer of a language other than English (built once, on first use). */
export function languageKit(language: Exclude<Language, 'en'>): LanguageKit {
  let kit = kits.get(language);
  if (kit === undefined) {
    const own = new Set(OWN[language].map((w) => w.normalize('NFC').toLowerCase()));
    const stemmer = STEMMERS[language];
    kit = { own, stop: new Set([...own, ...STOP_WORDS]), stem: (w) => stemmer.stem(w) };
    kits.set(language, kit);
  }
  return kit;
}

const detectionWords = new Map<Language, ReadonlySet<string>>();

/**
 * The stop words that tell a language, for detection: stopwords-iso 1.1.0's list of each language
 * (one source for all, 400-1300 words each). natural's lists, which drop words from texts, range
 * from 58 words (Spanish) to 430 (Swedish); with them a Spanish page scored below French and
 * Portuguese on its shared "de", "la", "que", and one English manual page in 500 was read as
 * Swedish or Portuguese (Debian's manpages, section 1; the report of issue 16).
 */
export function ownStopWords(language: Language): ReadonlySet<string> {
  let words = detectionWords.get(language);
  if (words === undefined) {
    words = new Set((isoStopWords[language] ?? []).map((w) => w.normalize('NFC').toLowerCase()));
    detectionWords.set(language, words);
  }
  return words;
}
