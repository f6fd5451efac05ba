/**
 * Test data with known structure and the neighbourhood measures the map tests use. These are
 * written independently of src/core/map (plain arrays, sorting, ml-matrix's SVD) so they can
 * check it from outside.
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { createRandom } from '../../../src/core/random.js';

export interface Points {
  readonly n: number;
  readonly dim: number;
  readonly data: Float32Array;
}

/** Random orthonormal rows (Gram–Schmidt on Gaussian vectors): count×dim. */
export function orthonormalRows(count: number, dim: number, seed: number): number[][] {
  const rng = createRandom(seed);
  const rows: number[][] = [];
  while (rows.length < count) {
    const v = Array.from({ length: dim }, () => rng.normal());
    for (const r of rows) {
      const d = v.reduce((s, x, i) => s + x * r[i], 0);
      for (let i = 0; i < dim; i++) v[i] -= d * r[i];
    }
    const norm = Math.hypot(...v);
    if (norm > 1e-6) rows.push(v.map((x) => x / norm));
  }
  return rows;
}

/**
 * The Swiss roll of Tenenbaum, de Silva & Langford (2000): (t·cos t, h, t·sin t) with
 * t ∈ [1.5π, 4.5π], h ∈ [0, 21] (the common parametrisation, e.g. scikit-learn's make_swiss_roll),
 * placed by a random orthonormal map into `dim` dimensions with a constant offset along a further
 * orthogonal direction. The offset keeps the roll away from the origin, so the unit normalisation
 * the map applies (cosine geometry) is a smooth central projection that keeps its shape.
 */
export function swissRoll(n: number, dim: number, seed: number, offset = 60): Points & { t: Float64Array; h: Float64Array } {
  const rng = createRandom(seed);
  const frame = orthonormalRows(4, dim, seed + 1);
  const data = new Float32Array(n * dim);
  const t = new Float64Array(n);
  const h = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = 1.5 * Math.PI * (1 + 2 * rng.next());
    h[i] = 21 * rng.next();
    const p = [t[i] * Math.cos(t[i]), h[i] - 10.5, t[i] * Math.sin(t[i]), offset];
    for (let d = 0; d < dim; d++) data[i * dim + d] = p[0] * frame[0][d] + p[1] * frame[1][d] + p[2] * frame[2][d] + p[3] * frame[3][d];
  }
  return { n, dim, data, t, h };
}

/** Well-separated Gaussian clusters around random non-negative unit centres, rows unit length. */
export function clusters(perCluster: number, count: number, dim: number, spread: number, seed: number): Points & { labels: Int32Array } {
  const rng = createRandom(seed);
  const centres = Array.from({ length: count }, () => {
    const c = Array.from({ length: dim }, () => Math.abs(rng.normal()) ** 3);
    const norm = Math.hypot(...c);
    return c.map((x) => x / norm);
  });
  const n = perCluster * count;
  const data = new Float32Array(n * dim);
  const labels = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const c = i % count;
    labels[i] = c;
    const v = centres[c].map((x) => x + spread * rng.normal());
    const norm = Math.hypot(...v);
    for (let d = 0; d < dim; d++) data[i * dim + d] = v[d] / norm;
  }
  return { n, dim, data, labels };
}

function unitRows(p: Points): number[][] {
  return Array.from({ length: p.n }, (_, i) => {
    const row = Array.from(p.data.subarray(i * p.dim, (i + 1) * p.dim));
    const norm = Math.hypot(...row);
    return norm > 0 ? row.map((x) => x / norm) : row;
  });
}

function euclid(a: readonly number[], b: readonly number[]): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] - b[i]) ** 2;
  return Math.sqrt(s);
}

/** For each point, all other points sorted by distance (ties by index). */
function neighbourOrder(rows: number[][]): number[][] {
  return rows.map((r, i) =>
    rows
      .map((s, j) => [euclid(r, s), j] as const)
      .filter(([, j]) => j !== i)
      .sort((a, b) => a[0] - b[0] || a[1] - b[1])
      .map(([, j]) => j),
  );
}

function layoutRows(x: ArrayLike<number>, y: ArrayLike<number>): number[][] {
  return Array.from({ length: x.length }, (_, i) => [x[i], y[i]]);
}

/**
 * Trustworthiness (Venna & Kaski 2001): 1 − 2/(n·k·(2n − 3k − 1)) · Σ_i Σ_{j ∈ U_k(i)} (r(i, j) − k),
 * where U_k(i) are the map's k nearest neighbours of i that are not among its k nearest in the
 * input space (cosine geometry: unit rows), and r(i, j) is j's rank around i in the input space.
 * 1 means no false neighbours on the map.
 */
export function trustworthiness(p: Points, x: ArrayLike<number>, y: ArrayLike<number>, k: number): number {
  const n = p.n;
  const high = neighbourOrder(unitRows(p));
  const low = neighbourOrder(layoutRows(x, y));
  let penalty = 0;
  for (let i = 0; i < n; i++) {
    const rank = new Int32Array(n);
    high[i].forEach((j, r) => (rank[j] = r + 1));
    for (const j of low[i].slice(0, k)) if (rank[j] > k) penalty += rank[j] - k;
  }
  return 1 - (2 / (n * k * (2 * n - 3 * k - 1))) * penalty;
}

/** Mean share of each point's k input-space neighbours that are also its k map neighbours. */
export function knnOverlap(p: Points, x: ArrayLike<number>, y: ArrayLike<number>, k: number): number {
  const high = neighbourOrder(unitRows(p));
  const low = neighbourOrder(layoutRows(x, y));
  let hits = 0;
  for (let i = 0; i < p.n; i++) {
    const h = new Set(high[i].slice(0, k));
    for (const j of low[i].slice(0, k)) if (h.has(j)) hits++;
  }
  return hits / (p.n * k);
}

/**
 * Procrustes disparity as scipy.spatial.procrustes defines it: centre both configurations, scale
 * each to unit Frobenius norm, find the optimal orthogonal map and scale (SVD of AᵀB), and return
 * the remaining sum of squared differences, 1 − (Σ singular values)², in [0, 1].
 */
export function procrustesDisparity(ax: ArrayLike<number>, ay: ArrayLike<number>, bx: ArrayLike<number>, by: ArrayLike<number>): number {
  const std = (x: ArrayLike<number>, y: ArrayLike<number>): Matrix => {
    const n = x.length;
    const mx = Array.from(x).reduce((s, v) => s + v, 0) / n;
    const my = Array.from(y).reduce((s, v) => s + v, 0) / n;
    const m = new Matrix(n, 2);
    let ss = 0;
    for (let i = 0; i < n; i++) {
      m.set(i, 0, x[i] - mx);
      m.set(i, 1, y[i] - my);
      ss += (x[i] - mx) ** 2 + (y[i] - my) ** 2;
    }
    return m.div(Math.sqrt(ss));
  };
  const a = std(ax, ay);
  const b = std(bx, by);
  const svd = new SingularValueDecomposition(a.transpose().mmul(b));
  const trace = svd.diagonal.reduce((s, v) => s + v, 0);
  return 1 - trace * trace;
}
