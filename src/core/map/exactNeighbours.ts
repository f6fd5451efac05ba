/**
 * Exact k-nearest neighbours by brute force: every pair is compared once (n²/2 dot products of
 * length dim) and offered to both rows. Suited to a few thousand rows; larger inputs go through
 * NN-Descent (nnDescent.ts). Distances are Euclidean between rows; on unit rows that is the
 * cosine chord, so the neighbours are exactly the top-k by cosine similarity.
 */
import { InvalidInputError } from '../errors.js';
import { emptyNeighbourLists, offerNeighbour, type NeighbourLists } from './neighbourLists.js';
import { rowSquaredNorms, type RowVectors } from './rowVectors.js';

export function exactNeighbours(v: RowVectors, k: number): NeighbourLists {
  if (!Number.isInteger(k) || k < 1) throw new InvalidInputError(`neighbour count must be a positive whole number, got ${k}`);
  const { n, dim, data } = v;
  const lists = emptyNeighbourLists(n, k);
  const norms = rowSquaredNorms(v);
  const { distances } = lists;
  for (let i = 0; i < n; i++) {
    const oi = i * dim;
    const ni = norms[i];
    for (let j = i + 1; j < n; j++) {
      const oj = j * dim;
      let dot = 0;
      for (let c = 0; c < dim; c++) dot += data[oi + c] * data[oj + c];
      const d2 = ni + norms[j] - 2 * dot;
      const d = d2 > 0 ? Math.sqrt(d2) : 0;
      // Cheap rejection before the full offer: most pairs are farther than both rows' worst.
      if (d < distances[i * k + k - 1]) offerNeighbour(lists, i, j, d);
      if (d < distances[j * k + k - 1]) offerNeighbour(lists, j, i, d);
    }
  }
  return lists;
}
