import { describe, expect, it } from 'vitest';
import { DEFAULT_TOKENIZE_OPTIONS, splitIdentifier, stemWord, tokenize, wordTokens } from '../../../src/core/text/tokenize.js';

describe('tokenize', () => {
  it('splits camelCase, PascalCase, acronyms, snake_case, kebab-case and letter/digit boundaries', () => {
    expect(splitIdentifier('parseHTTPResponse')).toEqual(['parse', 'HTTP', 'Response']);
    expect(splitIdentifier('XMLHttpRequest')).toEqual(['XML', 'Http', 'Request']);
    expect(splitIdentifier('snake_case_name')).toEqual(['snake', 'case', 'name']);
    expect(splitIdentifier('utf8Decoder')).toEqual(['utf', '8', 'Decoder']);
    expect(tokenize('kebab-case-name', { stem: false })).toEqual(['kebab', 'name']);
  });

  it('keeps the joined identifier as well, so an exact name still matches', () => {
    expect(tokenize('harbourFeeTable', { stem: false })).toEqual(['harbour', 'fee', 'table', 'harbourfeetable']);
  });

  it('lowercases, drops English stop words and programming keywords', () => {
    expect(tokenize('The Ferry and THE Harbour', { stem: false })).toEqual(['ferry', 'harbour']);
    expect(tokenize('const value = await fetchTide(); return null;', { stem: false })).toEqual(['value', 'fetch', 'tide', 'fetchtide']);
  });

  it('drops one-character tokens, long digit runs and hex-looking runs', () => {
    expect(tokenize('a b 42 2024 123456 0xdeadbeef cafe1234beef x9', { stem: false })).toEqual(['42', '2024', 'x9']);
  });

  it('normalises Unicode: accents removed and compatibility forms folded', () => {
    expect(tokenize('Café naïve ﬁle', { stem: false })).toEqual(['cafe', 'naive', 'file']);
  });

  it('stems with the Porter algorithm', () => {
    // Examples from Porter (1980), "An algorithm for suffix stripping", Program 14(3), steps 1a–2
    // (recalled from memory of the paper's step tables; each agrees with the published algorithm).
    const cases: [string, string][] = [
      ['caresses', 'caress'],
      ['ponies', 'poni'],
      ['cats', 'cat'],
      ['feed', 'feed'],
      ['agreed', 'agre'],
      ['plastered', 'plaster'],
      ['motoring', 'motor'],
      ['sing', 'sing'],
      ['conflated', 'conflat'],
      ['hopping', 'hop'],
      ['falling', 'fall'],
      ['filing', 'file'],
      ['happy', 'happi'],
      ['relational', 'relat'],
      ['conditional', 'condit'],
      ['rational', 'ration'],
      ['digitizer', 'digit'],
    ];
    for (const [word, stem] of cases) expect(stemWord(word)).toBe(stem);
    expect(tokenize('Indexing indexed indexes')).toEqual(['index', 'index', 'index']);
  });

  it('wordTokens gives a normalised word the tokens tokenize gives it, for every option', () => {
    // Words of mixed scripts and forms (invented): identifiers, accents already stripped,
    // kana and Han beside Latin letters, digits, hex runs, astral letters.
    const text = (
      'retryBudget HTTPServer x86_64 数据结构Linux内核 使用kmalloc2次 Muller ΣύστημαAPI deadbeef42 0xFF ' +
      'ÄrgerXMLHttpRequest 𝒳value ﬁle sample_rate_Hz 中文 ab$cd'
    )
      .normalize('NFKD')
      .replace(/\p{M}/gu, '');
    for (const stem of [true, false])
      for (const keepCompounds of [true, false]) {
        const opts = { ...DEFAULT_TOKENIZE_OPTIONS, stem, keepCompounds };
        for (const [word] of text.matchAll(/[\p{L}\p{N}_$]+/gu)) {
          const out: string[] = [];
          wordTokens(word, opts, out);
          expect(out, word).toEqual(tokenize(word, opts));
        }
      }
  });

  it('gives the same tokens for the same text (memoised stems do not change results)', () => {
    const text = 'Generalization of the routing tables; generalizations again.';
    expect(tokenize(text)).toEqual(tokenize(text));
  });
});
