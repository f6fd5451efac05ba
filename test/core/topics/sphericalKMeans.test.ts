/**
 * Spherical k-means. References: exhaustive search over every 2-way partition of small point sets
 * (the objective Σ_c ‖Σ_{i∈c} x_i‖ is what Dhillon & Modha 2001 maximise, since the best centre of
 * a cluster is its normalised sum; the k-means cost on the sphere is Σ‖x − μ‖² = 2(n − objective));
 * the fixed-point conditions of Lloyd's iteration; planted, well-separated clusters (adjusted Rand
 * index 1 expected). k-means++ only promises cost ≤ 8(ln k + 2)·optimum in expectation (Arthur &
 * Vassilvitskii 2007); on structureless random points we ask for ≤ 1.05·optimum (our choice). The
 * Euclidean objective: exhaustive search over 2-way partitions of Σ‖x − mean‖², and the fixed point
 * of Lloyd's iteration (Lloyd 1982).
 */
import { describe, expect, it } from 'vitest';
import { sphericalKMeans } from '../../../src/core/topics/sphericalKMeans.js';
import { adjustedRandIndex, bestTwoClusterObjective, objectiveOf, plantedClusters, unitPoints } from './fixtures.js';

describe('spherical k-means', () => {
  for (const seed of [1, 2, 3, 4, 5]) {
    it(`comes within 5% of the exhaustive-search optimum cost for 2 clusters of 10 random unit vectors (instance ${seed})`, () => {
      const n = 10;
      const dims = 3;
      const p = unitPoints(n, dims, seed);
      const best = bestTwoClusterObjective(p, n, dims);
      const got = sphericalKMeans(p, n, dims, 2, { seed });
      expect(got.objective).toBeCloseTo(objectiveOf(p, dims, got.assignment, got.clusters), 9);
      expect(got.objective).toBeLessThanOrEqual(best + 1e-9);
      expect(2 * (n - got.objective)).toBeLessThanOrEqual(1.05 * 2 * (n - best));
    });
  }

  it('ends at a fixed point: each point at its nearest centre, each centre its normalised member sum', () => {
    const dims = 8;
    const p = unitPoints(200, dims, 9);
    const got = sphericalKMeans(p, 200, dims, 5, { seed: 3 });
    const k = got.clusters;
    for (let i = 0; i < 200; i++) {
      const cos = (c: number) => {
        let s = 0;
        for (let d = 0; d < dims; d++) s += p[i * dims + d] * got.centres[c * dims + d];
        return s;
      };
      for (let c = 0; c < k; c++) expect(cos(got.assignment[i])).toBeGreaterThanOrEqual(cos(c) - 1e-12);
    }
    for (let c = 0; c < k; c++) {
      const sum = new Float64Array(dims);
      for (let i = 0; i < 200; i++) if (got.assignment[i] === c) for (let d = 0; d < dims; d++) sum[d] += p[i * dims + d];
      const norm = Math.hypot(...sum);
      for (let d = 0; d < dims; d++) expect(got.centres[c * dims + d]).toBeCloseTo(sum[d] / norm, 9);
    }
  });

  it('reaches the exhaustive-search optimum when the points have two real groups', () => {
    const { points, labels, dims } = plantedClusters(2, 6, 3, 0.3, 5);
    let best = 0;
    for (let mask = 0; mask < 1 << 11; mask++)
      best = Math.max(
        best,
        objectiveOf(
          points,
          dims,
          Array.from({ length: 12 }, (_, i) => (i === 0 ? 0 : (mask >> (i - 1)) & 1)),
          2,
        ),
      );
    const got = sphericalKMeans(points, labels.length, dims, 2, { seed: 1 });
    expect(got.objective).toBeCloseTo(best, 9);
  });

  it('recovers planted, well-separated clusters exactly', () => {
    const { points, labels, dims } = plantedClusters(4, 30, 20, 0.15, 11);
    const got = sphericalKMeans(points, labels.length, dims, 4, { seed: 2 });
    expect(adjustedRandIndex(labels, Array.from(got.assignment))).toBeCloseTo(1, 12);
  });

  it('gives the same answer for the same seed', () => {
    const p = unitPoints(120, 6, 4);
    const a = sphericalKMeans(p, 120, 6, 4, { seed: 8 });
    const b = sphericalKMeans(p, 120, 6, 4, { seed: 8 });
    expect(Array.from(b.assignment)).toEqual(Array.from(a.assignment));
    expect(b.centres).toEqual(a.centres);
  });

  it('returns one cluster when every point is the same (a thousand identical files)', () => {
    const p = new Float64Array(1000 * 4);
    for (let i = 0; i < 1000; i++) p.set([0.5, 0.5, 0.5, 0.5], i * 4);
    const got = sphericalKMeans(p, 1000, 4, 6);
    expect(got.clusters).toBe(1);
    expect(new Set(got.assignment)).toEqual(new Set([0]));
  });

  /** Σ‖x − mean of its cluster‖² (the k-means cost Lloyd 1982 minimises). */
  const squaredError = (p: Float64Array, dims: number, labels: ArrayLike<number>, k: number): number => {
    let cost = 0;
    for (let c = 0; c < k; c++) {
      const members = Array.from(labels).flatMap((l, i) => (l === c ? [i] : []));
      for (let d = 0; d < dims; d++) {
        const mean = members.reduce((s, i) => s + p[i * dims + d], 0) / Math.max(1, members.length);
        for (const i of members) cost += (p[i * dims + d] - mean) ** 2;
      }
    }
    return cost;
  };

  for (const seed of [1, 2, 3]) {
    it(`with the Euclidean objective reaches the exhaustive-search optimum of Σ‖x − μ‖² on 10 random unit vectors, 2 clusters (instance ${seed})`, () => {
      const n = 10;
      const dims = 3;
      const p = unitPoints(n, dims, seed);
      let best = Infinity;
      for (let mask = 0; mask < 1 << (n - 1); mask++)
        best = Math.min(
          best,
          squaredError(
            p,
            dims,
            Array.from({ length: n }, (_, i) => (i === 0 ? 0 : (mask >> (i - 1)) & 1)),
            2,
          ),
        );
      const got = sphericalKMeans(p, n, dims, 2, { seed, objective: 'euclidean' });
      expect(-got.objective).toBeCloseTo(squaredError(p, dims, got.assignment, got.clusters), 9);
      expect(-got.objective).toBeLessThanOrEqual(1.05 * best + 1e-12);
    });
  }

  it('with the Euclidean objective ends at a fixed point: each point at its nearest member mean', () => {
    const dims = 8;
    const n = 200;
    const p = unitPoints(n, dims, 9);
    const got = sphericalKMeans(p, n, dims, 5, { seed: 3, objective: 'euclidean' });
    const means = Array.from({ length: got.clusters }, (_, c) => {
      const members = Array.from(got.assignment).flatMap((l, i) => (l === c ? [i] : []));
      return Array.from({ length: dims }, (_, d) => members.reduce((s, i) => s + p[i * dims + d], 0) / members.length);
    });
    const dist = (i: number, c: number) => means[c].reduce((s, m, d) => s + (p[i * dims + d] - m) ** 2, 0);
    for (let i = 0; i < n; i++)
      for (let c = 0; c < got.clusters; c++) expect(dist(i, got.assignment[i])).toBeLessThanOrEqual(dist(i, c) + 1e-12);
    for (let c = 0; c < got.clusters; c++) {
      const norm = Math.hypot(...means[c]);
      for (let d = 0; d < dims; d++) expect(got.centres[c * dims + d]).toBeCloseTo(means[c][d] / norm, 9);
    }
  });

  it('refuses a non-positive cluster count', () => {
    expect(() => sphericalKMeans(unitPoints(3, 2, 1), 3, 2, 0)).toThrow(/positive whole number/);
  });
});
