import { describe, expect, it } from 'vitest';
import { hyperplaneAgreement, simhashBands } from '../../../src/core/lookalike/simhash.js';
import { createRandom } from '../../../src/core/random.js';
import { atCosine, randomUnit } from './vectorFixtures.js';

describe('simhashBands', () => {
  // Charikar 2002 (random-hyperplane rounding, after Goemans–Williamson): two vectors at angle θ
  // get the same sign bit with probability 1 − θ/π. Tolerance: 4 binomial standard deviations.
  it.each([0.98, 0.95, 0.8, 0.5, 0, -0.6])('makes vectors at cosine %s agree on a bit with probability 1 − θ/π', (cosine) => {
    const dims = 48;
    const pairs = 40;
    const bands = 8;
    const bits = 32;
    const rng = createRandom(Math.round((cosine + 1) * 1000));
    const vectors = new Float32Array(2 * pairs * dims);
    for (let p = 0; p < pairs; p++) {
      const u = randomUnit(dims, rng);
      vectors.set(u, 2 * p * dims);
      vectors.set(atCosine(u, cosine, rng), (2 * p + 1) * dims);
    }
    const rows = Int32Array.from({ length: 2 * pairs }, (_, i) => i);
    const words = simhashBands(vectors, dims, rows, { bands, bitsPerBand: bits, seed: 3 });
    let agree = 0;
    for (let p = 0; p < pairs; p++) {
      for (let b = 0; b < bands; b++) {
        let same = ~(words[2 * p * bands + b] ^ words[(2 * p + 1) * bands + b]) >>> 0;
        while (same) {
          agree += same & 1;
          same >>>= 1;
        }
      }
    }
    const n = pairs * bands * bits;
    const p = hyperplaneAgreement(cosine);
    expect(p).toBeCloseTo(1 - Math.acos(cosine) / Math.PI, 12);
    expect(Math.abs(agree / n - p)).toBeLessThanOrEqual(4 * Math.sqrt((p * (1 - p)) / n) + 1 / n);
  });

  it('signs only the listed rows, in the listed order, and repeats itself for a seed', () => {
    const rng = createRandom(4);
    const dims = 10;
    const vectors = new Float32Array(3 * dims).map(() => rng.normal());
    const params = { bands: 3, bitsPerBand: 12, seed: 8 };
    const all = simhashBands(vectors, dims, Int32Array.from([0, 1, 2]), params);
    const some = simhashBands(vectors, dims, Int32Array.from([2, 0]), params);
    expect([...some]).toEqual([...all.slice(6, 9), ...all.slice(0, 3)]);
    expect(all.every((w) => w < 1 << 12)).toBe(true);
  });

  it('rejects more than 32 bits per band', () => {
    expect(() => simhashBands(new Float32Array(4), 2, Int32Array.from([0]), { bands: 1, bitsPerBand: 33, seed: 1 })).toThrow(/1 to 32/);
  });
});
