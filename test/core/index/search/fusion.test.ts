/**
 * fusion.ts helpers against hand computations (small invented term lists; values worked out by
 * hand from the formulas in the file's header) and the Rocchio formula (Rocchio 1971).
 */
import { describe, expect, it } from 'vitest';
import {
  distinctiveTerms,
  mergeTerms,
  QUESTION_FILLER,
  rocchio,
  spreadOf,
  spreadShare,
  stripPointing,
} from '../../../../src/core/index/search/fusion.js';
import { STOP_WORDS } from '../../../../src/core/text/stopWords.js';

const doc = { termIds: Int32Array.from([1, 4, 7, 9]), counts: Float32Array.from([3, 1, 1, 5]), length: 10 };

describe('fusion helpers', () => {
  it('distinctiveTerms keeps the highest log(1 + tf)·idf with their counts, in id order', () => {
    const idf = (t: number) => ({ 1: 0.5, 4: 3, 7: 1, 9: 0.2 })[t]!;
    // scores: 1 → ln4·0.5 = 0.693, 4 → ln2·3 = 2.079, 7 → ln2 = 0.693, 9 → ln6·0.2 = 0.358; tie 1/7 → lower id.
    const top = distinctiveTerms(doc, 2, idf);
    expect(Array.from(top.termIds)).toEqual([1, 4]);
    expect(Array.from(top.counts)).toEqual([3, 1]);
    expect(top.length).toBe(4);
    expect(distinctiveTerms(doc, 10, idf).termIds).toEqual(doc.termIds);
  });

  it('mergeTerms adds counts of shared ids and keeps ascending order', () => {
    const m = mergeTerms(doc, { termIds: Int32Array.from([2, 7]), counts: Float32Array.from([0.5, 0.25]), length: 1 });
    expect(Array.from(m.termIds)).toEqual([1, 2, 4, 7, 9]);
    expect(Array.from(m.counts)).toEqual([3, 0.5, 1, 1.25, 5]);
  });

  it('rocchio moves a unit query towards liked and away from unliked means, and reports the query’s factor', () => {
    const q = Float32Array.from([1, 0]);
    const r = rocchio(q, [
      { weight: 1, vectors: [Float32Array.from([0, 1])] },
      { weight: -0.5, vectors: [Float32Array.from([1, 0]), Float32Array.from([1, 0])] },
    ])!;
    // q + (0, 1) − 0.5·(1, 0) = (0.5, 1), norm √1.25.
    expect(r.vector[0]).toBeCloseTo(0.5 / Math.sqrt(1.25), 6);
    expect(r.vector[1]).toBeCloseTo(1 / Math.sqrt(1.25), 6);
    expect(r.scale).toBeCloseTo(1 / Math.sqrt(1.25), 12);
    expect(rocchio(q, [{ weight: -1, vectors: [q] }])).toBeNull();
  });

  it('question filler words are not stop words already, and pointing nouns before relative words go', () => {
    expect(QUESTION_FILLER).toContain('happens');
    expect(QUESTION_FILLER.some((w) => STOP_WORDS.has(w))).toBe(false);
    expect(stripPointing('where is the code that sends refunds')).toBe('where is the that sends refunds');
    expect(stripPointing('code review of the file format')).toBe('code review of the file format');
  });

  it('spreadShare: the raw-score blend it gives is the z-score blend up to a positive factor and a constant (Montague & Aslam 2001)', () => {
    // Seeded values (a linear congruential generator, common practice), skewed lexical scores.
    let x = 12345;
    const next = (): number => (x = (x * 1103515245 + 12345) % 2147483648) / 2147483648;
    const c = Float64Array.from({ length: 200 }, () => 0.2 + 0.5 * next());
    const l = Float64Array.from({ length: 200 }, () => next() ** 4);
    const all = (): boolean => true;
    const mean = (a: Float64Array): number => a.reduce((s, v) => s + v, 0) / a.length;
    const sd = (a: Float64Array): number => Math.sqrt(mean(Float64Array.from(a, (v) => (v - mean(a)) ** 2)));
    expect(spreadOf(c, all)).toBeCloseTo(sd(c), 12);
    const lambda = 0.6;
    const lq = spreadShare(lambda, sd(c), sd(l));
    const z = Float64Array.from(c, (_, j) => (1 - lambda) * ((c[j] - mean(c)) / sd(c)) + lambda * ((l[j] - mean(l)) / sd(l)));
    const raw = Float64Array.from(c, (_, j) => (1 - lq) * c[j] + lq * l[j]);
    // raw = f·z + const with f > 0: the same for every pair of files.
    const f = (raw[1] - raw[0]) / (z[1] - z[0]);
    expect(f).toBeGreaterThan(0);
    for (let j = 2; j < 200; j++) expect(raw[j] - raw[0]).toBeCloseTo(f * (z[j] - z[0]), 12);
    // The skewed lexical scores spread less here, so they get more than λ of the raw blend.
    expect(sd(l) < sd(c)).toBe(lq > lambda);
    // Degenerate spreads leave λ as it is; only live slots count.
    expect(spreadShare(lambda, 0, sd(l))).toBe(lambda);
    expect(spreadOf(Float64Array.from([1, 3, 100]), (j) => j < 2)).toBeCloseTo(1, 12);
  });
});
