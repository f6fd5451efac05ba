/**
 * Answering a query inside a standalone map page: tokenize the text with the engine's tokenizer
 * (passed in, so page and index split words the same way), weight each known term by
 * local(tf)·global weight, fold it as Σ weight·term vector (embeddedQueryData.ts states the
 * contract), then rank files by cosine against their int8 vectors and place the query on the
 * quick layout by its linear map. Unknown words are ignored; a query with no known word throws
 * NoKnownTermsError, like the engine's own search.
 */
import { InvalidInputError, NoKnownTermsError } from '../errors.js';
import { base64ToFloat32 } from './base64.js';
import type { EmbeddedQueryData, LocalWeighting } from './embeddedQueryData.js';
import type { Point2 } from './layoutFrame.js';
import { decodeQuantizedRows, type QuantizedRows } from './quantize.js';
import { projectQuick } from './quickProjection.js';

export type Tokenize = (text: string) => string[];

export interface EmbeddedSearchResult {
  /** The folded query, unit length. */
  readonly vector: Float32Array;
  readonly neighbours: Int32Array;
  readonly similarities: Float32Array;
  /** Position on the quick layout. */
  readonly quick: Point2;
  /** Distinct query terms found in the vocabulary. */
  readonly knownTerms: number;
}

export class EmbeddedQueryEngine {
  private readonly files: QuantizedRows;
  private readonly fileNorms: Float32Array;
  private readonly termVectors: QuantizedRows;
  private readonly globalWeights: Float32Array;
  private readonly termIndex = new Map<string, number>();

  constructor(
    private readonly data: EmbeddedQueryData,
    private readonly tokenize: Tokenize,
  ) {
    this.files = decodeQuantizedRows(data.files);
    this.termVectors = decodeQuantizedRows(data.termVectors);
    this.globalWeights = base64ToFloat32(data.globalWeights);
    if (this.files.cols !== data.dimensions || this.termVectors.cols !== data.dimensions || this.termVectors.rows !== data.terms.length) {
      throw new InvalidInputError('embedded query data has inconsistent dimensions');
    }
    data.terms.forEach((t, i) => this.termIndex.set(t, i));
    // Norms of the de-quantised file rows, so cosines are exact for the stored values.
    const { rows, cols, values, scales } = this.files;
    this.fileNorms = new Float32Array(rows);
    for (let r = 0; r < rows; r++) {
      let s = 0;
      for (let c = 0; c < cols; c++) s += values[r * cols + c] * values[r * cols + c];
      this.fileNorms[r] = Math.sqrt(s) * scales[r];
    }
  }

  /** The query's unit concept vector and how many distinct known terms it used. */
  fold(text: string): { vector: Float32Array; knownTerms: number } {
    const counts = new Map<number, number>();
    for (const token of this.tokenize(text)) {
      const t = this.termIndex.get(token);
      if (t !== undefined) counts.set(t, (counts.get(t) ?? 0) + 1);
    }
    if (counts.size === 0) throw new NoKnownTermsError(text);
    const k = this.data.dimensions;
    const acc = new Float64Array(k);
    const { values, scales } = this.termVectors;
    for (const [t, tf] of counts) {
      const w = localWeight(tf, this.data.localWeighting) * this.globalWeights[t] * scales[t];
      if (w === 0) continue;
      for (let c = 0; c < k; c++) acc[c] += w * values[t * k + c];
    }
    let s = 0;
    for (let c = 0; c < k; c++) s += acc[c] * acc[c];
    if (s === 0) throw new NoKnownTermsError(text);
    const inv = 1 / Math.sqrt(s);
    return { vector: Float32Array.from(acc, (v) => v * inv), knownTerms: counts.size };
  }

  search(text: string, count = this.data.neighbours): EmbeddedSearchResult {
    const { vector, knownTerms } = this.fold(text);
    const { rows, cols, values, scales } = this.files;
    const take = Math.min(count, rows);
    const neighbours = new Int32Array(take).fill(-1);
    const similarities = new Float32Array(take).fill(Number.NEGATIVE_INFINITY);
    for (let r = 0; r < rows; r++) {
      if (this.fileNorms[r] === 0) continue;
      let dot = 0;
      for (let c = 0; c < cols; c++) dot += vector[c] * values[r * cols + c];
      const sim = (dot * scales[r]) / this.fileNorms[r];
      if (!(sim > similarities[take - 1])) continue;
      let t = take - 1;
      while (t > 0 && similarities[t - 1] < sim) {
        similarities[t] = similarities[t - 1];
        neighbours[t] = neighbours[t - 1];
        t--;
      }
      similarities[t] = sim;
      neighbours[t] = r;
    }
    const found = neighbours.indexOf(-1);
    const end = found < 0 ? take : found;
    return {
      vector,
      neighbours: neighbours.slice(0, end),
      similarities: similarities.slice(0, end),
      quick: projectQuick(this.data.quick, vector),
      knownTerms,
    };
  }
}

export function localWeight(tf: number, rule: LocalWeighting): number {
  switch (rule) {
    case 'log1p':
      return Math.log1p(tf);
    case 'raw':
      return tf;
    case 'binary':
      return tf > 0 ? 1 : 0;
  }
}
