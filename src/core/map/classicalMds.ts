/**
 * Classical (Torgerson–Gower) multidimensional scaling (Torgerson 1952; Gower 1966): double-centre
 * the squared distances, B = −½·J·Δ·J with J = I − 11ᵀ/n, and take coordinates √λ_i·v_i from B's
 * largest eigenpairs. For Euclidean distances this recovers the configuration up to rotation,
 * reflection and translation. Dimensions whose eigenvalue is not positive (below 1e-9 of the
 * largest) get zero coordinates.
 *
 * Also the distance-based triangulation of landmark MDS (de Silva & Tenenbaum, "Sparse
 * multidimensional scaling using landmark points", 2004): a point with squared distances δ to the
 * landmarks lands at x = −½·L#·(δ − δ̄), where L#'s rows are v_iᵀ/√λ_i and δ̄ holds the mean
 * squared distance from each landmark to the others (the same formula as Gower's 1968 adding-a-point).
 */
import { InvalidInputError } from '../errors.js';
import { DEFAULT_TOP_EIGEN_OPTIONS, topEigenpairs, type TopEigenOptions } from './topEigen.js';

/** Relative size below which an eigenvalue is treated as zero: 10× the eigen-solver's default tolerance. */
const FLAT_AXIS_TOLERANCE = 1e-9;

export interface ClassicalMdsOptions {
  /** @default 2 */
  readonly dimensions: number;
  readonly eigen: TopEigenOptions;
}

export const DEFAULT_CLASSICAL_MDS_OPTIONS: ClassicalMdsOptions = { dimensions: 2, eigen: DEFAULT_TOP_EIGEN_OPTIONS };

export interface ClassicalMdsResult {
  readonly n: number;
  readonly dimensions: number;
  /** n×dimensions, row-major. */
  readonly coords: Float64Array;
  /** Eigenvalues of B used for each dimension, largest first (may be ≤ 0: that axis is flat). */
  readonly eigenvalues: Float64Array;
  /** dimensions×n: v_iᵀ/√λ_i, or zeros where λ_i ≤ 0. */
  readonly pseudoInverse: Float64Array;
  /** Mean of each column of the squared distance matrix (δ̄). */
  readonly meanSquared: Float64Array;
}

/** squared: n×n symmetric matrix of squared distances. */
export function classicalMds(squared: Float64Array, n: number, options: Partial<ClassicalMdsOptions> = {}): ClassicalMdsResult {
  const opts = { ...DEFAULT_CLASSICAL_MDS_OPTIONS, ...options };
  const d = opts.dimensions;
  if (squared.length !== n * n) throw new InvalidInputError(`expected ${n}×${n} squared distances, got ${squared.length}`);
  if (n < 1) throw new InvalidInputError('classical MDS needs at least one point');
  const meanSquared = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) {
      const v = squared[i * n + j];
      if (!Number.isFinite(v)) throw new InvalidInputError(`squared distance (${i}, ${j}) is not finite`);
      s += v;
    }
    meanSquared[i] = s / n;
  }
  let grand = 0;
  for (let i = 0; i < n; i++) grand += meanSquared[i];
  grand /= n;
  const b = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      b[i * n + j] = -0.5 * (squared[i * n + j] - meanSquared[i] - meanSquared[j] + grand);
    }
  }
  const eig = topEigenpairs(b, n, d, opts.eigen);
  const coords = new Float64Array(n * d);
  const eigenvalues = new Float64Array(d);
  const pseudoInverse = new Float64Array(d * n);
  // Eigenvalues within rounding of zero (relative to the largest) count as zero: a flat axis.
  const floor = FLAT_AXIS_TOLERANCE * Math.abs(eig.values[0] ?? 0);
  for (let r = 0; r < Math.min(d, eig.values.length); r++) {
    const lambda = eig.values[r];
    eigenvalues[r] = lambda;
    if (!(lambda > floor)) continue;
    const root = Math.sqrt(lambda);
    for (let i = 0; i < n; i++) {
      const v = eig.vectors[r * n + i];
      coords[i * d + r] = root * v;
      pseudoInverse[r * n + i] = v / root;
    }
  }
  return { n, dimensions: d, coords, eigenvalues, pseudoInverse, meanSquared };
}

/**
 * Place one point from its squared distances to the MDS points (distance-based triangulation).
 * squaredToLandmarks has mds.n entries; the result goes to out (mds.dimensions numbers).
 */
export function triangulate(mds: ClassicalMdsResult, squaredToLandmarks: ArrayLike<number>, out: Float64Array): Float64Array {
  const { n, dimensions, pseudoInverse, meanSquared } = mds;
  for (let r = 0; r < dimensions; r++) {
    let s = 0;
    const o = r * n;
    for (let l = 0; l < n; l++) s += pseudoInverse[o + l] * (squaredToLandmarks[l] - meanSquared[l]);
    out[r] = -0.5 * s;
  }
  return out;
}
