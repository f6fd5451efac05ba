/**
 * The index's public record and option types (documents, hits, search and prepare options), apart
 * from lsiIndex.ts so the class file holds behaviour only.
 */
import type { Language } from '../text/languages.js';
import type { DocTerms } from '../counting/termCounts.js';

export interface DocMeta {
  /** Workspace-relative path with '/' separators (multi-root: prefixed by the folder name). */
  readonly path: string;
  readonly size: number;
  readonly mtimeMs: number;
  /** The language the file was tokenized in (src/core/text/detectLanguage.ts); absent: English. */
  readonly language?: Language;
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
  /** The ranking score: (1 − λ)·cosine + λ·BM25/max BM25 (cosine of the query after feedback, fusion.ts). */
  readonly score: number;
  /** Cosine similarity in concept space. */
  readonly conceptScore: number;
  /**
   * The word match: BM25 divided by the best BM25 score of this query, plus nameWeight × the name
   * field's score divided by its best (0…1 + nameWeight; RankingOptions, nameField.ts).
   */
  readonly lexicalScore: number;
}

export interface NearbyHit {
  readonly path: string;
  /** The ranking score: (1 − μ)·cosine + μ·lexical (fusion.ts, RankingOptions.nearbyLexical). */
  readonly score: number;
  /** Cosine similarity of the two files' concept vectors. */
  readonly conceptScore: number;
  /**
   * The word match: BM25L (δ: RankingOptions.nearbyDelta, or NearbyOptions.wordMatchDelta) of the
   * file's most distinctive terms divided by the best other file's, plus η (nearbyNameWeight, or
   * NearbyOptions.wordMatchNames) × each name-field part divided by its best (nameField.ts: those
   * terms in the other file's name, the file's own name words in the other file's text), with a
   * share ν (RankingOptions.nearbyTfidfShare, or NearbyOptions.wordMatchTfidf) of TF-IDF cosine
   * divided by the best other file's: (1 − ν)·(BM25L/max + η·names) + ν·TFIDF/max.
   */
  readonly lexicalScore: number;
}

export interface SearchOptions {
  /** @default 10 */
  top: number;
  /** Only paths for which this returns true are ranked. */
  filter?: (path: string) => boolean;
  /** Search only: indexed files to find more like (Rocchio feedback; they are not ranked). */
  like?: readonly string[];
  /** Search only: indexed files to find fewer like (Rocchio feedback; they are not ranked). */
  unlike?: readonly string[];
}

/** Nearby's options: a search's, and the word match's BM25L δ for callers with their own calibration. */
export interface NearbyOptions extends SearchOptions {
  /** BM25L's δ of the word match (0 = classic BM25). @default RankingOptions.nearbyDelta */
  wordMatchDelta?: number;
  /** Share of TF-IDF cosine in the word match (0 = BM25L alone). @default RankingOptions.nearbyTfidfShare */
  wordMatchTfidf?: number;
  /** Weight of the name field in the word match (0 = none). @default RankingOptions.nearbyNameWeight */
  wordMatchNames?: number;
  /** How many of the file's most distinctive terms form the word match's query. @default RankingOptions.nearbyTerms */
  wordMatchTerms?: number;
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
