import { describe, expect, it } from 'vitest';
import { DEFAULT_TOKENIZE_OPTIONS, splitIdentifier, tokenize } from '../../../src/core/text/tokenize.js';
import { asciiParts, asciiWordTokens, isAsciiWord } from '../../../src/core/text/asciiWord.js';
import { MAX_DIGIT_RUN, MAX_TOKEN_LENGTH, MIN_HEXISH_LENGTH } from '../../../src/core/text/tokenRules.js';
import { createRandom } from '../../../src/core/random.js';
import { loadRankingFixture } from '../../helpers/rankingChecks.js';
import { loadCollection } from '../../helpers/shared.js';

// Reference: tokenize() itself (the regular-expression tokenizer this path must equal), on
// edge cases, generated identifiers, the words of the test collections and of two real code bases.
// Every combination of the two options.
const OPTION_SETS = [
  DEFAULT_TOKENIZE_OPTIONS,
  { stem: false, keepCompounds: true },
  { stem: true, keepCompounds: false },
  { stem: false, keepCompounds: false },
];

function check(words: Iterable<string>): number {
  let n = 0;
  for (const w of words) {
    if (!isAsciiWord(w)) continue;
    n++;
    for (const o of OPTION_SETS) expect(asciiWordTokens(w, o), `${w} ${JSON.stringify(o)}`).toEqual(tokenize(w, o));
  }
  return n;
}

const EDGE = [
  'a',
  'ab',
  'A',
  'HTTPServer',
  'getHTTPResponseCode',
  'parse_json_value',
  '__init__',
  '$scope',
  'a$b_c',
  'x86_64',
  'v2',
  '2fa',
  'ABc',
  'ABC',
  'aBC',
  'Version42Beta',
  'deadbeef',
  'deadbeef1',
  'DEADBEEF12',
  '0xFF',
  '0x',
  '0xg',
  '0X1f',
  '12345',
  '1234',
  '00000',
  'a1b2c3d4e5',
  'iPhone',
  'IO',
  'iOS',
  'the',
  'The',
  'THE',
  'for_each',
  'IS_ERR_OR_NULL',
  '_',
  '__',
  '$',
  'snake_CASE_Mixed',
  'x'.repeat(41),
  'ab'.repeat(20),
  `${'a'.repeat(20)}_${'b'.repeat(20)}`,
  'A1',
  '1A',
  'a_1',
  '1_a',
];

describe('asciiWordTokens', () => {
  it('covers every combination of the tokenize options', () => {
    const combos = new Set(OPTION_SETS.map((o) => `${o.stem}/${o.keepCompounds}`));
    expect(combos).toEqual(new Set(['true/true', 'false/true', 'true/false', 'false/false']));
  });

  it('keeps tokens and compounds of exactly the cap and drops those one longer, as tokenize() does', () => {
    const L = MAX_TOKEN_LENGTH;
    // Words made to sit on each limit: a part, a compound, a digit run and a hex-looking run.
    const word = (n: number, from = 'quorv') => Array.from({ length: n }, (_, i) => from[i % from.length]).join('');
    const cases: [string, string[]][] = [
      [word(L), [word(L)]],
      [word(L + 1), []],
      [`${word(L / 2)}_${word(L / 2, 'zelk')}`, [word(L / 2), word(L / 2, 'zelk'), word(L / 2) + word(L / 2, 'zelk')]],
      [`${word(L / 2)}_${word(L / 2 + 1, 'zelk')}`, [word(L / 2), word(L / 2 + 1, 'zelk')]],
      ['7'.repeat(MAX_DIGIT_RUN), ['7'.repeat(MAX_DIGIT_RUN)]],
      ['7'.repeat(MAX_DIGIT_RUN + 1), []],
      [`a${'1'.repeat(MIN_HEXISH_LENGTH - 2)}`, [`a${'1'.repeat(MIN_HEXISH_LENGTH - 2)}`]],
      [`a${'1'.repeat(MIN_HEXISH_LENGTH - 1)}`, []],
    ];
    const plain = { stem: false, keepCompounds: true };
    for (const [w, expected] of cases) {
      expect(tokenize(w, plain), w).toEqual(expected); // the reference itself, against the limits as written
      for (const o of OPTION_SETS) expect(asciiWordTokens(w, o), `${w} ${JSON.stringify(o)}`).toEqual(tokenize(w, o));
    }
    // Generated words of every length around the cap, split and unsplit.
    const rnd = createRandom(5);
    const around: string[] = [];
    for (let n = L - 3; n <= L + 3; n++) {
      for (let k = 0; k < 40; k++) {
        let w = '';
        for (let i = 0; i < n; i++) w += 'abcdeHIJKlmnop_0123'[Math.floor(rnd.next() * 19)];
        around.push(w);
      }
    }
    expect(check(around)).toBeGreaterThan(200);
  });

  it('splits identifiers exactly as splitIdentifier does', () => {
    for (const w of EDGE) if (isAsciiWord(w)) expect(asciiParts(w)).toEqual(splitIdentifier(w));
  });

  it('equals tokenize() on edge cases and on 20 000 generated identifiers', () => {
    expect(check(EDGE)).toBeGreaterThan(40);
    const rnd = createRandom(17);
    const alphabet = 'abcdefxyzABCDEFXYZ0123456789_$';
    const generated = Array.from({ length: 20000 }, () => {
      const len = 1 + Math.floor(rnd.next() * 14);
      let w = '';
      for (let i = 0; i < len; i++) w += alphabet[Math.floor(rnd.next() * alphabet.length)];
      return w;
    });
    expect(check(generated)).toBe(20000);
  });

  it('equals tokenize() on every ASCII word of the test collections', () => {
    let n = 0;
    for (const name of ['cran', 'cisi', 'cacm', 'adi']) {
      const col = loadCollection(name);
      const words = new Set<string>();
      for (const d of col.docs) for (const m of d.text.matchAll(/[A-Za-z0-9_$]+/g)) words.add(m[0]);
      n += check(words);
    }
    expect(n).toBeGreaterThan(10000);
  });

  // Real code identifiers: the rxjs 7.8.2 and lodash 4.18.1 sources (npm, Apache-2.0 and MIT;
  // test/fixtures/rxjs-src and lodash-src, provenance in their READMEs).
  it('equals tokenize() on every ASCII word of two real code bases (rxjs and lodash sources)', () => {
    let n = 0;
    for (const name of ['rxjs-src', 'lodash-src']) {
      const words = new Set<string>();
      for (const d of loadRankingFixture(name).docs) for (const m of d.text.matchAll(/[A-Za-z0-9_$]+/g)) words.add(m[0]);
      n += check(words);
    }
    expect(n).toBeGreaterThan(3000);
  });
});
