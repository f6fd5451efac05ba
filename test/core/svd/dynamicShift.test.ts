import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { invertUpperTransposed } from '../../../src/core/matrix/choleskyQr.js';
import { createRandom } from '../../../src/core/random.js';
import { nextShift, smallestSingularValue } from '../../../src/core/svd/dynamicShift.js';

/** A seeded upper-triangular l × l factor (row-major) with a diagonal kept away from 0. */
function upperFactor(l: number, seed: number): Float64Array {
  const random = createRandom(seed);
  const r = new Float64Array(l * l);
  for (let i = 0; i < l; i++) {
    r[i * l + i] = 1 + 4 * random.next();
    for (let j = i + 1; j < l; j++) r[i * l + j] = random.normal() * 0.5;
  }
  return r;
}

describe('smallestSingularValue', () => {
  it("matches ml-matrix's SVD of the factor within 1%, from above (reference library)", () => {
    for (const [l, seed] of [
      [12, 1],
      [40, 2],
      [90, 3],
    ]) {
      const r = upperFactor(l, seed);
      const rows = Array.from({ length: l }, (_, i) => Array.from(r.subarray(i * l, (i + 1) * l)));
      const exact = Math.min(...new SingularValueDecomposition(new Matrix(rows)).diagonal);
      const estimate = smallestSingularValue(invertUpperTransposed(r, l), l);
      // The power method approaches ‖R⁻¹‖ from below, so the estimate is never below σ_min.
      expect(estimate).toBeGreaterThanOrEqual(exact * (1 - 1e-12));
      expect(estimate / exact - 1).toBeLessThan(0.01);
    }
  });

  it('gives 0 for a factor whose inverse is not finite', () => {
    const inverseT = new Float64Array([Infinity, 0, 0, 1]);
    expect(smallestSingularValue(inverseT, 2)).toBe(0);
  });
});

describe('nextShift', () => {
  it('moves half way to the estimate when the estimate is above the shift (Feng et al. 2024), else stays', () => {
    expect(nextShift(0, 8)).toBe(4);
    expect(nextShift(4, 6)).toBe(5);
    expect(nextShift(4, 3)).toBe(4);
    expect(nextShift(4, 0)).toBe(4);
  });
});
