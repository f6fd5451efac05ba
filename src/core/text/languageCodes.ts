/**
 * The codes and names of the languages the tokenizer knows, apart from their stemmers
 * (languages.ts), so that settings code can check a code without bundling a stemmer.
 */

/** ISO 639-1 codes of the languages the tokenizer knows. */
export const LANGUAGES = ['en', 'de', 'fr', 'es', 'it', 'pt', 'nl', 'sv', 'ru'] as const;
export type Language = (typeof LANGUAGES)[number];

/** English names, for settings and messages. */
export const LANGUAGE_NAMES: Readonly<Record<Language, string>> = {
  en: 'English',
  de: 'German',
  fr: 'French',
  es: 'Spanish',
  it: 'Italian',
  pt: 'Portuguese',
  nl: 'Dutch',
  sv: 'Swedish',
  ru: 'Russian',
};

export function isLanguage(code: string): code is Language {
  return (LANGUAGES as readonly string[]).includes(code);
}
