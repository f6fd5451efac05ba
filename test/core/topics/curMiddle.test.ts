/**
 * CUR middle matrix and errors. Reference: a dense brute-force computation with ml-matrix
 * (pseudoInverse of C and R themselves, U = C⁺AR⁺, then ‖A − CUR‖_F, ‖A − CC⁺A‖_F and
 * ‖A − AR⁺R‖_F formed entry by entry), against the Gram/trace identities the code uses.
 */
import { Matrix, pseudoInverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { csrFromDense } from '../../../src/core/matrix/sparse.js';
import { createRandom } from '../../../src/core/random.js';
import { curFactors } from '../../../src/core/topics/curMiddle.js';
import type { Picks } from '../../../src/core/topics/leverage.js';

function sparseDense(rows: number, cols: number, density: number, seed: number): Float64Array {
  const r = createRandom(seed);
  const a = new Float64Array(rows * cols);
  for (let t = 0; t < a.length; t++) if (r.next() < density) a[t] = r.normal();
  return a;
}

function picks(indices: number[], scales?: number[]): Picks {
  return {
    indices: Int32Array.from(indices),
    counts: new Int32Array(indices.length).fill(1),
    scales: Float64Array.from(scales ?? indices.map(() => 1)),
  };
}

function dense(a: Float64Array, rows: number, cols: number): Matrix {
  return new Matrix(Array.from({ length: rows }, (_, i) => Array.from(a.subarray(i * cols, (i + 1) * cols))));
}

function bruteForce(a: Matrix, col: Picks, row: Picks) {
  const c = new Matrix(a.rows, col.indices.length);
  col.indices.forEach((j, s) =>
    c.setColumn(
      s,
      a.getColumn(j).map((x) => x * col.scales[s]),
    ),
  );
  const r = new Matrix(row.indices.length, a.columns);
  row.indices.forEach((i, s) =>
    r.setRow(
      s,
      a.getRow(i).map((x) => x * row.scales[s]),
    ),
  );
  const cp = pseudoInverse(c);
  const rp = pseudoInverse(r);
  const u = cp.mmul(a).mmul(rp);
  return {
    u,
    error: Matrix.sub(a, c.mmul(u).mmul(r)).norm(),
    columnError: Matrix.sub(a, c.mmul(cp).mmul(a)).norm(),
    rowError: Matrix.sub(a, a.mmul(rp).mmul(r)).norm(),
  };
}

describe('CUR middle matrix and errors', () => {
  const rows = 40;
  const cols = 60;
  const data = sparseDense(rows, cols, 0.2, 7);
  const a = csrFromDense(rows, cols, data);
  const am = dense(data, rows, cols);

  it('match a dense computation with ml-matrix pseudo-inverses (scaled picks)', () => {
    const col = picks([2, 5, 11, 17, 30, 44, 59], [1, 0.5, 2, 1.5, 1, 3, 0.7]);
    const row = picks([0, 9, 13, 27, 38], [2, 1, 1, 0.25, 1]);
    const got = curFactors(a, col, row);
    const ref = bruteForce(am, col, row);
    for (let s = 0; s < 7; s++) for (let b = 0; b < 5; b++) expect(got.middle[s * 5 + b]).toBeCloseTo(ref.u.get(s, b), 8);
    expect(Math.sqrt(got.errorSquared)).toBeCloseTo(ref.error, 8);
    expect(Math.sqrt(got.columnErrorSquared)).toBeCloseTo(ref.columnError, 8);
    expect(Math.sqrt(got.rowErrorSquared)).toBeCloseTo(ref.rowError, 8);
    expect(got.frobeniusSquared).toBeCloseTo(am.norm() ** 2, 10);
  });

  it('without the columns-only error gives the same middle matrix and CUR error, and NaN for the skipped one', () => {
    const col = picks([2, 5, 11, 17, 30, 44, 59], [1, 0.5, 2, 1.5, 1, 3, 0.7]);
    const row = picks([0, 9, 13, 27, 38], [2, 1, 1, 0.25, 1]);
    const ref = bruteForce(am, col, row);
    const got = curFactors(a, col, row, false);
    for (let s = 0; s < 7; s++) for (let b = 0; b < 5; b++) expect(got.middle[s * 5 + b]).toBeCloseTo(ref.u.get(s, b), 8);
    expect(Math.sqrt(got.errorSquared)).toBeCloseTo(ref.error, 8);
    expect(got.columnErrorSquared).toBeNaN();
  });

  it('give the same product whatever the scales (only the spans matter)', () => {
    const plain = curFactors(a, picks([1, 4, 9]), picks([3, 8]));
    const scaled = curFactors(a, picks([1, 4, 9], [5, 0.1, 2]), picks([3, 8], [0.3, 7]));
    expect(scaled.errorSquared).toBeCloseTo(plain.errorSquared, 9);
  });

  it('handle repeated (rank-deficient) columns like the dense pseudo-inverse does', () => {
    // Columns 0 and 1 identical, and a duplicated row: C and R lose rank.
    const d = sparseDense(12, 15, 0.5, 3);
    for (let i = 0; i < 12; i++) d[i * 15 + 1] = d[i * 15];
    for (let j = 0; j < 15; j++) d[5 * 15 + j] = d[4 * 15 + j];
    const col = picks([0, 1, 6, 9]);
    const row = picks([4, 5, 7]);
    const got = curFactors(csrFromDense(12, 15, d), col, row);
    const ref = bruteForce(dense(d, 12, 15), col, row);
    expect(Math.sqrt(got.errorSquared)).toBeCloseTo(ref.error, 7);
    expect(Math.sqrt(got.columnErrorSquared)).toBeCloseTo(ref.columnError, 7);
  });

  it('reproduce A exactly when the picks span it', () => {
    // A rank-2 matrix: two independent columns and two independent rows are enough.
    const d = new Float64Array(5 * 4);
    const x = [1, 2, 0, -1, 3];
    const y = [0, 1, 1, 2];
    const z = [2, 0, 1, 1, 0];
    const w = [1, -1, 0, 3];
    for (let i = 0; i < 5; i++) for (let j = 0; j < 4; j++) d[i * 4 + j] = x[i] * y[j] + z[i] * w[j];
    const got = curFactors(csrFromDense(5, 4, d), picks([0, 1]), picks([0, 1]));
    expect(Math.sqrt(got.errorSquared)).toBeLessThan(1e-6 * Math.sqrt(got.frobeniusSquared));
  });

  it('with no picks on a side, the error is the whole matrix', () => {
    const got = curFactors(a, picks([]), picks([1, 2]));
    expect(got.errorSquared).toBeCloseTo(got.frobeniusSquared, 12);
    expect(got.middle).toHaveLength(0);
  });
});
