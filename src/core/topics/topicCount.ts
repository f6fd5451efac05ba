/**
 * Automatic number of topics: the mean silhouette (Rousseeuw 1987, J. Comput. Appl. Math. 20)
 * of spherical k-means clusterings for each candidate count, on a seeded sample of the points,
 * with cosine distance 1 − cos. The count with the highest mean silhouette wins (ties: fewer).
 * A point alone in its cluster scores 0, as Rousseeuw defines it.
 * Defaults: candidates 2…min(20, ⌈√(n/2)⌉) — k ≈ √(n/2) is a textbook rule of thumb for the
 * number of clusters (Mardia, Kent & Bibby 1979 [M]), used here as the ceiling, and 20 topics is
 * about what one screen can show (our choice); every count up to 10, then every second one (the
 * choice costs a k-means run per candidate); sample 500 points (a 250 000-number distance table);
 * 3 k-means restarts per candidate. The k-means runs work from the sample's table of cosines
 * (gramKMeans.ts), so a candidate costs a few hundred thousand additions per pass. On large text collections the silhouette tends to keep
 * rising with the count, so the ceiling often decides there (see the benchmark notes). Fewer than 3 points, or points with a
 * single direction, give 1 topic. With draws > 1, each draw is an independent seeded sample with
 * its own k-means runs, and the silhouettes of a candidate are averaged over the draws before the
 * best is taken (the first draw is exactly the single-draw run).
 */
import { createRandom, DEFAULT_SEED, type RandomSource } from '../random.js';
import { gramKMeans, gramOf } from './gramKMeans.js';

export interface TopicCountOptions {
  /** @default 2 */
  minTopics: number;
  /** Largest count tried; undefined means min(20, ⌈√(n/2)⌉). */
  maxTopics?: number;
  /** @default 500 */
  sampleSize: number;
  /** k-means restarts per candidate. @default 3 */
  restarts: number;
  /** Lloyd passes per candidate run. @default 50 */
  maxIterations: number;
  /** Independent samples (each with its own k-means runs) whose silhouettes are averaged per candidate. @default 1 */
  draws: number;
  /** @default DEFAULT_SEED */
  seed: number;
}

export const DEFAULT_TOPIC_COUNT_OPTIONS: Readonly<TopicCountOptions> = Object.freeze({
  minTopics: 2,
  sampleSize: 500,
  restarts: 3,
  maxIterations: 50,
  draws: 1,
  seed: DEFAULT_SEED,
});

export interface TopicCountChoice {
  readonly topics: number;
  /** Mean silhouette of each candidate tried (empty when the answer was forced). */
  readonly scores: readonly { readonly topics: number; readonly silhouette: number }[];
  /** Points in the sample the silhouettes were computed on. */
  readonly sampled: number;
}

export function chooseTopicCount(
  points: Float64Array,
  n: number,
  dims: number,
  options: Partial<TopicCountOptions> = {},
): TopicCountChoice {
  const o = { ...DEFAULT_TOPIC_COUNT_OPTIONS, ...options };
  if (n < 3) return { topics: Math.max(0, Math.min(n, 1)), scores: [], sampled: n };
  const random = createRandom(o.seed);
  const draws = Math.max(1, Math.floor(o.draws));
  // Per candidate, the silhouettes of every draw (a candidate stays only while every draw reaches it).
  let table: { topics: number; silhouettes: number[] }[] | null = null;
  let s = 0;
  for (let draw = 0; draw < draws; draw++) {
    const one = drawSilhouettes(points, n, dims, o, random, draw === 0 ? o.seed : random.nextUint32());
    if (one === null) return { topics: 1, scores: [], sampled: Math.min(n, o.sampleSize) };
    s = one.sampled;
    table =
      table === null
        ? one.scores.map((x) => ({ topics: x.topics, silhouettes: [x.silhouette] }))
        : table
            .slice(0, one.scores.length)
            .map((x, i) => ({ topics: x.topics, silhouettes: [...x.silhouettes, one.scores[i].silhouette] }));
  }
  const scores = table!.map((x) => ({ topics: x.topics, silhouette: x.silhouettes.reduce((a, b) => a + b, 0) / x.silhouettes.length }));
  let best = { topics: 1, silhouette: -Infinity };
  for (const x of scores) if (x.silhouette > best.silhouette + 1e-12) best = x;
  return { topics: scores.length > 0 ? best.topics : 1, scores, sampled: s };
}

/**
 * One draw: a seeded sample, and the mean silhouette of the k-means clustering of each candidate
 * count (k-means seeded by kSeed + k); null when the sample has a single direction.
 */
function drawSilhouettes(
  points: Float64Array,
  n: number,
  dims: number,
  o: TopicCountOptions,
  random: RandomSource,
  kSeed: number,
): { scores: { topics: number; silhouette: number }[]; sampled: number } | null {
  // Partial Fisher–Yates: the first s entries of order are a uniform sample, kept in index order.
  const order = Int32Array.from({ length: n }, (_, i) => i);
  const s = Math.min(n, o.sampleSize);
  for (let i = 0; i < s; i++) {
    const j = i + Math.floor(random.next() * (n - i));
    [order[i], order[j]] = [order[j], order[i]];
  }
  const chosen = order.slice(0, s).sort();
  const sample = new Float64Array(s * dims);
  chosen.forEach((p, i) => sample.set(points.subarray(p * dims, (p + 1) * dims), i * dims));
  const gram = gramOf(sample, s, dims);
  const dist = new Float64Array(s * s);
  let spread = 0;
  for (let i = 0; i < s; i++) {
    for (let j = 0; j < s; j++) {
      if (i === j) continue;
      const v = Math.max(0, 1 - gram[i * s + j]);
      dist[i * s + j] = v;
      spread = Math.max(spread, v);
    }
  }
  if (!(spread > 1e-9)) return null;
  const upper = Math.min(o.maxTopics ?? Math.min(20, Math.ceil(Math.sqrt(n / 2))), s - 1);
  const scores: { topics: number; silhouette: number }[] = [];
  for (let k = Math.max(2, o.minTopics); k <= upper; k += k < 10 ? 1 : 2) {
    const c = gramKMeans(gram, s, k, { restarts: o.restarts, maxIterations: o.maxIterations, seed: kSeed + k });
    if (c.clusters < k) break; // fewer distinct directions than k: larger k cannot do better
    scores.push({ topics: k, silhouette: meanSilhouette(dist, s, c.assignment, c.clusters) });
  }
  return { scores, sampled: s };
}

/** Mean silhouette of a labelling from a full s × s distance table. */
export function meanSilhouette(dist: Float64Array, s: number, labels: Int32Array, k: number): number {
  const size = new Int32Array(k);
  for (let i = 0; i < s; i++) size[labels[i]]++;
  const sums = new Float64Array(k);
  let total = 0;
  for (let i = 0; i < s; i++) {
    sums.fill(0);
    for (let j = 0; j < s; j++) sums[labels[j]] += dist[i * s + j];
    const own = labels[i];
    if (size[own] <= 1) continue; // singleton: silhouette 0
    const a = sums[own] / (size[own] - 1);
    let b = Infinity;
    for (let c = 0; c < k; c++) if (c !== own && size[c] > 0) b = Math.min(b, sums[c] / size[c]);
    const m = Math.max(a, b);
    total += m > 0 && Number.isFinite(b) ? (b - a) / m : 0;
  }
  return total / s;
}
