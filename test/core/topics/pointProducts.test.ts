import { describe, expect, it } from 'vitest';
import { timesSmallRows } from '../../../src/core/matrix/kernels.js';
import { kernelModule } from '../../../src/core/matrix/wasm/kernelModule.js';
import { PointProducts } from '../../../src/core/topics/pointProducts.js';
import { createRandom } from '../../../src/core/random.js';

function randomRows(n: number, dims: number, seed: number): Float64Array {
  const r = createRandom(seed);
  return Float64Array.from({ length: n * dims }, () => r.next() * 2 - 1);
}

describe('PointProducts', () => {
  it('runs on WebAssembly SIMD here (Node has it), so the checks below test the SIMD path', () => {
    expect(kernelModule()).not.toBeNull();
  });

  // Row counts that are and are not multiples of the kernels' 4-row tiles; odd and even centre counts.
  for (const [n, dims, k] of [
    [203, 195, 20],
    [64, 17, 7],
    [5, 3, 1],
  ] as const) {
    it(`points · centresᵀ and points · point j: the plain kernel's bits, and the naive sums to rounding (${n} × ${dims}, ${k} centres)`, () => {
      const points = randomRows(n, dims, n);
      const centres = randomRows(k, dims, k + 1);
      const products = new PointProducts(points, n, dims, k);
      const got = new Float64Array(n * k);
      products.timesCentres(centres, k, got);
      const plain = new Float64Array(n * k);
      timesSmallRows(points, dims, centres, k, false, plain, 0, n);
      expect(Array.from(got)).toEqual(Array.from(plain));
      for (let i = 0; i < n; i++)
        for (let c = 0; c < k; c++) {
          let s = 0;
          for (let d = 0; d < dims; d++) s += points[i * dims + d] * centres[c * dims + d];
          expect(got[i * k + c]).toBeCloseTo(s, 10);
        }
      const column = new Float64Array(n);
      const j = n - 1;
      products.timesPoint(j, column);
      const plainColumn = new Float64Array(n);
      timesSmallRows(points, dims, points.subarray(j * dims, (j + 1) * dims), 1, false, plainColumn, 0, n);
      expect(Array.from(column)).toEqual(Array.from(plainColumn));
    });
  }

  it('more centres than it was sized for fall back to the plain kernel with the same result', () => {
    const points = randomRows(40, 8, 3);
    const centres = randomRows(6, 8, 4);
    const small = new PointProducts(points, 40, 8, 2);
    const got = new Float64Array(40 * 6);
    small.timesCentres(centres, 6, got);
    const plain = new Float64Array(40 * 6);
    timesSmallRows(points, 8, centres, 6, false, plain, 0, 40);
    expect(Array.from(got)).toEqual(Array.from(plain));
  });

  it('points past the resident size go a block of rows at a time, with the same bits (blocks of 8 rows, a last block of 3)', () => {
    const n = 83;
    const dims = 13;
    const points = randomRows(n, dims, 7);
    const centres = randomRows(5, dims, 8);
    const blocked = new PointProducts(points, n, dims, 5, 8 * dims);
    const got = new Float64Array(n * 5);
    blocked.timesCentres(centres, 5, got);
    const plain = new Float64Array(n * 5);
    timesSmallRows(points, dims, centres, 5, false, plain, 0, n);
    expect(Array.from(got)).toEqual(Array.from(plain));
    const column = new Float64Array(n);
    blocked.timesPoint(4, column);
    const plainColumn = new Float64Array(n);
    timesSmallRows(points, dims, points.subarray(4 * dims, 5 * dims), 1, false, plainColumn, 0, n);
    expect(Array.from(column)).toEqual(Array.from(plainColumn));
  });
});
