import { describe, expect, it } from 'vitest';
import { exactNeighbours } from '../../../src/core/map/exactNeighbours.js';
import { rowVectors } from '../../../src/core/map/rowVectors.js';
import { InvalidInputError } from '../../../src/core/errors.js';
import { clusters } from './helpers.js';

describe('exactNeighbours', () => {
  const p = clusters(20, 4, 8, 0.3, 1);
  it('matches a full sort of cosine similarities for every row (brute-force reference)', () => {
    const lists = exactNeighbours(rowVectors(p.data, p.n, p.dim), 5);
    for (let i = 0; i < p.n; i++) {
      const sims: [number, number][] = [];
      for (let j = 0; j < p.n; j++) {
        if (j === i) continue;
        let dot = 0;
        for (let d = 0; d < p.dim; d++) dot += p.data[i * p.dim + d] * p.data[j * p.dim + d];
        sims.push([dot, j]);
      }
      sims.sort((a, b) => b[0] - a[0]);
      const expected = sims.slice(0, 5).map(([, j]) => j);
      expect(Array.from(lists.indices.subarray(i * 5, i * 5 + 5))).toEqual(expected);
      expect(lists.distances[i * 5]).toBeCloseTo(Math.sqrt(2 - 2 * sims[0][0]), 5);
    }
  });

  it('pads rows with -1 when there are fewer other rows than slots', () => {
    const lists = exactNeighbours(rowVectors(p.data.subarray(0, 3 * p.dim), 3, p.dim), 4);
    expect(
      Array.from(lists.indices.subarray(0, 4))
        .filter((j) => j >= 0)
        .sort(),
    ).toEqual([1, 2]);
    expect(lists.indices[3]).toBe(-1);
    expect(lists.distances[3]).toBe(Number.POSITIVE_INFINITY);
  });

  it('rejects a neighbour count below one', () => {
    expect(() => exactNeighbours(rowVectors(p.data, p.n, p.dim), 0)).toThrow(InvalidInputError);
  });
});
