/**
 * Spherical k-means from the cosine table (gramKMeans.ts) against the vector form
 * (sphericalKMeans.ts), which is checked against exhaustive search in its own tests: the kernel
 * form is the same algorithm (Dhillon, Guan & Kulis 2004), so on the same points it must reach the
 * same objective Σ‖Σ_{i∈c} x_i‖ computed from its own labels, and recover planted clusters.
 */
import { describe, expect, it } from 'vitest';
import { gramKMeans, gramOf } from '../../../src/core/topics/gramKMeans.js';
import { sphericalKMeans } from '../../../src/core/topics/sphericalKMeans.js';
import { adjustedRandIndex, plantedClusters, objectiveOf, unitPoints } from './fixtures.js';

describe('spherical k-means from the cosine table', () => {
  it('gramOf: a symmetric table whose every entry has the bits of the plain in-order sum (SIMD path or not)', () => {
    for (const [n, dims] of [
      [37, 195],
      [6, 3],
    ] as const) {
      const p = unitPoints(n, dims, n);
      const g = gramOf(p, n, dims);
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) {
          let v = 0;
          for (let d = 0; d < dims; d++) v += p[i * dims + d] * p[j * dims + d];
          expect(g[i * n + j]).toBe(v);
          expect(g[j * n + i]).toBe(g[i * n + j]);
        }
    }
  });

  it('reports the objective of its own labels, within 2% of the vector form on random points', () => {
    const dims = 6;
    const n = 300;
    const p = unitPoints(n, dims, 4);
    const g = gramOf(p, n, dims);
    const got = gramKMeans(g, n, 5, { seed: 2 });
    expect(got.objective).toBeCloseTo(objectiveOf(p, dims, got.assignment, got.clusters), 9);
    const vec = sphericalKMeans(p, n, dims, 5, { seed: 2 });
    // Both are local optima of the same objective from the same seeding; 10 restarts each.
    expect(Math.abs(got.objective - vec.objective) / vec.objective).toBeLessThan(0.02);
  });

  it('recovers well-separated planted clusters (adjusted Rand index 1)', () => {
    const { points, labels, dims } = plantedClusters(4, 25, 8, 0.2, 3);
    const n = labels.length;
    const got = gramKMeans(gramOf(points, n, dims), n, 4, { seed: 1 });
    expect(adjustedRandIndex([...got.assignment], labels)).toBeCloseTo(1, 9);
  });

  it('is deterministic for a seed and gives fewer clusters when fewer directions exist', () => {
    const p = unitPoints(80, 4, 7);
    const g = gramOf(p, 80, 4);
    expect(gramKMeans(g, 80, 3, { seed: 5 })).toEqual(gramKMeans(g, 80, 3, { seed: 5 }));
    const same = new Float64Array(30 * 3).map((_, i) => (i % 3 === 0 ? 1 : 0));
    expect(gramKMeans(gramOf(same, 30, 3), 30, 4).clusters).toBe(1);
  });
});
