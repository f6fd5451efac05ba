/**
 * Query-word focus (src/core/index/search/termFocus.ts): the mean resultant length against exact
 * values of directional statistics, its chance level against sampling from a real collection's
 * concept vectors (CRAN, test/fixtures/corpora/cran), and the weights a search uses.
 */
import { describe, expect, it } from 'vitest';
import { focusOf, focusWeights, meanResultant } from '../../../../src/core/index/search/termFocus.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { createRandom } from '../../../../src/core/random.js';
import { loadCollection } from '../../../helpers/shared.js';

const visitAll =
  (slots: number[]) =>
  (visit: (slot: number) => void): void =>
    slots.forEach(visit);

describe('meanResultant', () => {
  it('is cos(θ/2) for two unit vectors θ apart, 1 for one vector or none, 0 for opposite vectors', () => {
    // Two unit vectors at angle θ: ‖a + b‖ = 2·cos(θ/2), so r = cos(θ/2) (Mardia & Jupp 2000, §2.3.1).
    for (const theta of [0.3, 1.1, 2.5]) {
      const rows = Float32Array.from([1, 0, 0, Math.cos(theta), Math.sin(theta), 0]);
      expect(meanResultant(rows, 3, visitAll([0, 1])).r).toBeCloseTo(Math.cos(theta / 2), 6);
    }
    const rows = Float32Array.from([0, 1, 0, 0, -1, 0]);
    expect(meanResultant(rows, 3, visitAll([0, 1]))).toEqual({ r: 0, m: 2 });
    expect(meanResultant(rows, 3, visitAll([1]))).toEqual({ r: 1, m: 1 });
    expect(meanResultant(rows, 3, visitAll([]))).toEqual({ r: 1, m: 0 });
  });
  it('sums the rows one at a time in the visiting order (the same bits, however many rows are taken a step)', () => {
    const k = 37;
    const random = createRandom(11);
    const rows = Float32Array.from({ length: 50 * k }, () => random.normal());
    for (const m of [1, 7, 8, 9, 23, 50]) {
      const picks = Array.from({ length: m }, () => Math.floor(random.next() * 50));
      const acc = new Float64Array(k);
      for (const j of picks) for (let c = 0; c < k; c++) acc[c] += rows[j * k + c];
      const r = Math.min(1, Math.sqrt(acc.reduce((s, x) => s + x * x, 0)) / m);
      expect(Object.is(meanResultant(rows, k, visitAll(picks)).r, r)).toBe(true);
    }
  });
});

describe('focusOf', () => {
  it("divides r by its chance level: m files drawn at random from CRAN's concept vectors score about 1", () => {
    const cran = loadCollection('cran');
    const b = new IndexBuilder({});
    cran.docs.forEach((d) => b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text));
    const index = b.build();
    const rows = index.vectors();
    const n = index.slots().length;
    const k = index.k;
    const mean = new Float64Array(k);
    for (let j = 0; j < n; j++) for (let c = 0; c < k; c++) mean[c] += rows[j * k + c] / n;
    const mu2 = mean.reduce((s, x) => s + x * x, 0);
    const random = createRandom(7);
    for (const m of [3, 20, 200]) {
      // E‖Σv‖² = m + m(m − 1)‖μ‖² for m independent draws: the sampled mean of r² matches (1/m + (1 − 1/m)‖μ‖²).
      let r2 = 0;
      const trials = 400;
      for (let t = 0; t < trials; t++) {
        const picks = Array.from({ length: m }, () => Math.floor(random.next() * n));
        r2 += meanResultant(rows, k, visitAll(picks)).r ** 2;
      }
      expect(r2 / trials / (1 / m + (1 - 1 / m) * mu2)).toBeGreaterThan(0.9);
      expect(r2 / trials / (1 / m + (1 - 1 / m) * mu2)).toBeLessThan(1.1);
    }
    // A word held by files that share a topic is focused beyond chance: the files nearest one file.
    const near = index.nearby(index.paths()[0], { top: 10 }).map((h) => index.paths().indexOf(h.path));
    expect(focusOf(meanResultant(rows, k, visitAll(near)), mu2)).toBeGreaterThan(1.5);
  });

  it('is 1 for a word no file holds', () => {
    expect(focusOf({ r: 1, m: 0 }, 0.3)).toBe(1);
  });
});

describe('focusWeights', () => {
  it("weighs each word by its focus relative to the query's most focused word, to the power p", () => {
    expect(focusWeights([2, 1, 0.5])).toEqual([1, 0.5, 0.25]);
    expect(focusWeights([2, 1], { power: 2 })).toEqual([1, 0.25]);
    expect(focusWeights([2, 1], { power: 0 })).toEqual([1, 1]);
    expect(focusWeights([3])).toEqual([1]);
  });
});
