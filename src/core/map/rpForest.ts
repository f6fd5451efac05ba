/**
 * Random projection trees (Dasgupta & Freund, "Random projection trees and low dimensional
 * manifolds", STOC 2008), used only to give NN-Descent a good start: each tree splits the rows
 * recursively by the hyperplane halfway between two random rows until a leaf holds at most
 * leafSize rows; rows sharing a leaf are likely neighbours. Starting NN-Descent from leaf-mates
 * rather than random lists cuts its iterations several-fold (common practice, from memory of
 * the PyNNDescent documentation). Cost per tree O(n·dim·depth).
 */
import type { RandomSource } from '../random.js';
import type { RowVectors } from './rowVectors.js';

/** Leaves of one tree: rows permuted so each leaf is a contiguous range [starts[i], starts[i+1]). */
export interface RpLeaves {
  readonly order: Int32Array;
  readonly starts: Int32Array;
}

export function randomProjectionLeaves(v: RowVectors, norms: Float64Array, leafSize: number, rng: RandomSource): RpLeaves {
  const { n, dim, data } = v;
  const order = Int32Array.from({ length: n }, (_, i) => i);
  const side = new Float64Array(n);
  const starts: number[] = [];
  const stack: number[] = [0, n];
  while (stack.length > 0) {
    const end = stack.pop() as number;
    const start = stack.pop() as number;
    const size = end - start;
    if (size <= leafSize) {
      starts.push(start);
      continue;
    }
    const a = order[start + Math.floor(rng.next() * size)];
    let b = order[start + Math.floor(rng.next() * size)];
    if (a === b) b = order[start + ((order.indexOf(a, start) - start + 1) % size)];
    const oa = a * dim;
    const ob = b * dim;
    const offset = 0.5 * (norms[a] - norms[b]);
    let left = 0;
    for (let t = start; t < end; t++) {
      const o = order[t] * dim;
      let s = 0;
      for (let c = 0; c < dim; c++) s += data[o + c] * (data[oa + c] - data[ob + c]);
      side[t] = s - offset;
      if (side[t] > 0) left++;
    }
    let mid: number;
    if (left === 0 || left === size) {
      mid = start + (size >> 1); // all rows on one side (duplicates): split the range in half
    } else {
      // In-place partition: rows with side > 0 first.
      let i = start;
      let j = end - 1;
      while (i <= j) {
        if (side[i] > 0) i++;
        else {
          swap(order, side, i, j);
          j--;
        }
      }
      mid = i;
    }
    stack.push(mid, end, start, mid);
  }
  starts.sort((x, y) => x - y);
  starts.push(n);
  return { order, starts: Int32Array.from(starts) };
}

function swap(order: Int32Array, side: Float64Array, i: number, j: number): void {
  const o = order[i];
  order[i] = order[j];
  order[j] = o;
  const s = side[i];
  side[i] = side[j];
  side[j] = s;
}
