/** Look-alike (near-duplicate) detection: public API. */
export { findLookalikes } from './findLookalikes.js';
export { DEFAULT_LOOKALIKE_OPTIONS, resolveLookalikeOptions, type LookalikeOptions } from './options.js';
export type { ExactGroup, LookalikeFile, OverlapBand, LookalikeInput, LookalikePair, LookalikeReport, LookalikeStats } from './types.js';
export { BAND_TITLES } from './types.js';
export {
  buildTermSpace,
  termSpaceFromCounts,
  termNeighbours,
  rowCosine,
  type TermCountRow,
  type TermSpace,
  type Neighbours,
} from './termSpace.js';
export { namesOf, rareNameIndex, type RareNames, type RareNameIndex } from './rareNames.js';
export { findRetoldPairs, boilerplateLines, withoutBoilerplate, type RetoldPair } from './retold.js';
export { contentHash, isBlankText, normaliseForHash } from './contentHash.js';
export { shingleSet, shingleTokens, jaccardSorted, intersectionSize, type ShingleSet } from './shingles.js';
export { createMinHasher, estimateJaccard, type MinHasher } from './minhash.js';
export { bandCandidates, candidateProbability, type BandingParams, type CandidatePairs } from './banding.js';
export { lineCounts, sharedLineCount } from './sharedLines.js';
export { describeShared, sharedAmount, MIN_LINES, type SharedAmount, type SharedCounts } from './sharedUnits.js';
