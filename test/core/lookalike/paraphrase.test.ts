import { describe, expect, it } from 'vitest';
import { findHighCosinePairs } from '../../../src/core/lookalike/paraphrase.js';
import { createRandom } from '../../../src/core/random.js';
import { atCosine, cosineOf, randomUnit } from './vectorFixtures.js';

const params = { threshold: 0.95, allPairsLimit: 2000, simhashBands: 24, simhashBitsPerBand: 16, maxBucketSize: 100, seed: 5 };

/** n random unit vectors with `planted` partners at cosines spread over [0.9, 0.995]. */
function plantedVectors(n: number, planted: number, dims: number, seed: number): Float32Array {
  const rng = createRandom(seed);
  const out = new Float32Array(n * dims);
  for (let i = 0; i < n; i++) out.set(randomUnit(dims, rng), i * dims);
  for (let p = 0; p < planted; p++) {
    const u = Float64Array.from(out.subarray(2 * p * dims, (2 * p + 1) * dims));
    out.set(atCosine(u, 0.9 + (0.095 * p) / planted, rng), (2 * p + 1) * dims);
  }
  return out;
}

/** Reference: every pair's cosine in float64, written here from the definition. */
function bruteForce(v: Float32Array, n: number, dims: number, threshold: number): Map<string, number> {
  const found = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const c = cosineOf(v.subarray(i * dims, (i + 1) * dims), v.subarray(j * dims, (j + 1) * dims));
      if (c >= threshold) found.set(`${i} ${j}`, c);
    }
  }
  return found;
}

describe('findHighCosinePairs', () => {
  it('returns exactly the brute-force pairs in all-pairs mode', () => {
    const n = 400;
    const dims = 24;
    const v = plantedVectors(n, 60, dims, 1);
    const truth = bruteForce(v, n, dims, 0.95);
    const got = findHighCosinePairs(v, dims, Array.from({ length: n }, (_, i) => i), params);
    expect(got.mode).toBe('all-pairs');
    expect(got.candidates).toBe((n * (n - 1)) / 2);
    expect(new Set(got.left.map((a, t) => `${a} ${got.right[t]}`))).toEqual(new Set(truth.keys()));
    got.left.forEach((a, t) => expect(got.cosine[t]).toBeCloseTo(truth.get(`${a} ${got.right[t]}`) as number, 6));
  });

  // SimHash banding with 24 bands × 16 bits: a pair at cosine c is a candidate with probability
  // 1 − (1 − (1 − arccos(c)/π)^16)^24 (Charikar 2002 + MMDS ch. 3): ≈ 0.992 at 0.95, higher above.
  it('finds ≥ 97 % of the brute-force pairs with SimHash candidates, and only true pairs', () => {
    const n = 3000;
    const dims = 32;
    const v = plantedVectors(n, 300, dims, 2);
    const truth = bruteForce(v, n, dims, 0.95);
    const got = findHighCosinePairs(v, dims, Array.from({ length: n }, (_, i) => i), { ...params, allPairsLimit: 1000 });
    expect(got.mode).toBe('simhash');
    const keys = got.left.map((a, t) => `${a} ${got.right[t]}`);
    expect(keys.every((k) => truth.has(k))).toBe(true);
    expect(keys.length / truth.size).toBeGreaterThanOrEqual(0.97);
    expect(truth.size).toBeGreaterThan(100);
    expect(got.candidates).toBeLessThan((n * (n - 1)) / 2 / 20); // far from all pairs
  });

  it('leaves out zero vectors and rows not listed', () => {
    const v = new Float32Array([1, 0, 0, 0, 0.99, 0.141, 1, 0.001]);
    const got = findHighCosinePairs(v, 2, [0, 1, 2], params);
    expect(got.left).toEqual([0]);
    expect(got.right).toEqual([2]);
  });
});
