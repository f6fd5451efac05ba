/**
 * The Rayleigh–Ritz step that ends the randomized SVD (Halko, Martinsson & Tropp 2011, Alg. 5.1,
 * in its "eigen-decomposition of BBᵀ" form, as gensim's multi-pass LSI uses): for an orthonormal
 * basis Q (small side, S × l) of A's range and Z = AᵀQ (big side, B × l), G = ZᵀZ = BBᵀ with
 * B = QᵀA. With G = W Λ Wᵀ (symmetricEigen.ts, l × l): σ = √λ, small-side vectors Q W and big-side
 * vectors Z W Σ⁻¹ = Aᵀ (Q W) Σ⁻¹ (formed in randomizedSvd.ts by one sparse pass, in blocks of
 * rows). Only l × l work happens here.
 *
 * Eigenvalues below RANK_TOLERANCE·λ₁ are rounding noise of the Gram matrix (about ε·λ₁) and
 * are reported as σ = 0. Big-side vectors of weak directions (σ < WEAK·σ₁) lose orthogonality
 * in proportion to (σ₁/σ)²·ε, so they are re-orthogonalised against the others by Gram–Schmidt
 * (twice), or replaced by a seeded random direction when nothing is left of them.
 */
import { symmetricEigen } from '../matrix/symmetricEigen.js';
import type { RandomSource } from '../random.js';

/** λ below this share of λ₁ counts as zero (a few hundred ε; common practice for Gram matrices). */
export const RANK_TOLERANCE = 1e-12;
/** σ/σ₁ below which big-side vectors are re-orthogonalised explicitly (our choice: ε(σ₁/σ)² ≤ 1e-8). */
export const WEAK = 1e-4;

export interface RitzPairs {
  /** Top-k singular values, descending. */
  readonly s: Float64Array;
  /** l × k eigenvectors of G for those values (row-major). */
  readonly w: Float64Array;
}

/** Top-k eigenpairs of the symmetric l × l matrix G (descending; ties by index). */
export function topEigenpairs(g: Float64Array, l: number, k: number): RitzPairs {
  const sym = new Float64Array(l * l);
  for (let i = 0; i < l; i++) for (let j = 0; j < l; j++) sym[i * l + j] = 0.5 * (g[i * l + j] + g[j * l + i]);
  const { values: lambda, vectors } = symmetricEigen(sym, l);
  const order = Array.from({ length: l }, (_, i) => i)
    .sort((a, b) => lambda[b] - lambda[a] || a - b)
    .slice(0, k);
  const top = Math.max(lambda[order[0]], 0);
  const s = Float64Array.from(order, (i) => (lambda[i] > RANK_TOLERANCE * top ? Math.sqrt(lambda[i]) : 0));
  const w = new Float64Array(l * k);
  for (let c = 0; c < k; c++) for (let i = 0; i < l; i++) w[i * k + c] = vectors[order[c] * l + i];
  return { s, w };
}

/** Wᵀ (k × l) of a row-major l × k matrix, optionally scaling column c by scale[c]. */
export function transposeScaled(w: Float64Array, l: number, k: number, scale?: Float64Array): Float64Array {
  const wt = new Float64Array(k * l);
  for (let i = 0; i < l; i++) for (let c = 0; c < k; c++) wt[c * l + i] = w[i * k + c] * (scale ? scale[c] : 1);
  return wt;
}

/** Re-orthogonalises the weak columns of a rows × k block in place (see the header). */
export function repairWeakColumns(v: Float64Array | Float32Array, rows: number, k: number, s: Float64Array, random: RandomSource): number {
  const top = s[0];
  const done = Uint8Array.from(s, (x) => (top > 0 && x >= WEAK * top ? 1 : 0));
  let repaired = 0;
  for (let c = 0; c < k; c++) {
    if (done[c]) continue;
    repaired++;
    for (let attempt = 0; attempt < 4; attempt++) {
      const before = normalizeColumn(v, rows, k, c);
      // Two sweeps of Gram–Schmidt against the finished columns ("twice is enough").
      for (let sweep = 0; sweep < 2; sweep++) {
        for (let p = 0; p < k; p++) {
          if (!done[p]) continue;
          let dot = 0;
          for (let i = 0; i < rows; i++) dot += v[i * k + p] * v[i * k + c];
          for (let i = 0; i < rows; i++) v[i * k + c] -= dot * v[i * k + p];
        }
      }
      if (before > 0 && normalizeColumn(v, rows, k, c) > 1e-6) break;
      for (let i = 0; i < rows; i++) v[i * k + c] = random.normal();
    }
    done[c] = 1;
  }
  return repaired;
}

/** Scales column c to unit length; returns its norm before (0 leaves it untouched). */
function normalizeColumn(v: Float64Array | Float32Array, rows: number, k: number, c: number): number {
  let ss = 0;
  for (let i = 0; i < rows; i++) ss += v[i * k + c] ** 2;
  const norm = Math.sqrt(ss);
  if (norm > 0) for (let i = 0; i < rows; i++) v[i * k + c] /= norm;
  return norm;
}
