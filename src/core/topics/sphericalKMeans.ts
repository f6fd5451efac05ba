/**
 * Spherical k-means (Dhillon & Modha 2001, Machine Learning 42:143–175): cluster unit vectors by
 * cosine. Each centre is the normalised sum of its members ("concept vector"); each point joins
 * the centre with the largest cosine; repeat until no point moves or maxIterations.
 * Seeding: greedy k-means++ (Arthur & Vassilvitskii 2007) with the squared chordal distance
 * ‖x − μ‖² = 2(1 − cos) as the sampling weight, from the seeded random source. Several seeded
 * restarts keep the one with the largest total cosine; a caller may instead give start centres. If fewer than K distinct directions exist
 * (say, a thousand identical files) seeding stops early and fewer clusters come back.
 * Defaults: 10 restarts (scikit-learn's KMeans n_init before 1.4), 50 iterations (our choice). Ties go to the lower index.
 */
import { InvalidInputError } from '../errors.js';
import { createRandom, DEFAULT_SEED, type RandomSource } from '../random.js';

export interface SphericalKMeansOptions {
  /** @default 10 */
  restarts: number;
  /** Start centres (clusters × dims, unit rows): one run from them, no seeding or restarts. */
  initial?: Float64Array;
  /** @default 50 */
  maxIterations: number;
  /** @default DEFAULT_SEED */
  seed: number;
}

export const DEFAULT_SPHERICAL_KMEANS_OPTIONS: Readonly<SphericalKMeansOptions> = Object.freeze({
  restarts: 10,
  maxIterations: 50,
  seed: DEFAULT_SEED,
});

export interface Clustering {
  /** Cluster of each point (0…clusters−1). */
  readonly assignment: Int32Array;
  /** clusters × dims unit centres, row-major. */
  readonly centres: Float64Array;
  readonly clusters: number;
  /** Σ cos(point, its centre): the objective maximised. */
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
  if (o.initial) return lloyd(points, n, dims, o.initial, o.maxIterations);
  const random = createRandom(o.seed);
  let best: Clustering | null = null;
  for (let r = 0; r < Math.max(1, o.restarts); r++) {
    const run = lloyd(points, n, dims, seedCentres(points, n, dims, Math.min(k, n), random), o.maxIterations);
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
export function seedCentres(points: Float64Array, n: number, dims: number, k: number, random: RandomSource): Float64Array {
  const chosen: number[] = [Math.floor(random.next() * n)];
  const trials = 2 + Math.floor(Math.log(Math.max(1, k)));
  const weight = new Float64Array(n);
  for (let i = 0; i < n; i++) weight[i] = chordSquared(points, i, chosen[0], dims);
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
      let potential = 0;
      for (let i = 0; i < n; i++) {
        trial[i] = Math.min(weight[i], chordSquared(points, i, pick, dims));
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
  const centres = new Float64Array(chosen.length * dims);
  chosen.forEach((p, c) => centres.set(points.subarray(p * dims, (p + 1) * dims), c * dims));
  return centres;
}

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

/** ‖x_i − x_j‖² = 2 − 2·cos for unit vectors (clamped at 0). */
function chordSquared(points: Float64Array, i: number, j: number, dims: number): number {
  return Math.max(0, 2 - 2 * dot(points, i, points, j, dims));
}

function lloyd(points: Float64Array, n: number, dims: number, initial: Float64Array, maxIterations: number): Clustering {
  let centres = initial;
  const assignment = new Int32Array(n).fill(-1);
  let iterations = 0;
  let objective = assign(points, n, dims, centres, assignment).objective;
  while (iterations < maxIterations) {
    iterations++;
    centres = updateCentres(points, n, dims, centres.length / dims, assignment);
    const pass = assign(points, n, dims, centres, assignment);
    objective = pass.objective;
    if (pass.moved === 0) break;
  }
  return { assignment, centres, clusters: centres.length / dims, objective, iterations };
}

/** Each point to its nearest centre by cosine; returns how many points changed cluster. */
function assign(
  points: Float64Array,
  n: number,
  dims: number,
  centres: Float64Array,
  assignment: Int32Array,
): { moved: number; objective: number } {
  const k = centres.length / dims;
  let moved = 0;
  let objective = 0;
  for (let i = 0; i < n; i++) {
    let bestC = 0;
    let bestCos = -Infinity;
    const o = i * dims;
    for (let c = 0; c < k; c++) {
      // Inlined dot product: this loop is where k-means spends its time.
      let v = 0;
      const oc = c * dims;
      let d = 0;
      for (; d + 3 < dims; d += 4) {
        v +=
          points[o + d] * centres[oc + d] +
          points[o + d + 1] * centres[oc + d + 1] +
          points[o + d + 2] * centres[oc + d + 2] +
          points[o + d + 3] * centres[oc + d + 3];
      }
      for (; d < dims; d++) v += points[o + d] * centres[oc + d];
      if (v > bestCos) {
        bestCos = v;
        bestC = c;
      }
    }
    if (assignment[i] !== bestC) moved++;
    assignment[i] = bestC;
    objective += bestCos;
  }
  return { moved, objective };
}

/** Normalised member sums; clusters left empty (or summing to zero) are dropped. */
function updateCentres(points: Float64Array, n: number, dims: number, k: number, assignment: Int32Array): Float64Array {
  const sums = new Float64Array(k * dims);
  for (let i = 0; i < n; i++) {
    const o = assignment[i] * dims;
    for (let d = 0; d < dims; d++) sums[o + d] += points[i * dims + d];
  }
  let kept = 0;
  for (let c = 0; c < k; c++) {
    let ss = 0;
    for (let d = 0; d < dims; d++) ss += sums[c * dims + d] ** 2;
    if (!(ss > 0)) continue;
    const inv = 1 / Math.sqrt(ss);
    for (let d = 0; d < dims; d++) sums[kept * dims + d] = sums[c * dims + d] * inv;
    kept++;
  }
  return sums.slice(0, Math.max(1, kept) * dims);
}

function dot(a: Float64Array, i: number, b: Float64Array, j: number, dims: number): number {
  let s = 0;
  const oa = i * dims;
  const ob = j * dims;
  for (let d = 0; d < dims; d++) s += a[oa + d] * b[ob + d];
  return s;
}
