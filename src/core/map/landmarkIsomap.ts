/**
 * The faithful map layout: landmark Isomap (Tenenbaum, de Silva & Langford, Science 2000; de Silva
 * & Tenenbaum, NIPS 2003 and the 2004 report "Sparse multidimensional scaling using landmark
 * points").
 *  1. Connected k-NN graph of the unit concept vectors (geodesicGraph.ts).
 *  2. Landmarks by greedy MaxMin in geodesic distance: the first at random (seeded), each next one
 *     the file farthest from all landmarks so far. The Dijkstra run from each landmark serves both
 *     the MaxMin choice and the landmark distance table (m×n, float32).
 *  3. Classical MDS on the m×m squared landmark geodesics.
 *  4. Every file placed by distance-based triangulation from its geodesics to the landmarks.
 * Cost: near-linear in n: NN-Descent neighbours (empirically ≈O(n^1.14·dim)), O(m·(E + n log n))
 * for the paths, O(m·n) for placement; memory m×n for the distance table plus O(m²). m = 300 follows the methods
 * notes (200–400 landmarks, §8.12); m must exceed dimensions + 1 = 3 (de Silva & Tenenbaum).
 */
import { EmptyCorpusError, InvalidInputError } from '../errors.js';
import { createRandom, DEFAULT_SEED } from '../random.js';
import { classicalMds, type ClassicalMdsResult } from './classicalMds.js';
import { ShortestPaths } from './dijkstra.js';
import { buildGeodesicGraph, DEFAULT_GEODESIC_GRAPH_OPTIONS, type GeodesicGraph, type GeodesicGraphOptions } from './geodesicGraph.js';
import { applyFrameAll, fitFrame, type LayoutFrame } from './layoutFrame.js';
import { rowVectors, type RowVectors } from './rowVectors.js';

export interface LandmarkIsomapOptions {
  /** Number of MaxMin landmarks (capped at the file count). @default 300 */
  readonly landmarks: number;
  readonly graph: Partial<GeodesicGraphOptions>;
  readonly seed: number;
}

export const DEFAULT_LANDMARK_ISOMAP_OPTIONS: LandmarkIsomapOptions = {
  landmarks: 300,
  graph: DEFAULT_GEODESIC_GRAPH_OPTIONS,
  seed: DEFAULT_SEED,
};

export interface FaithfulLayout {
  readonly kind: 'faithful';
  readonly method: 'landmark-isomap' | 'isomap';
  readonly x: Float32Array;
  readonly y: Float32Array;
  /** Raw MDS coordinates before the display frame. */
  readonly rawX: Float64Array;
  readonly rawY: Float64Array;
  readonly frame: LayoutFrame;
  /** Indices of the landmark files, in MaxMin order. */
  readonly landmarks: Int32Array;
  /** landmarks.length × n geodesic distances, row l from landmark l. */
  readonly landmarkGeodesics: Float32Array;
  readonly mds: ClassicalMdsResult;
  /** Unit-normalised vectors the layout was built on (needed to place queries). */
  readonly vectors: RowVectors;
  readonly norms: Float64Array;
  readonly neighbourMethod: 'exact' | 'nn-descent';
  readonly componentCount: number;
  readonly bridgeCount: number;
}

export function landmarkIsomap(
  vectors: Float32Array,
  n: number,
  dim: number,
  options: Partial<LandmarkIsomapOptions> = {},
): FaithfulLayout {
  const opts = { ...DEFAULT_LANDMARK_ISOMAP_OPTIONS, ...options };
  if (!Number.isInteger(opts.landmarks) || opts.landmarks < 4) {
    throw new InvalidInputError(`landmark Isomap needs at least 4 landmarks for a 2-D map, got ${opts.landmarks}`);
  }
  if (n === 0) throw new EmptyCorpusError('there are no files to lay out');
  const g = buildGeodesicGraph(rowVectors(vectors, n, dim), { ...opts.graph, seed: opts.seed });
  const m = Math.min(opts.landmarks, n);
  const { landmarks, geodesics } = maxMinLandmarks(g, m, opts.seed);
  const squared = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      const a = geodesics[i * n + landmarks[j]];
      const b = geodesics[j * n + landmarks[i]];
      const d = 0.5 * (a + b);
      squared[i * m + j] = d * d;
    }
  }
  const mds = classicalMds(squared, m, { dimensions: 2 });
  const rawX = new Float64Array(n);
  const rawY = new Float64Array(n);
  const { pseudoInverse: pinv, meanSquared } = mds;
  for (let l = 0; l < m; l++) {
    const px = -0.5 * pinv[l];
    const py = -0.5 * pinv[m + l];
    const mean = meanSquared[l];
    const o = l * n;
    for (let a = 0; a < n; a++) {
      const d = geodesics[o + a];
      const t = d * d - mean;
      rawX[a] += px * t;
      rawY[a] += py * t;
    }
  }
  return finishLayout('landmark-isomap', g, rawX, rawY, landmarks, geodesics, mds);
}

/** Greedy MaxMin landmarks and their geodesic rows (m×n, float32). */
export function maxMinLandmarks(g: GeodesicGraph, m: number, seed: number): { landmarks: Int32Array; geodesics: Float32Array } {
  const n = g.graph.n;
  const rng = createRandom(seed ^ 0x2545f491);
  const paths = new ShortestPaths(g.graph);
  const landmarks = new Int32Array(m);
  const geodesics = new Float32Array(m * n);
  const minD = new Float64Array(n).fill(Number.POSITIVE_INFINITY);
  const chosen = new Uint8Array(n);
  const row = new Float64Array(n);
  let next = Math.floor(rng.next() * n);
  for (let t = 0; t < m; t++) {
    landmarks[t] = next;
    chosen[next] = 1;
    paths.from(next, row);
    const o = t * n;
    for (let i = 0; i < n; i++) {
      geodesics[o + i] = row[i];
      if (row[i] < minD[i]) minD[i] = row[i];
    }
    let best = -1;
    let bestD = -1;
    for (let i = 0; i < n; i++) {
      if (chosen[i] === 0 && minD[i] > bestD) {
        bestD = minD[i];
        best = i;
      }
    }
    next = best;
  }
  return { landmarks, geodesics };
}

/** Shared tail of both Isomap variants: display frame and the typed result. */
export function finishLayout(
  method: FaithfulLayout['method'],
  g: GeodesicGraph,
  rawX: Float64Array,
  rawY: Float64Array,
  landmarks: Int32Array,
  geodesics: Float32Array,
  mds: ClassicalMdsResult,
): FaithfulLayout {
  const frame = fitFrame(rawX, rawY);
  const { x, y } = applyFrameAll(frame, rawX, rawY);
  return {
    kind: 'faithful',
    method,
    x,
    y,
    rawX,
    rawY,
    frame,
    landmarks,
    landmarkGeodesics: geodesics,
    mds,
    vectors: g.vectors,
    norms: g.norms,
    neighbourMethod: g.neighbourMethod,
    componentCount: g.componentCount,
    bridgeCount: g.bridges.length,
  };
}
