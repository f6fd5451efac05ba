import { describe, expect, it } from 'vitest';
import { candidateProbability } from '../../../src/core/lookalike/banding.js';
import { DEFAULT_LOOKALIKE_OPTIONS, resolveLookalikeOptions } from '../../../src/core/lookalike/options.js';
import { InvalidInputError } from '../../../src/core/errors.js';

describe('DEFAULT_LOOKALIKE_OPTIONS', () => {
  it('uses the documented defaults: 5-gram shingles, K = 128, b = 16 × r = 8, J ≥ 0.8', () => {
    const o = DEFAULT_LOOKALIKE_OPTIONS;
    expect([o.shingleSize, o.numHashes, o.bands, o.threshold]).toEqual([5, 128, 16, 0.8]);
    // With these, a pair at the threshold is a candidate with probability ≈ 0.95 (1 − (1 − s^r)^b, Mining of Massive Datasets ch. 3).
    expect(candidateProbability(o.threshold, o.bands, o.numHashes / o.bands)).toBeGreaterThan(0.94);
  });

  it('lets the bands meet: partial copies start where "same content, other words" ends (0.2), and the retold rule collapses copies at its own 0.3', () => {
    const o = DEFAULT_LOOKALIKE_OPTIONS;
    expect(o.partialThreshold).toBe(0.2);
    expect(o.retoldMaxJaccard).toBe(o.partialThreshold);
    expect(o.retoldCopyJaccard).toBe(0.3);
  });
});

describe('resolveLookalikeOptions', () => {
  it('merges partial options over the defaults', () => {
    expect(resolveLookalikeOptions({ threshold: 0.9 })).toEqual({ ...DEFAULT_LOOKALIKE_OPTIONS, threshold: 0.9 });
  });

  it.each([
    [{ bands: 15 }, /divide/],
    [{ threshold: 0 }, /threshold/],
    [{ threshold: 1.5 }, /threshold/],
    [{ shingleSize: 2.5 }, /shingleSize/],
    [{ maxBucketSize: 1 }, /maxBucketSize/],
    [{ partialThreshold: 0.9 }, /partialThreshold/],
    [{ retoldCopyJaccard: 0 }, /retoldCopyJaccard/],
    [{ boilerplateFiles: 1 }, /boilerplateFiles/],
    [{ retoldMinGap: -0.1 }, /retoldMinGap/],
    [{ retoldNameMinWords: -1 }, /retoldNameMinWords/],
    [{ retoldMinWords: 1.5 }, /retoldMinWords/],
    [{ retoldNameMinWords: 2.5 }, /retoldNameMinWords/],
    [{ retoldNamesDecide: 'yes' as unknown as boolean }, /retoldNamesDecide/],
    [{ retoldMinEvidence: -0.5 }, /retoldMinEvidence/],
    [{ retoldFewNamesMinEvidence: Number.NaN }, /retoldFewNamesMinEvidence/],
    [{ retoldConceptMinDiff: -2 }, /retoldConceptMinDiff/],
    [{ retoldConceptK: 0 }, /retoldConceptK/],
    [{ retoldConceptMinCosine: 0 }, /retoldConceptMinCosine/],
    [{ retoldConceptMinWords: 1.5 }, /retoldConceptMinWords/],
    [{ retoldConceptMinNameShare: 2 }, /retoldConceptMinNameShare/],
    [{ retoldConceptMinGap: -0.1 }, /retoldConceptMinGap/],
    [{ retoldEvidenceMinCosine: 0 }, /retoldEvidenceMinCosine/],
    [{ retoldEvidenceMinWords: 10.5 }, /retoldEvidenceMinWords/],
    [{ retoldMarginMaxSharedNeighbours: 2.5 }, /retoldMarginMaxSharedNeighbours/],
    [{ retoldMarginMaxSharedNeighbours: -1 }, /retoldMarginMaxSharedNeighbours/],
  ])('rejects %j with a clear message', (bad, message) => {
    expect(() => resolveLookalikeOptions(bad)).toThrow(InvalidInputError);
    expect(() => resolveLookalikeOptions(bad)).toThrow(message);
  });
});
