/**
 * Discrete empirical interpolation (DEIM) index selection, as used for CUR by Sorensen & Embree
 * (SIAM J. Sci. Comput. 38(3), 2016, arXiv 1407.5516; the greedy step is Chaturantabut & Sorensen
 * 2010): from k orthonormal singular vectors (an n × k basis), pick k indices one vector at a
 * time. The first index is where |v₁| is largest; index j is where the residual of v_j, after
 * interpolating it from the previous vectors at the chosen indices, is largest in magnitude.
 * Deterministic: ties go to the lower index. Stops early (fewer than k picks) when the remaining
 * vectors are numerically dependent at the chosen indices.
 */
import { InvalidInputError } from '../errors.js';

/** DEIM indices of the first k columns of a row-major n × stride basis. */
export function deimIndices(basis: Float64Array | Float32Array, n: number, stride: number, k: number): number[] {
  if (!(k >= 1 && k <= stride && k <= n) || basis.length < n * stride)
    throw new InvalidInputError(`DEIM needs 1 ≤ k ≤ min(${n}, ${stride})`);
  const chosen: number[] = [argmaxAbs(n, (i) => basis[i * stride])];
  const residual = new Float64Array(n);
  for (let j = 1; j < k; j++) {
    // Solve V[p, 0:j] · c = V[p, j] (j × j).
    const a = new Float64Array(j * j);
    const b = new Float64Array(j);
    for (let r = 0; r < j; r++) {
      const o = chosen[r] * stride;
      for (let c = 0; c < j; c++) a[r * j + c] = basis[o + c];
      b[r] = basis[o + j];
    }
    const coef = solveSquare(a, b, j);
    if (!coef) break;
    for (let i = 0; i < n; i++) {
      const o = i * stride;
      let s = basis[o + j];
      for (let c = 0; c < j; c++) s -= basis[o + c] * coef[c];
      residual[i] = s;
    }
    for (const p of chosen) residual[p] = 0; // exactly interpolated there (rounding aside)
    const next = argmaxAbs(n, (i) => residual[i]);
    if (!(Math.abs(residual[next]) > 1e-12)) break;
    chosen.push(next);
  }
  return chosen;
}

function argmaxAbs(n: number, at: (i: number) => number): number {
  let best = 0;
  let bestAbs = -1;
  for (let i = 0; i < n; i++) {
    const v = Math.abs(at(i));
    if (v > bestAbs) {
      bestAbs = v;
      best = i;
    }
  }
  return best;
}

/** Gaussian elimination with partial pivoting; null when the matrix is numerically singular. */
export function solveSquare(a: Float64Array, b: Float64Array, n: number): Float64Array | null {
  const m = Float64Array.from(a);
  const x = Float64Array.from(b);
  let scale = 0;
  for (const v of m) scale = Math.max(scale, Math.abs(v));
  const tol = scale * n * 1e-13;
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r * n + col]) > Math.abs(m[piv * n + col])) piv = r;
    if (!(Math.abs(m[piv * n + col]) > tol)) return null;
    if (piv !== col) {
      for (let c = 0; c < n; c++) [m[col * n + c], m[piv * n + c]] = [m[piv * n + c], m[col * n + c]];
      [x[col], x[piv]] = [x[piv], x[col]];
    }
    for (let r = col + 1; r < n; r++) {
      const f = m[r * n + col] / m[col * n + col];
      if (f === 0) continue;
      for (let c = col; c < n; c++) m[r * n + c] -= f * m[col * n + c];
      x[r] -= f * x[col];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = x[r];
    for (let c = r + 1; c < n; c++) s -= m[r * n + c] * x[c];
    x[r] = s / m[r * n + r];
  }
  return x;
}
