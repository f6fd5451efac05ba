/**
 * Leverage scores and leverage sampling. References: the definition π_j = (1/k)Σ(v_j^ξ)² with V_k
 * from an exact dense SVD (ml-matrix, a general-purpose library); unbiasedness E[CCᵀ] = AAᵀ of
 * scaled column sampling (Drineas, Kannan & Mahoney 2006, SICOMP 36(1), Lemma on matrix
 * multiplication [M: from memory], checked here by brute-force averaging over seeds).
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import {
  columnSelect,
  leverageScores,
  padWithLeverage,
  sampleSize,
  sampleWithReplacement,
  type Picks,
} from '../../../src/core/topics/leverage.js';

function randomMatrix(rows: number, cols: number, seed: number): number[][] {
  const r = createRandom(seed);
  // Columns of very different sizes, so the leverage is far from uniform.
  return Array.from({ length: rows }, () => Array.from({ length: cols }, (_, j) => r.normal() * (1 + (j % 5) * (j % 3))));
}

/** Σ over chosen columns of (scale·a_j)(scale·a_j)ᵀ. */
function cct(a: number[][], picks: Picks): Float64Array {
  const m = a.length;
  const out = new Float64Array(m * m);
  picks.indices.forEach((j, s) => {
    const sc = picks.scales[s] ** 2;
    for (let p = 0; p < m; p++) for (let q = 0; q < m; q++) out[p * m + q] += sc * a[p][j] * a[q][j];
  });
  return out;
}

describe('leverage scores', () => {
  it('match the definition from an exact SVD and sum to 1', () => {
    const a = randomMatrix(6, 20, 3);
    // V of A is U of Aᵀ (ml-matrix wants tall input).
    const v = new SingularValueDecomposition(new Matrix(a).transpose()).leftSingularVectors; // 20 × 6
    const k = 3;
    const flat = new Float64Array(20 * 6);
    for (let j = 0; j < 20; j++) for (let c = 0; c < 6; c++) flat[j * 6 + c] = v.get(j, c);
    const pi = leverageScores(flat, 20, 6, k);
    let sum = 0;
    for (let j = 0; j < 20; j++) {
      let expected = 0;
      for (let c = 0; c < k; c++) expected += v.get(j, c) ** 2 / k;
      expect(pi[j]).toBeCloseTo(expected, 12);
      sum += pi[j];
    }
    expect(sum).toBeCloseTo(1, 10);
  });

  it('use the published sample size c = k·ln k/ε², with ln k floored at 1 so k = 1 still selects', () => {
    // Orange3 cur.py uses c = k·ln k/ε² (Orange/projection/cur.py, from its source); k = 10, ε = 1 → ⌈23.03⌉ = 24.
    expect(sampleSize(10, 1)).toBe(24);
    expect(sampleSize(10, 0.5)).toBe(93);
    expect(sampleSize(1, 1)).toBe(1);
    expect(() => sampleSize(5, 0)).toThrow(/epsilon/);
  });
});

describe('leverage sampling', () => {
  const a = randomMatrix(4, 12, 11);
  const v = new SingularValueDecomposition(new Matrix(a).transpose()).leftSingularVectors; // 12 × 4
  const flat = new Float64Array(12 * 4);
  for (let j = 0; j < 12; j++) for (let c = 0; c < 4; c++) flat[j * 4 + c] = v.get(j, c);
  const pi = leverageScores(flat, 12, 4, 2);
  const aat = new Float64Array(16);
  for (let p = 0; p < 4; p++) for (let q = 0; q < 4; q++) for (let j = 0; j < 12; j++) aat[p * 4 + q] += a[p][j] * a[q][j];

  for (const [name, sample] of [
    ['ColumnSelect', columnSelect],
    ['with replacement', sampleWithReplacement],
  ] as const) {
    it(`${name} is unbiased: the mean of CCᵀ over 4000 seeds is AAᵀ within 4%`, () => {
      const mean = new Float64Array(16);
      const runs = 4000;
      for (let s = 0; s < runs; s++) {
        const c = cct(a, sample(pi, 4, createRandom(1000 + s)));
        for (let t = 0; t < 16; t++) mean[t] += c[t] / runs;
      }
      let err = 0;
      let norm = 0;
      for (let t = 0; t < 16; t++) {
        err += (mean[t] - aat[t]) ** 2;
        norm += aat[t] ** 2;
      }
      expect(Math.sqrt(err / norm)).toBeLessThan(0.04);
    });
  }

  it('with replacement merges repeated picks and scales them by √(count/(c·p))', () => {
    const picks = sampleWithReplacement(pi, 30, createRandom(5));
    let draws = 0;
    picks.indices.forEach((j, s) => {
      draws += picks.counts[s];
      expect(picks.scales[s]).toBeCloseTo(Math.sqrt(picks.counts[s] / (30 * pi[j])), 12);
    });
    expect(draws).toBe(30);
    expect(new Set(picks.indices).size).toBe(picks.indices.length);
    expect(picks.counts.some((t) => t > 1)).toBe(true); // 30 draws from 12 columns must repeat
  });

  it('ColumnSelect keeps about Σ min(1, c·π) columns on average', () => {
    const c = 5;
    let expected = 0;
    for (const p of pi) expected += Math.min(1, c * p);
    let total = 0;
    for (let s = 0; s < 2000; s++) total += columnSelect(pi, c, createRandom(s)).indices.length;
    expect(Math.abs(total / 2000 - expected)).toBeLessThan(0.1);
  });

  it('padding keeps the deterministic picks and adds the highest leverage next', () => {
    const order = Array.from(pi.keys()).sort((x, y) => pi[y] - pi[x]);
    const chosen = [order[11]]; // the lowest-leverage column
    const padded = padWithLeverage(chosen, pi, 3);
    expect([...padded.indices]).toEqual([order[11], order[0], order[1]].sort((x, y) => x - y));
  });
});
