/** WordTable against a Map from the key's string (brute-force reference). */
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { FNV_OFFSET, FNV_PRIME, WordTable } from '../../../src/node/parallel/wordTable.js';

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
