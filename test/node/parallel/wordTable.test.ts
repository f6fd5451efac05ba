import { describe, expect, it } from 'vitest';
import { grow32, mappedInt32, mappedUint16, WordTable } from '../../../src/node/parallel/wordTable.js';

// The threshold is glibc's: malloc maps a block of its own from M_MMAP_THRESHOLD on, a threshold
// that adapts up to DEFAULT_MMAP_THRESHOLD_MAX, 32 MiB on 64-bit systems (glibc malloc/malloc.c).
const GLIBC_MMAP_THRESHOLD_MAX = 32 * 1024 * 1024;

describe.runIf(process.platform === 'linux')('mappedInt32 / mappedUint16', () => {
  it('puts an array of 256 KiB or more in a buffer above glibc’s largest mapping threshold, a smaller one in a buffer of its size', () => {
    for (const [make, bytes] of [
      [mappedInt32, 4],
      [mappedUint16, 2],
    ] as const) {
      const small = make(1000);
      expect(small.length).toBe(1000);
      expect(small.buffer.byteLength).toBe(1000 * bytes);
      const n = (256 * 1024) / bytes;
      const big = make(n);
      expect(big.length).toBe(n);
      expect(big.buffer.byteLength).toBeGreaterThan(GLIBC_MMAP_THRESHOLD_MAX);
      expect(Array.from(big.subarray(0, 4))).toEqual([0, 0, 0, 0]);
    }
  });

  it('grow32 keeps the values and the length asked for, past the threshold too', () => {
    let a = Int32Array.from({ length: 1000 }, (_, i) => i * 3);
    a = grow32(a, 100_000);
    expect(a.length).toBe(100_000);
    expect(Array.from(a.subarray(0, 1000))).toEqual(Array.from({ length: 1000 }, (_, i) => i * 3));
    expect(a[99_999]).toBe(0);
    expect(a.buffer.byteLength).toBeGreaterThan(GLIBC_MMAP_THRESHOLD_MAX);
  });
});

describe('WordTable', () => {
  it('finds every key after growing past the mapping threshold', () => {
    const table = new WordTable(1 << 20, 1 << 4);
    const keys = Array.from({ length: 50_000 }, (_, i) => `w${i.toString(36)}`);
    const units = (s: string): Uint16Array => Uint16Array.from(s, (c) => c.charCodeAt(0));
    const hash = (u: Uint16Array): number => {
      let h = 0x811c9dc5 | 0;
      for (const c of u) h = Math.imul(h ^ c, 0x01000193);
      return h;
    };
    keys.forEach((k, i) => {
      const u = units(k);
      table.insert(u, 0, u.length, hash(u), i);
    });
    expect(
      keys.every((k, i) => {
        const u = units(k);
        return table.value(table.find(u, 0, u.length, hash(u))) === i;
      }),
    ).toBe(true);
  });
});
