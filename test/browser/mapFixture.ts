/**
 * A small latent-semantic index built in the test from synthetic clustered documents, for the map
 * page tests: made-up words (letters only, so the engine's tokenizer keeps them whole), documents
 * drawn mostly from their cluster's words, log-entropy weighting with unit document columns
 * (methods notes §8.1), a dense SVD by ml-matrix, concept vectors U_kᵀd, and both map layouts from
 * the core. Nothing here is prose: every word and path is generated.
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { buildEmbeddedQueryData } from '../../src/core/map/embeddedQueryData.js';
import { buildMapPageData, type MapPageData, type MapSource } from '../../src/core/map/mapData.js';
import { computeMapLayouts, type MapLayouts } from '../../src/core/map/mapLayouts.js';
import { createRandom } from '../../src/core/random.js';
import { tokenize } from '../../src/core/text/tokenize.js';

export interface MapFixture {
  readonly source: MapSource;
  readonly layouts: MapLayouts;
  readonly page: MapPageData;
  /** Surface words of each cluster, for writing queries. */
  readonly clusterWords: string[][];
  readonly clusterOf: Int32Array;
  /** Fold a query exactly as the fixture's index would (unit length). */
  fold(text: string): Float32Array;
}

export function buildMapFixture(clusters = 8, perCluster = 60, k = 12, seed = 5): MapFixture {
  const rng = createRandom(seed);
  const cons = 'bdfgklmnprstvz';
  const vowels = 'aeiou';
  const surface: string[] = [];
  const terms: string[] = [];
  const seen = new Set<string>();
  const wanted = clusters * 10 + 30;
  while (surface.length < wanted) {
    let w = '';
    const syllables = 2 + Math.floor(rng.next() * 2);
    for (let s = 0; s < syllables; s++) w += cons[Math.floor(rng.next() * cons.length)] + vowels[Math.floor(rng.next() * vowels.length)];
    const t = tokenize(w);
    if (t.length !== 1 || seen.has(t[0])) continue;
    seen.add(t[0]);
    surface.push(w);
    terms.push(t[0]);
  }
  const clusterWordIds = Array.from({ length: clusters }, (_, c) => Array.from({ length: 10 }, (_, i) => c * 10 + i));
  const shared = Array.from({ length: 30 }, (_, i) => clusters * 10 + i);
  const m = terms.length;
  const n = clusters * perCluster;
  const tf = new Matrix(m, n);
  const clusterOf = new Int32Array(n);
  const tokenCounts = new Int32Array(n);
  for (let j = 0; j < n; j++) {
    const c = j % clusters;
    clusterOf[j] = c;
    const length = Math.round(30 * Math.exp(3 * rng.next()));
    tokenCounts[j] = length;
    for (let t = 0; t < length; t++) {
      const r = rng.next();
      const pool = r < 0.65 ? clusterWordIds[c] : r < 0.72 ? clusterWordIds[(c + 1) % clusters] : shared;
      const pick = pool[Math.min(pool.length - 1, Math.floor(pool.length * rng.next() ** 1.6))];
      tf.set(pick, j, tf.get(pick, j) + 1);
    }
  }
  // Log-entropy: g_i = 1 + Σ_j p_ij log p_ij / log n, w_ij = g_i · log(1 + tf_ij).
  const g = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const row = tf.getRow(i);
    const gf = row.reduce((s, v) => s + v, 0);
    let h = 0;
    for (const v of row) if (v > 0) h += (v / gf) * Math.log(v / gf);
    g[i] = gf > 0 ? 1 + h / Math.log(n) : 0;
  }
  const a = new Matrix(m, n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < m; i++) {
      const w = g[i] * Math.log1p(tf.get(i, j));
      a.set(i, j, w);
      s += w * w;
    }
    for (let i = 0; i < m; i++) a.set(i, j, a.get(i, j) / Math.sqrt(s));
  }
  const svd = new SingularValueDecomposition(a, { autoTranspose: true });
  const u = svd.leftSingularVectors;
  const vectors = new Float32Array(n * k);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let c = 0; c < k; c++) {
      let v = 0;
      for (let i = 0; i < m; i++) v += u.get(i, c) * a.get(i, j);
      vectors[j * k + c] = v;
      s += v * v;
    }
    for (let c = 0; c < k; c++) vectors[j * k + c] /= Math.sqrt(s);
  }
  const termVectors = new Float32Array(m * k);
  for (let i = 0; i < m; i++) for (let c = 0; c < k; c++) termVectors[i * k + c] = u.get(i, c);
  let energy = 0;
  for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) energy += a.get(i, j) ** 2;
  const topicIds = Int32Array.from(clusterOf, (c, j) => (j % 37 === 36 ? -1 : c));
  const topicLabels = clusterWordIds.map((ids) =>
    ids
      .slice(0, 3)
      .map((t) => terms[t])
      .join(' · '),
  );
  const paths = Array.from(
    clusterOf,
    (c, j) => `notes/${surface[c * 10]}/${surface[c * 10 + 1 + (j % 5)]}-${String(j).padStart(4, '0')}.md`,
  );
  const topTerms = Array.from({ length: n }, (_, j) =>
    Array.from({ length: m }, (_, i) => i)
      .filter((i) => a.get(i, j) > 0)
      .sort((x, y) => a.get(y, j) - a.get(x, j))
      .slice(0, 6)
      .map((i) => terms[i]),
  );
  const source: MapSource = {
    count: n,
    dimensions: k,
    vectors,
    paths,
    tokenCounts,
    topicIds,
    topicLabels,
    topTerms,
    singularValues: Float64Array.from(svd.diagonal.slice(0, 40)),
    k,
    totalEnergy: energy,
  };
  const layouts = computeMapLayouts(vectors, n, k, { faithful: { landmarks: 120 } });
  const embedded = buildEmbeddedQueryData({
    count: n,
    dimensions: k,
    fileVectors: vectors,
    terms,
    termVectors,
    globalWeights: g,
    localWeighting: 'log1p',
    quick: layouts.quick,
  });
  const page = buildMapPageData(source, layouts, embedded, { title: 'Concept map · synthetic clusters' });
  const termIndex = new Map(terms.map((t, i) => [t, i]));
  const fold = (text: string): Float32Array => {
    const counts = new Map<number, number>();
    for (const t of tokenize(text)) {
      const i = termIndex.get(t);
      if (i !== undefined) counts.set(i, (counts.get(i) ?? 0) + 1);
    }
    const q = new Float64Array(k);
    for (const [i, c] of counts) for (let d = 0; d < k; d++) q[d] += Math.log1p(c) * g[i] * u.get(i, d);
    const s = Math.hypot(...q);
    return Float32Array.from(q, (v) => v / s);
  };
  return { source, layouts, page, clusterWords: clusterWordIds.map((ids) => ids.map((i) => surface[i])), clusterOf, fold };
}
