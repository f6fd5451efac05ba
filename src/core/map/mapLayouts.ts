/**
 * Both map layouts for one index, ready for the page: the quick PCA projection and the faithful
 * landmark Isomap, the latter turned to match the former's orientation (layoutFrame.ts) so the
 * toggle between them keeps groups roughly in place. Small inputs (n ≤ fullIsomapMaxN) use full
 * Isomap, where landmarks would save nothing.
 */
import { fullIsomap } from './fullIsomap.js';
import { DEFAULT_LANDMARK_ISOMAP_OPTIONS, landmarkIsomap, type FaithfulLayout, type LandmarkIsomapOptions } from './landmarkIsomap.js';
import { alignFrame, applyFrameAll } from './layoutFrame.js';
import { quickLayout, type QuickLayout } from './quickLayout.js';

export interface MapLayoutOptions {
  readonly faithful: Partial<LandmarkIsomapOptions>;
  /** Inputs up to this size get full Isomap. @default 0 (always landmarks; full Isomap equals landmark Isomap once every file is a landmark) */
  readonly fullIsomapMaxN: number;
  /** Turn the faithful layout to match the quick one. @default true */
  readonly align: boolean;
}

export const DEFAULT_MAP_LAYOUT_OPTIONS: MapLayoutOptions = {
  faithful: DEFAULT_LANDMARK_ISOMAP_OPTIONS,
  fullIsomapMaxN: 0,
  align: true,
};

export interface MapLayouts {
  readonly quick: QuickLayout;
  readonly faithful: FaithfulLayout;
}

export function computeMapLayouts(vectors: Float32Array, n: number, dim: number, options: Partial<MapLayoutOptions> = {}): MapLayouts {
  const opts = { ...DEFAULT_MAP_LAYOUT_OPTIONS, ...options };
  const quick = quickLayout(vectors, n, dim);
  const faithful =
    n <= opts.fullIsomapMaxN
      ? fullIsomap(vectors, n, dim, { graph: opts.faithful.graph, seed: opts.faithful.seed })
      : landmarkIsomap(vectors, n, dim, opts.faithful);
  return { quick, faithful: opts.align ? alignFaithful(faithful, quick) : faithful };
}

/** The faithful layout turned (rotation or reflection) to best match the quick one. */
export function alignFaithful(faithful: FaithfulLayout, quick: QuickLayout): FaithfulLayout {
  const frame = alignFrame(faithful.frame, faithful.rawX, faithful.rawY, quick.x, quick.y);
  const { x, y } = applyFrameAll(frame, faithful.rawX, faithful.rawY);
  return { ...faithful, frame, x, y };
}
