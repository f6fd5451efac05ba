import { describe, expect, it } from 'vitest';
import { spectrumSeries } from '../../../src/core/map/spectrum.js';
import { InvalidInputError } from '../../../src/core/errors.js';

describe('spectrumSeries', () => {
  it('gives σ²/‖A‖²F shares and their running sum (hand-computed)', () => {
    // A with singular values 3, 2, 1 has ‖A‖²F = 9 + 4 + 1 = 14 (Frobenius norm = Σσ², Golub & Van Loan §2.5).
    const s = spectrumSeries([3, 2, 1], 14, 2);
    expect(Array.from(s.share)).toEqual([9 / 14, 4 / 14, 1 / 14]);
    expect(s.cumulative[1]).toBeCloseTo(13 / 14, 15);
    expect(s.cumulative[2]).toBeCloseTo(1, 15);
    expect(s.k).toBe(2);
  });

  it('rejects a non-positive total energy', () => {
    expect(() => spectrumSeries([1], 0, 1)).toThrow(InvalidInputError);
  });
});
