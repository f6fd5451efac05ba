import { describe, expect, it } from 'vitest';
import { ConceptRows, dotRows } from '../../../../src/core/index/search/conceptRows.js';
import { createRandom } from '../../../../src/core/random.js';

/** Reference: the dot product summed left to right in f64 (the brute-force definition). */
function plainDots(rows: Float32Array, k: number, n: number, q: Float32Array): Float64Array {
  const out = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let c = 0; c < k; c++) s += rows[j * k + c] * q[c];
    out[j] = s;
  }
  return out;
}

function randomRows(n: number, k: number, seed: number): { rows: Float32Array; q: Float32Array } {
  const rnd = createRandom(seed);
  const rows = Float32Array.from({ length: n * k }, () => rnd.next() * 2 - 1);
  const q = Float32Array.from({ length: k }, () => rnd.next() * 2 - 1);
  return { rows, q };
}

/** The products of rows given to the constructor (a copy: dots() returns a reused view). */
const plainDotsBits = (r: ConceptRows, q: Float32Array, n: number): Float64Array => r.dots(q, n).slice();

describe('ConceptRows', () => {
  // k = 200 is the project default; 13, 7 and 1 exercise the tail past the last block of eight.
  for (const k of [200, 13, 7, 1]) {
    it(`gives the plain dot product to rounding, and the same bits with or without WebAssembly (k = ${k})`, () => {
      const n = 301;
      const { rows, q } = randomRows(n, k, 11 + k);
      const wasm = new ConceptRows(k, n, rows);
      const plain = new ConceptRows(k, n, rows, { wasm: false });
      expect(plain.usesWasm).toBe(false);
      const a = wasm.dots(q, n).slice();
      const b = plain.dots(q, n).slice();
      expect(Buffer.from(a.buffer).equals(Buffer.from(b.buffer))).toBe(true);
      const ref = plainDots(rows, k, n, q);
      // Reordering a sum of k products of magnitude ≤ 1 moves it by at most about k·ε·Σ|terms|.
      for (let j = 0; j < n; j++) expect(Math.abs(a[j] - ref[j])).toBeLessThanOrEqual(k * k * 2.3e-16);
    });
  }

  it('uses the WebAssembly kernel where Node offers SIMD and shared memory', () => {
    expect(new ConceptRows(8, 4).usesWasm).toBe(true);
  });

  it('keeps rows and earlier views through growth, and new rows start at zero', () => {
    const k = 9;
    const { rows, q } = randomRows(5, k, 3);
    const store = new ConceptRows(k, 5, rows);
    const view = store.rows.subarray(0, 5 * k);
    store.dots(q, 5); // leaves scores in the scratch that growth moves past
    store.ensureCapacity(400);
    expect(store.capacity).toBeGreaterThanOrEqual(400);
    expect(Array.from(store.rows.subarray(0, 5 * k))).toEqual(Array.from(rows));
    expect(Array.from(view)).toEqual(Array.from(rows));
    expect(store.rows.subarray(5 * k, 400 * k).every((v) => v === 0)).toBe(true);
    store.setRow(399, q);
    const d = store.dots(q, 400);
    const ref = plainDots(store.rows, k, 400, q);
    for (let j = 0; j < 400; j++) expect(d[j]).toBeCloseTo(ref[j], 12);
    store.clearRow(399);
    expect(store.dots(q, 400)[399]).toBe(0);
  });

  it('moves to a larger memory past the reserved maximum, keeping rows and scores', () => {
    const k = 200;
    const { rows, q } = randomRows(10, k, 9);
    const store = new ConceptRows(k, 10, rows);
    const view = store.rows.subarray(0, 10 * k);
    store.ensureCapacity(5000); // 4 MB of rows, past the 1 MB reserved for a small block
    expect(Array.from(store.rows.subarray(0, 10 * k))).toEqual(Array.from(rows));
    expect(Array.from(view)).toEqual(Array.from(rows));
    store.setRow(4999, q);
    const d = store.dots(q, 5000);
    const ref = plainDots(store.rows, k, 5000, q);
    for (const j of [0, 9, 10, 4998, 4999]) expect(d[j]).toBeCloseTo(ref[j], 12);
    expect(store.usesWasm).toBe(true);
  });

  it('exports the same loop as a function over any block', () => {
    const { rows, q } = randomRows(20, 16, 5);
    const out = new Float64Array(20);
    dotRows(rows, 16, 20, q, out);
    expect(Array.from(out)).toEqual(Array.from(new ConceptRows(16, 20, rows).dots(q, 20)));
  });
  it('takes rows written in place through rowBytes (as a reopen reads them from its file) as given to the constructor', () => {
    const [k, n] = [13, 57];
    const { rows, q } = randomRows(n, k, 5);
    const little = new Uint8Array(rows.buffer).slice(); // the saved bytes (f32, little-endian)
    for (const wasm of [true, false]) {
      const given = new ConceptRows(k, n, rows, { wasm });
      const filled = new ConceptRows(k, n, undefined, { wasm });
      filled.rowBytes(n).set(little);
      expect(filled.rows).toEqual(given.rows);
      expect(Array.from(filled.dots(q, n))).toEqual(Array.from(plainDotsBits(given, q, n)));
      expect(() => filled.rowBytes(n + 1)).toThrow(RangeError);
    }
  });
});
