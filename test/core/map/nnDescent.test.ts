import { describe, expect, it } from 'vitest';
import { exactNeighbours } from '../../../src/core/map/exactNeighbours.js';
import { nnDescent } from '../../../src/core/map/nnDescent.js';
import { rowVectors } from '../../../src/core/map/rowVectors.js';
import { clusters } from './helpers.js';

function recall(truth: Int32Array, found: Int32Array, n: number, k: number): number {
  let hits = 0;
  for (let i = 0; i < n; i++) {
    const t = new Set(truth.subarray(i * k, i * k + k));
    for (let s = 0; s < k; s++) if (t.has(found[i * k + s])) hits++;
  }
  return hits / (n * k);
}

describe('nnDescent (Dong, Charikar & Li 2011)', () => {
  const p = clusters(100, 15, 24, 0.25, 3);
  const v = rowVectors(p.data, p.n, p.dim);
  const truth = exactNeighbours(v, 10);

  it('finds over 90% of the exact 10 nearest neighbours, the recall the paper reports', () => {
    const r = nnDescent(v, 10, { seed: 2 });
    expect(recall(truth.indices, r.lists.indices, p.n, 10)).toBeGreaterThan(0.9);
  });

  it('compares far fewer pairs than brute force', () => {
    const r = nnDescent(v, 10, { seed: 2 });
    expect(r.distanceEvaluations).toBeLessThan((p.n * (p.n - 1)) / 2 / 2);
  });

  it('also converges from random starting lists, as in the paper', () => {
    const r = nnDescent(v, 10, { seed: 2, trees: 0 });
    expect(recall(truth.indices, r.lists.indices, p.n, 10)).toBeGreaterThan(0.9);
  });

  it('keeps every row sorted, free of itself and of repeats', () => {
    const { indices, distances } = nnDescent(v, 10, { seed: 5 }).lists;
    for (let i = 0; i < p.n; i++) {
      const row = Array.from(indices.subarray(i * 10, i * 10 + 10));
      expect(row).not.toContain(i);
      expect(new Set(row).size).toBe(10);
      for (let s = 1; s < 10; s++) expect(distances[i * 10 + s]).toBeGreaterThanOrEqual(distances[i * 10 + s - 1]);
    }
  });

  it('is deterministic for a fixed seed', () => {
    const a = nnDescent(v, 10, { seed: 9 });
    const b = nnDescent(v, 10, { seed: 9 });
    expect(Array.from(b.lists.indices)).toEqual(Array.from(a.lists.indices));
  });
});
