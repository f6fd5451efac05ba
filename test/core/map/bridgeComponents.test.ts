import { describe, expect, it } from 'vitest';
import { bridgeComponents } from '../../../src/core/map/bridgeComponents.js';
import { exactNeighbours } from '../../../src/core/map/exactNeighbours.js';
import { buildNeighbourGraph, connectedComponents } from '../../../src/core/map/neighbourGraph.js';
import { rowSquaredNorms, rowVectors } from '../../../src/core/map/rowVectors.js';
import { createRandom } from '../../../src/core/random.js';
import { clusters } from './helpers.js';

describe('bridgeComponents', () => {
  const p = clusters(12, 4, 10, 0.05, 8);
  const v = rowVectors(p.data, p.n, p.dim);
  const norms = rowSquaredNorms(v);
  const lists = exactNeighbours(v, 4);
  const comps = connectedComponents(buildNeighbourGraph(lists));

  it('connects every part of a disconnected graph', () => {
    expect(comps.count).toBeGreaterThan(1);
    const bridges = bridgeComponents(v, norms, comps, createRandom(1));
    const joined = connectedComponents(buildNeighbourGraph(lists, bridges));
    expect(joined.count).toBe(1);
    expect(bridges.length).toBeGreaterThanOrEqual(comps.count - 1);
  });

  it('bridges each small part by exactly its closest outside pair (brute-force reference)', () => {
    const bridges = bridgeComponents(v, norms, comps, createRandom(1));
    const dist = (a: number, b: number) => {
      let s = 0;
      for (let d = 0; d < p.dim; d++) s += (p.data[a * p.dim + d] - p.data[b * p.dim + d]) ** 2;
      return Math.sqrt(s);
    };
    // In the first Borůvka round every part links to its nearest other part; its shortest
    // outgoing gap must be one of the bridges.
    for (let c = 0; c < comps.count; c++) {
      let best = Number.POSITIVE_INFINITY;
      for (let a = 0; a < p.n; a++) {
        if (comps.labels[a] !== c) continue;
        for (let b = 0; b < p.n; b++) if (comps.labels[b] !== c) best = Math.min(best, dist(a, b));
      }
      expect(bridges.some((e) => Math.abs(e.length - best) < 1e-6)).toBe(true);
    }
    for (const e of bridges) expect(e.length).toBeCloseTo(dist(e.a, e.b), 5);
  });

  it('scales bridge lengths by lengthScale', () => {
    const plain = bridgeComponents(v, norms, comps, createRandom(1));
    const scaled = bridgeComponents(v, norms, comps, createRandom(1), { lengthScale: 3 });
    expect(scaled.map((e) => e.length)).toEqual(plain.map((e) => e.length * 3));
  });
});
