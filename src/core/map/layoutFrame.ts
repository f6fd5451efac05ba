/**
 * The 2-D frame a raw layout is shown in: centred on the mean, scaled to unit RMS radius, and
 * optionally turned (rotation or reflection) to best match another layout, so switching between
 * the quick and faithful views keeps groups roughly where they were. The best orthogonal map is
 * the 2-D case of the orthogonal Procrustes problem (Schönemann 1966), solved in closed form.
 * Query placements go through the same frame as the files.
 */

export interface LayoutFrame {
  readonly cx: number;
  readonly cy: number;
  readonly scale: number;
  /** Row-major 2×2 orthogonal matrix applied after centring. */
  readonly m: readonly [number, number, number, number];
}

export interface Point2 {
  readonly x: number;
  readonly y: number;
}

export function fitFrame(rawX: Float64Array, rawY: Float64Array): LayoutFrame {
  const n = rawX.length;
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < n; i++) {
    cx += rawX[i];
    cy += rawY[i];
  }
  cx = n > 0 ? cx / n : 0;
  cy = n > 0 ? cy / n : 0;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (rawX[i] - cx) ** 2 + (rawY[i] - cy) ** 2;
  const rms = n > 0 ? Math.sqrt(ss / n) : 0;
  return { cx, cy, scale: rms > 0 ? 1 / rms : 1, m: [1, 0, 0, 1] };
}

export function applyFrame(f: LayoutFrame, u: number, v: number): Point2 {
  const a = (u - f.cx) * f.scale;
  const b = (v - f.cy) * f.scale;
  return { x: f.m[0] * a + f.m[1] * b, y: f.m[2] * a + f.m[3] * b };
}

export function applyFrameAll(f: LayoutFrame, rawX: Float64Array, rawY: Float64Array): { x: Float32Array; y: Float32Array } {
  const n = rawX.length;
  const x = new Float32Array(n);
  const y = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const p = applyFrame(f, rawX[i], rawY[i]);
    x[i] = p.x;
    y[i] = p.y;
  }
  return { x, y };
}

/**
 * Turn frame f (over raw coordinates) so its output best matches reference positions (already
 * centred and scaled): the orthogonal R maximising Σ refᵢᵀ·R·pᵢ, over rotations and reflections.
 */
export function alignFrame(f: LayoutFrame, rawX: Float64Array, rawY: Float64Array, refX: Float32Array, refY: Float32Array): LayoutFrame {
  const base: LayoutFrame = { ...f, m: [1, 0, 0, 1] };
  let c00 = 0;
  let c01 = 0;
  let c10 = 0;
  let c11 = 0;
  for (let i = 0; i < rawX.length; i++) {
    const p = applyFrame(base, rawX[i], rawY[i]);
    c00 += p.x * refX[i];
    c01 += p.x * refY[i];
    c10 += p.y * refX[i];
    c11 += p.y * refY[i];
  }
  const rot = Math.hypot(c00 + c11, c01 - c10);
  const ref = Math.hypot(c00 - c11, c01 + c10);
  if (rot >= ref) {
    const t = Math.atan2(c01 - c10, c00 + c11);
    return { ...f, m: [Math.cos(t), -Math.sin(t), Math.sin(t), Math.cos(t)] };
  }
  const t = Math.atan2(c01 + c10, c00 - c11);
  return { ...f, m: [Math.cos(t), Math.sin(t), Math.sin(t), -Math.cos(t)] };
}
