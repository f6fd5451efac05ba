/**
 * Topics of an index, each explained by real terms and real files.
 *
 * 1. Group the files' unit concept vectors by spherical k-means (sphericalKMeans.ts); the number
 *    of topics is chosen by mean silhouette (topicCount.ts) unless the caller gives it.
 * 2. CUR of the weighted file × term matrix (cur.ts, deterministic DEIM by default) picks actual
 *    files (rows) and actual terms (columns) that span its leading concepts.
 * 3. Each topic's signature terms: among its 3N most distinctive terms (mean weight inside the
 *    topic minus mean weight outside), those CUR picked come first, then the others, N in all.
 *    Its exemplar files: among its 3F members closest to its centre, CUR's picks first, then the
 *    others, F in all. Every term and file says whether CUR picked it.
 * Files without any model term have a zero concept vector and are listed as unplaced.
 * Defaults: 8 terms and 5 files per topic (our choice); CUR rank min(20, max(10, topics)) as
 * a rank of 10–20 keeps the picks few enough to read (our choice); CUR terms max(2·rank, 8·topics)
 * so every topic has picks to draw on (our choice); files 2·rank (our choice, as in cur.ts).
 */
import { EmptyCorpusError, InvalidInputError } from '../errors.js';
import type { LsiIndex } from '../index/lsiIndex.js';
import { createRandom, DEFAULT_SEED } from '../random.js';
import { curDecomposition, type CurMethod } from './cur.js';
import { leadingFactors, weightedMatrix } from './indexMatrix.js';
import { sphericalKMeans, type Clustering } from './sphericalKMeans.js';
import { chooseTopicCount, type TopicCountChoice } from './topicCount.js';
import { rankWithPicks, termContrast } from './topicSignature.js';

export interface TopicsOptions {
  /** Number of topics; undefined chooses it automatically. */
  topics?: number;
  /** Largest count the automatic choice tries (see topicCount.ts). */
  maxTopics?: number;
  /** @default 8 */
  termsPerTopic: number;
  /** @default 5 */
  filesPerTopic: number;
  /** @default 'deim' */
  curMethod: CurMethod;
  /** CUR rank; undefined means min(20, max(10, topics)). */
  curRank?: number;
  /** Above this many files, k-means is fitted on a seeded sample of this size, then refined on all. @default 2000 */
  fitSample: number;
  /** @default DEFAULT_SEED */
  seed: number;
  /** Readable word for a stem (e.g. SurfaceForms.wordFor); identity when absent. */
  wordFor?: (stem: string) => string;
}

export const DEFAULT_TOPICS_OPTIONS: Readonly<TopicsOptions> = Object.freeze({ termsPerTopic: 8, filesPerTopic: 5, curMethod: 'deim', fitSample: 2000, seed: DEFAULT_SEED });

export interface TopicTerm {
  /** The index term (a stem when stemming is on). */
  readonly term: string;
  /** A readable form of the term. */
  readonly word: string;
  /** Mean weight inside the topic minus mean weight outside. */
  readonly weight: number;
  /** True when CUR picked this term. */
  readonly picked: boolean;
}

export interface TopicFile {
  readonly path: string;
  /** Cosine of the file's concept vector with the topic centre. */
  readonly similarity: number;
  readonly picked: boolean;
}

export interface Topic {
  readonly id: number;
  readonly size: number;
  /** Mean cosine of the members with the centre (1 = all alike). */
  readonly cohesion: number;
  readonly terms: readonly TopicTerm[];
  readonly files: readonly TopicFile[];
  /** Every member, closest to the centre first. */
  readonly members: readonly string[];
}

export interface TopicsReport {
  /** Largest first. */
  readonly topics: readonly Topic[];
  /** Files without any term the model knows (no concept vector). */
  readonly unplaced: readonly string[];
  readonly count: TopicCountChoice & { readonly chosen: 'auto' | 'given' };
  readonly cur: {
    readonly method: CurMethod;
    readonly rank: number;
    readonly files: number;
    readonly terms: number;
    /** ‖A − CUR‖_F / ‖A − A_k‖_F (null when A has rank ≤ k). */
    readonly errorRatio: number | null;
  };
}

export function findTopics(index: LsiIndex, options: Partial<TopicsOptions> = {}): TopicsReport {
  const o = { ...DEFAULT_TOPICS_OPTIONS, ...options };
  if (o.topics !== undefined && (!Number.isInteger(o.topics) || o.topics < 1)) throw new InvalidInputError(`the number of topics must be a positive whole number, got ${o.topics}`);
  const im = weightedMatrix(index);
  const dims = index.k;
  const all = index.vectors();
  const placed: number[] = [];
  const unplaced: string[] = [];
  im.slots.forEach((slot, row) => {
    let ss = 0;
    for (let c = 0; c < dims; c++) ss += all[slot * dims + c] ** 2;
    if (ss > 0) placed.push(row);
    else unplaced.push(im.paths[row]);
  });
  const n = placed.length;
  if (n === 0) throw new EmptyCorpusError('No file has a word the index knows, so there are no topics to find.');
  const points = new Float64Array(n * dims);
  placed.forEach((row, i) => {
    for (let c = 0; c < dims; c++) points[i * dims + c] = all[im.slots[row] * dims + c];
  });
  const choice: TopicCountChoice =
    o.topics !== undefined ? { topics: Math.min(o.topics, n), scores: [], sampled: 0 } : chooseTopicCount(points, n, dims, { maxTopics: o.maxTopics, seed: o.seed });
  const clustering = clusterPoints(points, n, dims, Math.max(1, choice.topics), o.fitSample, o.seed);
  const K = clustering.clusters;

  const rank = Math.max(1, Math.min(o.curRank ?? Math.min(20, Math.max(10, K)), im.matrix.rows, im.matrix.cols));
  const cur = curDecomposition(
    im.matrix,
    { rank, method: o.curMethod, seed: o.seed, rowCount: 2 * rank, columnCount: Math.max(2 * rank, 8 * K) },
    leadingFactors(index, im, rank, o.seed),
  );
  const pickedRows = new Set(cur.rows.indices);
  const pickedTerms = new Set(cur.columns.indices);

  const topicOfRow = new Int32Array(im.matrix.rows).fill(-1);
  placed.forEach((row, i) => (topicOfRow[row] = clustering.assignment[i]));
  const contrast = termContrast(im.matrix, topicOfRow, K);
  const vocab = index.vocab;
  const termName = (col: number): string => vocab.termOf(index.model.keptIds[col]);
  const word = o.wordFor ?? ((s: string) => s);

  const topics: Topic[] = [];
  for (let t = 0; t < K; t++) {
    const members: { row: number; sim: number }[] = [];
    placed.forEach((row, i) => {
      if (clustering.assignment[i] !== t) return;
      let d = 0;
      for (let c = 0; c < dims; c++) d += points[i * dims + c] * clustering.centres[t * dims + c];
      members.push({ row, sim: d });
    });
    if (members.length === 0) continue;
    members.sort((a, b) => b.sim - a.sim || a.row - b.row);
    const files = rankWithPicks(members.map((m) => m.row), (row) => pickedRows.has(row), o.filesPerTopic).map((row) => ({
      path: im.paths[row],
      similarity: members.find((m) => m.row === row)!.sim,
      picked: pickedRows.has(row),
    }));
    const weights = contrast.subarray(t * im.matrix.cols, (t + 1) * im.matrix.cols);
    const order = distinctive(weights);
    const terms = rankWithPicks(order, (col) => pickedTerms.has(col), o.termsPerTopic).map((col) => ({
      term: termName(col),
      word: word(termName(col)),
      weight: weights[col],
      picked: pickedTerms.has(col),
    }));
    const cohesion = members.reduce((s, m) => s + m.sim, 0) / members.length;
    topics.push({ id: 0, size: members.length, cohesion, terms, files, members: members.map((m) => im.paths[m.row]) });
  }
  topics.sort((a, b) => b.size - a.size || (a.members[0] < b.members[0] ? -1 : 1));
  return {
    topics: topics.map((t, i) => ({ ...t, id: i + 1 })),
    unplaced,
    count: { ...choice, topics: topics.length, chosen: o.topics !== undefined ? 'given' : 'auto' },
    cur: { method: cur.method, rank: cur.rank, files: cur.rows.indices.length, terms: cur.columns.indices.length, errorRatio: cur.error.ratio },
  };
}

/**
 * Restarts that fit a budget of about 4·10⁸ multiply-adds (20 Lloyd passes of n·K·dims each),
 * kept between 3 and 100: small folders get many restarts, which on the demo lifts the agreement
 * with its planted topics and makes it far less seed-dependent (our measurement, see the topics
 * tests); big folders get few.
 */
export function restartsFor(n: number, k: number, dims: number): number {
  return Math.max(3, Math.min(100, Math.floor(4e8 / (20 * n * k * dims))));
}

/**
 * Spherical k-means on all points, or, past fitSample points, fitted with restarts on a seeded
 * sample and then refined by up to 10 Lloyd passes over every point from the sample's centres.
 */
function clusterPoints(points: Float64Array, n: number, dims: number, k: number, fitSample: number, seed: number): Clustering {
  if (n <= fitSample) return sphericalKMeans(points, n, dims, k, { seed, restarts: restartsFor(n, k, dims) });
  const random = createRandom(seed);
  const order = Int32Array.from({ length: n }, (_, i) => i);
  for (let i = 0; i < fitSample; i++) {
    const j = i + Math.floor(random.next() * (n - i));
    [order[i], order[j]] = [order[j], order[i]];
  }
  const sample = new Float64Array(fitSample * dims);
  for (let i = 0; i < fitSample; i++) sample.set(points.subarray(order[i] * dims, (order[i] + 1) * dims), i * dims);
  const fitted = sphericalKMeans(sample, fitSample, dims, k, { seed, restarts: restartsFor(fitSample, k, dims) });
  return sphericalKMeans(points, n, dims, k, { initial: fitted.centres, maxIterations: 10 });
}

/** Term columns with positive weight, strongest first (ties: lower column). */
function distinctive(weights: Float64Array): number[] {
  const cols: number[] = [];
  for (let c = 0; c < weights.length; c++) if (weights[c] > 0) cols.push(c);
  return cols.sort((a, b) => weights[b] - weights[a] || a - b);
}
