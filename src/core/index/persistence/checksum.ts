/**
 * A fast 32-bit checksum over bytes, word at a time (multiply–rotate mixing in the style of
 * MurmurHash3's block step, Appleby 2011, with its fmix32 finaliser). It detects damaged or
 * truncated index files; it is not a cryptographic hash.
 * Words are little-endian and go round-robin to four independent running states (so the
 * processor can work on four at once: a saved index is hundreds of megabytes and is checked on
 * every reopen); leftover words, the states in order, and the tail bytes then feed one final state.
 * The value does not depend on the platform's byte order or on the bytes' alignment.
 */

import { fmix32 } from '../../lookalike/murmur3.js';

const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** One block step: mixes word k into state h. */
function step(h: number, k: number): number {
  k = Math.imul(k, 0xcc9e2d51);
  k = (k << 15) | (k >>> 17);
  h ^= Math.imul(k, 0x1b873593);
  h = (h << 13) | (h >>> 19);
  return (Math.imul(h, 5) + 0xe6546b64) | 0;
}

/** The bytes' whole little-endian words (a view when possible, else a copy). */
function wordsOf(bytes: Uint8Array): Uint32Array {
  const words = bytes.length >>> 2;
  if (LITTLE_ENDIAN && bytes.byteOffset % 4 === 0) return new Uint32Array(bytes.buffer, bytes.byteOffset, words);
  const out = new Uint32Array(words);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  for (let i = 0; i < words; i++) out[i] = view.getUint32(i * 4, true);
  return out;
}

export function checksum32(bytes: Uint8Array): number {
  const w = wordsOf(bytes);
  const blocks = w.length & ~3;
  let h0 = 0x12345678;
  let h1 = 0x9e3779b9;
  let h2 = 0x85ebca6b;
  let h3 = 0xc2b2ae35;
  for (let i = 0; i < blocks; i += 4) {
    let k = Math.imul(w[i], 0xcc9e2d51);
    k = (k << 15) | (k >>> 17);
    h0 ^= Math.imul(k, 0x1b873593);
    h0 = (h0 << 13) | (h0 >>> 19);
    h0 = (Math.imul(h0, 5) + 0xe6546b64) | 0;
    k = Math.imul(w[i + 1], 0xcc9e2d51);
    k = (k << 15) | (k >>> 17);
    h1 ^= Math.imul(k, 0x1b873593);
    h1 = (h1 << 13) | (h1 >>> 19);
    h1 = (Math.imul(h1, 5) + 0xe6546b64) | 0;
    k = Math.imul(w[i + 2], 0xcc9e2d51);
    k = (k << 15) | (k >>> 17);
    h2 ^= Math.imul(k, 0x1b873593);
    h2 = (h2 << 13) | (h2 >>> 19);
    h2 = (Math.imul(h2, 5) + 0xe6546b64) | 0;
    k = Math.imul(w[i + 3], 0xcc9e2d51);
    k = (k << 15) | (k >>> 17);
    h3 ^= Math.imul(k, 0x1b873593);
    h3 = (h3 << 13) | (h3 >>> 19);
    h3 = (Math.imul(h3, 5) + 0xe6546b64) | 0;
  }
  let h = 0x12345678 ^ bytes.length;
  for (let i = blocks; i < w.length; i++) h = step(h, w[i]);
  h = step(step(step(step(h, h0), h1), h2), h3);
  for (let i = w.length * 4; i < bytes.length; i++) h = Math.imul(h ^ bytes[i], 0x01000193);
  return fmix32(h);
}

/**
 * checksum32 computed piece by piece: update(a); update(b); digest() equals checksum32 of a and b
 * joined, so a file can be checked while it is written or read in parts, never held whole.
 */
export class Checksum32 {
  private h0 = 0x12345678;
  private h1 = 0x9e3779b9;
  private h2 = 0x85ebca6b;
  private h3 = 0xc2b2ae35;
  private total = 0;
  /** Bytes of an unfinished 16-byte block (four words). */
  private readonly carry = new Uint8Array(16);
  private carried = 0;
  /** Aligned room for input that is not on a 4-byte boundary. */
  private scratch = new Uint8Array(0);

  update(bytes: Uint8Array): this {
    this.total += bytes.length;
    let pos = 0;
    if (this.carried > 0) {
      const take = Math.min(16 - this.carried, bytes.length);
      this.carry.set(bytes.subarray(0, take), this.carried);
      this.carried += take;
      pos = take;
      if (this.carried < 16) return this;
      this.blocks(wordsOf(this.carry));
      this.carried = 0;
    }
    const whole = (bytes.length - pos) & ~15;
    for (let done = 0; done < whole;) {
      let part = bytes.subarray(pos + done, pos + whole);
      if (!LITTLE_ENDIAN || part.byteOffset % 4 !== 0) {
        if (this.scratch.length === 0) this.scratch = new Uint8Array(1 << 16);
        part = part.subarray(0, this.scratch.length);
        this.scratch.set(part);
        part = this.scratch.subarray(0, part.length);
      }
      this.blocks(wordsOf(part));
      done += part.length;
    }
    pos += whole;
    this.carry.set(bytes.subarray(pos), 0);
    this.carried = bytes.length - pos;
    return this;
  }

  /** The checksum of every byte given so far (update may go on afterwards). */
  digest(): number {
    const w = wordsOf(this.carry.subarray(0, this.carried & ~3));
    let h = 0x12345678 ^ this.total;
    for (let i = 0; i < w.length; i++) h = step(h, w[i]);
    h = step(step(step(step(h, this.h0), this.h1), this.h2), this.h3);
    for (let i = w.length * 4; i < this.carried; i++) h = Math.imul(h ^ this.carry[i], 0x01000193);
    return fmix32(h);
  }

  /**
   * Feeds whole 4-word blocks (w.length a multiple of 4) round-robin to the four states: step()
   * written out four times, as in checksum32 (a reopen sums 2.4 GB on the Linux tree; the call
   * form took about a tenth longer).
   */
  private blocks(w: Uint32Array): void {
    let { h0, h1, h2, h3 } = this;
    for (let i = 0; i < w.length; i += 4) {
      let k = Math.imul(w[i], 0xcc9e2d51);
      k = (k << 15) | (k >>> 17);
      h0 ^= Math.imul(k, 0x1b873593);
      h0 = (h0 << 13) | (h0 >>> 19);
      h0 = (Math.imul(h0, 5) + 0xe6546b64) | 0;
      k = Math.imul(w[i + 1], 0xcc9e2d51);
      k = (k << 15) | (k >>> 17);
      h1 ^= Math.imul(k, 0x1b873593);
      h1 = (h1 << 13) | (h1 >>> 19);
      h1 = (Math.imul(h1, 5) + 0xe6546b64) | 0;
      k = Math.imul(w[i + 2], 0xcc9e2d51);
      k = (k << 15) | (k >>> 17);
      h2 ^= Math.imul(k, 0x1b873593);
      h2 = (h2 << 13) | (h2 >>> 19);
      h2 = (Math.imul(h2, 5) + 0xe6546b64) | 0;
      k = Math.imul(w[i + 3], 0xcc9e2d51);
      k = (k << 15) | (k >>> 17);
      h3 ^= Math.imul(k, 0x1b873593);
      h3 = (h3 << 13) | (h3 >>> 19);
      h3 = (Math.imul(h3, 5) + 0xe6546b64) | 0;
    }
    this.h0 = h0;
    this.h1 = h1;
    this.h2 = h2;
    this.h3 = h3;
  }
}
