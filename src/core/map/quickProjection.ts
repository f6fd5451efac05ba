/**
 * The quick layout's linear map, kept apart from quickLayout.ts so the map page can place
 * queries without bundling the eigen-solver: unit-normalise, subtract the mean, dot with the two
 * principal axes, then apply the display frame.
 */
import { applyFrame, type LayoutFrame, type Point2 } from './layoutFrame.js';

export interface QuickProjection {
  /** Mean of the unit concept vectors (dim numbers). */
  readonly mean: ArrayLike<number>;
  /** 2×dim principal axes, row-major. */
  readonly axes: ArrayLike<number>;
  readonly frame: LayoutFrame;
}

/** Place a query's concept vector (dim numbers, any length) on the quick layout. */
export function projectQuick(p: QuickProjection, query: ArrayLike<number>): Point2 {
  const dim = p.mean.length;
  let s = 0;
  for (let c = 0; c < dim; c++) s += query[c] * query[c];
  const inv = s > 0 ? 1 / Math.sqrt(s) : 0;
  const unit = new Float64Array(dim);
  for (let c = 0; c < dim; c++) unit[c] = query[c] * inv;
  const raw = projectRaw(unit, 0, p.mean, p.axes, dim);
  return applyFrame(p.frame, raw.x, raw.y);
}

/** Centred projection of the row starting at offset o onto the two axes (no frame). */
export function projectRaw(v: ArrayLike<number>, o: number, mean: ArrayLike<number>, axes: ArrayLike<number>, dim: number): Point2 {
  let x = 0;
  let y = 0;
  for (let c = 0; c < dim; c++) {
    const d = v[o + c] - mean[c];
    x += d * axes[c];
    y += d * axes[dim + c];
  }
  return { x, y };
}
