/**
 * The sections of one file as a trail of points on the map: each section's concept vector
 * (core/sections, folded into the same space as the files) placed exactly as a query is, on the
 * quick layout by its linear map (projectQuick) and on the faithful one by the layout's own rule
 * for a new point (placeQueryFaithful, de Silva & Tenenbaum 2004), kept in reading order so the
 * page can join them into a path through the file. A section without a word the model knows has
 * a zero vector and no place: it is left out of the trail (its neighbours are still joined).
 */
import { InvalidInputError } from '../errors.js';
import type { FaithfulLayout } from './landmarkIsomap.js';
import type { MapPoint } from './mapMessages.js';
import { placeQueryFaithful, type QueryPlacementOptions } from './placeQuery.js';
import type { QuickLayout } from './quickLayout.js';
import { projectQuick } from './quickProjection.js';

/** A file's sections: zero-based first lines, the lines after their last, titles, k unit numbers each. */
export interface TrailInput {
  readonly starts: ArrayLike<number>;
  readonly ends: ArrayLike<number>;
  readonly titles: readonly string[];
  readonly vectors: Float32Array;
}

export interface TrailPoint {
  readonly title: string;
  /** Zero-based first line and the line after the last. */
  readonly start: number;
  readonly end: number;
  readonly quick: MapPoint;
  readonly faithful: MapPoint | null;
}

export function placeSectionTrail(
  layouts: { readonly quick: QuickLayout; readonly faithful: FaithfulLayout | null },
  sections: TrailInput,
  k: number,
  options: Partial<QueryPlacementOptions> = {},
): TrailPoint[] {
  // Each field once: a reopened index makes them afresh on each access (sectionRows.ts).
  const { starts, ends, titles, vectors } = sections;
  const n = starts.length;
  if (ends.length !== n || titles.length !== n || vectors.length !== n * k)
    throw new InvalidInputError(`the sections disagree in size (${n} starts, ${vectors.length} numbers for k = ${k})`);
  const out: TrailPoint[] = [];
  for (let i = 0; i < n; i++) {
    const v = vectors.subarray(i * k, (i + 1) * k);
    let ss = 0;
    for (let c = 0; c < k; c++) ss += v[c] * v[c];
    if (!(ss > 0)) continue;
    const q = projectQuick(layouts.quick, v);
    const f = layouts.faithful ? placeQueryFaithful(layouts.faithful, v, options) : null;
    out.push({
      title: titles[i],
      start: starts[i],
      end: ends[i],
      quick: { x: q.x, y: q.y },
      faithful: f ? { x: f.x, y: f.y } : null,
    });
  }
  return out;
}
