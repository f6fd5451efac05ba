/**
 * UnitBuffer and the word-character tests against the built-in pipeline that tokenize() runs
 * (String.prototype.normalize('NFKD') then /\p{M}+/gu removed, words by /[\p{L}\p{N}_$]+/gu).
 */
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import {
  astralWordAt,
  caselessLetters,
  classify,
  HIGH_SURROGATE,
  UnitBuffer,
  unitsToString,
  WORD,
} from '../../../src/node/parallel/textUnits.js';

const reference = (text: string): string => text.normalize('NFKD').replace(/\p{M}+/gu, '');

function loaded(text: string, buf = new UnitBuffer()): string {
  buf.loadText(text);
  return unitsToString(buf.units, 0, buf.length);
}

/** Words found by code unit, as the counter finds them. */
function wordsOf(u: Uint16Array, n: number): string[] {
  const out: string[] = [];
  let i = 0;
  while (i < n) {
    const start = i;
    for (;;) {
      if (i >= n) break;
      const k = classify(u[i]);
      if (k === WORD) i++;
      else if (k === HIGH_SURROGATE && astralWordAt(u, i, n)) i += 2;
      else break;
    }
    if (i > start) out.push(unitsToString(u, start, i));
    else i++;
  }
  return out;
}

const ODD = [
  'Café naïve résumé — “quoted” ﬁle ①②③ Ｆｕｌｌｗｉｄｔｈ ΑΒΓ δέλτα 東京 ゲーム',
  'e\u0301tude a\u0300 o\u0308\u0323 x\u0323\u0301 and emoji 😀 in text_with_snake',
  '\u0301leading mark, lone \ud800 high and \udc00 low surrogates, 𝐀𝐁 math letters, 𝟙 double-struck one',
  'Hangul 한국어 ㎏ ㍻ ﷺ Ⅻ ǅungla İstanbul',
  '',
  'plain ascii only',
];

describe('UnitBuffer', () => {
  it('loads text as NFKD without combining marks (reference: normalize + replace)', () => {
    const buf = new UnitBuffer();
    for (const t of ODD) expect(loaded(t, buf)).toBe(reference(t));
  });

  it('equals the reference on 3 000 random strings of ASCII, accents, marks, CJK and surrogates', () => {
    const rnd = createRandom(5);
    const pool = [
      'a',
      'Z',
      '9',
      ' ',
      '_',
      'é',
      '\u0301',
      '\u0308',
      'ﬁ',
      '東',
      'ー',
      '①',
      '😀',
      '𝐀',
      '\ud800',
      '\udc00',
      'ǅ',
      'Σ',
      '—',
      '\u00a0',
    ];
    const buf = new UnitBuffer();
    for (let r = 0; r < 3000; r++) {
      let t = '';
      const len = Math.floor(rnd.next() * 12);
      for (let i = 0; i < len; i++) t += pool[Math.floor(rnd.next() * pool.length)];
      expect(loaded(t, buf), JSON.stringify(t)).toBe(reference(t));
      buf.loadText(t);
      expect(wordsOf(buf.units, buf.length)).toEqual(reference(t).match(/[\p{L}\p{N}_$]+/gu) ?? []);
    }
  });

  it('copies ASCII bytes as they are, after a longer text', () => {
    const buf = new UnitBuffer();
    buf.loadText('x'.repeat(100_000));
    buf.loadAscii(Buffer.from('short ASCII'));
    expect(unitsToString(buf.units, 0, buf.length)).toBe('short ASCII');
  });
});

describe('caselessLetters', () => {
  it('holds only for words that tokenize() keeps whole (reference: tokenize itself)', () => {
    const yes = ['東京', 'ゲーム', '한국어', 'שלום', 'عربى', 'ไทย'];
    const no = ['δέλτα', 'ΑΒΓ', 'Straße', '東京2', 'ǆ', 'кот'];
    for (const w of yes.map(reference)) {
      const u = Uint16Array.from(w, (c) => c.charCodeAt(0));
      expect(caselessLetters(u, 0, u.length), w).toBe(true);
      expect(tokenize(w)).toEqual([w]);
    }
    for (const w of no) {
      const u = Uint16Array.from(w.normalize('NFKD').replace(/\p{M}+/gu, ''), (c) => c.charCodeAt(0));
      expect(caselessLetters(u, 0, u.length), w).toBe(false);
    }
  });
});
