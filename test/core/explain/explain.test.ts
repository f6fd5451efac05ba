/**
 * "Why do these match?" References: the index's own scores, computed by separate code
 * (LsiIndex.search: blended score, cosine and BM25 parts; LsiIndex.nearby: cosines); an
 * independent dense computation of the concept shares with ml-matrix from the model's arrays
 * (share_t = w_t·(Σ^{α−1}U_kᵀ)_{:,t}·d̂ / ‖Σ^{α−1}U_kᵀw‖); real text and queries from CISI
 * (test/fixtures/corpora/cisi, first 400 abstracts, first 15 queries).
 */
import { Matrix } from 'ml-matrix';
import { beforeAll, describe, expect, it } from 'vitest';
import { NoKnownTermsError } from '../../../src/core/errors.js';
import { explainPair, QueryExplainer, topShares } from '../../../src/core/explain/explain.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { weightDocument } from '../../../src/core/weighting/termWeighting.js';
import { buildFixtureIndex, loadRankingFixture } from '../../helpers/rankingChecks.js';
import { loadCollection } from '../../helpers/shared.js';

const cisi = loadCollection('cisi');

describe('explanations on CISI', () => {
  let index: LsiIndex;
  const queries = () => cisi.queries.slice(0, 15).map((q) => q.text);

  beforeAll(() => {
    const b = new IndexBuilder();
    for (const d of cisi.docs.slice(0, 400)) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    index = b.build();
  });

  it('search shares add up to each result’s blended score, and their parts to its concept and word-match parts', () => {
    let checked = 0;
    for (const q of queries()) {
      // The query's own lexical share (settings.lexicalBlend on standardised scores, fusion.ts).
      const lambda = index.searchPlan(q).lambda;
      expect(lambda).toBeGreaterThan(0);
      expect(lambda).toBeLessThan(1);
      const explainer = new QueryExplainer(index, q);
      for (const hit of index.search(q, { top: 10 })) {
        const e = explainer.explain(hit.path);
        expect(e.score).toBeCloseTo(hit.score, 5);
        expect(e.terms.reduce((s, t) => s + t.share, 0) + e.feedback).toBeCloseTo(hit.score, 5);
        expect(e.terms.reduce((s, t) => s + t.concept, 0) + e.feedback).toBeCloseTo((1 - lambda) * hit.conceptScore, 5);
        expect(e.terms.reduce((s, t) => s + t.lexical, 0)).toBeCloseTo(lambda * hit.lexicalScore, 5);
        checked++;
      }
    }
    expect(checked).toBe(150);
  });

  it('concept-only shares add up to the cosine and equal a dense computation with ml-matrix', () => {
    const model = index.model;
    const k = model.k;
    for (const q of queries().slice(0, 5)) {
      const explainer = new QueryExplainer(index, q, false);
      const terms = index.queryTerms(q);
      const w = weightDocument(terms, model.columnOf, model.weights, model.scheme);
      const g = new Matrix(k, w.columns.length); // column t: Σ^{α−1}·u_t
      w.columns.forEach((col, t) => {
        for (let c = 0; c < k; c++) g.set(c, t, model.axisScale[c] * model.termVectors[col * k + c]);
      });
      const x = g.mmul(Matrix.columnVector(Array.from(w.values)));
      const norm = x.norm();
      const qv = index.projectText(q);
      for (const hit of index.search(q, { top: 3 })) {
        const d = Matrix.columnVector(Array.from(index.vectorOf(hit.path)));
        const gd = g.transpose().mmul(d);
        const e = explainer.explain(hit.path);
        let cos = 0;
        for (let c = 0; c < k; c++) cos += qv[c] * index.vectorOf(hit.path)[c];
        expect(e.score).toBeCloseTo(cos, 5);
        w.columns.forEach((col, t) => {
          const term = index.vocab.termOf(model.keptIds[col]);
          const share = e.terms.find((s) => s.term === term)?.share ?? 0;
          expect(share).toBeCloseTo((w.values[t] * gd.get(t, 0)) / norm, 9);
        });
      }
    }
  });

  it('file-to-file shares add up to the nearby score and its two parts; the cosine part does not depend on the order of the two files', () => {
    const mu = index.ranking.nearbyLexical;
    for (const path of index.paths().slice(0, 10)) {
      for (const hit of index.nearby(path, { top: 5 })) {
        const fused = explainPair(index, path, hit.path);
        expect(fused.score).toBeCloseTo(hit.score, 5);
        expect(fused.terms.reduce((s, t) => s + t.concept, 0)).toBeCloseTo((1 - mu) * hit.conceptScore, 5);
        expect(fused.terms.reduce((s, t) => s + t.lexical, 0)).toBeCloseTo(mu * hit.lexicalScore, 5);
        const ab = explainPair(index, path, hit.path, false);
        const ba = explainPair(index, hit.path, path, false);
        expect(ab.score).toBeCloseTo(hit.conceptScore, 5);
        expect(ba.score).toBeCloseTo(ab.score, 9);
        expect(ba.terms.map((t) => t.term)).toEqual(ab.terms.map((t) => t.term));
      }
    }
  });

  it('with the opt-in TF-IDF part of Nearby (in the word match, or taken from the concept part), shares still add up to the score and its parts', () => {
    const before = index.ranking;
    try {
      for (const form of [
        { nearbyTfidfShare: 0.1, nearbyTfidfTerms: 40, nearbyTfidfFromConcept: false },
        { nearbyTfidfShare: 0.25, nearbyTfidfTerms: 80, nearbyTfidfFromConcept: true },
      ]) {
        index.ranking = { ...before, ...form };
        for (const path of index.paths().slice(0, 6)) {
          const mu = index.nearbyPlan(path).lexicalShare;
          expect(mu).toBeCloseTo(form.nearbyTfidfFromConcept ? 0.5 + 0.5 * 0.25 : 0.5, 12);
          for (const hit of index.nearby(path, { top: 5 })) {
            const fused = explainPair(index, path, hit.path);
            expect(fused.score).toBeCloseTo(hit.score, 5);
            expect(fused.terms.reduce((s, t) => s + t.concept, 0)).toBeCloseTo((1 - mu) * hit.conceptScore, 5);
            expect(fused.terms.reduce((s, t) => s + t.lexical, 0)).toBeCloseTo(mu * hit.lexicalScore, 5);
          }
        }
      }
    } finally {
      index.ranking = before;
    }
  });

  it('sorts terms by the size of their share and sums the rest for display', () => {
    const q = queries()[0];
    const hit = index.search(q, { top: 1 })[0];
    const e = new QueryExplainer(index, q).explain(hit.path);
    for (let i = 1; i < e.terms.length; i++) expect(Math.abs(e.terms[i].share)).toBeLessThanOrEqual(Math.abs(e.terms[i - 1].share));
    const t = topShares(e, 3);
    expect(t.top.reduce((s, x) => s + x.share, 0) + t.rest + e.feedback).toBeCloseTo(e.score, 12);
  });
});

describe('explanations with the name field (rxjs 7.8.2: test/fixtures/rxjs-src, real paths, code and queries)', () => {
  it('search (the name field, by the share of the query a name covers) and Nearby shares add up to the score and its parts; the name parts count', () => {
    const rxjs = loadRankingFixture('rxjs-src');
    const index = buildFixtureIndex(rxjs);
    let moved = 0;
    for (const q of rxjs.queries.slice(0, 15).map((x) => x.text)) {
      const lambda = index.searchPlan(q).lambda;
      const explainer = new QueryExplainer(index, q);
      for (const hit of index.search(q, { top: 5 })) {
        const e = explainer.explain(hit.path);
        expect(e.terms.reduce((s, t) => s + t.share, 0) + e.feedback).toBeCloseTo(hit.score, 5);
        expect(e.terms.reduce((s, t) => s + t.lexical, 0)).toBeCloseTo(lambda * hit.lexicalScore, 5);
        if (hit.lexicalScore > 1) moved++;
      }
    }
    const mu = index.ranking.nearbyLexical;
    for (const path of index.paths().filter((_, i) => i % 25 === 0)) {
      for (const hit of index.nearby(path, { top: 5 })) {
        const fused = explainPair(index, path, hit.path);
        expect(fused.score).toBeCloseTo(hit.score, 5);
        expect(fused.terms.reduce((s, t) => s + t.lexical, 0)).toBeCloseTo(mu * hit.lexicalScore, 5);
        if (hit.lexicalScore > 1) moved++;
      }
    }
    // Word matches above 1 hold a name part (BM25/max is at most 1), so the sums above include it.
    expect(moved).toBeGreaterThan(10);
  });
});

describe('explanations on a small hand-made index', () => {
  const build = () => {
    const b = new IndexBuilder({ prune: { minDocs: 2, maxDocFraction: 1, maxTerms: 100000 } });
    b.addText(
      { path: 'tides.md', size: 1, mtimeMs: 0 },
      'Tide tables give the tidal window for the ferry berth. The tide sets the window.',
    );
    b.addText({ path: 'berth.md', size: 1, mtimeMs: 0 }, 'The ferry berth is dredged; at low tide the berth is shallow.');
    b.addText({ path: 'fares.md', size: 1, mtimeMs: 0 }, 'Ferry fares and refunds: refunds are paid when sailings are cancelled.');
    b.addText({ path: 'refunds.md', size: 1, mtimeMs: 0 }, 'Refunds for cancelled sailings and refunds of fares, with vouchers.');
    b.addText({ path: 'blank.md', size: 1, mtimeMs: 0 }, '');
    return b.build();
  };

  it('a query word that occurs only once in the folder (outside the model) counts by word match alone', () => {
    const index = build();
    // "vouchers" occurs in one file: pruned from the concept model (minDocs 2) but scored by BM25.
    const e = new QueryExplainer(index, 'vouchers refunds').explain('refunds.md');
    const voucher = e.terms.find((t) => t.term === 'voucher')!;
    expect(voucher.concept).toBe(0);
    expect(voucher.lexical).toBeGreaterThan(0);
    expect(voucher.inBoth).toBe(true);
    expect(e.terms.find((t) => t.term === 'refund')!.concept).not.toBe(0);
  });

  it('a query word absent from a file contributes through the concept space only', () => {
    const index = build();
    const e = new QueryExplainer(index, 'tide berth').explain('tides.md');
    const berth = e.terms.find((t) => t.term === 'berth')!;
    expect(berth.inBoth).toBe(true);
    const e2 = new QueryExplainer(index, 'refunds tide').explain('fares.md');
    const tide = e2.terms.find((t) => t.term === 'tide')!;
    expect(tide).toBeDefined();
    expect(tide.inBoth).toBe(false);
    expect(tide.lexical).toBe(0);
    expect(tide.concept).not.toBe(0);
  });

  it('a file without indexed words explains as score 0 with no terms', () => {
    const index = build();
    const e = explainPair(index, 'blank.md', 'tides.md');
    expect(e.score).toBe(0);
    expect(e.terms).toHaveLength(0);
  });

  it('unknown words are refused with a clear error', () => {
    expect(() => new QueryExplainer(build(), 'zzyzx qwv')).toThrow(NoKnownTermsError);
  });
});
