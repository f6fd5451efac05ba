import { describe, expect, it } from 'vitest';
import { Vocabulary } from '../../../src/core/counting/termCounts.js';
import { createRandom } from '../../../src/core/random.js';
import { mergeSortedUnits } from '../../../src/node/parallel/sortedCount.js';
import { termUnitsInOrder } from '../../../src/node/parallel/termOrder.js';

const byUnits = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** A list's terms in sorted order as code units, and that order (what a thread sends). */
function sortedList(terms: readonly string[]): { order: Int32Array; units: ReturnType<typeof termUnitsInOrder> } {
  const order = Int32Array.from([...terms.keys()].sort((a, b) => byUnits(terms[a], terms[b])));
  return { order, units: termUnitsInOrder(terms, order) };
}

// Reference: the sorted union of the threads' term sets (Array.prototype.sort, UTF-16 order) by
// brute force, encoded as Vocabulary.fromTerms encodes it (TextEncoder, the WHATWG Encoding
// standard's UTF-8 encoder, over the terms joined by '\0').
describe('mergeSortedUnits', () => {
  it('gives the sorted union of overlapping term lists as the vocabulary fromTerms makes, and maps every term to its id', () => {
    const rnd = createRandom(3);
    // ASCII, Latin-1, CJK, an astral letter (a surrogate pair) and a lone surrogate.
    const heads = ['a', 'b', 'c', 'é', '日', '\u{1d400}', '\ud800'];
    const words = Array.from({ length: 3000 }, (_, i) => `${heads[i % heads.length]}${Math.floor(rnd.next() * 1e6).toString(36)}`);
    const lists = [0, 1, 2].map((w) => [...new Set(words.filter(() => rnd.next() < 0.4 + 0.2 * w))]);
    const sent = lists.map(sortedList);
    const { bytes, starts, toMerged } = mergeSortedUnits(sent.map((s) => s.units));
    const union = [...new Set(lists.flat())].sort();
    const expected = Vocabulary.fromTerms(union).toBytes();
    expect(bytes).toEqual(expected.bytes);
    expect(starts).toEqual(expected.starts);
    const vocab = Vocabulary.fromEncoded(bytes, starts)!;
    expect(vocab.byteOrdered).toBe(expected.sorted);
    expect(vocab.terms).toEqual(union.map((t) => new TextDecoder().decode(new TextEncoder().encode(t))));
    lists.forEach((l, w) =>
      expect(Array.from(toMerged[w], (id, p) => [id, l[sent[w].order[p]]])).toEqual(Array.from(toMerged[w], (id) => [id, union[id]])),
    );
  });

  it('handles empty lists beside others', () => {
    const { bytes, starts, toMerged } = mergeSortedUnits([[], ['b', 'a'], []].map((l) => sortedList(l).units));
    expect(new TextDecoder().decode(bytes)).toBe('a\0b');
    expect(Array.from(starts)).toEqual([0, 2, 4]);
    expect(Array.from(toMerged[1])).toEqual([0, 1]);
    expect(toMerged[0].length + toMerged[2].length).toBe(0);
  });

  it('gives what fromTerms gives for no terms at all', () => {
    const { bytes, starts } = mergeSortedUnits([sortedList([]).units]);
    const expected = Vocabulary.fromTerms([]).toBytes();
    expect(bytes).toEqual(expected.bytes);
    expect(starts).toEqual(expected.starts);
  });

  it('refuses a term holding U+0000 as fromTerms does', () => {
    expect(() => mergeSortedUnits([sortedList(['a\0b']).units])).toThrow(/U\+0000/);
  });
});
