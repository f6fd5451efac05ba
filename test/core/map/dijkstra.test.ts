import { describe, expect, it } from 'vitest';
import { ShortestPaths } from '../../../src/core/map/dijkstra.js';
import { buildNeighbourGraph } from '../../../src/core/map/neighbourGraph.js';
import { emptyNeighbourLists } from '../../../src/core/map/neighbourLists.js';
import { createRandom } from '../../../src/core/random.js';

describe('ShortestPaths (Dijkstra 1959)', () => {
  it('matches Floyd–Warshall on a random weighted graph (brute-force reference)', () => {
    const n = 40;
    const rng = createRandom(3);
    const extra = [];
    for (let e = 0; e < 90; e++) {
      const a = Math.floor(rng.next() * n);
      const b = Math.floor(rng.next() * n);
      if (a !== b) extra.push({ a, b, length: 0.1 + rng.next() });
    }
    const g = buildNeighbourGraph(emptyNeighbourLists(n, 1), extra);
    const fw = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 0 : Infinity)));
    for (let i = 0; i < n; i++) {
      for (let p = g.offsets[i]; p < g.offsets[i + 1]; p++) fw[i][g.targets[p]] = Math.min(fw[i][g.targets[p]], g.weights[p]);
    }
    for (let k = 0; k < n; k++) for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) fw[i][j] = Math.min(fw[i][j], fw[i][k] + fw[k][j]);
    const sp = new ShortestPaths(g);
    for (let s = 0; s < n; s++) {
      const d = sp.from(s);
      for (let t = 0; t < n; t++) {
        if (fw[s][t] === Infinity) expect(d[t]).toBe(Infinity);
        else expect(d[t]).toBeCloseTo(fw[s][t], 12);
      }
    }
  });
});
