/**
 * Spherical k-means (Dhillon & Modha 2001, Machine Learning 42:143–175): cluster unit vectors by
 * cosine. Each centre is the normalised sum of its members ("concept vector"); each point joins
 * the centre with the largest cosine; repeat until no point moves or maxIterations.
 * Seeding: greedy k-means++ (Arthur & Vassilvitskii 2007) with the squared chordal distance
 * ‖x − μ‖² = 2(1 − cos) as the sampling weight, from the seeded random source. Several seeded
 * restarts keep the one with the largest total cosine; a caller may instead give start centres. With refineSweeps > 0 each
 * run is refined by first-variation moves (firstVariation.ts) before the runs are compared. If fewer than K distinct directions exist
 * (say, a thousand identical files) seeding stops early and fewer clusters come back.
 * With objective 'euclidean' the same loop is Lloyd's k-means (Lloyd 1982, IEEE Trans. Inf. Theory
 * 28:129–137): each centre is the mean of its members and each point joins the nearest mean, so
 * ‖x − μ_c‖² = ‖x‖² − 2·x·Σ_c/n_c + ‖Σ_c‖²/n_c² is read off the same sums; restarts are compared by
 * the sum of squared distances (returned negated as the objective); first-variation refinement is
 * the spherical objective's and is not applied. The seeding is the same (on unit points the squared
 * chordal distance is the squared Euclidean one) and the centres returned are the means' directions.
 * Defaults: 10 restarts (scikit-learn's KMeans n_init before 1.4), 50 iterations (our choice), no refinement, the cosine objective. Ties go to the lower index.
 * The dot products (where the time goes) run on pointProducts.ts: WebAssembly SIMD where available, the same bits as the plain kernel.
 */
import { InvalidInputError } from '../errors.js';
import { createRandom, DEFAULT_SEED, type RandomSource } from '../random.js';
import { firstVariation } from './firstVariation.js';
import { PointProducts } from './pointProducts.js';

export interface SphericalKMeansOptions {
  /** @default 10 */
  restarts: number;
  /** Start centres (clusters × dims, unit rows): one run from them, no seeding or restarts. */
  initial?: Float64Array;
  /** @default 50 */
  maxIterations: number;
  /** Sweeps of first-variation moves after each run's Lloyd passes (firstVariation.ts); 0 = none. @default 0 */
  refineSweeps: number;
  /** 'cosine': spherical k-means; 'euclidean': Lloyd's k-means on the same points (see the header). @default 'cosine' */
  objective: KMeansObjective;
  /** @default DEFAULT_SEED */
  seed: number;
}

export type KMeansObjective = 'cosine' | 'euclidean';

export const DEFAULT_SPHERICAL_KMEANS_OPTIONS: Readonly<SphericalKMeansOptions> = Object.freeze({
  restarts: 10,
  maxIterations: 50,
  refineSweeps: 0,
  objective: 'cosine',
  seed: DEFAULT_SEED,
});

export interface Clustering {
  /** Cluster of each point (0…clusters−1). */
  readonly assignment: Int32Array;
  /** clusters × dims unit centres, row-major. */
  readonly centres: Float64Array;
  readonly clusters: number;
  /** The objective maximised: Σ cos(point, its centre), or with 'euclidean' −Σ ‖point − its mean‖². */
  readonly objective: number;
  readonly iterations: number;
}

/** points: n × dims unit vectors, row-major. */
export function sphericalKMeans(
  points: Float64Array,
  n: number,
  dims: number,
  k: number,
  options: Partial<SphericalKMeansOptions> = {},
): Clustering {
  const o = { ...DEFAULT_SPHERICAL_KMEANS_OPTIONS, ...options };
  if (n < 1 || points.length < n * dims) throw new InvalidInputError('k-means needs at least one point');
  if (!Number.isInteger(k) || k < 1) throw new InvalidInputError(`the number of clusters must be a positive whole number, got ${k}`);
  const products = new PointProducts(points, n, dims, o.initial ? o.initial.length / dims : Math.min(k, n));
  const refine = (c: Clustering): Clustering => {
    if (!(o.refineSweeps > 0) || c.clusters < 2 || o.objective !== 'cosine') return c;
    const r = firstVariation(points, n, dims, c.assignment, c.clusters, { maxSweeps: o.refineSweeps }, products);
    return { ...c, assignment: r.assignment, centres: r.centres, objective: r.objective };
  };
  const euclidean = o.objective === 'euclidean';
  if (o.initial) return refine(lloyd(points, n, dims, o.initial, o.maxIterations, products, euclidean));
  const random = createRandom(o.seed);
  let best: Clustering | null = null;
  for (let r = 0; r < Math.max(1, o.restarts); r++) {
    const start = seedCentres(points, n, dims, Math.min(k, n), random, products);
    const run = refine(lloyd(points, n, dims, start, o.maxIterations, products, euclidean));
    if (!best || run.objective > best.objective + 1e-12) best = run;
  }
  return best!;
}

/**
 * Greedy k-means++ seeding on the sphere: each new centre is the best (lowest total weight) of
 * 2 + ⌊ln k⌋ candidates drawn with probability ∝ weight (the local-trials variant Arthur &
 * Vassilvitskii 2007 suggest; the count is scikit-learn's default). Returns fewer centres when
 * every remaining point coincides with a centre.
 */
export function seedCentres(
  points: Float64Array,
  n: number,
  dims: number,
  k: number,
  random: RandomSource,
  products = new PointProducts(points, n, dims, 1),
): Float64Array {
  const chosen = seedPicks(n, k, random, (j, out) => {
    products.timesPoint(j, out);
    for (let i = 0; i < n; i++) out[i] = Math.max(0, 2 - 2 * out[i]);
  });
  const centres = new Float64Array(chosen.length * dims);
  chosen.forEach((p, c) => centres.set(points.subarray(p * dims, (p + 1) * dims), c * dims));
  return centres;
}

/**
 * The seeding loop shared by seedCentres and gramKMeans' seedFromGram: the points chosen as
 * centres, given the squared distances of every point to point j (distancesTo fills out, n long).
 */
export function seedPicks(n: number, k: number, random: RandomSource, distancesTo: (j: number, out: Float64Array) => void): number[] {
  const chosen: number[] = [Math.floor(random.next() * n)];
  const trials = 2 + Math.floor(Math.log(Math.max(1, k)));
  const weight = new Float64Array(n);
  distancesTo(chosen[0], weight);
  const trial = new Float64Array(n);
  const bestTrial = new Float64Array(n);
  while (chosen.length < k) {
    let total = 0;
    for (let i = 0; i < n; i++) total += weight[i];
    if (!(total > 1e-12)) break;
    let bestPotential = Infinity;
    let bestPick = -1;
    for (let t = 0; t < trials; t++) {
      const pick = drawByWeight(weight, total, random.next());
      distancesTo(pick, trial);
      let potential = 0;
      for (let i = 0; i < n; i++) {
        trial[i] = Math.min(weight[i], trial[i]);
        potential += trial[i];
      }
      if (potential < bestPotential) {
        bestPotential = potential;
        bestPick = pick;
        bestTrial.set(trial);
      }
    }
    chosen.push(bestPick);
    weight.set(bestTrial);
  }
  return chosen;
}

/** An index drawn with probability proportional to its weight (`u01` uniform in [0, 1)). */
function drawByWeight(weight: Float64Array, total: number, u01: number): number {
  let u = u01 * total;
  let last = -1;
  for (let i = 0; i < weight.length; i++) {
    if (weight[i] <= 0) continue;
    last = i;
    u -= weight[i];
    if (u < 0) return i;
  }
  return last;
}

/**
 * Lloyd's iteration kept in sums: S = X·Σᵀ (each point's dot product with each cluster's member
 * sum) and Q_c = ‖Σ_c‖², so cos(x_i, centre_c) = S_ic / √Q_c and, for the Euclidean objective,
 * ‖x_i − μ_c‖² = ‖x_i‖² − (2·S_ic/n_c − Q_c/n_c²). After the first passes few points move, and a
 * point moving from cluster a to b changes only columns a and b of S by ±X·x_j, so a pass costs
 * n·dims per moved point instead of n·k·dims (exact up to rounding; the whole table is recomputed
 * when at least k/2 points moved).
 */
function lloyd(
  points: Float64Array,
  n: number,
  dims: number,
  initial: Float64Array,
  maxIterations: number,
  products: PointProducts,
  euclidean: boolean,
): Clustering {
  const k = initial.length / dims;
  const assignment = new Int32Array(n);
  const s = new Float64Array(n * k);
  products.timesCentres(initial, k, s);
  // Score of point i for cluster c: S_ic·scale_c − shift_c (largest wins).
  const scale = new Float64Array(k).fill(euclidean ? 2 : 1);
  const shift = new Float64Array(k);
  if (euclidean) for (let c = 0; c < k; c++) for (let d = 0; d < dims; d++) shift[c] += initial[c * dims + d] ** 2;
  let pointSquares = 0;
  if (euclidean) for (let j = 0; j < n * dims; j++) pointSquares += points[j] * points[j];
  const first = assignFromSums(s, n, k, scale, shift, assignment, null);
  let objective = first.objective;
  const sums = new Float64Array(k * dims);
  const counts = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    const o = assignment[i] * dims;
    counts[assignment[i]]++;
    for (let d = 0; d < dims; d++) sums[o + d] += points[i * dims + d];
  }
  const previous = new Int32Array(n);
  const column = new Float64Array(n);
  let iterations = 0;
  let movedPoints: number[] | null = null;
  while (iterations < maxIterations) {
    iterations++;
    if (movedPoints === null || 2 * movedPoints.length >= k) products.timesCentres(sums, k, s);
    else {
      for (const j of movedPoints) {
        const a = previous[j];
        const b = assignment[j];
        products.timesPoint(j, column);
        for (let i = 0; i < n; i++) {
          s[i * k + a] -= column[i];
          s[i * k + b] += column[i];
        }
      }
    }
    for (let c = 0; c < k; c++) {
      let ss = 0;
      for (let d = 0; d < dims; d++) ss += sums[c * dims + d] ** 2;
      if (!euclidean) scale[c] = ss > 0 ? 1 / Math.sqrt(ss) : 0;
      else {
        scale[c] = counts[c] > 0 ? 2 / counts[c] : 0;
        shift[c] = counts[c] > 0 ? ss / (counts[c] * counts[c]) : 0;
      }
    }
    previous.set(assignment);
    const pass = assignFromSums(s, n, k, scale, shift, assignment, previous);
    objective = pass.objective;
    movedPoints = pass.moved;
    for (const j of movedPoints) {
      const oa = previous[j] * dims;
      const ob = assignment[j] * dims;
      counts[previous[j]]--;
      counts[assignment[j]]++;
      for (let d = 0; d < dims; d++) {
        sums[oa + d] -= points[j * dims + d];
        sums[ob + d] += points[j * dims + d];
      }
    }
    if (movedPoints.length === 0) break;
  }
  if (euclidean) objective -= pointSquares;
  // Clusters left empty (or summing to zero) are dropped and the rest renumbered in order.
  const renumber = new Int32Array(k).fill(-1);
  const centres: number[] = [];
  let kept = 0;
  for (let c = 0; c < k; c++) {
    let ss = 0;
    for (let d = 0; d < dims; d++) ss += sums[c * dims + d] ** 2;
    if (!(ss > 0)) continue;
    const inv = 1 / Math.sqrt(ss);
    for (let d = 0; d < dims; d++) centres.push(sums[c * dims + d] * inv);
    renumber[c] = kept++;
  }
  if (kept === 0) return { assignment: new Int32Array(n), centres: initial.slice(0, dims), clusters: 1, objective, iterations };
  for (let i = 0; i < n; i++) assignment[i] = renumber[assignment[i]];
  return { assignment, centres: Float64Array.from(centres), clusters: kept, objective, iterations };
}

/**
 * Each point to the cluster with the largest S_ic·scale_c − shift_c (clusters with scale 0 are
 * empty and skipped); ties go to the lower cluster. Returns the points that changed cluster
 * (against previous, when given) and the sum of the winning scores.
 */
function assignFromSums(
  s: Float64Array,
  n: number,
  k: number,
  scale: Float64Array,
  shift: Float64Array,
  assignment: Int32Array,
  previous: Int32Array | null,
): { moved: number[]; objective: number } {
  const moved: number[] = [];
  let objective = 0;
  for (let i = 0; i < n; i++) {
    let bestC = 0;
    let bestScore = -Infinity;
    const o = i * k;
    for (let c = 0; c < k; c++) {
      if (scale[c] === 0) continue;
      const v = s[o + c] * scale[c] - shift[c];
      if (v > bestScore) {
        bestScore = v;
        bestC = c;
      }
    }
    if (previous !== null && previous[i] !== bestC) moved.push(i);
    assignment[i] = bestC;
    objective += bestScore;
  }
  return { moved, objective };
}
