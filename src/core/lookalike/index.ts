/** Look-alike (near-duplicate) detection: public API. */
export { findLookalikes } from './findLookalikes.js';
export { DEFAULT_LOOKALIKE_OPTIONS, resolveLookalikeOptions, type LookalikeOptions } from './options.js';
export type {
  ConceptVectors,
  ExactGroup,
  LookalikeFile,
  LookalikeGroup,
  LookalikeInput,
  LookalikePair,
  LookalikeReport,
  LookalikeStats,
} from './types.js';
export { contentHash, isBlankText, normaliseForHash } from './contentHash.js';
export { shingleSet, shingleTokens, jaccardSorted, intersectionSize, type ShingleSet } from './shingles.js';
export { createMinHasher, estimateJaccard, type MinHasher } from './minhash.js';
export { bandCandidates, candidateProbability, type BandingParams, type CandidatePairs } from './banding.js';
export { simhashBands, hyperplaneAgreement, type SimhashParams } from './simhash.js';
export { lineCounts, sharedLineCount } from './sharedLines.js';
