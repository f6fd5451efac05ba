/** Shared test inputs for the topics tests: seeded bases, planted clusters, the demo workspace. */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { Matrix, QrDecomposition } from 'ml-matrix';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import type { IndexSettings } from '../../../src/core/index/model/settings.js';
import { createRandom } from '../../../src/core/random.js';
import { REPO_ROOT } from '../../helpers/shared.js';

/** The spherical k-means objective Σ_c ‖Σ_{i∈c} x_i‖ of a labelling, recomputed from the points. */
export function objectiveOf(points: Float64Array, dims: number, labels: ArrayLike<number>, k: number): number {
  const sums = new Float64Array(k * dims);
  for (let i = 0; i < labels.length; i++) for (let d = 0; d < dims; d++) sums[labels[i] * dims + d] += points[i * dims + d];
  let total = 0;
  for (let c = 0; c < k; c++) {
    let ss = 0;
    for (let d = 0; d < dims; d++) ss += sums[c * dims + d] ** 2;
    total += Math.sqrt(ss);
  }
  return total;
}

/** The best two-cluster objective of n points by trying every split (point 0 in cluster 0). */
export function bestTwoClusterObjective(points: Float64Array, n: number, dims: number): number {
  let best = 0;
  for (let mask = 0; mask < 1 << (n - 1); mask++) {
    const labels = Array.from({ length: n }, (_, i) => (i === 0 ? 0 : (mask >> (i - 1)) & 1));
    best = Math.max(best, objectiveOf(points, dims, labels, 2));
  }
  return best;
}

/** n seeded Gaussian points scaled to unit length, row-major n × dims. */
export function unitPoints(n: number, dims: number, seed: number): Float64Array {
  const r = createRandom(seed);
  const p = new Float64Array(n * dims);
  for (let i = 0; i < n; i++) {
    let ss = 0;
    for (let d = 0; d < dims; d++) ss += (p[i * dims + d] = r.normal()) ** 2;
    for (let d = 0; d < dims; d++) p[i * dims + d] /= Math.sqrt(ss);
  }
  return p;
}

/** An n × k row-major matrix with orthonormal columns (ml-matrix QR of a seeded Gaussian). */
export function orthonormalBasis(n: number, k: number, seed: number): Float64Array {
  const r = createRandom(seed);
  const g = new Matrix(n, k);
  for (let i = 0; i < n; i++) for (let c = 0; c < k; c++) g.set(i, c, r.normal());
  const q = new QrDecomposition(g).orthogonalMatrix;
  const out = new Float64Array(n * k);
  for (let i = 0; i < n; i++) for (let c = 0; c < k; c++) out[i * k + c] = q.get(i, c);
  return out;
}

/**
 * Points around `groups` random unit directions (dims each), `per` points per group, Gaussian
 * noise of the given size before normalising. Labels are the group numbers.
 */
export function plantedClusters(
  groups: number,
  per: number,
  dims: number,
  noise: number,
  seed: number,
): { points: Float64Array; labels: number[]; dims: number } {
  const r = createRandom(seed);
  const centres = orthonormalBasis(dims, groups, seed + 1); // dims × groups: column g is direction g
  const points = new Float64Array(groups * per * dims);
  const labels: number[] = [];
  for (let g = 0; g < groups; g++) {
    for (let t = 0; t < per; t++) {
      const i = labels.length;
      let ss = 0;
      for (let d = 0; d < dims; d++) ss += (points[i * dims + d] = centres[d * groups + g] + noise * r.normal()) ** 2;
      for (let d = 0; d < dims; d++) points[i * dims + d] /= Math.sqrt(ss);
      labels.push(g);
    }
  }
  return { points, labels, dims };
}

/** Adjusted Rand index (Hubert & Arabie 1985), from the contingency table. */
export function adjustedRandIndex(a: readonly number[], b: readonly number[]): number {
  const n = a.length;
  const table = new Map<string, number>();
  const ra = new Map<number, number>();
  const rb = new Map<number, number>();
  for (let i = 0; i < n; i++) {
    const key = `${a[i]},${b[i]}`;
    table.set(key, (table.get(key) ?? 0) + 1);
    ra.set(a[i], (ra.get(a[i]) ?? 0) + 1);
    rb.set(b[i], (rb.get(b[i]) ?? 0) + 1);
  }
  const pairs = (x: number) => (x * (x - 1)) / 2;
  let index = 0;
  for (const v of table.values()) index += pairs(v);
  let sa = 0;
  for (const v of ra.values()) sa += pairs(v);
  let sb = 0;
  for (const v of rb.values()) sb += pairs(v);
  const expected = (sa * sb) / pairs(n);
  const max = (sa + sb) / 2;
  return max === expected ? 1 : (index - expected) / (max - expected);
}

export interface DemoTopic {
  readonly name: string;
  readonly keywords: readonly string[];
  readonly files: readonly string[];
}

/** The demo workspace (demo/workspace) as an index, with its answer key. */
export function loadDemo(settings: Partial<IndexSettings> = {}): {
  index: LsiIndex;
  texts: Map<string, string>;
  topics: DemoTopic[];
  unassigned: string[];
} {
  const root = join(REPO_ROOT, 'demo', 'workspace');
  const key = join(REPO_ROOT, 'demo', 'expectations.json');
  const walk = (dir: string): string[] =>
    readdirSync(dir).flatMap((n) => (statSync(join(dir, n)).isDirectory() ? walk(join(dir, n)) : [join(dir, n)]));
  const builder = new IndexBuilder(settings);
  const texts = new Map<string, string>();
  for (const file of walk(root).sort()) {
    const path = relative(root, file).split(sep).join('/');
    const text = readFileSync(file, 'utf8');
    texts.set(path, text);
    builder.addText({ path, size: text.length, mtimeMs: 0 }, text);
  }
  const answers = JSON.parse(readFileSync(key, 'utf8')) as { topics: DemoTopic[]; unassigned: string[] };
  return { index: builder.build(), texts, topics: answers.topics, unassigned: answers.unassigned };
}
