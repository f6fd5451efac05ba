/**
 * Single-source shortest paths on a non-negatively weighted graph: Dijkstra's algorithm
 * (Dijkstra 1959) with an indexed binary heap supporting decrease-key, O((E + n) log n) per
 * source. Isomap's geodesic distances are these path lengths (Tenenbaum et al. 2000, step 2).
 * The heap and its position table are reused across sources to avoid allocation per landmark.
 */
import type { NeighbourGraph } from './neighbourGraph.js';

export class ShortestPaths {
  private readonly heap: Int32Array;
  private readonly pos: Int32Array;
  private readonly key: Float64Array;
  private size = 0;

  constructor(private readonly graph: NeighbourGraph) {
    this.heap = new Int32Array(graph.n);
    this.pos = new Int32Array(graph.n);
    this.key = new Float64Array(graph.n);
  }

  /** Path lengths from source to every node into out (+Infinity where unreachable). */
  from(source: number, out: Float64Array = new Float64Array(this.graph.n)): Float64Array {
    const { offsets, targets, weights } = this.graph;
    const { pos, key } = this;
    out.fill(Number.POSITIVE_INFINITY);
    pos.fill(-1);
    this.size = 0;
    key[source] = 0;
    this.push(source);
    while (this.size > 0) {
      const u = this.pop();
      const du = key[u];
      out[u] = du;
      pos[u] = -2; // settled
      for (let p = offsets[u]; p < offsets[u + 1]; p++) {
        const v = targets[p];
        if (pos[v] === -2) continue;
        const dv = du + weights[p];
        if (pos[v] === -1) {
          key[v] = dv;
          this.push(v);
        } else if (dv < key[v]) {
          key[v] = dv;
          this.siftUp(pos[v]);
        }
      }
    }
    return out;
  }

  private push(v: number): void {
    const i = this.size++;
    this.heap[i] = v;
    this.pos[v] = i;
    this.siftUp(i);
  }

  private pop(): number {
    const top = this.heap[0];
    const last = this.heap[--this.size];
    if (this.size > 0) {
      this.heap[0] = last;
      this.pos[last] = 0;
      this.siftDown(0);
    }
    return top;
  }

  private siftUp(i: number): void {
    const { heap, pos, key } = this;
    const v = heap[i];
    const kv = key[v];
    while (i > 0) {
      const parent = (i - 1) >> 1;
      const p = heap[parent];
      if (key[p] <= kv) break;
      heap[i] = p;
      pos[p] = i;
      i = parent;
    }
    heap[i] = v;
    pos[v] = i;
  }

  private siftDown(i: number): void {
    const { heap, pos, key } = this;
    const size = this.size;
    const v = heap[i];
    const kv = key[v];
    for (;;) {
      let c = 2 * i + 1;
      if (c >= size) break;
      if (c + 1 < size && key[heap[c + 1]] < key[heap[c]]) c++;
      if (key[heap[c]] >= kv) break;
      heap[i] = heap[c];
      pos[heap[c]] = i;
      i = c;
    }
    heap[i] = v;
    pos[v] = i;
  }
}
