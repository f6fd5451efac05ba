import { beforeAll, describe, expect, it } from 'vitest';
import { landmarkIsomap, type FaithfulLayout } from '../../../src/core/map/landmarkIsomap.js';
import { nearestByCosine, placeQueryFaithful } from '../../../src/core/map/placeQuery.js';
import { interpolateFromNeighbours } from '../../../src/core/map/neighbourInterpolation.js';
import { InvalidInputError } from '../../../src/core/errors.js';
import { swissRoll } from './helpers.js';

describe('placing a query on the faithful layout', () => {
  const roll = swissRoll(600, 8, 21);
  let layout: FaithfulLayout;
  beforeAll(() => {
    layout = landmarkIsomap(roll.data, roll.n, roll.dim, { landmarks: 60 });
  });
  const spread = () => Math.sqrt(layout.x.reduce((s, v, i) => s + v * v + layout.y[i] ** 2, 0) / roll.n);

  it('puts a file’s own vector where the file is (within 2% of the map’s RMS radius)', () => {
    for (const i of [3, 150, 420]) {
      const p = placeQueryFaithful(layout, roll.data.subarray(i * roll.dim, (i + 1) * roll.dim));
      expect(p).not.toBeNull();
      expect(Math.hypot(p!.x - layout.x[i], p!.y - layout.y[i])).toBeLessThan(0.02 * spread());
      expect(p!.neighbours[0]).toBe(i);
      expect(p!.similarities[0]).toBeCloseTo(1, 5);
    }
  });

  it('puts a new point on the roll between its neighbours on the map', () => {
    // A point halfway (in the roll's own coordinates) between two nearby files.
    const [a, b] = [10, layout.vectors.n > 11 ? 11 : 0];
    const mid = new Float32Array(roll.dim);
    for (let d = 0; d < roll.dim; d++) mid[d] = 0.5 * (roll.data[a * roll.dim + d] + roll.data[b * roll.dim + d]);
    const p = placeQueryFaithful(layout, mid)!;
    const near = Array.from(p.neighbours.subarray(0, 5));
    const cx = near.reduce((s, j) => s + layout.x[j], 0) / near.length;
    const cy = near.reduce((s, j) => s + layout.y[j], 0) / near.length;
    expect(Math.hypot(p.x - cx, p.y - cy)).toBeLessThan(0.1 * spread());
  });

  it('returns null for a zero query vector', () => {
    expect(placeQueryFaithful(layout, new Float32Array(roll.dim))).toBeNull();
  });
});

describe('nearestByCosine', () => {
  it('matches sorting every similarity (brute-force reference) and rejects a wrong length', () => {
    const data = Float32Array.from([1, 0, 0.6, 0.8, 0, 1, -1, 0]);
    const got = nearestByCosine(data, 4, 2, [2, 1], 3);
    const sims = [0, 1, 2, 3].map((i) => (2 * data[2 * i] + data[2 * i + 1]) / Math.sqrt(5));
    const order = [0, 1, 2, 3].sort((a, b) => sims[b] - sims[a]).slice(0, 3);
    expect(Array.from(got.index)).toEqual(order);
    expect(got.similarity[0]).toBeCloseTo(sims[order[0]], 6);
    expect(() => nearestByCosine(data, 4, 2, [1, 2, 3], 2)).toThrow(InvalidInputError);
  });
});

describe('interpolateFromNeighbours (Shepard 1968)', () => {
  it('lands on a neighbour at distance zero and between equally distant ones', () => {
    const x = [0, 10, 4];
    const y = [0, 0, 4];
    expect(interpolateFromNeighbours(x, y, [2, 0], [0, 1])!.x).toBeCloseTo(4, 6);
    const mid = interpolateFromNeighbours(x, y, [0, 1], [0.5, 0.5])!;
    expect(mid.x).toBeCloseTo(5, 9);
    expect(interpolateFromNeighbours(x, y, [], [])).toBeNull();
  });
});
