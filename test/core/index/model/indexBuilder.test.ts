import { describe, expect, it, vi } from 'vitest';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { decodeIndex, encodeIndex } from '../../../../src/core/index/persistence/serialize.js';
import { Vocabulary, type DocTerms } from '../../../../src/core/counting/termCounts.js';
import { loadCollection } from '../../../helpers/shared.js';

// Real text: ADI (test/fixtures/corpora/adi, 82 abstracts on documentation and retrieval).
const adi = loadCollection('adi');

const doc = (ids: number[]): DocTerms => ({ termIds: Int32Array.from(ids), counts: Float32Array.from(ids, () => 1), length: ids.length });

/** A vocabulary as a reopened index holds it: UTF-8 bytes, '\0' between terms, all ids byte-ordered. */
function savedVocabulary(terms: string[]): Vocabulary {
  const bytes = new TextEncoder().encode(terms.join('\0'));
  const starts = new Int32Array(terms.length + 1);
  let at = 0;
  terms.forEach((t, i) => {
    starts[i] = at;
    at += new TextEncoder().encode(t).length + 1;
  });
  starts[terms.length] = bytes.length + 1;
  return Vocabulary.fromBytes({ bytes, starts, sorted: terms.length })!;
}

describe('IndexBuilder', () => {
  it('rebuilds from a reopened index without decoding its terms, to the same vectors and ids as from strings', () => {
    const b = new IndexBuilder({ k: 10 });
    adi.docs.forEach((d) => b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text));
    const reopened = decodeIndex(encodeIndex(b.build()));
    const fromBytes = new IndexBuilder({ k: 10 }, reopened.vocab);
    const fromStrings = new IndexBuilder({ k: 10 }, new Vocabulary(reopened.vocab.terms));
    for (const p of reopened.paths()) for (const x of [fromBytes, fromStrings]) x.addCounted(reopened.meta(p)!, reopened.termsOf(p));
    const again = decodeIndex(encodeIndex(b.build())).vocab; // a reopened vocabulary whose strings were never asked for
    const spy = vi.spyOn(again, 'terms', 'get');
    const rebuilt = new IndexBuilder({ k: 10 }, again);
    for (const p of reopened.paths()) rebuilt.addCounted(reopened.meta(p)!, reopened.termsOf(p));
    const a = rebuilt.build();
    expect(spy).not.toHaveBeenCalled();
    expect(a.vocab).toBe(again); // already in term order: kept, not renumbered
    const c = fromStrings.build();
    expect(Array.from(a.vectors())).toEqual(Array.from(c.vectors()));
    expect(Array.from(fromBytes.build().vectors())).toEqual(Array.from(c.vectors()));
    expect(a.vocab.termOf(123)).toBe(c.vocab.termOf(123));
  });
});

describe('IndexBuilder term order', () => {
  it('renumbers a byte-ordered vocabulary whose order differs in code units (a character above U+FFFF)', () => {
    // UTF-8 puts U+1D6FC (4 bytes, F0…) after U+FB01 (EF AC 81); in UTF-16 code units the surrogate
    // D835 comes before FB01. Byte order and code-unit order of these two terms disagree.
    const terms = ['alpha', 'beta', 'delta', '\uFB01x', '\u{1D6FC}y'];
    const vocab = savedVocabulary(terms);
    const b = new IndexBuilder({ k: 2 }, vocab);
    [
      [0, 1, 3],
      [1, 2, 4],
      [0, 2, 3, 4],
      [0, 1, 2],
    ].forEach((ids, i) => b.addCounted({ path: `d${i}`, size: 1, mtimeMs: 0 }, doc(ids)));
    const built = b.build();
    const order = Array.from({ length: built.vocab.size }, (_, i) => built.vocab.termOf(i));
    expect(order).toEqual([...terms].sort());
    expect(order.indexOf('\u{1D6FC}y')).toBeLessThan(order.indexOf('\uFB01x'));
    expect(built.vocab).not.toBe(vocab);
  });

  it('keeps a byte-ordered vocabulary of plain terms as it is', () => {
    const vocab = savedVocabulary(['ant', 'bee', 'cat', 'dog']);
    const b = new IndexBuilder({ k: 2 }, vocab);
    [
      [0, 1],
      [1, 2, 3],
      [0, 3],
      [0, 2],
    ].forEach((ids, i) => b.addCounted({ path: `d${i}`, size: 1, mtimeMs: 0 }, doc(ids)));
    expect(b.build().vocab).toBe(vocab);
  });
});
