/**
 * Single-source shortest paths on a non-negatively weighted graph: Dijkstra's algorithm
 * (Dijkstra 1959) with an indexed binary heap supporting decrease-key, O((E + n) log n) per
 * source. Isomap's geodesic distances are these path lengths (Tenenbaum et al. 2000, step 2).
 * The heap and its position table are reused across sources (one run per landmark), and the
 * heap operations are written inline on local typed arrays: this loop dominates the faithful
 * layout's cost, with hundreds of sources over tens of thousands of files.
 */
import type { NeighbourGraph } from './neighbourGraph.js';

/** pos[] marker for a node that was never reached. */
const UNSEEN = -1;
/** pos[] marker for a node whose distance is final. */
const SETTLED = -2;

export class ShortestPaths {
  private readonly heap: Int32Array;
  private readonly pos: Int32Array;
  private readonly key: Float64Array;

  constructor(private readonly graph: NeighbourGraph) {
    this.heap = new Int32Array(graph.n);
    this.pos = new Int32Array(graph.n);
    this.key = new Float64Array(graph.n);
  }

  /** Path lengths from source to every node into out (+Infinity where unreachable). */
  from(source: number, out: Float64Array = new Float64Array(this.graph.n)): Float64Array {
    const { offsets, targets, weights } = this.graph;
    const { heap, pos, key } = this;
    out.fill(Number.POSITIVE_INFINITY);
    pos.fill(UNSEEN);
    let size = 1;
    heap[0] = source;
    pos[source] = 0;
    key[source] = 0;
    while (size > 0) {
      // Pop the minimum.
      const u = heap[0];
      const du = key[u];
      size--;
      if (size > 0) {
        const last = heap[size];
        const kl = key[last];
        let i = 0;
        for (;;) {
          let c = 2 * i + 1;
          if (c >= size) break;
          if (c + 1 < size && key[heap[c + 1]] < key[heap[c]]) c++;
          if (key[heap[c]] >= kl) break;
          heap[i] = heap[c];
          pos[heap[i]] = i;
          i = c;
        }
        heap[i] = last;
        pos[last] = i;
      }
      out[u] = du;
      pos[u] = SETTLED;
      // Relax u's edges.
      for (let p = offsets[u], end = offsets[u + 1]; p < end; p++) {
        const v = targets[p];
        const pv = pos[v];
        if (pv === SETTLED) continue;
        const dv = du + weights[p];
        let i: number;
        if (pv === UNSEEN) {
          i = size++;
        } else if (dv < key[v]) {
          i = pv;
        } else {
          continue;
        }
        key[v] = dv;
        // Sift up.
        while (i > 0) {
          const parent = (i - 1) >> 1;
          const w = heap[parent];
          if (key[w] <= dv) break;
          heap[i] = w;
          pos[w] = i;
          i = parent;
        }
        heap[i] = v;
        pos[v] = i;
      }
    }
    return out;
  }
}
