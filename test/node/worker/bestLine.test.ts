import { beforeAll, describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { DEFAULT_PASSAGE_OPTIONS } from '../../../src/core/text/passage.js';
import { bestMatchingLine } from '../../../src/node/worker/bestLine.js';
import { loadCollection } from '../../helpers/shared.js';

// Real text: CISI (test/fixtures/corpora/cisi, 1460 library-science abstracts) gives the vocabulary,
// idf and concept space the line scores are measured in.
describe('bestMatchingLine', () => {
  // Built when the tests run, not when the file is collected (a missing collection then fails
  // the tests with its message instead of breaking the collection).
  let index: LsiIndex;
  beforeAll(() => {
    const b = new IndexBuilder();
    for (const d of loadCollection('cisi').docs.slice(0, 600)) b.addText({ path: d.id, size: 0, mtimeMs: 0 }, d.text);
    index = b.build();
  });

  it('picks the line that holds the query words, not the first or the longest line', () => {
    const file = [
      '# Notes',
      '',
      'The library opened a new reading room for students and staff this year.',
      'Citation indexing lets a reader follow references forward in time.',
      'Opening hours are posted at the front desk.',
    ].join('\n');
    const got = bestMatchingLine(file, index, 'citation indexing of references');
    expect(got.line).toBe(3);
    // The passage runs on within its paragraph, and the query's words are marked where they stand.
    expect(got.text.startsWith('Citation indexing lets a reader follow references forward in time.')).toBe(true);
    expect(got.highlights.map(([a, b]) => got.text.slice(a, b))).toEqual(['Citation', 'indexing', 'references']);
  });

  it('prefers a rare shared word over a common one (idf weighting)', () => {
    // "thesaurus" is far rarer than "information" in CISI, so its line should win.
    const bm25 = index.bm25();
    const id = (w: string) => index.queryTerms(w).termIds[0];
    expect(bm25.idf(id('thesaurus'))).toBeGreaterThan(bm25.idf(id('information')));
    const file = 'Information is everywhere in this building.\nA thesaurus was compiled last spring.';
    expect(bestMatchingLine(file, index, 'information thesaurus').line).toBe(1);
  });

  it('falls back to the first non-blank line when no line relates to the query', () => {
    const file = '\n\n   \n12 34\n--';
    expect(bestMatchingLine(file, index, 'citation analysis').line).toBe(3);
  });

  it('shortens very long lines', () => {
    const long = `citation ${'analysis '.repeat(60)}`;
    const got = bestMatchingLine(long, index, 'citation analysis');
    expect(got.text.length).toBeLessThanOrEqual(DEFAULT_PASSAGE_OPTIONS.maxChars);
    expect(got.text.endsWith('…')).toBe(true);
  });
});
