/**
 * Seeded pseudo-random source: xoshiro128** (Blackman & Vigna, "Scrambled linear pseudorandom
 * number generators", ACM TOMS 2021) seeded through splitmix32, plus Box–Muller normals.
 * The core never calls Math.random; the same seed gives the same stream on every platform
 * (32-bit integer arithmetic via Math.imul only).
 */

export interface RandomSource {
  /** Uniform in [0, 1). */
  next(): number;
  /** Standard normal N(0, 1). */
  normal(): number;
  /** Uniform 32-bit unsigned integer. */
  nextUint32(): number;
}

/** Default seed used when the caller gives none (common practice: any fixed constant). */
export const DEFAULT_SEED = 20261201;

export function createRandom(seed: number = DEFAULT_SEED): RandomSource {
  // splitmix32 expands one 32-bit seed into four state words.
  let x = seed >>> 0;
  const split = (): number => {
    x = (x + 0x9e3779b9) >>> 0;
    let z = x;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  let s0 = split();
  let s1 = split();
  let s2 = split();
  let s3 = split();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;

  const nextUint32 = (): number => {
    const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return r;
  };
  const next = (): number => nextUint32() / 4294967296;
  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const v = spare;
      spare = null;
      return v;
    }
    let u = 0;
    while (u === 0) u = next();
    const w = next();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * w);
    return r * Math.cos(2 * Math.PI * w);
  };
  return { next, normal, nextUint32 };
}

function rotl(v: number, k: number): number {
  return ((v << k) | (v >>> (32 - k))) >>> 0;
}
