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

// An invented scenario: notes of a small bakery co-operative. Texts are generated from a word list.
const WORDS = (
  'oven dough crumb proof starter flour rye spelt loaf batch shift ledger crate delivery market stall ' +
  'ferment timer rack cool slice order invoice supplier route morning evening recipe salt water yeast ' +
  'levain knead fold shape score bake steam crust tray counter bench note plan week stock'
).split(' ');

function note(seed: number, lines = 12, perLine = 8): string {
  const rng = createRandom(seed);
  return Array.from({ length: lines }, () =>
    Array.from({ length: perLine }, () => WORDS[Math.floor(rng.next() * WORDS.length)]).join(' '),
  ).join('\n');
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
    expect(r.nearPairs).toEqual([]);
    expect(r.partialPairs).toEqual([]);
    expect(r.retoldPairs).toEqual([]);
    expect(r.stats).toMatchObject({ files: 0, shingled: 0, candidates: 0, verified: 0 });
  });

  it('handles a single file', () => {
    const r = findLookalikes({ files: [{ id: 'a.md', text: note(1) }] });
    expect(r.stats).toMatchObject({ files: 1, distinctTexts: 1, shingled: 1, candidates: 0 });
    expect(r.exactGroups.length + r.nearPairs.length + r.partialPairs.length + r.retoldPairs.length).toBe(0);
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
    expect(r.nearPairs).toEqual([]);
  });

  it('puts 3000 identical files in one exact group without any LSH candidate', () => {
    const text = note(7);
    const files = Array.from({ length: 3000 }, (_, i) => ({ id: `copies/${i}.md`, text }));
    const r = findLookalikes({ files });
    expect(r.exactGroups).toHaveLength(1);
    expect(r.exactGroups[0].files).toHaveLength(3000);
    expect(r.exactGroups[0].sharedLines).toBe(12);
    expect(r.stats).toMatchObject({ distinctTexts: 1, shingled: 1, candidates: 0, verified: 0 });
    expect(r.nearPairs).toEqual([]);
  });

  it('caps the giant LSH bucket of 1000 templated files and still returns verified pairs, never a chained group', () => {
    // Every file is the same 96-token note plus one line naming its own number: all pairs are
    // near-copies (J ≈ 0.9), so all 1000 land in one bucket per band (banding.ts cap strategy).
    const body = note(21);
    const files = Array.from({ length: 1000 }, (_, i) => ({ id: `stations/${i}.md`, text: `${body}\nstation ${i}` }));
    const r = findLookalikes({ files });
    expect(r.stats.cappedBuckets).toBeGreaterThan(0);
    // At most bands · m · CAPPED_NEIGHBOURS = 16 · 1000 · 10 = 160 000; all pairs would be m²/2 ≈ 5·10⁵.
    expect(r.stats.candidates).toBeLessThanOrEqual(16 * 1000 * 10);
    expect(r.nearPairs.length).toBeGreaterThan(1000);
    const inPairs = new Set(r.nearPairs.flatMap((p) => [p.a, p.b]));
    expect(inPairs.size).toBeGreaterThan(990);
    const [i, j] = [r.nearPairs[0].a, r.nearPairs[0].b].map((id) => Number(id.replace(/\D/g, '')));
    expect(r.nearPairs[0].similarity).toBeCloseTo(referenceJaccard(files[i].text, files[j].text), 12);
  });

  it('rejects duplicate ids and malformed files', () => {
    expect(() =>
      findLookalikes({
        files: [
          { id: 'x', text: 'a' },
          { id: 'x', text: 'b' },
        ],
      }),
    ).toThrow(/more than once/);
    expect(() => findLookalikes({ files: [{ id: 'x', text: 3 as unknown as string }] })).toThrow(InvalidInputError);
  });
});

describe('findLookalikes: bands', () => {
  const base = note(11);
  const lines = base.split('\n');
  const near = [...lines.slice(0, 11), 'a new closing line about the oven timer'].join('\n'); // one line replaced
  const files: LookalikeFile[] = [
    { id: 'notes/plan.md', text: base },
    { id: 'notes/plan-copy.md', text: base.replace(/\n/g, '\r\n') },
    { id: 'notes/plan-v2.md', text: near },
    { id: 'notes/other.md', text: note(12) },
  ];

  it('reports exact copies once and pairs the near-copy with one representative, with the exact Jaccard, shared lines and words', () => {
    const r = findLookalikes({ files });
    expect(r.exactGroups.map((g) => g.files)).toEqual([['notes/plan.md', 'notes/plan-copy.md']]);
    expect(r.exactGroups[0].words).toBe(96); // 12 lines × 8 words (by construction)
    expect(r.nearPairs).toHaveLength(1);
    const pair = r.nearPairs[0];
    expect(pair.band).toBe('near');
    expect([pair.a, pair.b]).toEqual(['notes/plan.md', 'notes/plan-v2.md']);
    expect(pair.similarity).toBeCloseTo(referenceJaccard(base, near), 12); // brute-force string shingles
    expect(pair.jaccard).toBe(pair.similarity);
    expect(pair.sharedLines).toBe(11); // 11 of 12 lines kept verbatim (by construction)
    expect(pair.lines).toEqual([12, 12]);
    expect(pair.words[0]).toBe(96);
    expect(pair.sharedWords).toBeGreaterThanOrEqual(88); // the 88 words of the 11 kept lines, plus any the new line repeats
  });

  it('puts a copy with about half its text kept in "Partial copies", not in near-copies', () => {
    const half = [...lines.slice(0, 7), ...note(14, 5).split('\n')].join('\n');
    const r = findLookalikes({
      files: [
        { id: 'a.md', text: base },
        { id: 'b.md', text: half },
        { id: 'c.md', text: note(15) },
      ],
    });
    const j = referenceJaccard(base, half);
    expect(j).toBeGreaterThanOrEqual(0.3);
    expect(j).toBeLessThan(0.8);
    expect(r.nearPairs).toEqual([]);
    expect(r.partialPairs.map((p) => [p.a, p.b, p.band])).toEqual([['a.md', 'b.md', 'partial']]);
    expect(r.partialPairs[0].jaccard).toBeCloseTo(j, 12);
    expect(r.partialPairs[0].sharedLines).toBe(7);
  });

  it('puts a copy with about 5 of its 12 lines kept (Jaccard 0.2–0.3) in "Partial copies": the band starts where "other words" ends', () => {
    const kept = [...lines.slice(0, 5), ...note(16, 7).split('\n')].join('\n');
    const r = findLookalikes({
      files: [
        { id: 'a.md', text: base },
        { id: 'b.md', text: kept },
        { id: 'c.md', text: note(15) },
      ],
    });
    const j = referenceJaccard(base, kept);
    expect(j).toBeGreaterThanOrEqual(0.2);
    expect(j).toBeLessThan(0.3);
    expect(r.partialPairs.map((p) => [p.a, p.b])).toEqual([['a.md', 'b.md']]);
    expect(r.partialPairs[0].jaccard).toBeCloseTo(j, 12);
    expect(r.partialPairs[0].sharedLines).toBe(5);
    expect(r.retoldPairs).toEqual([]);
  });

  it('ranks exact-copy groups by text length, so one-line stubs come last', () => {
    const stub = 'This file has moved.';
    const r = findLookalikes({
      files: [
        { id: 'old/a.md', text: stub },
        { id: 'old/b.md', text: stub },
        { id: 'old/c.md', text: stub },
        { id: 'x.md', text: base },
        { id: 'y.md', text: base },
      ],
    });
    expect(r.exactGroups.map((g) => g.files[0])).toEqual(['x.md', 'old/a.md']);
  });

  it('gives the same report for the same input and seed', () => {
    expect(findLookalikes({ files })).toEqual(findLookalikes({ files }));
  });

  it('honours a stricter threshold', () => {
    const j = referenceJaccard(base, near);
    expect(findLookalikes({ files }, { threshold: Math.min(1, j + 0.01) }).nearPairs).toEqual([]);
  });
});
