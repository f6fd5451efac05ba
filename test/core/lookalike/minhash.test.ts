import { describe, expect, it, vi } from 'vitest';
import { createMinHasher, estimateJaccard, multiplyAddShift } from '../../../src/core/lookalike/minhash.js';
import { createRandom } from '../../../src/core/random.js';
import { setPairWithJaccard } from './corpusFixtures.js';

describe('multiplyAddShift', () => {
  it('equals ⌊((a·x + b) mod 2⁶⁴) / 2³²⌋ computed with BigInt', () => {
    // Reference: exact integer arithmetic (JavaScript BigInt) on the family's definition.
    const rng = createRandom(5);
    const edge = [0, 1, 0xffff, 0x10000, 0x7fffffff, 0x80000000, 0xffffffff];
    for (let t = 0; t < 3000; t++) {
      const pickWord = (): number => (t < 343 ? edge[Math.floor(rng.next() * edge.length)] : rng.nextUint32());
      const [aHi, aLo, bHi, bLo, x] = [pickWord(), pickWord(), pickWord(), pickWord(), pickWord()];
      const a = (BigInt(aHi) << 32n) | BigInt(aLo);
      const b = (BigInt(bHi) << 32n) | BigInt(bLo);
      const expected = Number(((a * BigInt(x) + b) & ((1n << 64n) - 1n)) >> 32n);
      expect(multiplyAddShift(aHi, aLo, bHi, bLo, x)).toBe(expected);
    }
  });
});

describe('createMinHasher', () => {
  it('gives the same signature for the same seed and set, and another for another seed', () => {
    const [a] = setPairWithJaccard(200, 100, createRandom(1));
    expect(createMinHasher(64, 9).signature(a)).toEqual(createMinHasher(64, 9).signature(a));
    expect(createMinHasher(64, 10).signature(a)).not.toEqual(createMinHasher(64, 9).signature(a));
  });

  it('gives the same signatures on the WebAssembly kernel as on the plain loop, for small and large sets', () => {
    // The kernel's u64 arithmetic against the float pieces of multiplyAddShift (itself checked against BigInt above).
    const rng = createRandom(21);
    const edge = [0, 1, 0xffff, 0x10000, 0x7fffffff, 0x80000000, 0xffffffff];
    const kernel = createMinHasher(128, 4);
    const plain = createMinHasher(128, 4, { kernel: false });
    for (const n of [1, 2, 7, 300, 5000, 70_000]) {
      const keys = Uint32Array.from({ length: n }, (_, i) => (i < edge.length && n < 300 ? edge[i] : rng.nextUint32()));
      expect(kernel.signature(keys)).toEqual(plain.signature(keys));
    }
    // Written at an offset into a caller's array, as findLookalikes does.
    const keys = Uint32Array.from({ length: 50 }, () => rng.nextUint32());
    const out = new Uint32Array(3 * 128);
    kernel.signature(keys, out, 128);
    expect(out.subarray(128, 256)).toEqual(plain.signature(keys));
    expect(out.subarray(0, 128).every((v) => v === 0) && out.subarray(256).every((v) => v === 0)).toBe(true);
  });

  it('falls back on the plain loop, with the same signatures, where the kernel gets no memory', () => {
    const keys = Uint32Array.from({ length: 400 }, (_, i) => Math.imul(i + 1, 0x9e3779b1) >>> 0);
    const expected = createMinHasher(64, 8, { kernel: false }).signature(keys);
    const refuse = vi.spyOn(WebAssembly, 'Memory').mockImplementation(() => {
      throw new RangeError('WebAssembly.Memory(): could not allocate memory');
    });
    try {
      expect(createMinHasher(64, 8).signature(keys)).toEqual(expected);
      expect(refuse).toHaveBeenCalled();
    } finally {
      refuse.mockRestore();
    }
  });

  it('refuses an empty set and a non-positive size', () => {
    expect(() => createMinHasher(8, 1).signature(new Uint32Array(0))).toThrow(/empty set/);
    expect(() => createMinHasher(0, 1)).toThrow(/positive/);
  });

  // Broder 1997: each MinHash entry matches with probability J, so the estimate from K entries is
  // unbiased with standard error √(J(1−J)/K) (binomial: 0.035 at K = 128, J = 0.8).
  // Tolerances: mean within 4 standard errors of the mean over T trials; the sample standard
  // deviation within ±20 % of √(J(1−J)/K) (its own relative error is ≈ 1/√(2T) = 5 % at T = 200).
  it.each([0.2, 0.5, 0.8, 0.95])('estimates J = %s without bias and with standard error √(J(1−J)/K)', (j) => {
    const K = 128;
    const T = 200;
    const union = 400;
    const rng = createRandom(Math.round(j * 1000));
    const estimates: number[] = [];
    for (let t = 0; t < T; t++) {
      const [a, b] = setPairWithJaccard(union, Math.round(j * union), rng);
      const hasher = createMinHasher(K, 1000 + t);
      estimates.push(estimateJaccard(hasher.signature(a), hasher.signature(b)));
    }
    const mean = estimates.reduce((s, e) => s + e, 0) / T;
    const sd = Math.sqrt(estimates.reduce((s, e) => s + (e - mean) ** 2, 0) / (T - 1));
    const se = Math.sqrt((j * (1 - j)) / K);
    expect(Math.abs(mean - j)).toBeLessThan((4 * se) / Math.sqrt(T));
    expect(sd / se).toBeGreaterThan(0.8);
    expect(sd / se).toBeLessThan(1.2);
  });
});
