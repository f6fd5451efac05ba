/**
 * Shared concepts of two files. References: the index's own nearby scores (LsiIndex.nearby, separate
 * code) for the exact sum, and real text (CISI, test/fixtures/corpora/cisi, first 400 abstracts): a
 * concept's naming words must be index terms of one of the two files and load on that concept axis
 * on the files' side (checked against the model's U_k directly).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { sharedConcepts } from '../../../src/core/explain/sharedConcepts.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { loadCollection } from '../../helpers/shared.js';

describe('concepts two files share, on CISI', () => {
  let index: LsiIndex;
  beforeAll(() => {
    const b = new IndexBuilder();
    for (const d of loadCollection('cisi').docs.slice(0, 400)) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    index = b.build();
  });

  it('splits each nearby score exactly into the listed concepts, the rest and the word-match part', () => {
    let checked = 0;
    for (const a of index.paths().slice(0, 20)) {
      for (const hit of index.nearby(a, { top: 5 })) {
        const s = sharedConcepts(index, a, hit.path);
        expect(s.score).toBeCloseTo(hit.score, 5);
        expect(s.concepts.reduce((x, c) => x + c.share, 0) + s.rest + s.wordMatch).toBeCloseTo(hit.score, 9);
        // The blend's parts, from the hit's own concept and word-match scores (LsiIndex.nearby).
        const mu = index.ranking.nearbyLexical;
        expect(s.wordMatch).toBeCloseTo(mu * hit.lexicalScore, 9);
        expect(s.score - s.wordMatch).toBeCloseTo((1 - mu) * hit.conceptScore, 9);
        expect(s.concepts.length).toBeGreaterThan(0);
        for (let i = 1; i < s.concepts.length; i++) expect(s.concepts[i - 1].share).toBeGreaterThanOrEqual(s.concepts[i].share);
        checked++;
      }
    }
    expect(checked).toBe(100);
  });

  it('names a concept by terms of the two files that load on its axis on their side', () => {
    const a = index.paths()[0];
    const b = index.nearby(a, { top: 1 })[0].path;
    const s = sharedConcepts(index, a, b, { words: 3 });
    const k = index.k;
    const terms = new Set([...index.termsOf(a).termIds, ...index.termsOf(b).termIds].map((id) => index.vocab.termOf(id)));
    const column = new Map(Array.from(index.model.keptIds, (id, c) => [index.vocab.termOf(id), c]));
    const va = index.vectorOf(a);
    expect(new Set(s.concepts.flatMap((c) => c.terms)).size).toBe(s.concepts.length * 3); // no word names two concepts
    for (const c of s.concepts) {
      expect(c.terms.length).toBe(3);
      for (const t of c.terms) {
        expect(terms.has(t)).toBe(true);
        expect(Math.sign(va[c.axis]) * index.model.termVectors[column.get(t)! * k + c.axis]).toBeGreaterThan(0);
      }
    }
  });
});
