/**
 * The data a standalone map file carries so its page can answer queries without a host: each
 * file's concept vector and each vocabulary term's vector quantised to int8 (quantize.ts), the
 * terms' global weights, the local weighting rule, and the quick layout's linear map.
 *
 * Contract for termVectors: a query's concept vector must be (up to a positive factor)
 * Σ_t local(tf_t)·g_t·termVectors[t], e.g. rows of U_k, or of U_k·Σ_k⁻¹ if the engine folds
 * queries that way; the builder of this data picks the rows that match its own folding.
 */
import { InvalidInputError } from '../errors.js';
import { float32ToBase64 } from './base64.js';
import type { LayoutFrame } from './layoutFrame.js';
import { encodeQuantizedRows, quantizeRows, type QuantizedRowsData } from './quantize.js';

export type LocalWeighting = 'log1p' | 'raw' | 'binary';

export interface EmbeddedQueryData {
  readonly dimensions: number;
  readonly files: QuantizedRowsData;
  readonly terms: string[];
  readonly termVectors: QuantizedRowsData;
  /** base64 float32, one per term. */
  readonly globalWeights: string;
  readonly localWeighting: LocalWeighting;
  readonly quick: { readonly mean: number[]; readonly axes: number[]; readonly frame: LayoutFrame };
  /** Nearest files ringed around a query. */
  readonly neighbours: number;
}

export interface EmbeddedQuerySource {
  readonly count: number;
  readonly dimensions: number;
  readonly fileVectors: Float32Array;
  readonly terms: readonly string[];
  /** terms.length × dimensions, row-major. */
  readonly termVectors: Float32Array | Float64Array;
  readonly globalWeights: ArrayLike<number>;
  readonly localWeighting: LocalWeighting;
  readonly quick: { readonly mean: ArrayLike<number>; readonly axes: ArrayLike<number>; readonly frame: LayoutFrame };
}

export interface EmbeddedQueryOptions {
  /** @default 10 */
  readonly neighbours: number;
}

export const DEFAULT_EMBEDDED_QUERY_OPTIONS: EmbeddedQueryOptions = { neighbours: 10 };

export function buildEmbeddedQueryData(src: EmbeddedQuerySource, options: Partial<EmbeddedQueryOptions> = {}): EmbeddedQueryData {
  const opts = { ...DEFAULT_EMBEDDED_QUERY_OPTIONS, ...options };
  const m = src.terms.length;
  const k = src.dimensions;
  if (src.termVectors.length !== m * k)
    throw new InvalidInputError(`term vectors hold ${src.termVectors.length} numbers for ${m} terms × ${k}`);
  if (src.globalWeights.length !== m) throw new InvalidInputError(`${src.globalWeights.length} global weights for ${m} terms`);
  if (src.quick.mean.length !== k || src.quick.axes.length !== 2 * k)
    throw new InvalidInputError('quick projection does not match the dimensions');
  return {
    dimensions: k,
    files: encodeQuantizedRows(quantizeRows(src.fileVectors, src.count, k)),
    terms: [...src.terms],
    termVectors: encodeQuantizedRows(quantizeRows(src.termVectors, m, k)),
    globalWeights: float32ToBase64(Float32Array.from(src.globalWeights)),
    localWeighting: src.localWeighting,
    quick: { mean: Array.from(src.quick.mean), axes: Array.from(src.quick.axes), frame: src.quick.frame },
    neighbours: opts.neighbours,
  };
}
