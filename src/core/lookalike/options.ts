/**
 * Options of the look-alike finder, with their defaults and where each default comes from.
 */
import { InvalidInputError } from '../errors.js';
import { DEFAULT_SEED } from '../random.js';

export interface LookalikeOptions {
  /** Tokens per shingle. @default 5 (token 5-grams, as in the Stack's and C4's deduplication, Kocetkov et al. 2022, Lee et al. 2022) */
  readonly shingleSize: number;
  /** MinHash functions K. @default 128 (common practice: the Stack and CodeParrot use 256, datasketch 128) */
  readonly numHashes: number;
  /** LSH bands b; rows r = numHashes / bands. @default 16 (r = 8: P(candidate) 0.95 at J = 0.8, 0.99 at 0.85, from 1 − (1 − s^r)^b, Leskovec, Rajaraman & Ullman, Mining of Massive Datasets, ch. 3) */
  readonly bands: number;
  /** Exact Jaccard at or above which two files are near-copies. @default 0.8 (the threshold of Lee et al. 2022, "Deduplicating training data makes language models better") */
  readonly threshold: number;
  /** Largest LSH bucket paired all-against-all; bigger ones use sorted neighbourhood (banding.ts). @default 100 (common practice, our choice) */
  readonly maxBucketSize: number;
  /** Cosine of concept vectors at or above which two files with low shingle overlap are paraphrases. @default 0.95 (our choice) */
  readonly paraphraseThreshold: number;
  /**
   * Up to this many eligible files, paraphrase candidates are all pairs (exact, no misses); above
   * it, SimHash banding. @default 2000 — all pairs then costs 2·10⁶ dot products (≈0.4 GFLOP at
   * k = 200, well under a second in JS), about what SimHash signing costs at that size [E].
   */
  readonly paraphraseAllPairsLimit: number;
  /** SimHash bands. @default 24 (with 16 bits: P(candidate) ≈ 0.99 at cosine 0.95, ≈ 0.006 at cosine 0.3) [E arithmetic] */
  readonly simhashBands: number;
  /** Hyperplane bits per SimHash band (1–32). @default 16 */
  readonly simhashBitsPerBand: number;
  /** Seed for the MinHash family and the hyperplanes. @default DEFAULT_SEED (random.ts) */
  readonly seed: number;
}

export const DEFAULT_LOOKALIKE_OPTIONS: LookalikeOptions = Object.freeze({
  shingleSize: 5,
  numHashes: 128,
  bands: 16,
  threshold: 0.8,
  maxBucketSize: 100,
  paraphraseThreshold: 0.95,
  paraphraseAllPairsLimit: 2000,
  simhashBands: 24,
  simhashBitsPerBand: 16,
  seed: DEFAULT_SEED,
});

/** Defaults merged with the caller's choices, each checked. */
export function resolveLookalikeOptions(options: Partial<LookalikeOptions> = {}): LookalikeOptions {
  const o: LookalikeOptions = { ...DEFAULT_LOOKALIKE_OPTIONS, ...options };
  positiveInteger('shingleSize', o.shingleSize);
  positiveInteger('numHashes', o.numHashes);
  positiveInteger('bands', o.bands);
  if (o.numHashes % o.bands !== 0) {
    throw new InvalidInputError(`bands (${o.bands}) must divide numHashes (${o.numHashes}) so every band has the same rows`);
  }
  unitInterval('threshold', o.threshold);
  unitInterval('paraphraseThreshold', o.paraphraseThreshold);
  positiveInteger('maxBucketSize', o.maxBucketSize);
  if (o.maxBucketSize < 2) throw new InvalidInputError(`maxBucketSize must be at least 2, got ${o.maxBucketSize}`);
  if (!Number.isInteger(o.paraphraseAllPairsLimit) || o.paraphraseAllPairsLimit < 0) {
    throw new InvalidInputError(`paraphraseAllPairsLimit must be a whole number ≥ 0, got ${o.paraphraseAllPairsLimit}`);
  }
  positiveInteger('simhashBands', o.simhashBands);
  positiveInteger('simhashBitsPerBand', o.simhashBitsPerBand);
  if (o.simhashBitsPerBand > 32) throw new InvalidInputError(`simhashBitsPerBand must be at most 32, got ${o.simhashBitsPerBand}`);
  if (!Number.isInteger(o.seed)) throw new InvalidInputError(`seed must be a whole number, got ${o.seed}`);
  return o;
}

function positiveInteger(name: string, v: number): void {
  if (!Number.isInteger(v) || v < 1) throw new InvalidInputError(`${name} must be a whole number ≥ 1, got ${v}`);
}

function unitInterval(name: string, v: number): void {
  if (!(v > 0 && v <= 1)) throw new InvalidInputError(`${name} must be in (0, 1], got ${v}`);
}
