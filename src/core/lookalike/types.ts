/**
 * Input and result types of the look-alike finder (findLookalikes.ts).
 */

/** One file: a unique id (usually its workspace path) and its text. */
export interface LookalikeFile {
  readonly id: string;
  readonly text: string;
}

/** Optional concept vectors (e.g. LSI document vectors), row i for files[i], unit length. */
export interface ConceptVectors {
  /** files.length × dims numbers, row-major. */
  readonly vectors: Float32Array;
  readonly dims: number;
}

export interface LookalikeInput {
  readonly files: readonly LookalikeFile[];
  readonly concepts?: ConceptVectors;
}

/** Two files and how alike they are. */
export interface LookalikePair {
  readonly a: string;
  readonly b: string;
  /** Exact shingle Jaccard for near-copies; concept cosine for paraphrases. */
  readonly similarity: number;
  /** Exact shingle Jaccard (equals similarity for near-copies). */
  readonly jaccard: number;
  /** Identical non-blank trimmed lines the two files share (sharedLines.ts). */
  readonly sharedLines: number;
}

/** Files whose normalised texts are identical (contentHash.ts). Every pair has similarity 1. */
export interface ExactGroup {
  readonly files: readonly string[];
  readonly similarity: 1;
  /** Non-blank lines of the text: what any two members share. */
  readonly sharedLines: number;
  readonly contentHash: string;
}

/**
 * Files joined by verified pairs (union-find). Pairs link one representative of each distinct
 * text; `files` also lists the exact copies of those representatives (see exactGroups).
 */
export interface LookalikeGroup {
  readonly files: readonly string[];
  readonly pairs: readonly LookalikePair[];
}

export interface LookalikeStats {
  /** Files given. */
  readonly files: number;
  /** Files holding only whitespace: counted here, never grouped. */
  readonly emptyFiles: number;
  /** Distinct non-empty normalised texts (one representative each goes on). */
  readonly distinctTexts: number;
  /** Distinct texts with at least one shingle (MinHashed and banded). */
  readonly shingled: number;
  /** Distinct non-empty texts with fewer tokens than a shingle: left out of near-copy and paraphrase search. */
  readonly skippedShort: number;
  /** LSH candidate pairs (each verified by exact Jaccard). */
  readonly candidates: number;
  /** Candidates whose exact Jaccard reached the threshold. */
  readonly verified: number;
  /** LSH buckets over maxBucketSize, paired by sorted neighbourhood (pair lists partial). */
  readonly cappedBuckets: number;
  /** How paraphrase candidates were found; 'none' without concept vectors. */
  readonly paraphraseMode: 'none' | 'all-pairs' | 'simhash';
  /** Paraphrase candidate pairs whose cosine was computed. */
  readonly paraphraseCandidates: number;
}

export interface LookalikeReport {
  /** Exact copies, largest group first. */
  readonly exactGroups: readonly ExactGroup[];
  /** Near-copies: verified exact Jaccard ≥ threshold. */
  readonly nearGroups: readonly LookalikeGroup[];
  /** "Same content, different words": cosine ≥ paraphraseThreshold, Jaccard < threshold. */
  readonly paraphraseGroups: readonly LookalikeGroup[];
  readonly stats: LookalikeStats;
}
