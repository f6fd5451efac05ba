/**
 * Full Isomap (Tenenbaum, de Silva & Langford, Science 2000) for small inputs: geodesic distances
 * between all pairs (Dijkstra from every file) and classical MDS on the whole n×n matrix. O(n²)
 * memory and O(n·(E + n log n) + n²·steps) time, so it is capped at maxN files; it exists as the
 * reference the landmark layout is checked against, and for small workspaces.
 */
import { EmptyCorpusError, InvalidInputError } from '../errors.js';
import { DEFAULT_SEED } from '../random.js';
import { classicalMds } from './classicalMds.js';
import { ShortestPaths } from './dijkstra.js';
import { buildGeodesicGraph, DEFAULT_GEODESIC_GRAPH_OPTIONS, type GeodesicGraphOptions } from './geodesicGraph.js';
import { finishLayout, type FaithfulLayout } from './landmarkIsomap.js';
import { rowVectors } from './rowVectors.js';

export interface FullIsomapOptions {
  /** Largest accepted file count. @default 2000 (n² float64 distances ≈ 32 MB) */
  readonly maxN: number;
  readonly graph: Partial<GeodesicGraphOptions>;
  readonly seed: number;
}

export const DEFAULT_FULL_ISOMAP_OPTIONS: FullIsomapOptions = { maxN: 2000, graph: DEFAULT_GEODESIC_GRAPH_OPTIONS, seed: DEFAULT_SEED };

export function fullIsomap(vectors: Float32Array, n: number, dim: number, options: Partial<FullIsomapOptions> = {}): FaithfulLayout {
  const opts = { ...DEFAULT_FULL_ISOMAP_OPTIONS, ...options };
  if (n === 0) throw new EmptyCorpusError('there are no files to lay out');
  if (n > opts.maxN) throw new InvalidInputError(`full Isomap is limited to ${opts.maxN} files (got ${n}); use landmarkIsomap`);
  const g = buildGeodesicGraph(rowVectors(vectors, n, dim), { ...opts.graph, seed: opts.seed });
  const paths = new ShortestPaths(g.graph);
  const geodesics = new Float32Array(n * n);
  const squared = new Float64Array(n * n);
  const row = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    paths.from(i, row);
    for (let j = 0; j < n; j++) geodesics[i * n + j] = row[j];
  }
  // Path sums may differ in the last bit between directions; MDS wants an exactly symmetric matrix.
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const d = 0.5 * (geodesics[i * n + j] + geodesics[j * n + i]);
      squared[i * n + j] = d * d;
      squared[j * n + i] = d * d;
    }
  }
  const mds = classicalMds(squared, n, { dimensions: 2 });
  const rawX = new Float64Array(n);
  const rawY = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    rawX[i] = mds.coords[2 * i];
    rawY[i] = mds.coords[2 * i + 1];
  }
  const all = Int32Array.from({ length: n }, (_, i) => i);
  return finishLayout('isomap', g, rawX, rawY, all, geodesics, mds);
}
