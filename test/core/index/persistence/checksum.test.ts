import { describe, expect, it } from 'vitest';
import { Checksum32, checksum32 } from '../../../../src/core/index/persistence/checksum.js';
import { createRandom } from '../../../../src/core/random.js';

// The checksum is our own (MurmurHash3's block step and finaliser, four running states), so there
// is no published value to compare with; these checks are brute force over every damage of a kind.
function randomBytes(n: number, seed: number): Uint8Array {
  const rng = createRandom(seed);
  return Uint8Array.from({ length: n }, () => rng.nextUint32() & 0xff);
}

describe('checksum32', () => {
  it('changes for every single-bit flip of a buffer', () => {
    const bytes = randomBytes(1027, 7);
    const base = checksum32(bytes);
    let unchanged = 0;
    for (let i = 0; i < bytes.length * 8; i++) {
      bytes[i >> 3] ^= 1 << (i & 7);
      if (checksum32(bytes) === base) unchanged++;
      bytes[i >> 3] ^= 1 << (i & 7);
    }
    expect(unchanged).toBe(0);
    expect(checksum32(bytes)).toBe(base);
  });

  it('changes when any two distinct words swap places or the buffer loses its last byte', () => {
    const bytes = randomBytes(256, 11);
    const base = checksum32(bytes);
    const words = new Uint32Array(bytes.buffer);
    let unchanged = 0;
    for (let i = 0; i < words.length; i++) {
      for (let j = i + 1; j < words.length; j++) {
        if (words[i] === words[j]) continue;
        [words[i], words[j]] = [words[j], words[i]];
        if (checksum32(bytes) === base) unchanged++;
        [words[i], words[j]] = [words[j], words[i]];
      }
    }
    expect(unchanged).toBe(0);
    expect(checksum32(bytes.subarray(0, 255))).not.toBe(base);
    expect(checksum32(new Uint8Array(257).fill(0).map((_, i) => (i < 256 ? bytes[i] : 0)))).not.toBe(base);
  });

  it('gives the same value for the same bytes at any alignment', () => {
    for (const n of [0, 1, 3, 4, 15, 16, 17, 1000]) {
      const bytes = randomBytes(n, n + 1);
      const shifted = new Uint8Array(n + 3);
      shifted.set(bytes, 3);
      expect(checksum32(shifted.subarray(3))).toBe(checksum32(bytes));
    }
  });
});

describe('Checksum32', () => {
  it('gives checksum32 of the whole whatever the pieces: random cuts, empty pieces, unaligned views', () => {
    const rng = createRandom(5);
    for (const n of [0, 1, 3, 15, 16, 17, 64, 1027, 200_003]) {
      const backing = randomBytes(n + 3, n + 1);
      for (const shift of [0, 1, 3]) {
        const bytes = backing.subarray(shift, shift + n);
        const whole = checksum32(bytes);
        for (let trial = 0; trial < 4; trial++) {
          const sum = new Checksum32();
          for (let at = 0; at < n;) {
            const len = trial === 0 ? 1 : Math.min(n - at, rng.nextUint32() % (trial * 40_000 + 1));
            sum.update(bytes.subarray(at, at + len));
            at += len;
          }
          expect(sum.digest()).toBe(whole);
        }
      }
    }
  });

  it('differs from the checksum of the pieces in another order', () => {
    const a = randomBytes(40, 1);
    const b = randomBytes(24, 2);
    expect(new Checksum32().update(a).update(b).digest()).not.toBe(new Checksum32().update(b).update(a).digest());
  });
});
