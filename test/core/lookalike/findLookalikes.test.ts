/**
 * findLookalikes end to end on small invented texts. Expected values are worked out by
 * construction (how many lines were kept, which files are copies), Jaccard values are checked
 * against the brute-force string-shingle reference in corpusFixtures.ts, and the awkward-input
 * expectations follow the documented contract in findLookalikes.ts / types.ts.
 */
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../../src/core/errors.js';
import { findLookalikes } from '../../../src/core/lookalike/findLookalikes.js';
import type { LookalikeFile } from '../../../src/core/lookalike/types.js';
import { createRandom } from '../../../src/core/random.js';
import { referenceShingles } from './corpusFixtures.js';
import { atCosine, randomUnit } from './vectorFixtures.js';

// An invented scenario: notes of a small bakery co-operative. Texts are generated from a word list.
const WORDS = (
  'oven dough crumb proof starter flour rye spelt loaf batch shift ledger crate delivery market stall ' +
  'ferment timer rack cool slice order invoice supplier route morning evening recipe salt water yeast ' +
  'levain knead fold shape score bake steam crust tray counter bench note plan week stock'
).split(' ');

function note(seed: number, lines = 12, perLine = 8): string {
  const rng = createRandom(seed);
  return Array.from({ length: lines }, () => Array.from({ length: perLine }, () => WORDS[Math.floor(rng.next() * WORDS.length)]).join(' ')).join('\n');
}

/** Reference Jaccard of token 5-gram string sets (independent of the finder's hashing). */
function referenceJaccard(a: string, b: string): number {
  const sa = referenceShingles(a, 5);
  const sb = referenceShingles(b, 5);
  const common = [...sa].filter((x) => sb.has(x)).length;
  return common / (sa.size + sb.size - common);
}

describe('findLookalikes: awkward input', () => {
  it('returns an empty report for no files', () => {
    const r = findLookalikes({ files: [] });
    expect(r.exactGroups).toEqual([]);
    expect(r.nearGroups).toEqual([]);
    expect(r.paraphraseGroups).toEqual([]);
    expect(r.stats).toMatchObject({ files: 0, shingled: 0, candidates: 0, verified: 0, paraphraseMode: 'none' });
  });

  it('handles a single file', () => {
    const r = findLookalikes({ files: [{ id: 'a.md', text: note(1) }] });
    expect(r.stats).toMatchObject({ files: 1, distinctTexts: 1, shingled: 1, candidates: 0 });
    expect(r.exactGroups.length + r.nearGroups.length).toBe(0);
  });

  it('counts blank files instead of grouping them', () => {
    const files = Array.from({ length: 50 }, (_, i) => ({ id: `empty${i}.ts`, text: ['', '\n', '  \r\n\t'][i % 3] }));
    const r = findLookalikes({ files });
    expect(r.stats.emptyFiles).toBe(50);
    expect(r.exactGroups).toEqual([]);
    expect(r.stats.distinctTexts).toBe(0);
  });

  it('skips texts shorter than a shingle from near-copy search but still groups their exact copies', () => {
    const files = [
      { id: 'a.ts', text: 'export {};' },
      { id: 'b.ts', text: 'export {};\n' },
      { id: 'c.ts', text: 'return one two' },
      { id: 'd.ts', text: 'return one two three' },
    ];
    const r = findLookalikes({ files });
    expect(r.exactGroups.map((g) => g.files)).toEqual([['a.ts', 'b.ts']]);
    expect(r.stats.skippedShort).toBe(3); // three distinct texts, all under 5 tokens
    expect(r.stats.shingled).toBe(0);
    expect(r.nearGroups).toEqual([]);
  });

  it('puts 3000 identical files in one exact group without any LSH candidate', () => {
    const text = note(7);
    const files = Array.from({ length: 3000 }, (_, i) => ({ id: `copies/${i}.md`, text }));
    const r = findLookalikes({ files });
    expect(r.exactGroups).toHaveLength(1);
    expect(r.exactGroups[0].files).toHaveLength(3000);
    expect(r.exactGroups[0].sharedLines).toBe(12);
    expect(r.stats).toMatchObject({ distinctTexts: 1, shingled: 1, candidates: 0, verified: 0 });
    expect(r.nearGroups).toEqual([]);
  });

  it('caps the giant LSH bucket of 1000 templated files and still returns them as one group', () => {
    // Every file is the same 96-token note plus one line naming its own number: all pairs are
    // near-copies (J ≈ 0.9), so all 1000 land in one bucket per band (banding.ts cap strategy).
    const body = note(21);
    const files = Array.from({ length: 1000 }, (_, i) => ({ id: `stations/${i}.md`, text: `${body}\nstation ${i}` }));
    const r = findLookalikes({ files });
    expect(r.stats.cappedBuckets).toBeGreaterThan(0);
    // At most bands · m · CAPPED_NEIGHBOURS = 16 · 1000 · 10 = 160 000; all pairs would be m²/2 ≈ 5·10⁵.
    expect(r.stats.candidates).toBeLessThanOrEqual(16 * 1000 * 10);
    expect(r.nearGroups).toHaveLength(1);
    expect(r.nearGroups[0].files).toHaveLength(1000);
    const [i, j] = [r.nearGroups[0].pairs[0].a, r.nearGroups[0].pairs[0].b].map((id) => Number(id.replace(/\D/g, '')));
    expect(r.nearGroups[0].pairs[0].similarity).toBeCloseTo(referenceJaccard(files[i].text, files[j].text), 12);
  });

  it('rejects duplicate ids, malformed files and misaligned concept vectors', () => {
    expect(() => findLookalikes({ files: [{ id: 'x', text: 'a' }, { id: 'x', text: 'b' }] })).toThrow(/more than once/);
    expect(() => findLookalikes({ files: [{ id: 'x', text: 3 as unknown as string }] })).toThrow(InvalidInputError);
    expect(() => findLookalikes({ files: [{ id: 'x', text: 'a' }], concepts: { vectors: new Float32Array(3), dims: 2 } })).toThrow(/1×2/);
  });
});

describe('findLookalikes: groups', () => {
  const base = note(11);
  const lines = base.split('\n');
  const near = [...lines.slice(0, 11), 'a new closing line about the oven timer'].join('\n'); // one line replaced
  const files: LookalikeFile[] = [
    { id: 'notes/plan.md', text: base },
    { id: 'notes/plan-copy.md', text: base.replace(/\n/g, '\r\n') },
    { id: 'notes/plan-v2.md', text: near },
    { id: 'notes/other.md', text: note(12) },
  ];

  it('reports exact copies once and links the near-copy to them, with the exact Jaccard and shared lines', () => {
    const r = findLookalikes({ files });
    expect(r.exactGroups.map((g) => g.files)).toEqual([['notes/plan.md', 'notes/plan-copy.md']]);
    expect(r.nearGroups).toHaveLength(1);
    const g = r.nearGroups[0];
    expect(g.files).toEqual(['notes/plan.md', 'notes/plan-copy.md', 'notes/plan-v2.md']);
    expect(g.pairs).toHaveLength(1);
    const pair = g.pairs[0];
    expect([pair.a, pair.b]).toEqual(['notes/plan.md', 'notes/plan-v2.md']);
    expect(pair.similarity).toBeCloseTo(referenceJaccard(base, near), 12); // brute-force string shingles
    expect(pair.jaccard).toBe(pair.similarity);
    expect(pair.sharedLines).toBe(11); // 11 of 12 lines kept verbatim (by construction)
  });

  it('gives the same report for the same input and seed', () => {
    expect(findLookalikes({ files })).toEqual(findLookalikes({ files }));
  });

  it('lists "same content, different words" from concept vectors, apart from near-copies', () => {
    const rng = createRandom(3);
    const dims = 16;
    const u = randomUnit(dims, rng);
    const rows = [u, u, atCosine(u, 0.99, rng), atCosine(u, 0.97, rng)];
    const extra = { id: 'notes/plan-reworded.md', text: note(13) };
    const all = [...files.slice(0, 3), extra, files[3]];
    const vectors = new Float32Array(all.length * dims);
    [...rows, randomUnit(dims, rng)].forEach((v, i) => vectors.set(v, i * dims));
    const r = findLookalikes({ files: all, concepts: { vectors, dims } });
    expect(r.stats.paraphraseMode).toBe('all-pairs');
    // plan ↔ plan-v2 is a near-copy, so only the reworded file joins as a paraphrase.
    expect(r.paraphraseGroups).toHaveLength(1);
    const g = r.paraphraseGroups[0];
    expect(g.files).toEqual(['notes/plan.md', 'notes/plan-copy.md', 'notes/plan-v2.md', 'notes/plan-reworded.md']);
    for (const p of g.pairs) {
      expect(p.b).toBe('notes/plan-reworded.md');
      expect(p.similarity).toBeGreaterThanOrEqual(0.95);
      expect(p.jaccard).toBeLessThan(0.8);
    }
    const simhash = findLookalikes({ files: all, concepts: { vectors, dims } }, { paraphraseAllPairsLimit: 0 });
    expect(simhash.stats.paraphraseMode).toBe('simhash');
    expect(simhash.paraphraseGroups.map((x) => x.files)).toEqual(r.paraphraseGroups.map((x) => x.files));
  });

  it('honours a stricter threshold', () => {
    const j = referenceJaccard(base, near);
    expect(findLookalikes({ files }, { threshold: Math.min(1, j + 0.01) }).nearGroups).toEqual([]);
  });
});
