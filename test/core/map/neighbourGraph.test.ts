import { describe, expect, it } from 'vitest';
import { buildNeighbourGraph, connectedComponents } from '../../../src/core/map/neighbourGraph.js';
import { emptyNeighbourLists, offerNeighbour } from '../../../src/core/map/neighbourLists.js';

function lists(rows: number[][]): ReturnType<typeof emptyNeighbourLists> {
  const l = emptyNeighbourLists(rows.length, 2);
  rows.forEach((r, i) => r.forEach((j) => offerNeighbour(l, i, j, Math.abs(i - j))));
  return l;
}

describe('buildNeighbourGraph', () => {
  it('joins i and j when either lists the other, once, with the edge length', () => {
    const g = buildNeighbourGraph(lists([[1], [0, 2], [], [4], []]));
    const adj = (i: number) => Array.from(g.targets.subarray(g.offsets[i], g.offsets[i + 1])).sort();
    expect(adj(0)).toEqual([1]);
    expect(adj(1)).toEqual([0, 2]);
    expect(adj(2)).toEqual([1]);
    expect(adj(4)).toEqual([3]);
    expect(g.targets.length).toBe(6);
    expect(Array.from(g.weights)).toEqual(Array.from(g.weights).map(() => 1));
  });

  it('adds extra edges both ways', () => {
    const g = buildNeighbourGraph(lists([[1], [], []]), [{ a: 0, b: 2, length: 7 }]);
    const p = Array.from(g.targets.subarray(g.offsets[2], g.offsets[3]));
    expect(p).toEqual([0]);
    expect(g.weights[g.offsets[2]]).toBe(7);
  });
});

describe('connectedComponents', () => {
  it('labels parts in order of their lowest node and counts their sizes', () => {
    const c = connectedComponents(buildNeighbourGraph(lists([[1], [0, 2], [], [4], [], []])));
    expect(c.count).toBe(3);
    expect(Array.from(c.labels)).toEqual([0, 0, 0, 1, 1, 2]);
    expect(Array.from(c.sizes)).toEqual([3, 2, 1]);
  });
});
