/**
 * Readable words for stems. Reference: the tokenizer itself (tokenize.ts) — every term it emits
 * for a text must be named by a word that stems back to that term; the text is real (the first
 * 200 CRAN abstracts, test/fixtures/corpora) plus hand-written code identifiers.
 */
import { describe, expect, it } from 'vitest';
import { SurfaceForms } from '../../../src/core/text/surfaceForms.js';
import { stemWord, tokenize } from '../../../src/core/text/tokenize.js';
import { loadCollection } from '../../helpers/shared.js';

describe('surface forms of stems', () => {
  it('names a stem by its most frequent spelling', () => {
    const f = new SurfaceForms();
    f.add('Retrieval systems. Retrieving documents; retrieval of documents; RETRIEVAL.');
    expect(f.wordFor(stemWord('retrieval'))).toBe('retrieval');
    expect(f.formsOf(stemWord('retrieval'))).toEqual([
      ['retrieval', 3],
      ['retrieving', 1],
    ]);
    expect(f.wordFor('document')).toBe('documents');
  });

  it('splits identifiers as the tokenizer does and keeps the joined compound', () => {
    const f = new SurfaceForms();
    f.add('const tideTable = getTideTable(station_id);');
    expect(f.wordFor(stemWord('table'))).toBe('table');
    expect(f.wordFor(stemWord('tidetable'))).toBe('tidetable');
    expect(f.wordFor('station')).toBe('station');
  });

  it('returns the stem itself when no form was seen, and tracks only wanted stems when asked', () => {
    const f = new SurfaceForms({ stem: true }, new Set([stemWord('harbour')]));
    f.add('Harbours and harbour pilots');
    expect(f.wordFor(stemWord('harbour'))).toBe('harbour');
    expect(f.wordFor(stemWord('pilot'))).toBe(stemWord('pilot'));
  });

  it('breaks ties by the shorter form, then alphabetically', () => {
    const f = new SurfaceForms();
    f.add('connected connecting connect');
    expect(f.wordFor(stemWord('connect'))).toBe('connect');
  });

  const cran = loadCollection('cran');
  it('names every term the tokenizer emits for real text with a word that stems to it', () => {
    const f = new SurfaceForms();
    const terms = new Set<string>();
    for (const d of cran.docs.slice(0, 200)) {
      f.add(d.text);
      for (const t of tokenize(d.text)) terms.add(t);
    }
    expect(terms.size).toBeGreaterThan(1000);
    for (const t of terms) {
      const word = f.wordFor(t);
      expect(f.formsOf(t).length).toBeGreaterThan(0);
      expect(stemWord(word)).toBe(t);
    }
  });
});
