import { describe, expect, it } from 'vitest';
import { collectPostings, PostingsBuild, TermPostings } from '../../../../src/core/index/search/termPostings.js';
import type { DocTerms } from '../../../../src/core/counting/termCounts.js';
import { createRandom } from '../../../../src/core/random.js';
import { countTerms, Vocabulary } from '../../../../src/core/counting/termCounts.js';
import { tokenize } from '../../../../src/core/text/tokenize.js';
import { loadCollection } from '../../../helpers/shared.js';

/** Random documents: sorted distinct ids below `terms`, integer counts 1–5 (some slots empty). */
function randomDocs(n: number, terms: number, seed: number): (DocTerms | null)[] {
  const rnd = createRandom(seed);
  return Array.from({ length: n }, (_, j) => {
    if (j % 13 === 5) return null;
    const ids = new Set<number>();
    const m = Math.floor(rnd.next() * 40);
    for (let i = 0; i < m; i++) ids.add(Math.floor(rnd.next() * terms));
    const termIds = Int32Array.from(ids).sort();
    const counts = Float32Array.from(termIds, () => 1 + Math.floor(rnd.next() * 5));
    return { termIds, counts, length: counts.reduce((s, c) => s + c, 0) };
  });
}

/** Brute force: every (slot, tf) holding term t, slots ascending. */
function bruteForce(docs: readonly (DocTerms | null)[], t: number): [number, number][] {
  const out: [number, number][] = [];
  docs.forEach((d, j) => {
    const at = d ? d.termIds.indexOf(t) : -1;
    if (at >= 0) out.push([j, d!.counts[at]]);
  });
  return out;
}

const pairsOf = (p: TermPostings): [number, number][] => Array.from(p.docs, (j, i) => [j, p.tfs[i]]);

describe('collectPostings', () => {
  it('finds exactly the documents holding each wanted term, with their counts, in slot order', () => {
    const docs = randomDocs(500, 120, 7);
    // Common and rare ids, the first and last possible ids, and ids no document has.
    const want = Int32Array.from([0, 3, 4, 50, 51, 119, 120, 5000]);
    const lists = collectPostings(docs, want, 9);
    expect(lists.length).toBe(want.length);
    want.forEach((t, w) => {
      const expected = bruteForce(docs, t);
      expect(pairsOf(lists[w])).toEqual(expected);
      expect(lists[w].df).toBe(expected.length);
      expect(lists[w].builtAt).toBe(9);
      expect(lists[w].side).toEqual([]);
    });
    expect(lists[6].df + lists[7].df).toBe(0);
  });

  it('handles no wanted terms and documents with no terms', () => {
    expect(collectPostings(randomDocs(10, 5, 1), new Int32Array(0), 0)).toEqual([]);
    const empty: DocTerms = { termIds: new Int32Array(0), counts: new Float32Array(0), length: 0 };
    expect(collectPostings([empty, null, empty], Int32Array.from([0, 2]), 0).map((p) => p.df)).toEqual([0, 0]);
  });
});

describe('TermPostings', () => {
  it('keeps exactly the current holders of a term through removals and additions, merging a long side list', () => {
    const docs = randomDocs(3000, 4, 11);
    const t = 2;
    const p = collectPostings(docs, Int32Array.from([t]), 0)[0];
    const stamp = new Float64Array(docs.length);
    let edits = 0;
    /** Live entries: main entries not stamped since the build, then side entries. */
    const live = (): [number, number][] => {
      const main = pairsOf(p).filter(([j]) => stamp[j] <= p.builtAt);
      const side: [number, number][] = [];
      for (let i = 0; i < p.side.length; i += 2) side.push([p.side[i], p.side[i + 1]]);
      return [...main, ...side].sort((a, b) => a[0] - b[0]);
    };
    const set = (slot: number, d: DocTerms | null): void => {
      const was = stamp[slot];
      stamp[slot] = ++edits;
      const old = docs[slot];
      const at = old ? old.termIds.indexOf(t) : -1;
      if (at >= 0) p.remove(slot, was);
      const now = d ? d.termIds.indexOf(t) : -1;
      if (now >= 0) p.add(slot, d!.counts[now], stamp, edits);
      docs[slot] = d;
    };
    const replacements = randomDocs(3000, 4, 12);
    const mainBefore = p.docs;
    for (let i = 0; i < 2500; i++) set((i * 7) % 3000, i % 9 === 0 ? null : replacements[(i * 11) % 3000]);
    // The side list grew past 256 postings and a quarter of the main list, so it was merged.
    expect(p.docs).not.toBe(mainBefore);
    expect(p.builtAt).toBeGreaterThan(0);
    expect(live()).toEqual(bruteForce(docs, t));
    expect(p.df).toBe(bruteForce(docs, t).length);
  });
});

describe('PostingsBuild', () => {
  it('gives every term the list collectPostings makes (brute force checked), whether run at once or one step at a time', () => {
    const docs = randomDocs(700, 150, 21);
    const want = Int32Array.from({ length: 150 }, (_, t) => t);
    const lazy = collectPostings(docs, want, 4);
    const atOnce = new PostingsBuild(docs, 4).run(() => true)!;
    const build = new PostingsBuild(docs, 4);
    let steps = 1;
    let stepped = build.run(() => false);
    for (; stepped === null; steps++) stepped = build.run(() => false);
    expect(steps).toBeGreaterThan(10); // 700 documents take many single steps
    for (const block of [atOnce, stepped]) {
      expect(block.builtAt).toBe(4);
      expect(block.terms).toBeLessThanOrEqual(150);
      want.forEach((t, w) => {
        const p = t < block.terms ? block.postings(t) : null;
        expect(p ? pairsOf(p) : []).toEqual(bruteForce(docs, t));
        expect(p ? pairsOf(p) : []).toEqual(pairsOf(lazy[w]));
        expect(p?.df ?? 0).toBe(lazy[w].df);
        if (t < block.terms) expect(block.df(t)).toBe(lazy[w].df);
      });
    }
  });

  it('keeps counts that are not small whole numbers and slots far apart bit for bit', () => {
    // Counts a varint cannot hold (0, fractions, negative, 2^28 and beyond, f32 extremes) are kept
    // as raw f32 bytes; gaps of 1 to 4 varint bytes (slots up to 2^22 apart).
    const odd = [1, 127, 128, 16383, 16384, 2 ** 28 - 1, 2 ** 28, 0.5, 1.25e-7, 0, -3, 3.4e38, 7];
    const docs: (DocTerms | null)[] = new Array<DocTerms | null>(2 ** 22 + 3).fill(null);
    const at = [0, 1, 129, 16513, 2 ** 21 + 16513, 2 ** 22 + 2];
    at.forEach((slot, i) => {
      const termIds = Int32Array.from([0, 1 + i]);
      docs[slot] = { termIds, counts: Float32Array.from([odd[i], odd[odd.length - 1 - i]]), length: 2 };
    });
    const block = new PostingsBuild(docs, 0).run(() => true)!;
    expect(pairsOf(block.postings(0))).toEqual(at.map((slot, i) => [slot, Math.fround(odd[i])]));
    at.forEach((slot, i) => expect(pairsOf(block.postings(1 + i))).toEqual([[slot, Math.fround(odd[odd.length - 1 - i])]]));
    expect(Object.is(block.postings(1 + 3).tfs[0], Math.fround(odd[odd.length - 4]))).toBe(true);
  });

  it('holds real postings in under half the bytes of plain slot and count arrays (CRAN abstracts)', () => {
    // Real text: CRAN (test/fixtures/corpora/cran, 1400 aerodynamics abstracts), counted as a build counts.
    const vocab = new Vocabulary();
    const docs = loadCollection('cran').docs.map((d) => countTerms(tokenize(d.text), vocab, true));
    const block = new PostingsBuild(docs, 0).run(() => true)!;
    const postings = docs.reduce((n, d) => n + d.termIds.length, 0);
    const want = Int32Array.from({ length: block.terms }, (_, t) => t);
    const lazy = collectPostings(docs, want, 0);
    want.forEach((t) => expect(pairsOf(block.postings(t))).toEqual(pairsOf(lazy[t])));
    expect(block.byteLength).toBeLessThan((8 * postings + 4 * (block.terms + 1)) / 2);
  });

  it('copes with no documents, empty documents and holes only', () => {
    expect(new PostingsBuild([], 0).run(() => true)!.terms).toBe(0);
    const empty = { termIds: new Int32Array(0), counts: new Float32Array(0), length: 0 };
    const block = new PostingsBuild([null, empty, null], 2).run(() => true)!;
    expect(block.terms).toBe(0);
  });
});
