import { describe, expect, it } from 'vitest';
import { ConceptCodes, roundHalfUp } from '../../../../src/core/index/search/conceptCodes.js';
import { createRandom } from '../../../../src/core/random.js';

function unitRows(n: number, k: number, seed: number): Float32Array {
  const rnd = createRandom(seed);
  const rows = new Float32Array(n * k);
  for (let j = 0; j < n; j++) {
    let ss = 0;
    for (let c = 0; c < k; c++) ss += (rows[j * k + c] = rnd.normal() * (c < 5 ? 4 : 1)) ** 2;
    for (let c = 0; c < k; c++) rows[j * k + c] /= Math.sqrt(ss);
  }
  return rows;
}

describe('ConceptCodes', () => {
  it('bounds every exact dot product (computed left to right in f64) and keeps the bound small', () => {
    for (const k of [200, 21]) {
      const n = 500;
      const rows = unitRows(n, k, k);
      const codes = ConceptCodes.create(k, n, rows, n)!;
      expect(codes).not.toBeNull();
      for (let t = 0; t < 5; t++) {
        const q = rows.subarray(t * 37 * k, (t * 37 + 1) * k);
        const { center, radius } = codes.bounds(q, n);
        for (let j = 0; j < n; j++) {
          let exact = 0;
          for (let c = 0; c < k; c++) exact += rows[j * k + c] * q[c];
          expect(Math.abs(exact - center[j])).toBeLessThanOrEqual(radius[j]);
          // 8-bit codes: an error of about max|v|/127/√12·√k (common practice estimate) at most.
          expect(radius[j]).toBeLessThan(0.05);
        }
      }
    }
  });

  it('follows row changes and growth: new, cleared and moved rows are bounded as the rows are', () => {
    const k = 200;
    const rows = unitRows(40, k, 3);
    const codes = ConceptCodes.create(k, 4, rows, 4)!;
    codes.ensureCapacity(40); // past the reserved size of a 4-row block: the codes move
    for (let j = 4; j < 40; j++) codes.setRow(j, rows.subarray(j * k, (j + 1) * k));
    codes.clearRow(7);
    const q = rows.subarray(0, k);
    const { center, radius } = codes.bounds(q, 40);
    for (let j = 0; j < 40; j++) {
      let exact = 0;
      if (j !== 7) for (let c = 0; c < k; c++) exact += rows[j * k + c] * q[c];
      expect(Math.abs(exact - center[j])).toBeLessThanOrEqual(radius[j]);
    }
    expect(center[7]).toBe(0);
    expect(center[0]).toBeCloseTo(1, 1);
  });

  it('codes a block with setRows to the same bits as row by row with setRow, zero rows included', () => {
    const k = 37;
    const n = 300;
    const rows = unitRows(n, k, 9);
    rows.fill(0, 11 * k, 12 * k); // a hole
    rows[20 * k + 3] = -0;
    const one = ConceptCodes.empty(k, n)!;
    for (let j = 0; j < n; j++) one.setRow(j, rows.subarray(j * k, (j + 1) * k));
    const block = ConceptCodes.empty(k, n)!;
    block.setRows(rows, 0, 100);
    block.setRows(rows, 100, n);
    const viaCreate = ConceptCodes.create(k, n, rows, n)!;
    // The codes themselves are private: equal bounds for several queries mean equal codes, scales and errors.
    for (let t = 0; t < 4; t++) {
      const q = rows.subarray(t * 50 * k, (t * 50 + 1) * k);
      const ref = one.bounds(q, n);
      const [c0, r0] = [ref.center.slice(), ref.radius.slice()];
      for (const other of [block, viaCreate]) {
        const got = other.bounds(q, n);
        expect(Buffer.from(got.center.buffer, got.center.byteOffset, 8 * n).equals(Buffer.from(c0.buffer))).toBe(true);
        expect(Buffer.from(got.radius.buffer, got.radius.byteOffset, 8 * n).equals(Buffer.from(r0.buffer))).toBe(true);
      }
    }
  });

  it('codes blocks placed at a slot with setRowsAt and bounds runs of rows with boundsRuns as bounds does', () => {
    const k = 45;
    const n = 200;
    const rows = unitRows(n, k, 11);
    const ref = ConceptCodes.create(k, n, rows, n)!;
    const placed = ConceptCodes.empty(k, n)!;
    placed.setRowsAt(0, rows.subarray(0, 70 * k), 70);
    placed.setRowsAt(70, rows.subarray(70 * k), n - 70);
    expect(placed.filled).toBe(n);
    const q = rows.subarray(5 * k, 6 * k);
    const want = ref.bounds(q, n);
    const [c0, r0] = [want.center.slice(), want.radius.slice()];
    const got = placed.boundsRuns(q, Int32Array.of(3, 90, 150), Int32Array.of(40, 91, 200), 3);
    for (const [from, to] of [
      [3, 40],
      [90, 91],
      [150, 200],
    ])
      for (let j = from; j < to; j++) {
        expect(got.center[j]).toBe(c0[j]);
        expect(got.radius[j]).toBe(r0[j]);
      }
  });

  it('rounds every value a code can take as Math.round does: halves, their neighbours, and random values', () => {
    // Reference: the engine's Math.round (ECMAScript: the integer nearest x, halves toward +∞).
    const bits = new Float64Array(1);
    const word = new BigInt64Array(bits.buffer);
    const step = (x: number, ulps: number): number => {
      bits[0] = x;
      word[0] += BigInt(x >= 0 ? ulps : -ulps);
      return bits[0];
    };
    const values = [0.49999999999999994, -0.49999999999999994, 5e-324, -5e-324, 0, 127.5, -127.5];
    for (let m = -128; m < 128; m++) for (const h of [m + 0.5, m]) for (let u = -3; u <= 3; u++) values.push(step(h, u));
    const rnd = createRandom(5);
    for (let i = 0; i < 100_000; i++) values.push((rnd.next() - 0.5) * 255);
    let wrong = 0;
    for (const x of values) if (Math.abs(x) <= 127.5 && roundHalfUp(x) !== Math.round(x)) wrong++;
    expect(wrong).toBe(0);
    expect(roundHalfUp(0.49999999999999994)).toBe(0); // fl(x + 0.5) = 1 here: naive floor(x + 0.5) is wrong
    expect(roundHalfUp(-2.5)).toBe(-2);
  });
});
