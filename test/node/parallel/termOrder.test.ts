import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { sortedUnitIds, termUnitsInOrder } from '../../../src/node/parallel/termOrder.js';

/** The order of the terms given as code units (as a thread holds them). */
const sortedTermIds = (terms: readonly string[]): Int32Array => sortedUnitIds(termUnitsInOrder(terms, Int32Array.from(terms.keys())));

// Reference: Array.prototype.sort on the strings (UTF-16 code unit order, ECMAScript spec), then
// each term's position in the input.
function reference(terms: readonly string[]): number[] {
  const at = new Map(terms.map((t, i) => [t, i]));
  return [...terms].sort().map((t) => at.get(t)!);
}

function randomTerms(seed: number, n: number, alphabet: readonly string[]): string[] {
  const random = createRandom(seed);
  const seen = new Set<string>();
  while (seen.size < n) {
    const len = 1 + Math.floor(random.next() * 7);
    let t = '';
    for (let i = 0; i < len; i++) t += alphabet[Math.floor(random.next() * alphabet.length)];
    seen.add(t);
  }
  return [...seen];
}

describe('sortedUnitIds', () => {
  it('orders ids as a plain string sort does, on short ASCII terms with shared prefixes', () => {
    const terms = randomTerms(11, 5000, ['a', 'b', 'c', 'z', '0', '9', '_']);
    expect(Array.from(sortedTermIds(terms))).toEqual(reference(terms));
  });

  it('orders one-unit terms before longer terms with the same first unit, and handles non-ASCII and astral units', () => {
    const terms = ['b', 'ba', 'a', 'ab', 'é', 'éa', 'z', '日本', '日', '\u{1F600}x', '\u{1D400}', 'ÿ', 'a\u00ff', 'a\uffee'];
    expect(Array.from(sortedTermIds(terms))).toEqual(reference(terms));
    const mixed = randomTerms(5, 3000, ['a', 'é', 'Ω', '日', '本', '\u{1F600}', '\u{1D400}', '1']);
    expect(Array.from(sortedTermIds(mixed))).toEqual(reference(mixed));
  });

  it('gives an empty order for no terms', () => {
    expect(sortedTermIds([]).length).toBe(0);
  });
});
