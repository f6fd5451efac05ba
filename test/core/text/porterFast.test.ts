import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import PorterStemmer from 'natural/lib/natural/stemmers/porter_stemmer.js';
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { porterStem } from '../../../src/core/text/porterFast.js';
import { MAX_TOKEN_LENGTH } from '../../../src/core/text/tokenRules.js';
import { loadRankingFixture } from '../../helpers/rankingChecks.js';
import { loadCollection, REPO_ROOT } from '../../helpers/shared.js';

// Reference: natural's PorterStemmer (a published port of Porter's algorithm, which tokenize() used
// before it used porterFast), word by word. Porter's own
// examples (Porter 1980, "An algorithm for suffix stripping") are among the edge cases.
function check(words: Iterable<string>): number {
  let n = 0;
  for (const w of words) {
    n++;
    expect(porterStem(w), w).toBe(PorterStemmer.stem(w));
  }
  return n;
}

const PORTER_EXAMPLES = [
  'caresses',
  'ponies',
  'ties',
  'caress',
  'cats',
  'feed',
  'agreed',
  'plastered',
  'bled',
  'motoring',
  'sing',
  'conflated',
  'troubled',
  'sized',
  'hopping',
  'tanned',
  'falling',
  'hissing',
  'fizzed',
  'failing',
  'filing',
  'happy',
  'sky',
  'relational',
  'conditional',
  'rational',
  'valenci',
  'hesitanci',
  'digitizer',
  'conformabli',
  'radicalli',
  'differentli',
  'vileli',
  'analogousli',
  'vietnamization',
  'predication',
  'operator',
  'feudalism',
  'decisiveness',
  'hopefulness',
  'callousness',
  'formaliti',
  'sensitiviti',
  'sensibiliti',
  'triplicate',
  'formative',
  'formalize',
  'electriciti',
  'electrical',
  'hopeful',
  'goodness',
  'revival',
  'allowance',
  'inference',
  'airliner',
  'gyroscopic',
  'adjustable',
  'defensible',
  'irritant',
  'replacement',
  'adjustment',
  'dependent',
  'adoption',
  'homologou',
  'communism',
  'activate',
  'angulariti',
  'homologous',
  'effective',
  'bowdlerize',
  'probate',
  'rate',
  'cease',
  'controll',
  'roll',
  'yyy',
  'ayy',
  'byy',
  'eed',
  'ed',
  'ing',
  'ying',
  'sses',
  'ies',
  'ss',
  'is',
  'ous',
  'ion',
  'sion',
  'tion',
  'ation',
  'x86',
  'ipv6',
  'utf8',
  'abc123',
  'y2k',
  '2ed',
  'spinlock',
  'irqsave',
  'kmalloc',
  'devm',
  'struct',
  'printk',
];

describe('porterStem', () => {
  it("equals natural's PorterStemmer on Porter's examples and edge cases", () => {
    expect(check(PORTER_EXAMPLES)).toBe(PORTER_EXAMPLES.length);
  });

  it('equals it on tokens of every length up to the tokenizer cap, and just past it', () => {
    const rnd = createRandom(29);
    const pieces = ['a', 'e', 'y', 'b', 's', 't', 'ed', 'ing', 'ational', 'iveness', 'ful', 'ization', 'ousli', 'ement', 'ss', 'ies', '7'];
    const words: string[] = [];
    for (let n = 1; n <= MAX_TOKEN_LENGTH + 2; n++) {
      for (let k = 0; k < 60; k++) {
        let w = '';
        while (w.length < n) w += pieces[Math.floor(rnd.next() * pieces.length)];
        words.push(w.slice(w.length - n)); // keep the suffix, where the stemmer works
      }
    }
    expect(check(words)).toBe(60 * (MAX_TOKEN_LENGTH + 2));
  });

  it('equals it on 30 000 generated lowercase tokens', () => {
    const rnd = createRandom(23);
    const pieces = [
      'a',
      'e',
      'i',
      'o',
      'u',
      'y',
      'b',
      'c',
      'l',
      's',
      't',
      'z',
      'w',
      'x',
      'n',
      'g',
      'd',
      'r',
      '1',
      '9',
      'ed',
      'ing',
      'ion',
      'ies',
      'ss',
      'll',
      'eed',
      'at',
      'bl',
      'iz',
      'ate',
      'al',
      'ent',
      'ful',
      'ness',
      'ic',
    ];
    const words = Array.from({ length: 30000 }, () => {
      let w = '';
      const n = 1 + Math.floor(rnd.next() * 7);
      for (let i = 0; i < n; i++) w += pieces[Math.floor(rnd.next() * pieces.length)];
      return w;
    });
    check(words);
  });

  it('equals it on every lowercase word of the test collections and of the CMake and Django manuals', () => {
    const words = new Set<string>();
    for (const name of ['cran', 'cisi', 'cacm', 'adi']) {
      for (const d of loadCollection(name).docs) for (const m of d.text.toLowerCase().matchAll(/[a-z0-9]+/g)) words.add(m[0]);
    }
    // Real documentation: the CMake and Django manuals (Debian cmake-doc and python-django-doc;
    // test/fixtures/cmake-doc and django-doc, provenance in their READMEs).
    for (const name of ['cmake-doc', 'django-doc'])
      for (const d of loadRankingFixture(name).docs) for (const m of d.text.toLowerCase().matchAll(/[a-z0-9]+/g)) words.add(m[0]);
    expect(words.size).toBeGreaterThan(10000);
    // At most 60 000 words, to keep the run light (a one-off check once covered a whole source tree).
    check(Array.from(words).slice(0, 60000));
  });

  it('equals it on lowercase tokens with letters outside ASCII (generated, and every such word of the six-language pages)', () => {
    // The Porter suffixes after mixes of ASCII and other letters (accented, Cyrillic, Greek,
    // Turkish dotless i, CJK, a ligature, an astral letter).
    const rnd = createRandom(29);
    const letters = ['a', 'e', 'i', 'o', 'u', 'y', 'b', 'l', 's', 't', 'z', 'w', 'x', 'é', 'ß', 'ж', 'я', 'δ', 'ω', 'ı', '東', 'ﬁ', '𝐀'];
    const suffixes = [
      '',
      'ing',
      'ed',
      'ies',
      'sses',
      'ational',
      'ization',
      'fulness',
      'ement',
      'ance',
      'able',
      'ent',
      'ion',
      'ous',
      'ive',
      'e',
      'y',
      'll',
      'eed',
      'bli',
      'logi',
    ];
    const words = new Set<string>();
    for (let i = 0; i < 30000; i++) {
      let w = '';
      const n = 1 + Math.floor(rnd.next() * 6);
      for (let j = 0; j < n; j++) w += letters[Math.floor(rnd.next() * letters.length)];
      words.add(w + suffixes[Math.floor(rnd.next() * suffixes.length)]);
    }
    // Real pages in six languages: the GNOME help (test/fixtures/gnome-help, Debian gnome-user-docs 43.0-2).
    const root = join(REPO_ROOT, 'test', 'fixtures', 'gnome-help');
    for (const f of readdirSync(root, { recursive: true }) as string[])
      if (f.endsWith('.page'))
        for (const m of readFileSync(join(root, f), 'utf8')
          .toLowerCase()
          .matchAll(/[\p{L}\p{N}]+/gu))
          if (/[^\p{ASCII}]/u.test(m[0])) words.add(m[0]);
    expect(words.size).toBeGreaterThan(20000);
    check(words);
  });
});
