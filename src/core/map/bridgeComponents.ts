/**
 * Joining the parts of a disconnected neighbour graph, so every file has a finite geodesic
 * distance to every landmark. Choice (documented for the map): instead of laying out each part on
 * its own and packing the pieces, we add "bridge" edges between parts, Borůvka style: each round,
 * every part links to its closest point in each of its `partners` nearest other parts, until one
 * part remains. Linking to more than the single nearest part (a spanning tree of parts would lay
 * groups out along a chain) keeps cycles among groups, so the geodesic distance between two
 * groups stays close to their direct distance and the groups spread over both map axes. A bridge
 * is as long as the gap it spans (times lengthScale).
 *
 * Per round: each part contributes up to `sampleSize` seeded sample members as representatives;
 * each part's samples are compared with all other parts' representatives to rank partner parts
 * and give starting pairs, which are refined by alternating "closest member of this part to the
 * partner point / closest partner member to this point" (a local search that never lengthens the
 * pair). When every part has at most sampleSize members the pairs found are exactly the closest
 * pairs. Cost per round O((Σ samples)²·dim + partners·n·refineSteps·dim); parts at least halve
 * per round.
 */
import { type RandomSource } from '../random.js';
import { UnionFind } from '../lookalike/unionFind.js';
import type { Components, ExtraEdge } from './neighbourGraph.js';
import { rowDistance, type RowVectors } from './rowVectors.js';

export interface BridgeOptions {
  /** Nearest other parts each part links to per round. @default 3 (common practice) */
  readonly partners: number;
  /** Sample members per part. @default 32 (common practice) */
  readonly sampleSize: number;
  /** Budget on all representatives together; per-part samples shrink when parts are many. @default 4096 */
  readonly maxRepresentatives: number;
  /** Alternating refinement steps. @default 4 (common practice) */
  readonly refineSteps: number;
  /** Multiplier on a bridge's true distance. @default 1 */
  readonly lengthScale: number;
}

export const DEFAULT_BRIDGE_OPTIONS: BridgeOptions = {
  partners: 3,
  sampleSize: 32,
  maxRepresentatives: 4096,
  refineSteps: 4,
  lengthScale: 1,
};

export function bridgeComponents(
  v: RowVectors,
  norms: Float64Array,
  components: Components,
  rng: RandomSource,
  options: Partial<BridgeOptions> = {},
): ExtraEdge[] {
  const opts = { ...DEFAULT_BRIDGE_OPTIONS, ...options };
  // Components joined so far; each part is named by its smallest component label, so the parts
  // are visited (and sampled) in a fixed order.
  const joined = new UnionFind(components.count);
  const edges: ExtraEdge[] = [];
  const seen = new Set<string>();
  let parts = components.count;
  while (parts > 1) {
    const smallest = new Int32Array(components.count).fill(-1);
    for (let c = 0; c < components.count; c++) {
      const r = joined.find(c);
      if (smallest[r] < 0) smallest[r] = c;
    }
    const part = new Int32Array(v.n);
    for (let i = 0; i < v.n; i++) part[i] = smallest[joined.find(components.labels[i])];
    const groups = [...groupByPart(part, components.count).values()];
    const perPart = Math.max(1, Math.min(opts.sampleSize, Math.floor(opts.maxRepresentatives / groups.length)));
    const samples = groups.map((members) => sampleOf(members, perPart, rng));
    const round: ExtraEdge[] = [];
    for (let g = 0; g < groups.length; g++) {
      // Closest sampled pair to every other part, then the `partners` nearest parts.
      const best = groups.map(() => ({ a: -1, b: -1, d: Number.POSITIVE_INFINITY }));
      for (const x of samples[g]) {
        for (let h = 0; h < groups.length; h++) {
          if (h === g) continue;
          const cur = best[h];
          for (const y of samples[h]) {
            const dd = rowDistance(v, norms, x, y);
            if (dd < cur.d) [cur.a, cur.b, cur.d] = [x, y, dd];
          }
        }
      }
      const order = best
        .map((p, h) => ({ ...p, h }))
        .filter((p) => p.h !== g)
        .sort((p, q) => p.d - q.d || p.h - q.h)
        .slice(0, Math.max(1, opts.partners));
      for (const p of order) round.push(refine(v, norms, groups[g], groups[p.h], p.a, p.b, p.d, opts.refineSteps));
    }
    for (const e of round) {
      const key = e.a < e.b ? `${e.a}:${e.b}` : `${e.b}:${e.a}`;
      if (!seen.has(key)) {
        seen.add(key);
        edges.push({ a: e.a, b: e.b, length: e.length * opts.lengthScale });
      }
      if (joined.union(part[e.a], part[e.b])) parts--;
    }
  }
  return edges;
}

/** Alternate nearest-member searches between two parts, starting from pair (a, b). */
function refine(
  v: RowVectors,
  norms: Float64Array,
  own: Int32Array,
  other: Int32Array,
  a: number,
  b: number,
  d: number,
  steps: number,
): ExtraEdge {
  for (let s = 0; s < steps; s++) {
    const [a2] = nearestIn(v, norms, own, b);
    const [b2, d2] = nearestIn(v, norms, other, a2);
    if (a2 === a && b2 === b) break;
    if (!(d2 < d)) break;
    [a, b, d] = [a2, b2, d2];
  }
  return { a, b, length: d };
}

function nearestIn(v: RowVectors, norms: Float64Array, members: Int32Array, q: number): [number, number] {
  let best = -1;
  let bestD = Number.POSITIVE_INFINITY;
  for (let t = 0; t < members.length; t++) {
    const d = rowDistance(v, norms, members[t], q);
    if (d < bestD) [best, bestD] = [members[t], d];
  }
  return [best, bestD];
}

function sampleOf(members: Int32Array, count: number, rng: RandomSource): Int32Array {
  if (members.length <= count) return members;
  const copy = members.slice();
  for (let t = 0; t < count; t++) {
    const r = t + Math.floor(rng.next() * (copy.length - t));
    const s = copy[r];
    copy[r] = copy[t];
    copy[t] = s;
  }
  return copy.slice(0, count);
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
