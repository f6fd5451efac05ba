/**
 * Where to write each topic's words on the map: at the coordinate-wise median of its files'
 * positions (robust to a few far-flung members, unlike the mean), for topics with at least
 * `minFiles` files, largest topics first so they win when labels would overlap. The overlap test
 * itself happens in screen space (label boxes depend on the zoom and the font): labelsToDraw.
 * Median anchors and largest-first greedy placement are common practice for map labels.
 */

export interface RegionAnchor {
  readonly topic: number;
  readonly x: number;
  readonly y: number;
  readonly count: number;
}

export interface RegionLabelOptions {
  /** Topics with fewer files get no label. @default 3 */
  readonly minFiles: number;
}

export const DEFAULT_REGION_LABEL_OPTIONS: RegionLabelOptions = { minFiles: 3 };

function median(values: number[]): number {
  values.sort((a, b) => a - b);
  const m = values.length >> 1;
  return values.length % 2 ? values[m] : (values[m - 1] + values[m]) / 2;
}

export function regionAnchors(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  topicIds: ArrayLike<number>,
  topicCount: number,
  options: Partial<RegionLabelOptions> = {},
): RegionAnchor[] {
  const o = { ...DEFAULT_REGION_LABEL_OPTIONS, ...options };
  const xs: number[][] = Array.from({ length: topicCount }, () => []);
  const ys: number[][] = Array.from({ length: topicCount }, () => []);
  for (let i = 0; i < topicIds.length; i++) {
    const t = topicIds[i];
    if (t < 0 || t >= topicCount) continue;
    xs[t].push(x[i]);
    ys[t].push(y[i]);
  }
  const out: RegionAnchor[] = [];
  for (let t = 0; t < topicCount; t++)
    if (xs[t].length >= o.minFiles) out.push({ topic: t, count: xs[t].length, x: median(xs[t]), y: median(ys[t]) });
  return out.sort((a, b) => b.count - a.count || a.topic - b.topic);
}

export interface LabelBox {
  readonly topic: number;
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}

/** The boxes to draw, in order, leaving out any that would overlap one already kept (plus `gap`). */
export function labelsToDraw(boxes: readonly LabelBox[], gap = 4): LabelBox[] {
  const kept: LabelBox[] = [];
  for (const b of boxes) {
    const clash = kept.some(
      (k) =>
        b.left < k.left + k.width + gap &&
        k.left < b.left + b.width + gap &&
        b.top < k.top + k.height + gap &&
        k.top < b.top + b.height + gap,
    );
    if (!clash) kept.push(b);
  }
  return kept;
}
