import { describe, expect, it } from 'vitest';
import { SpatialGrid } from '../../../src/core/map/spatialGrid.js';
import { createRandom } from '../../../src/core/random.js';

describe('SpatialGrid', () => {
  const rng = createRandom(8);
  const n = 3000;
  // Clustered points: dense blobs and empty space, the case a uniform grid must handle.
  const x = Float64Array.from({ length: n }, (_, i) => (i % 5) * 3 + 0.3 * rng.normal());
  const y = Float64Array.from({ length: n }, (_, i) => Math.floor(i / 600) + 0.2 * rng.normal());
  const grid = SpatialGrid.build(x, y);

  const brute = (px: number, py: number, max: number, accept: (i: number) => boolean = () => true) => {
    let best = -1;
    let bestD = max * max;
    for (let i = 0; i < n; i++) {
      const d = (x[i] - px) ** 2 + (y[i] - py) ** 2;
      if (d <= bestD && (d < bestD || best < 0 || i < best) && accept(i)) [best, bestD] = [i, d];
    }
    return best;
  };

  it('finds the same nearest point as a linear scan, within the search radius', () => {
    for (let t = 0; t < 400; t++) {
      const px = -2 + 18 * rng.next();
      const py = -1 + 7 * rng.next();
      const r = 0.05 + rng.next();
      expect(grid.nearest(px, py, r)).toBe(brute(px, py, r));
    }
  });

  it('honours the accept filter and reports -1 when nothing is close enough', () => {
    const even = (i: number) => i % 2 === 0;
    for (let t = 0; t < 100; t++) {
      const px = 15 * rng.next();
      const py = 5 * rng.next();
      expect(grid.nearest(px, py, 0.5, even)).toBe(brute(px, py, 0.5, even));
    }
    expect(grid.nearest(1000, 1000, 1)).toBe(-1);
  });

  it('copes with an unbounded radius and with no points', () => {
    expect(grid.nearest(100, 100, Infinity)).toBe(brute(100, 100, Infinity));
    expect(SpatialGrid.build([], []).nearest(0, 0, 10)).toBe(-1);
  });
});
