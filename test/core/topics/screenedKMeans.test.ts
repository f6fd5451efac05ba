/**
 * Screened k-means restarts. References: the objective Σ_c ‖Σ_{i∈c} x_i‖ that Dhillon & Modha 2001
 * maximise, recomputed from scratch; the fixed-point condition of Lloyd's iteration (each point at
 * the centre with the largest cosine), which the finalists' full runs must meet; exhaustive search
 * over every 2-way partition of a small set; planted, well-separated clusters (adjusted Rand
 * index 1 expected).
 */
import { describe, expect, it } from 'vitest';
import { screenedKMeans } from '../../../src/core/topics/screenedKMeans.js';
import { adjustedRandIndex, bestTwoClusterObjective, objectiveOf, plantedClusters, unitPoints } from './fixtures.js';

describe('screened k-means restarts', () => {
  it('reports its objective as recomputed and ends at a fixed point of Lloyd’s step on all the points', () => {
    const n = 900;
    const dims = 8;
    const p = unitPoints(n, dims, 21);
    const got = screenedKMeans(p, n, dims, 6, { seed: 5, sample: 200 });
    expect(got.objective).toBeCloseTo(objectiveOf(p, dims, got.assignment, got.clusters), 6);
    for (let i = 0; i < n; i++) {
      const cos = (c: number) => {
        let s = 0;
        for (let d = 0; d < dims; d++) s += p[i * dims + d] * got.centres[c * dims + d];
        return s;
      };
      for (let c = 0; c < got.clusters; c++) expect(cos(got.assignment[i])).toBeGreaterThanOrEqual(cos(c) - 1e-12);
    }
  });

  it('with refinement, no worse than the best of its own finalists unrefined', () => {
    const n = 900;
    const dims = 8;
    const p = unitPoints(n, dims, 22);
    const plain = screenedKMeans(p, n, dims, 6, { seed: 7, sample: 200 });
    const refined = screenedKMeans(p, n, dims, 6, { seed: 7, sample: 200, refineSweeps: 10 });
    expect(refined.objective).toBeGreaterThanOrEqual(plain.objective - 1e-9);
  });

  for (const seed of [1, 2, 3]) {
    it(`with the whole set as its sample, comes within 5% of the exhaustive-search optimum cost for 2 clusters of 12 random unit vectors (instance ${seed})`, () => {
      const n = 12;
      const dims = 3;
      const p = unitPoints(n, dims, seed);
      const best = bestTwoClusterObjective(p, n, dims);
      const got = screenedKMeans(p, n, dims, 2, { seed });
      expect(got.objective).toBeLessThanOrEqual(best + 1e-9);
      expect(2 * (n - got.objective)).toBeLessThanOrEqual(1.05 * 2 * (n - best));
    });
  }

  it('recovers planted, well-separated clusters exactly from a sample of a quarter of the points', () => {
    const { points, labels, dims } = plantedClusters(5, 80, 20, 0.15, 13);
    const got = screenedKMeans(points, labels.length, dims, 5, { seed: 3, sample: 100 });
    expect(adjustedRandIndex(labels, Array.from(got.assignment))).toBeCloseTo(1, 12);
  });

  it('gives the same answer for the same seed', () => {
    const p = unitPoints(400, 6, 4);
    const a = screenedKMeans(p, 400, 6, 5, { seed: 8, sample: 100 });
    const b = screenedKMeans(p, 400, 6, 5, { seed: 8, sample: 100 });
    expect(Array.from(b.assignment)).toEqual(Array.from(a.assignment));
    expect(b.centres).toEqual(a.centres);
  });

  it('refuses a non-positive cluster count', () => {
    expect(() => screenedKMeans(unitPoints(3, 2, 1), 3, 2, 0)).toThrow(/positive whole number/);
  });
});
