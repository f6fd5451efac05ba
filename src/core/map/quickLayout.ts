/**
 * The quick map layout: a linear projection of the unit-normalised concept vectors onto their
 * two leading principal axes after centring (PCA, Pearson 1901; Hotelling 1933). The vectors come
 * from a non-negative term-document matrix, whose first singular direction is the Perron vector
 * and mostly measures overall term mass rather than topic (methods notes §6), so plotting raw
 * concept axes 1–2 shows little structure; centring removes that common direction first.
 * Cost O(n·dim²) for the dim×dim covariance (accumulated in float64) plus a dense dim×dim
 * eigen-decomposition (symmetricEigen.ts). Queries are placed by the same linear map (quickProjection.ts).
 */
import { EmptyCorpusError } from '../errors.js';
import { symmetricEigen } from '../matrix/symmetricEigen.js';
import { applyFrameAll, fitFrame, type LayoutFrame } from './layoutFrame.js';
import { projectRaw } from './quickProjection.js';
import { normaliseRows, rowVectors } from './rowVectors.js';

export interface QuickLayout {
  readonly kind: 'quick';
  readonly x: Float32Array;
  readonly y: Float32Array;
  readonly frame: LayoutFrame;
  /** Mean of the unit vectors (dim numbers). */
  readonly mean: Float64Array;
  /** 2×dim principal axes, row-major; each axis's largest-magnitude loading is positive. */
  readonly axes: Float64Array;
  /** Share of the centred vectors' total variance shown by the two axes, in [0, 1]. */
  readonly varianceShare: number;
}

export function quickLayout(vectors: Float32Array, n: number, dim: number): QuickLayout {
  if (n === 0) throw new EmptyCorpusError('there are no files to lay out');
  const unit = normaliseRows(rowVectors(vectors, n, dim));
  const data = unit.data;
  const mean = new Float64Array(dim);
  for (let i = 0; i < n; i++) for (let c = 0; c < dim; c++) mean[c] += data[i * dim + c];
  for (let c = 0; c < dim; c++) mean[c] /= n;
  // Upper triangle of the scatter matrix Σ (v−μ)(v−μ)ᵀ.
  const scatter = new Float64Array(dim * dim);
  const centred = new Float64Array(dim);
  for (let i = 0; i < n; i++) {
    const o = i * dim;
    for (let c = 0; c < dim; c++) centred[c] = data[o + c] - mean[c];
    for (let r = 0; r < dim; r++) {
      const vr = centred[r];
      if (vr === 0) continue;
      const ro = r * dim;
      for (let c = r; c < dim; c++) scatter[ro + c] += vr * centred[c];
    }
  }
  const m = new Float64Array(dim * dim);
  let trace = 0;
  for (let r = 0; r < dim; r++) {
    trace += scatter[r * dim + r];
    for (let c = r; c < dim; c++) {
      m[r * dim + c] = scatter[r * dim + c];
      m[c * dim + r] = scatter[r * dim + c];
    }
  }
  const evd = symmetricEigen(m, dim);
  const order = Array.from(evd.values, (v, i) => [v, i] as const).sort((a, b) => b[0] - a[0]);
  const axes = new Float64Array(2 * dim);
  let shown = 0;
  for (let r = 0; r < Math.min(2, dim); r++) {
    shown += Math.max(0, order[r][0]);
    let big = 0;
    for (let c = 0; c < dim; c++) {
      const v = evd.vectors[order[r][1] * dim + c];
      axes[r * dim + c] = v;
      if (Math.abs(v) > Math.abs(big)) big = v;
    }
    if (big < 0) for (let c = 0; c < dim; c++) axes[r * dim + c] = -axes[r * dim + c];
  }
  const rawX = new Float64Array(n);
  const rawY = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = projectRaw(data, i * dim, mean, axes, dim);
    rawX[i] = p.x;
    rawY[i] = p.y;
  }
  const frame = fitFrame(rawX, rawY);
  const { x, y } = applyFrameAll(frame, rawX, rawY);
  return { kind: 'quick', x, y, frame, mean, axes, varianceShare: trace > 0 ? shown / trace : 0 };
}
