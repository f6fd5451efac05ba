import { describe, expect, it } from 'vitest';
import { countOfTerm, countTermIds, countTerms, Vocabulary } from '../../../src/core/counting/termCounts.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { loadCollection } from '../../helpers/shared.js';

// Real text: the CISI collection (test/fixtures/corpora/cisi). Every expected value below comes from a
// brute-force reference (a plain array and Map over the same terms), not from the code under test.
const cisi = loadCollection('cisi');

/** Terms in code-unit order, as IndexBuilder numbers them, plus characters where that order and UTF-8 byte order disagree. */
let cached: string[] | null = null;
function sortedTerms(): string[] {
  if (cached) return cached;
  const set = new Set<string>();
  for (const d of cisi.docs) for (const t of tokenize(d.text)) set.add(t);
  // U+FF5E (3 UTF-8 bytes) sorts after U+1F600 (a surrogate pair) by code units but before it by bytes.
  for (const t of ['zz\u{1F600}', 'zz\uFF5E', 'café', 'naïve', 'δ']) set.add(t);
  cached = [...set].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  return cached;
}

function reopen(v: Vocabulary): Vocabulary {
  const saved = v.toBytes();
  const copy = Vocabulary.fromBytes({ bytes: saved.bytes.slice(), starts: saved.starts.slice(), sorted: saved.sorted });
  if (!copy) throw new Error('fromBytes refused its own bytes');
  return copy;
}

describe('Vocabulary', () => {
  it('answers idOf and termOf for every term after a reopen as the brute-force table does', () => {
    const terms = sortedTerms();
    const copy = reopen(new Vocabulary(terms));
    expect(copy.size).toBe(terms.length);
    // The byte-order run stops at 'zz\uFF5E', so both the binary search and the map are used.
    expect(copy.toBytes().sorted).toBe(terms.indexOf('zz\uFF5E'));
    expect(terms.map((_, id) => copy.termOf(id))).toEqual(terms);
    expect(terms.map((t) => copy.idOf(t))).toEqual(terms.map((_, id) => id));
    for (const unknown of ['', 'zzzzzzzz', 'aaaa0', 'zz\u{1F601}', 'café2']) expect(copy.idOf(unknown)).toBeUndefined();
    expect(copy.terms).toEqual(terms);
  });

  it('fromTerms gives the same table as the terms added one by one, sorted or not, and grows the same way', () => {
    const terms = sortedTerms();
    // Sorted (the byte-order run stops at 'zz\uFF5E'), and shuffled by a fixed stride (no run at all).
    const stride = terms.map((_, i) => terms[(i * 7919) % terms.length]);
    for (const list of [terms, stride, []]) {
      const reference = new Map(list.map((t, i) => [t, i] as const));
      const v = Vocabulary.fromTerms(list);
      expect(v.size).toBe(list.length);
      expect(list.map((_, id) => v.termOf(id))).toEqual(list);
      expect(list.map((t) => v.idOf(t))).toEqual(list.map((_, id) => id));
      for (const unknown of ['', 'zzzzzzzz', 'zz\u{1F601}']) expect(v.idOf(unknown)).toBe(reference.get(unknown));
      expect(v.add('brandnew-term')).toBe(list.length);
      expect(v.terms).toEqual([...list, 'brandnew-term']);
    }
    expect(Vocabulary.fromTerms(terms).toBytes().sorted).toBe(terms.indexOf('zz\uFF5E'));
  });

  it('fromEncoded over the bytes fromTerms writes (TextEncoder, terms joined by U+0000) gives the same vocabulary, and refuses offsets that do not delimit them', () => {
    const terms = sortedTerms();
    for (const list of [terms, terms.map((_, i) => terms[(i * 7919) % terms.length]), []]) {
      const want = Vocabulary.fromTerms(list).toBytes();
      const bytes = new TextEncoder().encode(list.join('\0'));
      const starts = Int32Array.from(want.starts);
      const v = Vocabulary.fromEncoded(bytes, starts)!;
      expect(v.toBytes()).toEqual(want);
      expect(list.map((t) => v.idOf(t))).toEqual(list.map((_, id) => id));
    }
    const bytes = new TextEncoder().encode('ab\0cd');
    expect(Vocabulary.fromEncoded(bytes, Int32Array.from([0, 2, 6]))).toBeNull();
    expect(Vocabulary.fromEncoded(bytes, Int32Array.from([0, 3, 5]))).toBeNull();
    expect(Vocabulary.fromEncoded(bytes, Int32Array.from([0, 3, 6]))!.terms).toEqual(['ab', 'cd']);
  });

  it('fromTerms refuses a term holding the separator U+0000', () => {
    expect(() => Vocabulary.fromTerms(['a', 'b\0c'])).toThrow(/U\+0000/);
  });

  it('keeps ids stable when terms are added after a reopen, before and after `terms` is read', () => {
    const terms = sortedTerms();
    const copy = reopen(new Vocabulary(terms));
    const reference = new Map(terms.map((t, i) => [t, i] as const));
    for (const t of ['brandnew', 'aardvark-x', terms[5], 'zz\u{1F600}', 'ünïcode']) {
      const expected = reference.get(t) ?? reference.size;
      reference.set(t, expected);
      expect(copy.add(t)).toBe(expected);
    }
    expect(copy.terms).toEqual([...reference.keys()]);
    expect(copy.add('after-terms')).toBe(reference.size);
    expect(copy.terms[reference.size]).toBe('after-terms');
    expect(copy.termOf(reference.size)).toBe('after-terms');
    // Save again (tail unsorted) and reopen: the same table.
    const again = reopen(copy);
    expect([...reference.keys()].map((t) => again.idOf(t))).toEqual([...reference.values()]);
    expect([...reference.values()].map((id) => again.termOf(id))).toEqual([...reference.keys()]);
    expect(again.idOf('after-terms')).toBe(reference.size);
  });

  it('finds every term of a vocabulary in first-seen (unsorted) order after a reopen', () => {
    const v = new Vocabulary();
    const firstSeen: string[] = [];
    for (const d of cisi.docs.slice(0, 200))
      for (const t of tokenize(d.text))
        if (v.idOf(t) === undefined) {
          firstSeen.push(t);
          v.add(t);
        }
    const copy = reopen(v);
    expect(copy.toBytes().sorted).toBeLessThan(firstSeen.length);
    expect(firstSeen.map((t) => copy.idOf(t))).toEqual(firstSeen.map((_, id) => id));
    expect(copy.idOf('zzzzzzzz')).toBeUndefined();
  });

  it('counts a document against a reopened vocabulary exactly as against the original', () => {
    const terms = sortedTerms();
    const original = new Vocabulary(terms);
    const copy = reopen(original);
    for (const d of cisi.docs.slice(0, 50)) {
      const tokens = tokenize(`${d.text} unheardofword`);
      // Brute force: tally known tokens by id, ids ascending.
      const tally = new Map<number, number>();
      for (const t of tokens) if (original.idOf(t) !== undefined) tally.set(original.idOf(t)!, (tally.get(original.idOf(t)!) ?? 0) + 1);
      const ids = [...tally.keys()].sort((a, b) => a - b);
      const got = countTerms(tokens, copy, false);
      expect(Array.from(got.termIds)).toEqual(ids);
      expect(Array.from(got.counts)).toEqual(ids.map((id) => tally.get(id)));
      expect(got.length).toBe(ids.reduce((s, id) => s + tally.get(id)!, 0));
    }
  });
});

describe('Vocabulary bytes', () => {
  it('adds new terms in order of first occurrence when counting with grow', () => {
    const v = new Vocabulary(['b']);
    const got = countTerms(['c', 'a', 'b', 'c', 'a', 'c'], v, true);
    // By hand: c → 1, a → 2 (first occurrences), b is 0; counts b 1, c 3, a 2.
    expect(v.terms).toEqual(['b', 'c', 'a']);
    expect(Array.from(got.termIds)).toEqual([0, 1, 2]);
    expect(Array.from(got.counts)).toEqual([1, 3, 2]);
    expect(got.length).toBe(6);
  });

  it('round-trips the empty vocabulary and a vocabulary of one empty term', () => {
    expect(reopen(new Vocabulary()).size).toBe(0);
    const one = reopen(new Vocabulary(['']));
    expect(one.size).toBe(1);
    expect(one.idOf('')).toBe(0);
    expect(one.terms).toEqual(['']);
  });

  it('refuses offsets that do not delimit the terms of the bytes', () => {
    const bytes = new TextEncoder().encode('alpha\0beta\0gamma');
    // By hand: 'alpha' at 0, 'beta' at 6, 'gamma' at 11; the end mark is length + 1 = 17.
    const good = Vocabulary.fromBytes({ bytes, starts: Int32Array.of(0, 6, 11, 17), sorted: 3 });
    expect([good?.idOf('beta'), good?.termOf(2), good?.idOf('gamm')]).toEqual([1, 'gamma', undefined]);
    expect(Vocabulary.fromBytes({ bytes, starts: Int32Array.of(0, 6, 18), sorted: 2 })).toBeNull();
    expect(Vocabulary.fromBytes({ bytes, starts: Int32Array.of(0, 5, 11, 17), sorted: 3 })).toBeNull();
    expect(Vocabulary.fromBytes({ bytes, starts: Int32Array.of(0, 6, 11, 16), sorted: 3 })).toBeNull();
    expect(Vocabulary.fromBytes({ bytes, starts: Int32Array.of(0, 6, 11, 17), sorted: 4 })).toBeNull();
    expect(Vocabulary.fromBytes({ bytes, starts: Int32Array.of(0, 6, 11, 17), sorted: Number.NaN })).toBeNull();
    expect(Vocabulary.fromBytes({ bytes, starts: new Int32Array(0), sorted: 0 })).toBeNull();
  });
});

describe('countOfTerm', () => {
  // Real text: the first CISI abstracts (test/fixtures/corpora/cisi), against a plain scan of the counts.
  it('finds every term of a document with its count and gives 0 for ids it lacks', () => {
    const vocab = new Vocabulary();
    for (const d of loadCollection('cisi').docs.slice(0, 20)) {
      const terms = countTerms(tokenize(d.text), vocab, true);
      for (let i = 0; i < terms.termIds.length; i++) expect(countOfTerm(terms, terms.termIds[i])).toBe(terms.counts[i]);
      const present = new Set(terms.termIds);
      for (let id = 0; id < vocab.size + 2; id++) if (!present.has(id)) expect(countOfTerm(terms, id)).toBe(0);
    }
  });
});

describe('countTermIds', () => {
  it('gives what countTerms gives for the same tokens once looked up (CISI documents)', () => {
    const vocab = new Vocabulary();
    for (const d of cisi.docs.slice(0, 50)) {
      const tokens = tokenize(d.text);
      const want = countTerms(tokens, vocab, true);
      const ids = tokens.map((t) => vocab.idOf(t)!);
      const got = countTermIds(ids);
      expect(Array.from(got.termIds)).toEqual(Array.from(want.termIds));
      expect(Array.from(got.counts)).toEqual(Array.from(want.counts));
      expect(got.length).toBe(want.length);
    }
    expect(countTermIds([])).toEqual({ termIds: new Int32Array(0), counts: new Float32Array(0), length: 0 });
  });
});
