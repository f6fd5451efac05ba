import { describe, expect, it } from 'vitest';
import { intersectionSize, jaccardSorted, shingleSet, shingleTokens } from '../../../src/core/lookalike/shingles.js';
import { createRandom } from '../../../src/core/random.js';
import { loadCorpusDocs, referenceShingles } from './corpusFixtures.js';

describe('shingleTokens', () => {
  it('lowercases words, identifiers and numbers without stemming or dropping stop words', () => {
    expect(shingleTokens('The Running parse_header(Buf2, 3.14) is in the café')).toEqual([
      'the',
      'running',
      'parse_header',
      'buf2',
      '3',
      '14',
      'is',
      'in',
      'the',
      'café',
    ]);
  });
});

describe('shingleSet', () => {
  it('is empty for texts shorter than one shingle', () => {
    expect(shingleSet('only four tokens here', 5)).toEqual({ hashes: new Uint32Array(0), tokens: 4 });
    expect(shingleSet('', 5).hashes.length).toBe(0);
  });

  it('is sorted and duplicate-free', () => {
    const s = shingleSet('a b c d e a b c d e a b c d e f', 5).hashes;
    expect(s.length).toBe(6); // distinct 5-grams: abcde bcdea cdeab deabc eabcd bcdef
    for (let i = 1; i < s.length; i++) expect(s[i]).toBeGreaterThan(s[i - 1]);
  });

  const docs = loadCorpusDocs('cran');
  it('gives the exact Jaccard of string 5-gram sets on CRAN abstracts', () => {
    // Reference: Jaccard of Sets of the joined 5-gram strings (corpusFixtures.referenceShingles).
    // Shingle hashes are 32-bit; a collision (≈ 10⁻⁵ chance per file pair) would show up here as a
    // size or intersection mismatch.
    const rng = createRandom(3);
    const list = docs;
    for (let t = 0; t < 300; t++) {
      const a = list[Math.floor(rng.next() * list.length)].text;
      const b = t % 3 === 0 ? a.split('\n').slice(1).join('\n') : list[Math.floor(rng.next() * list.length)].text;
      const ra = referenceShingles(a, 5);
      const rb = referenceShingles(b, 5);
      const common = [...ra].filter((x) => rb.has(x)).length;
      const exact = ra.size + rb.size - common === 0 ? 0 : common / (ra.size + rb.size - common);
      const ha = shingleSet(a, 5).hashes;
      const hb = shingleSet(b, 5).hashes;
      expect(ha.length).toBe(ra.size);
      expect(intersectionSize(ha, hb)).toBe(common);
      expect(jaccardSorted(ha, hb)).toBeCloseTo(exact, 12);
    }
  });
});

describe('jaccardSorted', () => {
  it('counts by merging sorted sets (checked by hand)', () => {
    const a = Uint32Array.from([1, 3, 5, 7, 9]);
    const b = Uint32Array.from([3, 4, 5, 9, 10, 11]);
    expect(intersectionSize(a, b)).toBe(3);
    expect(jaccardSorted(a, b)).toBeCloseTo(3 / 8, 15);
    expect(jaccardSorted(new Uint32Array(0), new Uint32Array(0))).toBe(0);
  });
});
