import { describe, expect, it } from 'vitest';
import { base64ToFloat32, decodeBase64, encodeBase64, float32ToBase64 } from '../../../src/core/map/base64.js';
import { InvalidInputError } from '../../../src/core/errors.js';
import { createRandom } from '../../../src/core/random.js';

describe('base64', () => {
  it('matches the RFC 4648 §10 test vectors', () => {
    const vectors: [string, string][] = [
      ['', ''],
      ['f', 'Zg=='],
      ['fo', 'Zm8='],
      ['foo', 'Zm9v'],
      ['foob', 'Zm9vYg=='],
      ['fooba', 'Zm9vYmE='],
      ['foobar', 'Zm9vYmFy'],
    ];
    for (const [plain, encoded] of vectors) {
      const bytes = new TextEncoder().encode(plain);
      expect(encodeBase64(bytes)).toBe(encoded);
      expect(new TextDecoder().decode(decodeBase64(encoded))).toBe(plain);
    }
  });

  it('agrees with Node’s Buffer on random bytes of every length remainder (reference implementation)', () => {
    const rng = createRandom(2);
    for (const len of [1, 2, 3, 100, 30001]) {
      const bytes = Uint8Array.from({ length: len }, () => rng.nextUint32() & 255);
      const text = encodeBase64(bytes);
      expect(text).toBe(Buffer.from(bytes).toString('base64'));
      expect(Array.from(decodeBase64(text))).toEqual(Array.from(bytes));
    }
  });

  it('round-trips float32 arrays bit for bit', () => {
    const v = Float32Array.from([0, -1.5, 3.4028234663852886e38, 1e-45, Math.PI]);
    expect(Array.from(base64ToFloat32(float32ToBase64(v)))).toEqual(Array.from(v));
  });

  it('rejects malformed text', () => {
    expect(() => decodeBase64('abc')).toThrow(InvalidInputError);
    expect(() => decodeBase64('ab!=')).toThrow(InvalidInputError);
  });
});
