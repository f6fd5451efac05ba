import { describe, expect, it } from 'vitest';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { tokenizeIn } from '../../../src/core/text/tokenizeLanguage.js';
import { languageKit } from '../../../src/core/text/languages.js';

// Reference for the stems: natural 8.1.1's Snowball stemmers (held to Snowball's own output in
// languages.test.ts), called directly; for identifiers: tokenize() (the English rules).
describe('tokenizeIn', () => {
  it('is tokenize() for English', () => {
    const text = 'The retryBudget limits retries; HTTPServer parses requests.';
    expect(tokenizeIn(text, {}, 'en')).toEqual(tokenize(text));
  });

  it('stems plain words in their language before removing accents, and drops its stop words', () => {
    const de = languageKit('de');
    expect(tokenizeIn('Die Häuser und die Nationalität', {}, 'de')).toEqual([
      de.stem('häuser'),
      de.stem('nationalität').normalize('NFKD').replace(/\p{M}/gu, ''),
    ]);
    const fr = languageKit('fr');
    expect(tokenizeIn('les nationalités', {}, 'fr')).toEqual([fr.stem('nationalités')]);
    // Russian: "й" must reach the stemmer whole (NFKD would make it и + a mark).
    const ru = languageKit('ru');
    expect(tokenizeIn('новый', {}, 'ru')).toEqual([ru.stem('новый').normalize('NFKD').replace(/\p{M}/gu, '')]);
  });

  it('gives identifiers the English terms whatever the language of the text', () => {
    for (const lang of ['de', 'fr', 'es', 'it', 'pt', 'nl', 'sv', 'ru'] as const) {
      expect(tokenizeIn('retryBudget ledger_sync HTTPServer x86_64', {}, lang), lang).toEqual(
        tokenize('retryBudget ledger_sync HTTPServer x86_64'),
      );
    }
  });

  it('honours stem: false', () => {
    expect(tokenizeIn('Die Häuser', { stem: false }, 'de')).toEqual(['hauser']);
  });

  it('gives a word the same terms every time, whatever options came before (words are remembered per language and options)', () => {
    const de = languageKit('de');
    const text = 'Häuser retryBudget Häuser';
    const stemmed = [de.stem('häuser'), ...tokenize('retryBudget'), de.stem('häuser')];
    expect(tokenizeIn(text, {}, 'de')).toEqual(stemmed);
    expect(tokenizeIn(text, { stem: false }, 'de')).toEqual(['hauser', 'retry', 'budget', 'retrybudget', 'hauser']);
    expect(tokenizeIn(text, { keepCompounds: false }, 'de')).toEqual([
      de.stem('häuser'),
      ...tokenize('retryBudget', { keepCompounds: false }),
      de.stem('häuser'),
    ]);
    expect(tokenizeIn(text, {}, 'de')).toEqual(stemmed);
    expect(tokenizeIn(text, {}, 'nl')).toEqual([
      languageKit('nl').stem('häuser').normalize('NFKD').replace(/\p{M}/gu, ''),
      ...tokenize('retryBudget'),
      languageKit('nl').stem('häuser').normalize('NFKD').replace(/\p{M}/gu, ''),
    ]);
  });
});
