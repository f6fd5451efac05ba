import { describe, expect, it } from 'vitest';
import {
  crossRows,
  GAUSSIAN_BLOCK_ROWS,
  gaussianBlock,
  spmmRows,
  spmmSingleRows,
  timesSmallRows,
  unitRowsInto,
} from '../../../src/core/matrix/kernels.js';
import { createRandom } from '../../../src/core/random.js';

// Reference: brute-force dense arithmetic (plain triple loops), independent of the kernels' tiling.
const rnd = createRandom(11);
const randomArray = (n: number): Float64Array => Float64Array.from({ length: n }, () => rnd.normal());

function randomCsr(rows: number, cols: number, density: number) {
  const indptr = [0];
  const indices: number[] = [];
  const values: number[] = [];
  const dense = new Float64Array(rows * cols);
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < cols; j++) {
      if (rnd.next() < density) {
        const v = rnd.normal();
        indices.push(j);
        values.push(v);
        dense[i * cols + j] = v;
      }
    }
    indptr.push(indices.length);
  }
  return { indptr: Int32Array.from(indptr), indices: Int32Array.from(indices), values: Float64Array.from(values), dense };
}

const close = (a: ArrayLike<number>, b: ArrayLike<number>, tol = 1e-12): void => {
  expect(a.length).toBe(b.length);
  for (let i = 0; i < a.length; i++) expect(Math.abs(a[i] - b[i])).toBeLessThanOrEqual(tol * (1 + Math.abs(b[i])));
};

describe('row-range kernels', () => {
  for (const [rows, cols, l] of [
    [23, 17, 5],
    [40, 31, 8],
    [9, 50, 1],
  ] as const) {
    it(`spmmRows computes M·X for ${rows}×${cols} by ${l} columns, in any row split, grouped or sequential`, () => {
      const m = randomCsr(rows, cols, 0.3);
      const x = randomArray(cols * l);
      const want = new Float64Array(rows * l);
      for (let i = 0; i < rows; i++)
        for (let j = 0; j < cols; j++) for (let c = 0; c < l; c++) want[i * l + c] += m.dense[i * cols + j] * x[j * l + c];
      for (const grouped of [true, false]) {
        const whole = new Float64Array(rows * l);
        spmmRows(m.indptr, m.indices, m.values, x, l, whole, 0, rows, grouped);
        close(whole, want);
        const split = new Float64Array(rows * l).fill(NaN);
        spmmRows(m.indptr, m.indices, m.values, x, l, split, 0, 7, grouped);
        spmmRows(m.indptr, m.indices, m.values, x, l, split, 7, rows, grouped);
        expect(Array.from(split)).toEqual(Array.from(whole));
      }
    });
  }

  for (const [rows, cols, l] of [
    [23, 17, 5],
    [40, 31, 8],
    [9, 50, 1],
  ] as const) {
    it(`spmmSingleRows computes M·X in single precision for ${rows}×${cols} by ${l} columns, in any row split`, () => {
      const m = randomCsr(rows, cols, 0.3);
      const values = Float32Array.from(m.values);
      const x = Float32Array.from(randomArray(cols * l));
      const want = new Float64Array(rows * l);
      for (let i = 0; i < rows; i++)
        for (let p = m.indptr[i]; p < m.indptr[i + 1]; p++)
          for (let c = 0; c < l; c++) want[i * l + c] += values[p] * x[m.indices[p] * l + c];
      const whole = new Float32Array(rows * l);
      spmmSingleRows(m.indptr, m.indices, values, x, l, whole, 0, rows);
      // Single-precision sums of at most ~25 products of numbers below ~4: within 10⁻⁵ (relative
      // to the larger of 1 and the value) of the exact sums, ε₃₂ = 2⁻²⁴ per operation.
      close(whole, want, 1e-5);
      const split = new Float32Array(rows * l).fill(NaN);
      spmmSingleRows(m.indptr, m.indices, values, x, l, split, 0, 7);
      spmmSingleRows(m.indptr, m.indices, values, x, l, split, 7, rows);
      expect(Array.from(split)).toEqual(Array.from(whole));
    });
  }

  it('spmmSingleRows rounds every step to f32 (IEEE 754 round to nearest, ties to even), not only the sum', () => {
    // One row of five stored ones, X = 1 and four times 2⁻²⁴ (l = 1). 1 + 2⁻²⁴ lies halfway
    // between 1 and the next f32 number, 1 + 2⁻²³, and rounds to 1 (the even one): every
    // single-precision step stays at 1. The exact sum 1 + 2⁻²² is an f32 number, so a sum formed
    // in f64 and rounded once would give it.
    const tiny = 2 ** -24;
    const ones = Float32Array.of(1, 1, 1, 1, 1);
    const y = new Float32Array(1);
    spmmSingleRows(Int32Array.of(0, 5), Int32Array.of(0, 1, 2, 3, 4), ones, Float32Array.of(1, tiny, tiny, tiny, tiny), 1, y, 0, 1);
    expect(y[0]).toBe(1);
    const wide = new Float64Array(1);
    spmmRows(Int32Array.of(0, 5), Int32Array.of(0, 1, 2, 3, 4), ones, Float32Array.of(1, tiny, tiny, tiny, tiny), 1, wide, 0, 1);
    expect(Math.fround(wide[0])).toBe(1 + 2 ** -22);
  });

  for (const l of [4, 7, 9]) {
    it(`crossRows gives AᵀB and the upper triangle of AᵀA (l = ${l})`, () => {
      const rows = 13;
      const a = randomArray(rows * l);
      const b = randomArray(rows * l);
      const want = (x: Float64Array, y: Float64Array): Float64Array => {
        const g = new Float64Array(l * l);
        for (let p = 0; p < l; p++) for (let q = 0; q < l; q++) for (let i = 2; i < 11; i++) g[p * l + q] += x[i * l + p] * y[i * l + q];
        return g;
      };
      const g = new Float64Array(l * l);
      crossRows(a, b, l, 2, 11, g, false);
      close(g, want(a, b));
      const h = new Float64Array(l * l);
      crossRows(a, a, l, 2, 11, h, true);
      const ref = want(a, a);
      for (let p = 0; p < l; p++) for (let q = p; q < l; q++) expect(Math.abs(h[p * l + q] - ref[p * l + q])).toBeLessThan(1e-12);
    });
  }

  it('timesSmallRows multiplies by a small right factor, full or upper triangular', () => {
    const rows = 11,
      l = 7;
    const y = randomArray(rows * l);
    for (const c of [7, 3]) {
      for (const upper of c === l ? [false, true] : [false]) {
        const w = randomArray(l * c);
        if (upper) for (let a = 0; a < l; a++) for (let b = 0; b < a; b++) w[a * c + b] = 0;
        const wt = new Float64Array(c * l);
        for (let a = 0; a < l; a++) for (let b = 0; b < c; b++) wt[b * l + a] = w[a * c + b];
        const want = new Float64Array(rows * c);
        for (let i = 0; i < rows; i++)
          for (let a = 0; a < l; a++) for (let b = 0; b < c; b++) want[i * c + b] += y[i * l + a] * w[a * c + b];
        const out = new Float64Array(rows * c);
        timesSmallRows(y, l, wt, c, upper, out, 0, rows);
        close(out, want);
      }
    }
  });
});

describe('unitRowsInto', () => {
  it('scales each row by column and makes it a unit vector in f32; a zero row stays zero', () => {
    const k = 9,
      rows = 6;
    const y = randomArray(rows * k);
    y.fill(0, 2 * k, 3 * k); // row 2 is all zeros
    const s = Float64Array.from({ length: k }, (_, c) => (c === 4 ? 0 : 0.5 + rnd.next()));
    const out = new Float32Array(rows * k).fill(7);
    unitRowsInto(y, s, k, out, 0, rows);
    for (let r = 0; r < rows; r++) {
      // Reference: the scaled row over Math.hypot's norm (another summation), rounded to f32.
      const v = Array.from({ length: k }, (_, c) => y[r * k + c] * s[c]);
      const norm = Math.hypot(...v);
      for (let c = 0; c < k; c++) {
        const want = norm === 0 ? 0 : v[c] / norm;
        expect(Math.abs(out[r * k + c] - want)).toBeLessThanOrEqual(2 ** -23);
      }
    }
    expect(Array.from(out.subarray(2 * k, 3 * k))).toEqual(new Array(k).fill(0));
    // Only rows [r0, r1) are written.
    const part = new Float32Array(rows * k).fill(7);
    unitRowsInto(y, s, k, part, 1, 3);
    expect(part[0]).toBe(7);
    expect(Array.from(part.subarray(k, 3 * k))).toEqual(Array.from(out.subarray(k, 3 * k)));
    expect(part[3 * k]).toBe(7);
  });
});

describe('gaussianBlock', () => {
  // Φ by Abramowitz & Stegun 7.1.26 (|error| ≤ 1.5e-7), the reference distribution.
  const phi = (x: number): number => {
    const z = Math.abs(x) / Math.SQRT2;
    const t = 1 / (1 + 0.3275911 * z);
    const erf = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-z * z);
    return x >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
  };

  it('draws standard normal numbers: Kolmogorov–Smirnov distance below the 1% critical value 1.63/√n', () => {
    const rows = 3 * GAUSSIAN_BLOCK_ROWS + 17;
    const l = 7;
    const out = new Float64Array(rows * l);
    for (let b = 0; b * GAUSSIAN_BLOCK_ROWS < rows; b++) gaussianBlock(out, rows, l, 42, b);
    const n = out.length;
    const sorted = Float64Array.from(out).sort();
    let d = 0;
    for (let i = 0; i < n; i++) d = Math.max(d, Math.abs(phi(sorted[i]) - i / n), Math.abs(phi(sorted[i]) - (i + 1) / n));
    expect(d).toBeLessThan(1.63 / Math.sqrt(n));
    let mean = 0;
    for (const x of out) mean += x / n;
    expect(Math.abs(mean)).toBeLessThan(4 / Math.sqrt(n));
  });

  it("draws createRandom's stream: the same numbers as the polar method over createRandom's uniforms", () => {
    // The polar method (Marsaglia & Bray 1964) written plainly over createRandom (random.ts, the
    // generator the kernel writes out with its state in local integers), with the kernel's seeding.
    const plain = (out: Float64Array, rows: number, l: number, seed: number, b: number): void => {
      const r = createRandom((Math.imul(seed ^ 0x5bd1e995, 0x9e3779b1) + Math.imul(b + 1, 0x85ebca6b)) >>> 0);
      const end = Math.min(rows, (b + 1) * GAUSSIAN_BLOCK_ROWS) * l;
      let i = b * GAUSSIAN_BLOCK_ROWS * l;
      while (i < end) {
        const x = r.nextUint32() * (2 / 4294967296) - 1;
        const y = r.nextUint32() * (2 / 4294967296) - 1;
        const s = x * x + y * y;
        if (s >= 1 || s === 0) continue;
        const f = Math.sqrt((-2 * Math.log(s)) / s);
        out[i++] = x * f;
        if (i < end) out[i++] = y * f;
      }
    };
    for (const seed of [0, 9, 20261201, 0xffffffff]) {
      const rows = 2 * GAUSSIAN_BLOCK_ROWS + 3;
      const a = new Float64Array(rows * 5);
      const b = new Float64Array(rows * 5);
      for (let i = 0; i < 3; i++) {
        gaussianBlock(a, rows, 5, seed, i);
        plain(b, rows, 5, seed, i);
      }
      expect(Buffer.from(a.buffer).equals(Buffer.from(b.buffer))).toBe(true);
    }
  });

  it('gives each block the same numbers whatever order the blocks are drawn in', () => {
    const rows = 2 * GAUSSIAN_BLOCK_ROWS + 5;
    const a = new Float64Array(rows * 3);
    const b = new Float64Array(rows * 3);
    for (let i = 0; i < 3; i++) gaussianBlock(a, rows, 3, 9, i);
    for (let i = 2; i >= 0; i--) gaussianBlock(b, rows, 3, 9, i);
    expect(Buffer.from(a.buffer).equals(Buffer.from(b.buffer))).toBe(true);
    expect(a.every((x) => Number.isFinite(x) && x !== 0)).toBe(true);
  });
});
