/**
 * MurmurHash3 (Austin Appleby, SMHasher, public domain reference MurmurHash3.cpp): the x86_32 and
 * x86_128 variants, written from the published algorithm in 32-bit integer arithmetic
 * (Math.imul), so results match the reference byte for byte on every platform.
 *
 * - murmur3x86_32 / murmur3x86_128 hash bytes (little-endian 4-byte blocks).
 * - murmur3Words32 hashes 32-bit words; it equals murmur3x86_32 on their little-endian bytes and
 *   skips the byte packing (used to hash a window of token hashes into a shingle hash).
 * - hashString32 hashes the UTF-8 bytes of a string.
 * Not cryptographic: fine for grouping files, not for resisting a deliberate collision.
 */

const C1 = 0xcc9e2d51;
const C2 = 0x1b873593;

function rotl(v: number, k: number): number {
  return (v << k) | (v >>> (32 - k));
}

/** The 32-bit finaliser ("fmix32") of MurmurHash3. */
export function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

function mixBlock32(h: number, k: number): number {
  k = Math.imul(rotl(Math.imul(k, C1), 15), C2);
  h = rotl(h ^ k, 13);
  return (Math.imul(h, 5) + 0xe6546b64) | 0;
}

/** MurmurHash3_x86_32 of bytes[0..length). */
export function murmur3x86_32(bytes: Uint8Array, seed = 0, length = bytes.length): number {
  let h = seed | 0;
  const blocks = length & ~3;
  for (let i = 0; i < blocks; i += 4) {
    h = mixBlock32(h, bytes[i] | (bytes[i + 1] << 8) | (bytes[i + 2] << 16) | (bytes[i + 3] << 24));
  }
  const rest = length & 3;
  if (rest > 0) h ^= Math.imul(rotl(Math.imul(word(bytes, blocks, rest), C1), 15), C2);
  return fmix32(h ^ length);
}

/** MurmurHash3_x86_32 of the little-endian bytes of words[start..start+count). */
export function murmur3Words32(words: Uint32Array, start: number, count: number, seed = 0): number {
  let h = seed | 0;
  for (let i = start, end = start + count; i < end; i++) h = mixBlock32(h, words[i]);
  return fmix32(h ^ (count * 4));
}

const encoder = new TextEncoder();
let scratch = new Uint8Array(256);

/** MurmurHash3_x86_32 of the UTF-8 encoding of s. */
export function hashString32(s: string, seed = 0): number {
  // A UTF-16 code unit never needs more than 3 UTF-8 bytes (surrogate pairs: 4 bytes for 2 units).
  if (scratch.length < s.length * 3) scratch = new Uint8Array(s.length * 3);
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c >= 0x80) {
      n = encoder.encodeInto(s, scratch).written;
      break;
    }
    scratch[n++] = c;
  }
  return murmur3x86_32(scratch, seed, n);
}

const D1 = 0x239b961b;
const D2 = 0xab0e9789;
const D3 = 0x38b34ae5;
const D4 = 0xa1e38b93;

function word(b: Uint8Array, i: number, n: number): number {
  // Little-endian word of up to n (1..4) bytes, as the reference's tail switch builds it.
  let k = 0;
  for (let j = n - 1; j >= 0; j--) k = (k << 8) | b[i + j];
  return k;
}

/** MurmurHash3_x86_128 of bytes: the four 32-bit output words h1..h4 (unsigned). */
export function murmur3x86_128(bytes: Uint8Array, seed = 0): [number, number, number, number] {
  const length = bytes.length;
  let h1 = seed | 0;
  let h2 = h1;
  let h3 = h1;
  let h4 = h1;
  const blocks = length & ~15;
  for (let i = 0; i < blocks; i += 16) {
    h1 ^= Math.imul(rotl(Math.imul(word(bytes, i, 4), D1), 15), D2);
    h1 = (Math.imul(rotl(h1, 19) + h2, 5) + 0x561ccd1b) | 0;
    h2 ^= Math.imul(rotl(Math.imul(word(bytes, i + 4, 4), D2), 16), D3);
    h2 = (Math.imul(rotl(h2, 17) + h3, 5) + 0x0bcaa747) | 0;
    h3 ^= Math.imul(rotl(Math.imul(word(bytes, i + 8, 4), D3), 17), D4);
    h3 = (Math.imul(rotl(h3, 15) + h4, 5) + 0x96cd1c35) | 0;
    h4 ^= Math.imul(rotl(Math.imul(word(bytes, i + 12, 4), D4), 18), D1);
    h4 = (Math.imul(rotl(h4, 13) + h1, 5) + 0x32ac3b17) | 0;
  }
  const rest = length & 15;
  if (rest > 12) h4 ^= Math.imul(rotl(Math.imul(word(bytes, blocks + 12, rest - 12), D4), 18), D1);
  if (rest > 8) h3 ^= Math.imul(rotl(Math.imul(word(bytes, blocks + 8, Math.min(4, rest - 8)), D3), 17), D4);
  if (rest > 4) h2 ^= Math.imul(rotl(Math.imul(word(bytes, blocks + 4, Math.min(4, rest - 4)), D2), 16), D3);
  if (rest > 0) h1 ^= Math.imul(rotl(Math.imul(word(bytes, blocks, Math.min(4, rest)), D1), 15), D2);
  h1 ^= length;
  h2 ^= length;
  h3 ^= length;
  h4 ^= length;
  h1 = (h1 + h2 + h3 + h4) | 0;
  h2 = (h2 + h1) | 0;
  h3 = (h3 + h1) | 0;
  h4 = (h4 + h1) | 0;
  h1 = fmix32(h1);
  h2 = fmix32(h2);
  h3 = fmix32(h3);
  h4 = fmix32(h4);
  h1 = (h1 + h2 + h3 + h4) | 0;
  h2 = (h2 + h1) | 0;
  h3 = (h3 + h1) | 0;
  h4 = (h4 + h1) | 0;
  return [h1 >>> 0, h2 >>> 0, h3 >>> 0, h4 >>> 0];
}
