/**
 * The undirected weighted neighbour graph Isomap walks on (Tenenbaum, de Silva & Langford 2000,
 * step 1): i and j are joined when either is among the other's k nearest neighbours, with the
 * distance between them as the edge length. Stored as CSR adjacency on typed arrays, plus
 * connected components by breadth-first search.
 */
import type { NeighbourLists } from './neighbourLists.js';

export interface NeighbourGraph {
  readonly n: number;
  /** n + 1 offsets into targets/weights. */
  readonly offsets: Int32Array;
  readonly targets: Int32Array;
  readonly weights: Float64Array;
}

export interface ExtraEdge {
  readonly a: number;
  readonly b: number;
  readonly length: number;
}

/** Symmetrise k-NN lists (and any extra edges) into an undirected graph without duplicate edges. */
export function buildNeighbourGraph(lists: NeighbourLists, extra: readonly ExtraEdge[] = []): NeighbourGraph {
  const { n, k, indices, distances } = lists;
  const degree = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) {
    for (let s = 0; s < k; s++) {
      const j = indices[i * k + s];
      if (j < 0 || j === i) continue;
      degree[i]++;
      degree[j]++;
    }
  }
  for (const e of extra) {
    degree[e.a]++;
    degree[e.b]++;
  }
  const start = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) start[i + 1] = start[i] + degree[i];
  const fill = start.slice(0, n);
  const rawTargets = new Int32Array(start[n]);
  const rawWeights = new Float64Array(start[n]);
  const put = (a: number, b: number, w: number): void => {
    rawTargets[fill[a]] = b;
    rawWeights[fill[a]++] = w;
  };
  for (let i = 0; i < n; i++) {
    for (let s = 0; s < k; s++) {
      const j = indices[i * k + s];
      if (j < 0 || j === i) continue;
      const w = distances[i * k + s];
      put(i, j, w);
      put(j, i, w);
    }
  }
  for (const e of extra) {
    put(e.a, e.b, e.length);
    put(e.b, e.a, e.length);
  }
  // Deduplicate each row (an edge found from both ends appears twice), keeping the shorter length.
  const offsets = new Int32Array(n + 1);
  const targets = new Int32Array(start[n]);
  const weights = new Float64Array(start[n]);
  const seenAt = new Int32Array(n).fill(-1);
  let w = 0;
  for (let i = 0; i < n; i++) {
    const rowStart = w;
    for (let p = start[i]; p < start[i + 1]; p++) {
      const j = rawTargets[p];
      const at = seenAt[j];
      if (at >= rowStart) {
        if (rawWeights[p] < weights[at]) weights[at] = rawWeights[p];
        continue;
      }
      seenAt[j] = w;
      targets[w] = j;
      weights[w++] = rawWeights[p];
    }
    offsets[i + 1] = w;
  }
  return { n, offsets, targets: targets.slice(0, w), weights: weights.slice(0, w) };
}

export interface Components {
  readonly count: number;
  /** Component id of every node, 0-based in order of each component's lowest node. */
  readonly labels: Int32Array;
  readonly sizes: Int32Array;
}

export function connectedComponents(g: NeighbourGraph): Components {
  const { n, offsets, targets } = g;
  const labels = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  const sizes: number[] = [];
  for (let s = 0; s < n; s++) {
    if (labels[s] !== -1) continue;
    const id = sizes.length;
    let head = 0;
    let tail = 0;
    queue[tail++] = s;
    labels[s] = id;
    while (head < tail) {
      const u = queue[head++];
      for (let p = offsets[u]; p < offsets[u + 1]; p++) {
        const v = targets[p];
        if (labels[v] === -1) {
          labels[v] = id;
          queue[tail++] = v;
        }
      }
    }
    sizes.push(tail);
  }
  return { count: sizes.length, labels, sizes: Int32Array.from(sizes) };
}
