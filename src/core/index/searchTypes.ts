/**
 * The index's public record and option types (documents, hits, search and prepare options), apart
 * from lsiIndex.ts so the class file holds behaviour only.
 */
import type { DocTerms } from '../counting/termCounts.js';

export interface DocMeta {
  /** Workspace-relative path with '/' separators (multi-root: prefixed by the folder name). */
  readonly path: string;
  readonly size: number;
  readonly mtimeMs: number;
}

export interface DocSlot {
  meta: DocMeta;
  terms: DocTerms;
  /** True when the document was folded in after the last build. */
  folded: boolean;
  /** Fold-in residual (0 for documents present at build time). */
  residual: number;
}

export interface SearchHit {
  readonly path: string;
  /** The ranking score: (1 − λ)·cosine + λ·BM25/max BM25. */
  readonly score: number;
  /** Cosine similarity in concept space. */
  readonly conceptScore: number;
  /** BM25 score divided by the best BM25 score of this query (0…1). */
  readonly lexicalScore: number;
}

export interface NearbyHit {
  readonly path: string;
  /** Cosine similarity of the two files' concept vectors. */
  readonly score: number;
}

export interface SearchOptions {
  /** @default 10 */
  top: number;
  /** Only paths for which this returns true are ranked. */
  filter?: (path: string) => boolean;
}

export interface PrepareOptions {
  /** Milliseconds of work between two pauses (common practice for staying responsive). @default 15 */
  sliceMs: number;
  /** Stops preparing (between slices) once aborted. */
  signal?: AbortSignal;
  /** Awaited between slices, so other work can run. @default a zero-delay timer */
  pause: () => Promise<void>;
}

export const DEFAULT_PREPARE_OPTIONS: Readonly<PrepareOptions> = Object.freeze({
  sliceMs: 15,
  pause: () => new Promise<void>((resolve) => setTimeout(resolve, 0)),
});
