/**
 * MinHash signatures (Broder 1997; Broder, Charikar, Frieze & Mitzenmacher 2000, "Min-wise
 * independent permutations"). For a random permutation π, P[min π(A) = min π(B)] = J(A, B), so
 * the share of equal entries in two K-entry signatures estimates Jaccard with standard error
 * √(J(1−J)/K) (binomial; 0.035 at K = 128, J = 0.8).
 *
 * The K "permutations" are drawn from a seeded universal family over 32-bit keys: Dietzfelbinger's
 * multiply-add-shift, h(x) = ⌊((a·x + b) mod 2⁶⁴) / 2³²⌋ with random 64-bit a, b (Dietzfelbinger
 * 1996, STACS, "Universal hashing and k-wise independent random variables via integer arithmetic
 * without primes"; from memory). It is 2-independent, not fully min-wise; our keys are already
 * MurmurHash3 outputs, and the tests check the estimator's bias and spread against √(J(1−J)/K).
 * The 64-bit product is formed from exact float pieces (every intermediate < 2⁵³).
 *
 * Default K = 128 (with b = 16 bands of r = 8 rows: see options.ts).
 */
import { InvalidInputError } from '../errors.js';
import { createRandom } from '../random.js';

const TWO16 = 65536;
const INV16 = 1 / 65536;
const INV32 = 1 / 4294967296;

/** The K hash functions of one seed; same seed, same signatures. */
export interface MinHasher {
  readonly numHashes: number;
  /** Signature of a non-empty set of 32-bit keys; written into out[offset..offset+K) if given. */
  signature(keys: Uint32Array, out?: Uint32Array, offset?: number): Uint32Array;
}

/** One member of the family: ⌊((a·x + b) mod 2⁶⁴) / 2³²⌋ with a = aHi·2³² + aLo, b = bHi·2³² + bLo. */
export function multiplyAddShift(aHi: number, aLo: number, bHi: number, bLo: number, x: number): number {
  const p1 = aLo * (x >>> 16);
  const p1h = Math.floor(p1 * INV16);
  const low = aLo * (x & 0xffff) + (p1 - p1h * TWO16) * TWO16 + bLo;
  return (Math.floor(low * INV32) + p1h + Math.imul(aHi, x) + bHi) >>> 0;
}

export function createMinHasher(numHashes: number, seed: number): MinHasher {
  if (!Number.isInteger(numHashes) || numHashes < 1) {
    throw new InvalidInputError(`MinHash needs a positive whole number of hash functions, got ${numHashes}`);
  }
  const rng = createRandom(seed);
  const aHi = new Uint32Array(numHashes);
  const aLo = new Float64Array(numHashes);
  const bHi = new Float64Array(numHashes);
  const bLo = new Float64Array(numHashes);
  for (let i = 0; i < numHashes; i++) {
    aHi[i] = rng.nextUint32();
    aLo[i] = rng.nextUint32();
    bHi[i] = rng.nextUint32();
    bLo[i] = rng.nextUint32();
  }
  const signature = (keys: Uint32Array, out?: Uint32Array, offset = 0): Uint32Array => {
    if (keys.length === 0) throw new InvalidInputError('MinHash of an empty set is undefined');
    const dest = out ?? new Uint32Array(numHashes);
    // Permutation-major loop: the four constants and the running minimum stay in registers.
    for (let i = 0; i < numHashes; i++) {
      const lo = aLo[i];
      const hi = aHi[i];
      const bl = bLo[i];
      const bh = bHi[i];
      let best = 4294967296;
      for (let s = 0; s < keys.length; s++) {
        const x = keys[s];
        const p1 = lo * (x >>> 16);
        const p1h = Math.floor(p1 * INV16);
        const low = lo * (x & 0xffff) + (p1 - p1h * TWO16) * TWO16 + bl;
        const h = (Math.floor(low * INV32) + p1h + Math.imul(hi, x) + bh) >>> 0;
        if (h < best) best = h;
      }
      dest[offset + i] = best;
    }
    return dest;
  };
  return { numHashes, signature };
}

/** Share of equal entries in two signatures of length K starting at the given offsets. */
export function estimateJaccard(a: Uint32Array, b: Uint32Array, k = a.length, offsetA = 0, offsetB = 0): number {
  let equal = 0;
  for (let i = 0; i < k; i++) if (a[offsetA + i] === b[offsetB + i]) equal++;
  return k === 0 ? 0 : equal / k;
}
