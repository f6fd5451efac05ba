import { describe, expect, it } from 'vitest';
import { choleskyQr, invertUpperTransposed } from '../../../src/core/matrix/choleskyQr.js';
import { serialExecutor } from '../../../src/core/matrix/executor.js';
import { createRandom } from '../../../src/core/random.js';

// References: the definition of an orthonormal basis (QᵀQ = I, and Y = Q(QᵀY) when span Q = span Y),
// checked by brute-force products; R·R⁻¹ = I for the triangular inverse.
function orthoError(q: Float64Array, rows: number, l: number): number {
  const g = serialExecutor.cross(q, q, rows, l);
  let worst = 0;
  for (let a = 0; a < l; a++) for (let b = 0; b < l; b++) worst = Math.max(worst, Math.abs(g[a * l + b] - (a === b ? 1 : 0)));
  return worst;
}

function residualOutsideSpan(y: Float64Array, q: Float64Array, rows: number, l: number): number {
  const c = serialExecutor.cross(q, y, rows, l); // QᵀY
  let num = 0,
    den = 0;
  for (let i = 0; i < rows; i++)
    for (let b = 0; b < l; b++) {
      let proj = 0;
      for (let a = 0; a < l; a++) proj += q[i * l + a] * c[a * l + b];
      num += (y[i * l + b] - proj) ** 2;
      den += y[i * l + b] ** 2;
    }
  return Math.sqrt(num / den);
}

describe('choleskyQr', () => {
  const rnd = createRandom(3);
  const rows = 200,
    l = 12;

  it('inverts an upper-triangular factor', () => {
    const r = new Float64Array(l * l);
    for (let i = 0; i < l; i++) for (let j = i; j < l; j++) r[i * l + j] = i === j ? 2 + rnd.next() : rnd.normal();
    const xt = invertUpperTransposed(r, l);
    for (let i = 0; i < l; i++)
      for (let j = 0; j < l; j++) {
        let s = 0;
        for (let t = 0; t < l; t++) s += r[i * l + t] * xt[j * l + t];
        expect(Math.abs(s - (i === j ? 1 : 0))).toBeLessThan(1e-12);
      }
  });

  it('gives an orthonormal basis of the same span (two passes to working precision)', () => {
    // Columns scaled over six orders of magnitude: cond(Y) ≈ 1e6.
    const y = Float64Array.from({ length: rows * l }, (_, t) => rnd.normal() * 10 ** (-(t % l) / 2));
    const keep = Float64Array.from(y);
    const one = choleskyQr(serialExecutor, Float64Array.from(y), rows, l, 1, rnd);
    const two = choleskyQr(serialExecutor, y, rows, l, 2, rnd);
    expect(orthoError(one, rows, l)).toBeLessThan(1e-2);
    expect(orthoError(two, rows, l)).toBeLessThan(1e-13);
    expect(residualOutsideSpan(keep, two, rows, l)).toBeLessThan(1e-12);
  });

  it('keeps full width on a rank-deficient block (seeded random fill)', () => {
    const base = Float64Array.from({ length: rows * 3 }, () => rnd.normal());
    const y = new Float64Array(rows * l);
    for (let i = 0; i < rows; i++) for (let c = 0; c < l; c++) y[i * l + c] = base[i * 3 + (c % 3)] * (c + 1);
    const q = choleskyQr(serialExecutor, y, rows, l, 1, rnd);
    expect(orthoError(q, rows, l)).toBeLessThan(1e-10);
  });
});
