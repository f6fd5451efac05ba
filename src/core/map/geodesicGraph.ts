/**
 * Step 1 of both Isomap variants: the connected neighbour graph of the unit-normalised concept
 * vectors. Exact brute-force neighbours up to exactMaxN rows, NN-Descent above; the graph is the
 * symmetrised k-NN graph with cosine-chord edge lengths; disconnected parts are joined by bridge
 * edges (bridgeComponents.ts) so every geodesic distance is finite.
 *
 * Default k = 10 neighbours follows the map plan in the methods notes (§8.12); scikit-learn's
 * Isomap uses 5, which leaves text graphs with many small parts.
 */
import { createRandom, DEFAULT_SEED } from '../random.js';
import { bridgeComponents, DEFAULT_BRIDGE_OPTIONS, type BridgeOptions } from './bridgeComponents.js';
import { exactNeighbours } from './exactNeighbours.js';
import { buildNeighbourGraph, connectedComponents, type ExtraEdge, type NeighbourGraph } from './neighbourGraph.js';
import type { NeighbourLists } from './neighbourLists.js';
import { DEFAULT_NN_DESCENT_OPTIONS, nnDescent, type NnDescentOptions } from './nnDescent.js';
import { normaliseRows, rowSquaredNorms, type RowVectors } from './rowVectors.js';

export interface GeodesicGraphOptions {
  /** Neighbours per file in the k-NN graph. @default 10 */
  readonly neighbours: number;
  /**
   * Largest file count for exact brute-force neighbours; NN-Descent above. @default 2000
   * (measured with bench/mapLayout.bench.ts at 128 dimensions: at 2,000 files NN-Descent is already
   * about twice as fast with 0.99 recall, and exact cost grows as n²).
   */
  readonly exactMaxN: number;
  readonly nnDescent: Partial<NnDescentOptions>;
  readonly bridge: Partial<BridgeOptions>;
  readonly seed: number;
}

export const DEFAULT_GEODESIC_GRAPH_OPTIONS: GeodesicGraphOptions = {
  neighbours: 10,
  exactMaxN: 2000,
  nnDescent: DEFAULT_NN_DESCENT_OPTIONS,
  bridge: DEFAULT_BRIDGE_OPTIONS,
  seed: DEFAULT_SEED,
};

export interface GeodesicGraph {
  /** The unit-normalised vectors the graph was built on. */
  readonly vectors: RowVectors;
  readonly norms: Float64Array;
  readonly lists: NeighbourLists;
  readonly graph: NeighbourGraph;
  readonly neighbourMethod: 'exact' | 'nn-descent';
  /** Connected parts of the k-NN graph before bridging. */
  readonly componentCount: number;
  readonly bridges: readonly ExtraEdge[];
}

export function buildGeodesicGraph(v: RowVectors, options: Partial<GeodesicGraphOptions> = {}): GeodesicGraph {
  const opts = { ...DEFAULT_GEODESIC_GRAPH_OPTIONS, ...options };
  const unit = normaliseRows(v);
  const norms = rowSquaredNorms(unit);
  const k = Math.max(1, Math.min(opts.neighbours, unit.n - 1));
  const useExact = unit.n <= opts.exactMaxN;
  const lists = useExact ? exactNeighbours(unit, k) : nnDescent(unit, k, { ...opts.nnDescent, seed: opts.seed }).lists;
  const plain = buildNeighbourGraph(lists);
  const components = connectedComponents(plain);
  const rng = createRandom(opts.seed ^ 0x5bd1e995);
  const bridges = components.count > 1 ? bridgeComponents(unit, norms, components, rng, opts.bridge) : [];
  const graph = bridges.length > 0 ? buildNeighbourGraph(lists, bridges) : plain;
  return {
    vectors: unit,
    norms,
    lists,
    graph,
    neighbourMethod: useExact ? 'exact' : 'nn-descent',
    componentCount: components.count,
    bridges,
  };
}
