import { describe, expect, it } from 'vitest';
import { CAPPED_NEIGHBOURS, bandCandidates, candidateProbability } from '../../../src/core/lookalike/banding.js';
import { createMinHasher } from '../../../src/core/lookalike/minhash.js';
import { UnionFind } from '../../../src/core/lookalike/unionFind.js';
import { createRandom } from '../../../src/core/random.js';
import { setPairWithJaccard } from './corpusFixtures.js';

/** Binomial tolerance: 4 standard deviations of a rate from T trials, plus one count for discreteness. */
const tolerance = (p: number, trials: number): number => 4 * Math.sqrt((p * (1 - p)) / trials) + 1 / trials;

const B = 16;
const R = 8;

describe('candidateProbability', () => {
  it('reproduces 1 − (1 − s^r)^b for b=16, r=8 (Mining of Massive Datasets ch. 3; values from the formula, to 2 places) (P(0.6)=0.24, P(0.7)=0.61, P(0.8)=0.95, P(0.85)=0.99)', () => {
    expect(candidateProbability(0.6, B, R)).toBeCloseTo(0.24, 2);
    expect(candidateProbability(0.7, B, R)).toBeCloseTo(0.61, 2);
    expect(candidateProbability(0.8, B, R)).toBeCloseTo(0.95, 2);
    expect(candidateProbability(0.85, B, R)).toBeCloseTo(0.99, 2);
  });
});

describe('bandCandidates', () => {
  // MMDS ch. 3.4: if each of the b·r rows agrees independently with probability s, the pair is a
  // candidate with probability 1 − (1 − s^r)^b. Synthetic signatures with exactly that property.
  it.each([0.3, 0.5, 0.6, 0.7, 0.8, 0.9])('makes pairs with row agreement %s candidates at rate 1 − (1 − s^r)^b', (s) => {
    const T = 2000;
    const rng = createRandom(Math.round(s * 100));
    const sig = new Uint32Array(2 * T * B * R);
    for (let t = 0; t < T; t++) {
      for (let c = 0; c < B * R; c++) {
        const v = rng.nextUint32();
        sig[2 * t * B * R + c] = v;
        sig[(2 * t + 1) * B * R + c] = rng.next() < s ? v : (v ^ (1 + (rng.nextUint32() % 0xfffffffe))) >>> 0;
      }
    }
    const cand = bandCandidates(sig, 2 * T, B * R, { bands: B, rows: R, maxBucketSize: 100 });
    let planted = 0;
    for (let c = 0; c < cand.count; c++) if (cand.left[c] % 2 === 0 && cand.right[c] === cand.left[c] + 1) planted++;
    const p = candidateProbability(s, B, R);
    expect(Math.abs(planted / T - p)).toBeLessThanOrEqual(tolerance(p, T));
    expect(cand.count - planted).toBe(0); // unrelated random rows never share a band
  });

  // The same curve end to end: real MinHash signatures (K = 128, a fresh seed per trial) of key sets
  // with exact Jaccard s (Broder: each row matches with probability s).
  it.each([0.5, 0.7, 0.8, 0.9])('makes MinHash signatures of sets with Jaccard %s candidates at rate 1 − (1 − s^8)^16', (s) => {
    const T = 300;
    const rng = createRandom(Math.round(s * 1000) + 1);
    let hits = 0;
    for (let t = 0; t < T; t++) {
      const [a, b] = setPairWithJaccard(100, Math.round(s * 100), rng);
      const hasher = createMinHasher(B * R, 7000 + t);
      const sig = new Uint32Array(2 * B * R);
      hasher.signature(a, sig, 0);
      hasher.signature(b, sig, B * R);
      hits += bandCandidates(sig, 2, B * R, { bands: B, rows: R, maxBucketSize: 100 }).count;
    }
    const p = candidateProbability(s, B, R);
    expect(Math.abs(hits / T - p)).toBeLessThanOrEqual(tolerance(p, T));
  });

  it('emits exactly the pairs that share some band, when buckets are small (brute-force check)', () => {
    const rng = createRandom(21);
    const items = 200;
    const bands = 4;
    const rows = 2;
    const width = bands * rows;
    // Few distinct values per row, so many band collisions happen.
    const sig = Uint32Array.from({ length: items * width }, () => rng.nextUint32() % 3);
    const cand = bandCandidates(sig, items, width, { bands, rows, maxBucketSize: items });
    const got = new Set<string>();
    for (let c = 0; c < cand.count; c++) got.add(`${cand.left[c]} ${cand.right[c]}`);
    const expected = new Set<string>();
    for (let i = 0; i < items; i++) {
      for (let j = i + 1; j < items; j++) {
        for (let t = 0; t < bands; t++) {
          let same = true;
          for (let r = 0; r < rows; r++) same &&= sig[i * width + t * rows + r] === sig[j * width + t * rows + r];
          if (same) {
            expected.add(`${i} ${j}`);
            break;
          }
        }
      }
    }
    expect(got).toEqual(expected);
    expect(cand.count).toBe(got.size); // no pair twice
  });

  it('caps a giant bucket to sorted-neighbourhood pairs and still connects it', () => {
    const items = 300;
    const width = 16;
    const sig = new Uint32Array(items * width).fill(42); // one bucket of 300 in every band
    const cand = bandCandidates(sig, items, width, { bands: 4, rows: 4, maxBucketSize: 10 });
    // Each member pairs with its next CAPPED_NEIGHBOURS = 10 in order: Σ min(10, 299 − p) = 10·290 + (9 + … + 0) = 2945.
    expect(CAPPED_NEIGHBOURS).toBe(10);
    expect(cand.count).toBe(2945);
    expect(cand.cappedBuckets).toBe(4);
    const uf = new UnionFind(items);
    for (let c = 0; c < cand.count; c++) uf.union(cand.left[c], cand.right[c]);
    expect(uf.components()).toEqual([Array.from({ length: items }, (_, i) => i)]);
  });

  it('rejects signatures of the wrong size', () => {
    expect(() => bandCandidates(new Uint32Array(10), 2, 8, { bands: 2, rows: 4, maxBucketSize: 5 })).toThrow(/signature words/);
  });
});
