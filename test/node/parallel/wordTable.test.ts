/** WordTable against a Map from the key's string (brute-force reference). */
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { FNV_OFFSET, FNV_PRIME, grow32, mappedInt32, mappedUint16, WordTable } from '../../../src/node/parallel/wordTable.js';

function unitsOf(s: string): Uint16Array {
  return Uint16Array.from(s, (c) => c.charCodeAt(0));
}

function hashOf(u: Uint16Array, start: number, end: number): number {
  let h = FNV_OFFSET;
  for (let i = start; i < end; i++) h = Math.imul(h ^ u[i], FNV_PRIME);
  return h;
}

describe('WordTable', () => {
  it.each([
    ['the default room', undefined],
    ['room for one key', 1],
    ['room for more keys than it gets', 1 << 16],
  ])('finds every key it holds, with its value, and no other (50 000 random keys, %s)', (_, expected) => {
    const rnd = createRandom(9);
    const table = new WordTable(1_000_000, expected);
    const ref = new Map<string, number>();
    for (let r = 0; r < 50_000; r++) {
      let w = '';
      const len = 1 + Math.floor(rnd.next() * 8);
      for (let i = 0; i < len; i++) w += 'abcxyzé東'[Math.floor(rnd.next() * 8)];
      // Look the key up inside a longer text, as the counter does.
      const text = unitsOf(` ${w} `);
      const h = hashOf(text, 1, 1 + w.length);
      const e = table.find(text, 1, 1 + w.length, h);
      if (ref.has(w)) expect(table.value(e)).toBe(ref.get(w));
      else {
        expect(e).toBe(-1);
        table.insert(text, 1, 1 + w.length, h, r);
        ref.set(w, r);
      }
    }
    expect(table.size).toBe(ref.size);
    for (const [w, v] of ref) {
      const u = unitsOf(w);
      expect(table.value(table.find(u, 0, u.length, hashOf(u, 0, u.length)))).toBe(v);
    }
  });

  it('tells apart keys with the same hash', () => {
    const table = new WordTable(10);
    const a = unitsOf('alpha');
    const b = unitsOf('beta');
    table.insert(a, 0, a.length, 7, 1);
    table.insert(b, 0, b.length, 7, 2);
    expect(table.value(table.find(a, 0, a.length, 7))).toBe(1);
    expect(table.value(table.find(b, 0, b.length, 7))).toBe(2);
    expect(table.find(unitsOf('gamma'), 0, 5, 7)).toBe(-1);
  });

  it('starts empty again once it holds its limit of keys', () => {
    const table = new WordTable(3);
    for (const w of ['aa', 'bb', 'cc']) table.insert(unitsOf(w), 0, 2, hashOf(unitsOf(w), 0, 2), 1);
    expect(table.size).toBe(3);
    const d = unitsOf('dd');
    table.insert(d, 0, 2, hashOf(d, 0, 2), 4);
    expect(table.size).toBe(1);
    expect(table.find(unitsOf('aa'), 0, 2, hashOf(unitsOf('aa'), 0, 2))).toBe(-1);
    expect(table.value(table.find(d, 0, 2, hashOf(d, 0, 2)))).toBe(4);
  });
});

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

  it('grow32 lengthens a mapped array in its own buffer while it has room, then moves it to a bigger one', () => {
    let a = mappedInt32(100_000);
    for (let i = 0; i < a.length; i++) a[i] = i + 1;
    const buffer = a.buffer;
    a = grow32(a, 150_000);
    expect(a.buffer).toBe(buffer);
    expect(a.length).toBeGreaterThanOrEqual(200_000);
    expect(a[99_999]).toBe(100_000);
    expect(a[100_000]).toBe(0);
    expect(a[a.length - 1]).toBe(0);
    const room = buffer.byteLength / 4;
    a = grow32(a, room + 1);
    expect(a.buffer).not.toBe(buffer);
    expect(a.length).toBeGreaterThanOrEqual(room + 1);
    expect(a[0]).toBe(1);
    expect(a[99_999]).toBe(100_000);
    expect(a[room]).toBe(0);
  });
});
