/**
 * First-variation refinement of spherical k-means. References: the objective Σ_c ‖Σ_{i∈c} x_i‖
 * that Dhillon & Modha 2001 maximise, recomputed from scratch; the definition of a first-variation
 * local optimum (Dhillon, Guan & Kogan 2002: no single point's move to another cluster raises the
 * objective), checked by trying every single move; the fixed-point condition of Lloyd's step
 * (each point at the centre with the largest cosine), which such a local optimum must meet;
 * exhaustive search over every 2-way partition of a small set (the refinement may reach, never
 * pass, the optimum).
 */
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../../src/core/errors.js';
import { createRandom } from '../../../src/core/random.js';
import { firstVariation } from '../../../src/core/topics/firstVariation.js';
import { sphericalKMeans } from '../../../src/core/topics/sphericalKMeans.js';
import { bestTwoClusterObjective, objectiveOf, unitPoints } from './fixtures.js';

describe('first variation', () => {
  it('from a random start: the objective as recomputed, not below the start, and no single move improves it', () => {
    const n = 300;
    const dims = 6;
    const k = 5;
    const p = unitPoints(n, dims, 11);
    const r = createRandom(4);
    const start = Int32Array.from({ length: n }, (_, i) => (i < k ? i : Math.floor(r.next() * k)));
    const got = firstVariation(p, n, dims, start, k, { maxSweeps: 1000 });
    const objective = objectiveOf(p, dims, got.assignment, k);
    expect(got.objective).toBeCloseTo(objective, 9);
    expect(objective).toBeGreaterThan(objectiveOf(p, dims, start, k));
    expect(got.moves).toBeGreaterThan(0);
    const sizes = new Int32Array(k);
    for (const c of got.assignment) sizes[c]++;
    const moved = Int32Array.from(got.assignment);
    for (let i = 0; i < n; i++) {
      if (sizes[got.assignment[i]] === 1) continue;
      for (let c = 0; c < k; c++) {
        if (c === got.assignment[i]) continue;
        moved[i] = c;
        expect(objectiveOf(p, dims, moved, k)).toBeLessThanOrEqual(objective + 1e-9);
      }
      moved[i] = got.assignment[i];
    }
    // Lloyd's fixed point: each point's own centre has the largest cosine.
    for (let i = 0; i < n; i++) {
      const cos = (c: number) => {
        let v = 0;
        for (let d = 0; d < dims; d++) v += p[i * dims + d] * got.centres[c * dims + d];
        return v;
      };
      for (let c = 0; c < k; c++) expect(cos(got.assignment[i])).toBeGreaterThanOrEqual(cos(c) - 1e-9);
    }
    expect(Array.from(sizes).every((s) => s > 0)).toBe(true);
  });

  for (const seed of [1, 2, 3]) {
    it(`after one-restart k-means it stays at or below the exhaustive-search optimum for 2 clusters of 12 points (instance ${seed})`, () => {
      const n = 12;
      const dims = 3;
      const p = unitPoints(n, dims, seed);
      const best = bestTwoClusterObjective(p, n, dims);
      const lloyd = sphericalKMeans(p, n, dims, 2, { seed, restarts: 1 });
      const refined = sphericalKMeans(p, n, dims, 2, { seed, restarts: 1, refineSweeps: 10 });
      expect(refined.objective).toBeGreaterThanOrEqual(lloyd.objective - 1e-9);
      expect(refined.objective).toBeLessThanOrEqual(best + 1e-9);
      expect(refined.objective).toBeCloseTo(objectiveOf(p, dims, refined.assignment, refined.clusters), 9);
    });
  }

  it('gives the same clustering for the same input', () => {
    const p = unitPoints(200, 5, 7);
    const a = sphericalKMeans(p, 200, 5, 4, { seed: 2, restarts: 3, refineSweeps: 10 });
    const b = sphericalKMeans(p, 200, 5, 4, { seed: 2, restarts: 3, refineSweeps: 10 });
    expect(Array.from(a.assignment)).toEqual(Array.from(b.assignment));
  });

  it('refuses a cluster number outside the count given', () => {
    const p = unitPoints(4, 2, 1);
    expect(() => firstVariation(p, 4, 2, Int32Array.from([0, 1, 2, 0]), 2)).toThrow(InvalidInputError);
  });
});
