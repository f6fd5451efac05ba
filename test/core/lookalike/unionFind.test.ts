import { describe, expect, it } from 'vitest';
import { UnionFind } from '../../../src/core/lookalike/unionFind.js';
import { createRandom } from '../../../src/core/random.js';

/** Reference: connected components by breadth-first search over an adjacency list. */
function bfsComponents(n: number, edges: [number, number][]): number[][] {
  const adj: number[][] = Array.from({ length: n }, () => []);
  for (const [a, b] of edges) {
    adj[a].push(b);
    adj[b].push(a);
  }
  const seen = new Uint8Array(n);
  const out: number[][] = [];
  for (let s = 0; s < n; s++) {
    if (seen[s]) continue;
    const comp = [s];
    seen[s] = 1;
    for (let q = 0; q < comp.length; q++)
      for (const t of adj[comp[q]])
        if (!seen[t]) {
          comp.push(t);
          seen[t] = 1;
        }
    if (comp.length >= 2) out.push(comp.sort((x, y) => x - y));
  }
  return out.sort((x, y) => x[0] - y[0]);
}

describe('UnionFind', () => {
  it('finds the same components as breadth-first search on random sparse graphs', () => {
    const rng = createRandom(12);
    for (let trial = 0; trial < 20; trial++) {
      const n = 200;
      const edges: [number, number][] = Array.from({ length: 120 }, () => [Math.floor(rng.next() * n), Math.floor(rng.next() * n)]);
      const uf = new UnionFind(n);
      for (const [a, b] of edges) uf.union(a, b);
      expect(uf.components()).toEqual(bfsComponents(n, edges));
    }
  });

  it('reports whether a union joined two sets', () => {
    const uf = new UnionFind(3);
    expect(uf.union(0, 1)).toBe(true);
    expect(uf.union(1, 0)).toBe(false);
    expect(uf.components(1)).toEqual([[0, 1], [2]]);
  });
});
