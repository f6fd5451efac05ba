/**
 * First-variation refinement of a spherical k-means clustering (Dhillon, Guan & Kogan 2002,
 * "Iterative clustering of high dimensional text data augmented by local search", IEEE ICDM):
 * Lloyd's batch step (sphericalKMeans.ts) moves a point to the centre it is closest to but does not
 * count that the move also shifts both centres, so it stops at assignments where single moves
 * still raise the objective Σ_c ‖Σ_{i∈c} x_i‖. Here points are visited in order and each goes to
 * the cluster where the objective gains most, counting both changes exactly: with S_c the member
 * sum, moving x from a to b changes it by ‖S_b + x‖ − ‖S_b‖ + ‖S_a − x‖ − ‖S_a‖ (the sequential
 * rule of Hartigan & Wong 1979, Applied Statistics 28:100–108, for the spherical objective). Sweeps
 * repeat until no point moves or maxSweeps. The objective never falls, and a clustering no single
 * move improves is also a fixed point of Lloyd's step (the gain of a move is at least the gain in
 * cosine Lloyd's step sees), so the result is never worse than its start. A cluster is never
 * emptied. Each sweep starts from the table of every point's dot product with every member sum
 * (one product, pointProducts.ts); a move changes a sum by one unit vector, so a point's dot
 * product with a sum that m moves touched since is within ±m of the table's. A point is evaluated
 * exactly (k·dims multiply-adds) only when the gain bounded that way could pass the threshold: the
 * same moves, and after the first sweep few points need a look.
 * Defaults: 10 sweeps (our choice, a bound on the cost; on the CMake and Django manuals, 20 topics,
 * runs from one-restart k-means settled in 5–14 sweeps, so 10 stops a few of them early).
 * Citations from memory.
 */
import { InvalidInputError } from '../errors.js';
import { PointProducts } from './pointProducts.js';

export interface FirstVariationOptions {
  /** @default 10 */
  maxSweeps: number;
}

export const DEFAULT_FIRST_VARIATION_OPTIONS: Readonly<FirstVariationOptions> = Object.freeze({ maxSweeps: 10 });

export interface Refinement {
  /** Cluster of each point (0…clusters−1, the numbering given). */
  readonly assignment: Int32Array;
  /** clusters × dims unit centres, row-major. */
  readonly centres: Float64Array;
  /** Σ_c ‖Σ_{i∈c} x_i‖ after the moves. */
  readonly objective: number;
  /** Points moved, over all sweeps. */
  readonly moves: number;
  readonly sweeps: number;
}

/** A move must gain more than this (relative to the objective) to count: rounding cannot cycle. */
const MIN_GAIN = 1e-12;

/** points: n × dims, row-major; assignment: a cluster 0…clusters−1 for each point (not changed). */
export function firstVariation(
  points: Float64Array,
  n: number,
  dims: number,
  assignment: Int32Array,
  clusters: number,
  options: Partial<FirstVariationOptions> = {},
  products = new PointProducts(points, n, dims, clusters),
): Refinement {
  const o = { ...DEFAULT_FIRST_VARIATION_OPTIONS, ...options };
  if (assignment.length < n || points.length < n * dims) throw new InvalidInputError('first variation needs a cluster for every point');
  const k = clusters;
  const a = Int32Array.from(assignment.subarray(0, n));
  const sums = new Float64Array(k * dims);
  const size = new Int32Array(k);
  for (let i = 0; i < n; i++) {
    const c = a[i];
    if (!(c >= 0 && c < k)) throw new InvalidInputError(`cluster ${c} of point ${i} is outside 0…${k - 1}`);
    size[c]++;
    for (let d = 0; d < dims; d++) sums[c * dims + d] += points[i * dims + d];
  }
  const norm = new Float64Array(k);
  const renorm = (c: number) => {
    let ss = 0;
    for (let d = 0; d < dims; d++) ss += sums[c * dims + d] ** 2;
    norm[c] = Math.sqrt(ss);
  };
  for (let c = 0; c < k; c++) renorm(c);
  let objective = norm.reduce((s, x) => s + x, 0);
  const dot = new Float64Array(k);
  const table = new Float64Array(n * k);
  const touched = new Float64Array(k);
  const selfDot = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let xx = 0;
    for (let d = 0; d < dims; d++) xx += points[i * dims + d] ** 2;
    selfDot[i] = xx;
  }
  const longest = Math.sqrt(selfDot.reduce((m, x) => Math.max(m, x), 0));
  const gainOf = (q: number, t: number, xx: number) => Math.sqrt(Math.max(0, q + 2 * t + xx));
  let moves = 0;
  let sweeps = 0;
  while (sweeps < o.maxSweeps) {
    sweeps++;
    let moved = 0;
    products.timesCentres(sums, k, table);
    touched.fill(0);
    for (let i = 0; i < n; i++) {
      const from = a[i];
      if (size[from] <= 1) continue;
      const p = i * dims;
      const xx = selfDot[i];
      const threshold = MIN_GAIN * Math.max(1, objective);
      // Bound: the dot product with a sum lies within ±(moves that touched it, plus rounding) of the table's;
      // the gain rises with the dot product into b and falls with the one out of a.
      const slack = (c: number) => touched[c] * Math.sqrt(xx) * longest + 1e-9 * (norm[c] + 1);
      const leaveBound = Math.sqrt(Math.max(0, norm[from] ** 2 - 2 * (table[i * k + from] - slack(from)) + xx)) - norm[from];
      let couldMove = false;
      for (let c = 0; c < k && !couldMove; c++)
        if (c !== from && gainOf(norm[c] ** 2, table[i * k + c] + slack(c), xx) - norm[c] + leaveBound > threshold) couldMove = true;
      if (!couldMove) continue;
      for (let c = 0; c < k; c++) {
        let v = 0;
        const s = c * dims;
        for (let d = 0; d < dims; d++) v += points[p + d] * sums[s + d];
        dot[c] = v;
      }
      const leave = Math.sqrt(Math.max(0, norm[from] ** 2 - 2 * dot[from] + xx)) - norm[from];
      let best = -1;
      let bestGain = threshold;
      for (let c = 0; c < k; c++) {
        if (c === from) continue;
        const gain = Math.sqrt(Math.max(0, norm[c] ** 2 + 2 * dot[c] + xx)) - norm[c] + leave;
        if (gain > bestGain) {
          bestGain = gain;
          best = c;
        }
      }
      if (best < 0) continue;
      for (let d = 0; d < dims; d++) {
        sums[from * dims + d] -= points[p + d];
        sums[best * dims + d] += points[p + d];
      }
      const before = norm[from] + norm[best];
      renorm(from);
      renorm(best);
      objective += norm[from] + norm[best] - before;
      size[from]--;
      size[best]++;
      touched[from]++;
      touched[best]++;
      a[i] = best;
      moved++;
    }
    moves += moved;
    if (moved === 0) break;
  }
  const centres = new Float64Array(k * dims);
  for (let c = 0; c < k; c++) {
    renorm(c);
    const inv = norm[c] > 0 ? 1 / norm[c] : 0;
    for (let d = 0; d < dims; d++) centres[c * dims + d] = sums[c * dims + d] * inv;
  }
  return { assignment: a, centres, objective: norm.reduce((s, x) => s + x, 0), moves, sweeps };
}
