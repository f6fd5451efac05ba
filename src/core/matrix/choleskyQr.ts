/**
 * CholeskyQR on an executor (Fukaya, Nakatsukasa, Yanagisawa & Yamamoto 2014): G = YᵀY,
 * R = chol(G), Q = Y R⁻¹, with the Gram sum and the right product run by the executor and only
 * the l × l Cholesky factor and its inverse formed here. One pass leaves ‖QᵀQ − I‖ ≈ ε·cond(Y)²,
 * plenty for a basis between power iterations (a cheap normaliser: the l × l factor costs far less
 * than a Householder QR of the tall block, Halko et al. 2011 §4.5 allow any orthonormalisation
 * between products); two passes (CholeskyQR2, Fukaya et al. 2014) give orthonormality to working
 * precision while cond(Y) ≲ 1e8. When Cholesky breaks down (Y numerically rank-deficient), falls
 * back to orthonormalize() (SVQB with seeded random fill), which keeps the full width.
 */
import type { RandomSource } from '../random.js';
import { cholesky } from './dense.js';
import type { MatrixExecutor } from './executor.js';
import { orthonormalize } from './orthonormalize.js';

/**
 * Orthonormalises the rows × l block y (from executor memory) in place: each pass multiplies by
 * R⁻¹ (upper triangular) column by column from the top down, which needs no second buffer.
 * onFirstFactor, when given, sees (R⁻¹)ᵀ of the first pass (R's singular values are y's as it
 * came in); it is not called when the robust path runs instead.
 */
export function choleskyQr(
  ex: MatrixExecutor,
  y: Float64Array,
  rows: number,
  l: number,
  passes: 1 | 2,
  random: RandomSource,
  onFirstFactor?: (inverseT: Float64Array) => void,
): Float64Array {
  for (let pass = 0; pass < passes; pass++) {
    const r = cholesky(ex.cross(y, y, rows, l), l);
    if (!r) {
      // Rank-deficient block: the robust path (serial, rare) works in place on y.
      const q = orthonormalize({ rows, cols: l, data: y }, random).q.data;
      if (q !== y) y.set(q);
      return y;
    }
    const inverseT = invertUpperTransposed(r, l);
    if (pass === 0) onFirstFactor?.(inverseT);
    ex.timesSmall(y, rows, l, inverseT, l, true, y);
  }
  return y;
}

/** (R⁻¹)ᵀ for upper-triangular R (l × l row-major): the transposed factor timesSmall expects. */
export function invertUpperTransposed(r: Float64Array, l: number): Float64Array {
  // Column j of X = R⁻¹ solves R x = e_j by back substitution; X is upper triangular.
  const xt = new Float64Array(l * l); // xt[j * l + i] = X[i][j]
  for (let j = 0; j < l; j++) {
    const o = j * l;
    xt[o + j] = 1 / r[j * l + j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let t = i + 1; t <= j; t++) s += r[i * l + t] * xt[o + t];
      xt[o + i] = -s / r[i * l + i];
    }
  }
  return xt;
}
