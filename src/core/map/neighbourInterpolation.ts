/**
 * Place a point on any 2-D layout from its nearest files: inverse-distance weighting (Shepard
 * 1968, power 2) of the neighbours' positions. Used where the landmark distance table is not at
 * hand (the standalone page); an exact duplicate of a file lands on that file.
 */
import type { Point2 } from './layoutFrame.js';

/** Guards against division by zero for exact duplicates (common practice). */
const EPSILON = 1e-9;

export function interpolateFromNeighbours(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  neighbours: ArrayLike<number>,
  distances: ArrayLike<number>,
): Point2 | null {
  let sx = 0;
  let sy = 0;
  let sw = 0;
  for (let t = 0; t < neighbours.length; t++) {
    const j = neighbours[t];
    const d = distances[t];
    const w = 1 / (d * d + EPSILON);
    sx += w * x[j];
    sy += w * y[j];
    sw += w;
  }
  return sw > 0 ? { x: sx / sw, y: sy / sw } : null;
}
