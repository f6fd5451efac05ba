/**
 * How many sub-topics each topic of one level of the tree opens into, when the level's count is
 * shared out among its topics rather than chosen for each topic alone.
 * Each topic's dispersion curve: the spherical k-means loss Σ (1 − cos(file, its centre)) of its
 * files for 1…maxK clusters (Dhillon & Modha 2001; exact for one cluster, for more from a seeded
 * sample of at most sampleSize files, scaled to the topic's size, and made non-increasing). The
 * extra sub-topics then go one at a time to the topic whose loss falls most by one more
 * (marginal analysis, Fox 1966, "Discrete optimization via marginal analysis", Management
 * Science 13:210–216: optimal for convex decreasing curves), which is the level's k-means loss
 * made as small as the tree allows, step by step, at a given count.
 * Defaults (our choice, as the splits': topics.ts SPLIT_SAMPLE, SPLIT_PASSES): sample 150 files,
 * one restart, 15 Lloyd passes per count.
 */
import { createRandom } from '../random.js';
import { sphericalKMeans } from './sphericalKMeans.js';

export interface DispersionOptions {
  /** @default 150 */
  sampleSize: number;
  /** @default 1 */
  restarts: number;
  /** @default 15 */
  maxIterations: number;
  seed: number;
}

export const DEFAULT_DISPERSION_OPTIONS: Readonly<Omit<DispersionOptions, 'seed'>> = Object.freeze({
  sampleSize: 150,
  restarts: 1,
  maxIterations: 15,
});

/**
 * loss[k − 1] for k = 1…maxK: the topic's spherical k-means loss with k clusters (non-increasing).
 * idx: the topic's rows of points (unit vectors, row-major, dims wide).
 */
export function dispersionCurve(
  points: Float64Array,
  idx: ArrayLike<number>,
  dims: number,
  maxK: number,
  options: Partial<DispersionOptions> & { seed: number },
): Float64Array {
  const o = { ...DEFAULT_DISPERSION_OPTIONS, ...options };
  const m = idx.length;
  const top = Math.max(1, Math.min(maxK, m));
  const out = new Float64Array(top);
  const sum = new Float64Array(dims);
  for (let j = 0; j < m; j++) for (let d = 0; d < dims; d++) sum[d] += points[idx[j] * dims + d];
  let ss = 0;
  for (let d = 0; d < dims; d++) ss += sum[d] * sum[d];
  out[0] = Math.max(0, m - Math.sqrt(ss));
  if (top === 1) return out;
  const s = Math.min(m, o.sampleSize);
  const pick = Int32Array.from({ length: m }, (_, j) => j);
  const random = createRandom(o.seed);
  if (s < m)
    for (let j = 0; j < s; j++) {
      const r = j + Math.floor(random.next() * (m - j));
      [pick[j], pick[r]] = [pick[r], pick[j]];
    }
  const chosen = pick.slice(0, s).sort();
  const sample = new Float64Array(s * dims);
  chosen.forEach((j, i) => sample.set(points.subarray(idx[j] * dims, (idx[j] + 1) * dims), i * dims));
  const scale = m / s;
  for (let k = 2; k <= top; k++) {
    const c = sphericalKMeans(sample, s, dims, Math.min(k, s), {
      seed: (o.seed + k) >>> 0,
      restarts: o.restarts,
      maxIterations: o.maxIterations,
    });
    out[k - 1] = Math.min(out[k - 2], Math.max(0, (s - c.objective) * scale));
  }
  return out;
}

/**
 * Clusters per topic (each at least 1, topic t at most curves[t].length) adding up to at most
 * `total`: start from one each and give each further cluster to the topic whose loss falls most
 * (ties: the earlier topic). Stops early when no topic can take more or none would gain.
 */
export function allocateClusters(curves: readonly Float64Array[], total: number): Int32Array {
  const k = new Int32Array(curves.length).fill(1);
  for (let left = total - curves.length; left > 0; left--) {
    let best = -1;
    let gain = 1e-12;
    for (let t = 0; t < curves.length; t++) {
      if (k[t] >= curves[t].length) continue;
      const g = curves[t][k[t] - 1] - curves[t][k[t]];
      if (g > gain) {
        gain = g;
        best = t;
      }
    }
    if (best < 0) break;
    k[best]++;
  }
  return k;
}

/** A curve whose falls are m/2, m/3, …: shared out by it, each further cluster goes to the topic whose clusters would be largest on average (D'Hondt's divisors). */
export function sizeCurve(m: number, maxK: number): Float64Array {
  const out = new Float64Array(Math.max(1, Math.min(maxK, m)));
  for (let k = 1; k < out.length; k++) out[k] = out[k - 1] - m / (k + 1);
  return out;
}
