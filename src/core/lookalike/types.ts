/**
 * Input and result types of the look-alike finder (findLookalikes.ts).
 */
import type { TermCountRow } from './termSpace.js';

/** One file: a unique id (usually its workspace path) and its text. */
export interface LookalikeFile {
  readonly id: string;
  readonly text: string;
}

export interface LookalikeInput {
  readonly files: readonly LookalikeFile[];
  /**
   * Optional raw term counts of each file (aligned with `files`; ids ascending, e.g. an index's
   * stored counts) and the counter that made them, applied to single lines. With both, the full
   * term space is built from these counts, boilerplate lines subtracted, instead of tokenizing
   * every file again.
   */
  readonly termCounts?: readonly TermCountRow[];
  readonly countLine?: (line: string) => TermCountRow;
}

/** The four bands of the report, as stable machine keys. */
export type OverlapBand = 'exact' | 'near' | 'partial' | 'retold';

/** What people read for each band (CLI, view, README use these). */
export const BAND_TITLES: Readonly<Record<OverlapBand, string>> = Object.freeze({
  exact: 'Exact copies',
  near: 'Near-copies',
  partial: 'Partial copies',
  retold: 'Same content, other words',
});

/** Two files and how alike they are. */
export interface LookalikePair {
  readonly band: Exclude<OverlapBand, 'exact'>;
  readonly a: string;
  readonly b: string;
  /** What the pair is ranked by: Jaccard for near and partial copies, the cosine for retold pairs. */
  readonly similarity: number;
  /** Exact shingle Jaccard. */
  readonly jaccard: number;
  /** Identical non-blank trimmed lines the two files share (sharedLines.ts). */
  readonly sharedLines: number;
  /** Non-blank lines of a and of b. */
  readonly lines: readonly [number, number];
  /** Words the two files share, counting repeats (multiset intersection of shingle tokens). */
  readonly sharedWords: number;
  /** Words of a and of b. */
  readonly words: readonly [number, number];
  /** Retold pairs: full term-space cosine and its margin over each file's next neighbour (retold.ts). */
  readonly cosine?: number;
  readonly gap?: number;
  /** Retold pairs: rare names (options, identifiers) both files hold, and their share (rareNames.ts). */
  readonly sharedNames?: number;
  readonly nameShare?: number;
  /** Retold pairs: rare names each file holds, and the clause that passed the pair (retold.ts). */
  readonly namesHeld?: readonly [number, number];
  readonly clause?: 'margin' | 'names' | 'combined' | 'beyond-topic';
  /** Retold pairs: files found in both files' lists of nearest files (retold.ts, clause a's limit). */
  readonly sharedNeighbours?: number;
  /** Retold pairs: the pair's cosine in the coarse concept space of clause d (conceptView.ts), when that clause is on. */
  readonly conceptCosine?: number;
}

/** Files whose normalised texts are identical (contentHash.ts). Every pair has similarity 1. */
export interface ExactGroup {
  readonly files: readonly string[];
  readonly similarity: 1;
  /** Non-blank lines of the text: what any two members share. */
  readonly sharedLines: number;
  /** Words of the text (shingle tokens): groups are ranked by it, tiny files last. */
  readonly words: number;
  readonly contentHash: string;
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
  /** Lines left out of the term space as boilerplate (found in boilerplateFiles or more files). */
  readonly boilerplateLines: number;
  /** Candidate pairs from the term-space neighbour lists (each verified by exact Jaccard). */
  readonly neighbourCandidates: number;
}

export interface LookalikeReport {
  /** Exact copies, the group with the longest text first (tiny files last). */
  readonly exactGroups: readonly ExactGroup[];
  /** Near-copies: verified exact Jaccard ≥ threshold, highest first. */
  readonly nearPairs: readonly LookalikePair[];
  /** Partial copies: partialThreshold ≤ Jaccard < threshold, highest first. */
  readonly partialPairs: readonly LookalikePair[];
  /** Same content, other words (retold.ts): strongest evidence (margin + name share) first. */
  readonly retoldPairs: readonly LookalikePair[];
  readonly stats: LookalikeStats;
}
