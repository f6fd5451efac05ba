/**
 * Fixed-width k-nearest-neighbour lists on typed arrays: row i holds up to k neighbour indices
 * sorted by ascending distance, padded with -1 (and +Infinity) when fewer exist.
 */

export interface NeighbourLists {
  readonly n: number;
  /** Slots per row. */
  readonly k: number;
  /** n×k neighbour indices, -1 for an empty slot. */
  readonly indices: Int32Array;
  /** n×k distances matching indices, +Infinity for an empty slot. */
  readonly distances: Float64Array;
}

export function emptyNeighbourLists(n: number, k: number): NeighbourLists {
  const indices = new Int32Array(n * k).fill(-1);
  const distances = new Float64Array(n * k).fill(Number.POSITIVE_INFINITY);
  return { n, k, indices, distances };
}

/**
 * Offer neighbour j at distance d to row i. Keeps the row sorted; ignores j when it is already
 * present or not closer than the current worst. Returns true when the row changed.
 */
export function offerNeighbour(lists: NeighbourLists, i: number, j: number, d: number): boolean {
  const { k, indices, distances } = lists;
  const o = i * k;
  if (!(d < distances[o + k - 1])) return false;
  for (let s = 0; s < k; s++) {
    if (indices[o + s] === j) return false;
  }
  let s = k - 1;
  while (s > 0 && distances[o + s - 1] > d) {
    distances[o + s] = distances[o + s - 1];
    indices[o + s] = indices[o + s - 1];
    s--;
  }
  distances[o + s] = d;
  indices[o + s] = j;
  return true;
}
