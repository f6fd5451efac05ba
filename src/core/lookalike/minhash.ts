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
 * Signatures run on the WebAssembly kernel (../matrix/wasm/assembly/minHash.ts: one u64 multiply
 * and add, the same numbers; about six times faster) where WebAssembly SIMD and shared memory are
 * available, else on the plain loop below.
 */
import { InvalidInputError } from '../errors.js';
import { instantiateKernelModule, kernelModule, MAX_PAGES } from '../matrix/wasm/kernelModule.js';
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

export interface MinHasherOptions {
  /** Use the WebAssembly kernel when it is available (same signatures). @default true */
  readonly kernel: boolean;
}

export const DEFAULT_MIN_HASHER_OPTIONS: MinHasherOptions = Object.freeze({ kernel: true });

const PAGE = 65536;

export function createMinHasher(numHashes: number, seed: number, options: Partial<MinHasherOptions> = {}): MinHasher {
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
  const params: HashParams = { aHi, aLo, bHi, bLo };
  const plain = (keys: Uint32Array, dest: Uint32Array, offset: number): void => plainSignature(params, keys, dest, offset);
  const module = (options.kernel ?? DEFAULT_MIN_HASHER_OPTIONS.kernel) ? kernelModule() : null;
  const fast = module ? kernelSignature(module, params, plain) : plain;
  const signature = (keys: Uint32Array, out?: Uint32Array, offset = 0): Uint32Array => {
    if (keys.length === 0) throw new InvalidInputError('MinHash of an empty set is undefined');
    const dest = out ?? new Uint32Array(numHashes);
    fast(keys, dest, offset);
    return dest;
  };
  return { numHashes, signature };
}

/** The K functions' constants: a = aHi·2³² + aLo, b = bHi·2³² + bLo. */
interface HashParams {
  readonly aHi: Uint32Array;
  readonly aLo: Float64Array;
  readonly bHi: Float64Array;
  readonly bLo: Float64Array;
}

/** The signature of a non-empty set into dest[offset…offset+K), by the plain loop. */
function plainSignature({ aHi, aLo, bHi, bLo }: HashParams, keys: Uint32Array, dest: Uint32Array, offset: number): void {
  // Permutation-major loop: the four constants and the running minimum stay in registers.
  for (let i = 0; i < aHi.length; i++) {
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
}

/**
 * The signature on the kernel module, in a memory of its own: the 2K parameters (u64 a, b) and
 * the K-entry output first, then the keys, copied in for each set (the memory grows to the
 * largest). Where that memory cannot be had (address space refused), or cannot grow for a set,
 * the plain loop computes the same numbers.
 */
function kernelSignature(
  module: WebAssembly.Module,
  params: HashParams,
  plain: (keys: Uint32Array, dest: Uint32Array, offset: number) => void,
): (keys: Uint32Array, dest: Uint32Array, offset: number) => void {
  const numHashes = params.aHi.length;
  const outAt = 16 * numHashes;
  const keysAt = outAt + ((4 * numHashes + 15) & ~15);
  let memory: WebAssembly.Memory;
  let kernels: ReturnType<typeof instantiateKernelModule>;
  try {
    memory = new WebAssembly.Memory({ initial: Math.ceil((keysAt + 4096) / PAGE), maximum: MAX_PAGES, shared: true });
    kernels = instantiateKernelModule(module, memory);
  } catch {
    return plain;
  }
  // WebAssembly's u64 words are little-endian: the low half first.
  const words = new DataView(memory.buffer, 0, 16 * numHashes);
  for (let i = 0; i < numHashes; i++) {
    words.setUint32(16 * i, params.aLo[i], true);
    words.setUint32(16 * i + 4, params.aHi[i], true);
    words.setUint32(16 * i + 8, params.bLo[i], true);
    words.setUint32(16 * i + 12, params.bHi[i], true);
  }
  return (keys, dest, offset) => {
    const need = keysAt + 4 * keys.length;
    if (need > memory.buffer.byteLength) {
      try {
        memory.grow(Math.ceil((need - memory.buffer.byteLength) / PAGE));
      } catch {
        plain(keys, dest, offset);
        return;
      }
    }
    new Uint32Array(memory.buffer, keysAt, keys.length).set(keys);
    kernels.min_hash(keysAt, keys.length, 0, numHashes, outAt);
    dest.set(new Uint32Array(memory.buffer, outAt, numHashes), offset);
  };
}

/** Share of equal entries in two signatures of length K starting at the given offsets. */
export function estimateJaccard(a: Uint32Array, b: Uint32Array, k = a.length, offsetA = 0, offsetB = 0): number {
  let equal = 0;
  for (let i = 0; i < k; i++) if (a[offsetA + i] === b[offsetB + i]) equal++;
  return k === 0 ? 0 : equal / k;
}
