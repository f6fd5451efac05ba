/**
 * Spherical k-means (Dhillon & Modha 2001, Machine Learning 42:143–175) computed from the table of
 * cosines between the points (the Gram table G = X·Xᵀ of unit vectors) instead of the vectors:
 * the kernel form of k-means (Dhillon, Guan & Kulis 2004, "Kernel k-means, spectral clustering
 * and normalized cuts", KDD). A centre is the normalised member sum, so with S_ic = Σ_{j∈c} G_ij
 * and Q_c = Σ_{j∈c} S_jc = ‖Σ_{j∈c} x_j‖², cos(x_i, centre_c) = S_ic / √Q_c. A Lloyd pass costs n²
 * additions whatever the number of clusters and dimensions (and 2n per point that moves, once
 * the first pass has filled S), and k-means++ seeding reads the table,
 * which makes the many small runs of the topic-count choice (topicCount.ts, a few hundred sampled
 * points, every candidate count, several restarts) cheap; the result is the vector form's
 * (sphericalKMeans.ts) up to rounding, with the same seeding, restarts and stopping rule.
 */
import { InvalidInputError } from '../errors.js';
import { createRandom, type RandomSource } from '../random.js';
import { PointProducts } from './pointProducts.js';
import { DEFAULT_SPHERICAL_KMEANS_OPTIONS, seedPicks, type SphericalKMeansOptions } from './sphericalKMeans.js';

export interface GramClustering {
  /** Cluster of each point (0…clusters−1). */
  readonly assignment: Int32Array;
  readonly clusters: number;
  /** Σ cos(point, its centre): the objective maximised. */
  readonly objective: number;
  readonly iterations: number;
}

/** gram: n × n cosines of unit vectors, row-major (the diagonal holds ones). */
export function gramKMeans(
  gram: Float64Array,
  n: number,
  k: number,
  options: Partial<Omit<SphericalKMeansOptions, 'initial' | 'refineSweeps'>> = {},
): GramClustering {
  const o = { ...DEFAULT_SPHERICAL_KMEANS_OPTIONS, ...options };
  if (n < 1 || gram.length < n * n) throw new InvalidInputError('k-means needs at least one point');
  if (!Number.isInteger(k) || k < 1) throw new InvalidInputError(`the number of clusters must be a positive whole number, got ${k}`);
  const random = createRandom(o.seed);
  const scratch = new Float64Array(n * Math.min(k, n));
  let best: GramClustering | null = null;
  for (let r = 0; r < Math.max(1, o.restarts); r++) {
    const run = lloydGram(gram, n, seedFromGram(gram, n, Math.min(k, n), random), o.maxIterations, scratch);
    if (!best || run.objective > best.objective + 1e-12) best = run;
  }
  return best!;
}

/**
 * Greedy k-means++ seeding (Arthur & Vassilvitskii 2007) with the squared chordal distance
 * 2 − 2·cos, 2 + ⌊ln k⌋ local trials per centre, as sphericalKMeans.ts seeds: the chosen points.
 */
export function seedFromGram(gram: Float64Array, n: number, k: number, random: RandomSource): number[] {
  return seedPicks(n, k, random, (j, out) => {
    for (let i = 0; i < n; i++) out[i] = Math.max(0, 2 - 2 * gram[j * n + i]);
  });
}

function lloydGram(gram: Float64Array, n: number, seeds: readonly number[], maxIterations: number, scratch: Float64Array): GramClustering {
  const k = seeds.length;
  const assignment = new Int32Array(n);
  let objective = 0;
  // First assignment: the centres are the seed points themselves.
  for (let i = 0; i < n; i++) {
    let bestC = 0;
    let bestCos = -Infinity;
    for (let c = 0; c < k; c++) {
      const v = gram[i * n + seeds[c]];
      if (v > bestCos) {
        bestCos = v;
        bestC = c;
      }
    }
    assignment[i] = bestC;
    objective += bestCos;
  }
  // S_ic = Σ_{j∈c} G_ij, in full once, then by the rows of the points that move (G is symmetric).
  const s = scratch.subarray(0, n * k);
  s.fill(0);
  for (let i = 0; i < n; i++) {
    const row = i * n;
    const base = i * k;
    for (let j = 0; j < n; j++) s[base + assignment[j]] += gram[row + j];
  }
  const norm = new Float64Array(k);
  const previous = new Int32Array(n);
  let iterations = 0;
  while (iterations < maxIterations) {
    iterations++;
    norm.fill(0);
    for (let j = 0; j < n; j++) norm[assignment[j]] += s[j * k + assignment[j]];
    for (let c = 0; c < k; c++) norm[c] = norm[c] > 0 ? 1 / Math.sqrt(norm[c]) : 0;
    previous.set(assignment);
    const moved: number[] = [];
    objective = 0;
    for (let i = 0; i < n; i++) {
      let bestC = 0;
      let bestCos = -Infinity;
      const base = i * k;
      for (let c = 0; c < k; c++) {
        if (norm[c] === 0) continue; // empty cluster
        const v = s[base + c] * norm[c];
        if (v > bestCos) {
          bestCos = v;
          bestC = c;
        }
      }
      if (previous[i] !== bestC) moved.push(i);
      assignment[i] = bestC;
      objective += bestCos;
    }
    if (moved.length === 0) break;
    for (const j of moved) {
      const a = previous[j];
      const b = assignment[j];
      const row = j * n;
      for (let i = 0; i < n; i++) {
        const g = gram[row + i];
        s[i * k + a] -= g;
        s[i * k + b] += g;
      }
    }
  }
  // Clusters left empty are dropped and the rest renumbered in order.
  const size = new Int32Array(k);
  for (let i = 0; i < n; i++) size[assignment[i]]++;
  const renumber = new Int32Array(k).fill(-1);
  let clusters = 0;
  for (let c = 0; c < k; c++) if (size[c] > 0) renumber[c] = clusters++;
  for (let i = 0; i < n; i++) assignment[i] = renumber[assignment[i]];
  return { assignment, clusters, objective, iterations };
}

/**
 * The n × n table of dot products of n rows of dims numbers (row-major), symmetric: entry (i, j)
 * is Σ_d x_i[d]·x_j[d] summed over d in order, so (j, i) has the same bits. On the SIMD product
 * (pointProducts.ts) where available: the whole table, twice the multiply-adds of one triangle,
 * and still 2.5–3× less CPU time on 150 × 289 and 500 × 195 samples (our measurement, loaded
 * machine); else one triangle by plain loops, mirrored. The same bits either way.
 */
export function gramOf(points: Float64Array, n: number, dims: number): Float64Array {
  const g = new Float64Array(n * n);
  const products = new PointProducts(points, n, dims, n);
  if (products.simd) {
    products.timesCentres(points, n, g);
    return g;
  }
  for (let i = 0; i < n; i++) {
    const oi = i * dims;
    for (let j = i; j < n; j++) {
      const oj = j * dims;
      let v = 0;
      for (let d = 0; d < dims; d++) v += points[oi + d] * points[oj + d];
      g[i * n + j] = v;
      g[j * n + i] = v;
    }
  }
  return g;
}
