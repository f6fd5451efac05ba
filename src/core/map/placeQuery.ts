/**
 * Placing a query on the faithful layout with the layout's own rule (de Silva & Tenenbaum 2004):
 * the query's geodesic distance to each landmark is estimated through its nearest files,
 * g_l = min_j (|q − v_j| + G(l, j)) over the query's `neighbours` nearest files j, exactly as a
 * new node joined to its k nearest files would see it, and the query is then triangulated from
 * the squared g_l. The nearest files (by cosine) come back too, so the page can ring them.
 */
import { InvalidInputError } from '../errors.js';
import { triangulate } from './classicalMds.js';
import type { FaithfulLayout } from './landmarkIsomap.js';
import { applyFrame } from './layoutFrame.js';

export interface QueryPlacementOptions {
  /** Nearest files the query is joined to. @default 10 (the graph's own k) */
  readonly neighbours: number;
}

export const DEFAULT_QUERY_PLACEMENT_OPTIONS: QueryPlacementOptions = { neighbours: 10 };

export interface QueryPlacement {
  readonly x: number;
  readonly y: number;
  /** Nearest files, most similar first. */
  readonly neighbours: Int32Array;
  /** Their cosine similarities to the query. */
  readonly similarities: Float32Array;
}

/** The count most cosine-similar rows of a unit-row table to q (any length; zero q → none). */
export function nearestByCosine(
  data: Float32Array,
  n: number,
  dim: number,
  q: ArrayLike<number>,
  count: number,
): { index: Int32Array; similarity: Float32Array } {
  if (q.length !== dim) throw new InvalidInputError(`query vector has ${q.length} numbers, the map has ${dim}`);
  let qq = 0;
  for (let c = 0; c < dim; c++) qq += q[c] * q[c];
  const take = qq > 0 ? Math.min(count, n) : 0;
  const index = new Int32Array(take).fill(-1);
  const similarity = new Float32Array(take).fill(Number.NEGATIVE_INFINITY);
  const inv = 1 / Math.sqrt(qq);
  for (let i = 0; i < n && take > 0; i++) {
    const o = i * dim;
    let dot = 0;
    for (let c = 0; c < dim; c++) dot += q[c] * data[o + c];
    const s = dot * inv;
    if (!(s > similarity[take - 1])) continue;
    let t = take - 1;
    while (t > 0 && similarity[t - 1] < s) {
      similarity[t] = similarity[t - 1];
      index[t] = index[t - 1];
      t--;
    }
    similarity[t] = s;
    index[t] = i;
  }
  return { index, similarity };
}

export function placeQueryFaithful(
  layout: FaithfulLayout,
  query: ArrayLike<number>,
  options: Partial<QueryPlacementOptions> = {},
): QueryPlacement | null {
  const opts = { ...DEFAULT_QUERY_PLACEMENT_OPTIONS, ...options };
  const { n, dim, data } = layout.vectors;
  const near = nearestByCosine(data, n, dim, query, opts.neighbours);
  if (near.index.length === 0) return null;
  const m = layout.landmarks.length;
  const geo = layout.landmarkGeodesics;
  const squared = new Float64Array(m);
  for (let l = 0; l < m; l++) {
    let best = Number.POSITIVE_INFINITY;
    for (let t = 0; t < near.index.length; t++) {
      const j = near.index[t];
      // Chord between the unit query and row j (a zero row sits at distance 1).
      const chord = layout.norms[j] > 0 ? Math.sqrt(Math.max(0, 2 - 2 * near.similarity[t])) : 1;
      const g = chord + geo[l * n + j];
      if (g < best) best = g;
    }
    squared[l] = best * best;
  }
  const raw = triangulate(layout.mds, squared, new Float64Array(2));
  const p = applyFrame(layout.frame, raw[0], raw[1]);
  return { x: p.x, y: p.y, neighbours: near.index, similarities: near.similarity };
}
