/** CRC-32 against zlib's (node:zlib crc32, the reference implementation of the same standard). */
import { crc32 as zlibCrc32 } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { crc32 } from '../../../../src/core/index/persistence/crc32.js';
import { createRandom } from '../../../../src/core/random.js';

describe('crc32', () => {
  it('gives the published check value of "123456789" (0xCBF43926, the CRC-32/ISO-HDLC catalogue entry)', () => {
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
    expect(crc32(new Uint8Array(0))).toBe(0);
  });

  it('agrees with zlib on seeded random buffers of every length up to 70 and at odd offsets, and when continued', () => {
    const rnd = createRandom(11);
    for (let n = 0; n < 70; n++) {
      const buf = Uint8Array.from({ length: n + 3 }, () => Math.floor(rnd.next() * 256));
      const view = buf.subarray(3);
      expect(crc32(view)).toBe(zlibCrc32(view));
      expect(crc32(view.subarray(n >> 1), crc32(view.subarray(0, n >> 1)))).toBe(zlibCrc32(view));
    }
  });
});
