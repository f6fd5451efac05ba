/**
 * Joining the parts of a disconnected neighbour graph, so every file has a finite geodesic
 * distance to every landmark. Choice (documented for the map): instead of laying out each part on
 * its own and packing the pieces, we add "bridge" edges between parts, Borůvka style: each round,
 * every part links to its closest point outside itself, until one part remains. A bridge's
 * length is its true distance times lengthScale, so well-separated groups stay visibly apart.
 *
 * Closest pair search per part: every member is scanned when the part has at most sampleSize
 * points (then the pair is exactly the closest one); larger parts scan a seeded sample of members
 * and then alternate "closest member to the outside point / closest outside point to the member"
 * a few times, a local search that cannot lengthen the pair. Cost per round is
 * O(Σ min(|C|, sampleSize) · n · dim), near-linear in n for a modest number of parts.
 */
import { type RandomSource } from '../random.js';
import type { Components, ExtraEdge } from './neighbourGraph.js';
import { rowDistance, type RowVectors } from './rowVectors.js';

export interface BridgeOptions {
  /** Members scanned per part before refinement. @default 32 (common practice) */
  readonly sampleSize: number;
  /** Alternating refinement steps. @default 4 (common practice) */
  readonly refineSteps: number;
  /** Multiplier on a bridge's true distance. @default 1 (a bridge is as long as the gap it spans) */
  readonly lengthScale: number;
}

export const DEFAULT_BRIDGE_OPTIONS: BridgeOptions = { sampleSize: 32, refineSteps: 4, lengthScale: 1 };

export function bridgeComponents(
  v: RowVectors,
  norms: Float64Array,
  components: Components,
  rng: RandomSource,
  options: Partial<BridgeOptions> = {},
): ExtraEdge[] {
  const opts = { ...DEFAULT_BRIDGE_OPTIONS, ...options };
  const n = v.n;
  const parent = Int32Array.from({ length: components.count }, (_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]];
      x = parent[x];
    }
    return x;
  };
  const edges: ExtraEdge[] = [];
  const seen = new Set<string>();
  const part = new Int32Array(n);
  let parts = components.count;
  while (parts > 1) {
    for (let i = 0; i < n; i++) part[i] = find(components.labels[i]);
    const members = groupByPart(part, components.count);
    const round: ExtraEdge[] = [];
    for (const [root, list] of members) {
      const pair = closestOutside(v, norms, part, root, list, rng, opts);
      round.push(pair);
    }
    for (const e of round) {
      const key = e.a < e.b ? `${e.a}:${e.b}` : `${e.b}:${e.a}`;
      const ra = find(part[e.a]);
      const rb = find(part[e.b]);
      if (!seen.has(key)) {
        seen.add(key);
        edges.push({ a: e.a, b: e.b, length: e.length * opts.lengthScale });
      }
      if (ra !== rb) {
        parent[Math.max(ra, rb)] = Math.min(ra, rb);
        parts--;
      }
    }
  }
  return edges;
}

function groupByPart(part: Int32Array, maxParts: number): Map<number, Int32Array> {
  const counts = new Int32Array(maxParts);
  for (let i = 0; i < part.length; i++) counts[part[i]]++;
  const out = new Map<number, Int32Array>();
  const fill = new Int32Array(maxParts);
  for (let p = 0; p < maxParts; p++) if (counts[p] > 0) out.set(p, new Int32Array(counts[p]));
  for (let i = 0; i < part.length; i++) {
    const p = part[i];
    (out.get(p) as Int32Array)[fill[p]++] = i;
  }
  return out;
}

function closestOutside(
  v: RowVectors,
  norms: Float64Array,
  part: Int32Array,
  root: number,
  list: Int32Array,
  rng: RandomSource,
  opts: BridgeOptions,
): ExtraEdge {
  const n = v.n;
  const nearestOutside = (a: number): [number, number] => {
    let best = -1;
    let bestD = Number.POSITIVE_INFINITY;
    for (let x = 0; x < n; x++) {
      if (part[x] === root) continue;
      const d = rowDistance(v, norms, a, x);
      if (d < bestD) {
        bestD = d;
        best = x;
      }
    }
    return [best, bestD];
  };
  const sample = list.slice();
  const take = Math.min(opts.sampleSize, sample.length);
  for (let t = 0; t < take; t++) {
    const r = t + Math.floor(rng.next() * (sample.length - t));
    const s = sample[r];
    sample[r] = sample[t];
    sample[t] = s;
  }
  let a = -1;
  let b = -1;
  let d = Number.POSITIVE_INFINITY;
  for (let t = 0; t < take; t++) {
    const [x, dx] = nearestOutside(sample[t]);
    if (dx < d) {
      a = sample[t];
      b = x;
      d = dx;
    }
  }
  if (take < list.length) {
    for (let step = 0; step < opts.refineSteps; step++) {
      let a2 = a;
      let d2 = d;
      for (let t = 0; t < list.length; t++) {
        const dd = rowDistance(v, norms, list[t], b);
        if (dd < d2) {
          d2 = dd;
          a2 = list[t];
        }
      }
      const [b2, d3] = nearestOutside(a2);
      if (a2 === a && b2 === b) break;
      // d3 <= d2, since b itself is outside at distance d2.
      a = a2;
      b = b2;
      d = d3;
    }
  }
  return { a, b, length: d };
}
