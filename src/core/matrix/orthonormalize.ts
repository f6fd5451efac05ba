/**
 * Orthonormal basis of a tall block: Y = Q R with QᵀQ = I.
 *
 * CholeskyQR2 (Fukaya, Nakatsukasa, Yanagisawa & Yamamoto, 2014): R₁ = chol(YᵀY), Q₁ = Y R₁⁻¹,
 * repeated once to restore orthogonality to machine precision while cond(Y) ≲ 1e8. When the
 * Cholesky factorisation fails (Y numerically rank-deficient), falls back to SVQB (Stathopoulos &
 * Wu 2002): eigen-decompose YᵀY = WΛWᵀ, Q = YWΛ^{-1/2}, with directions of negligible energy
 * replaced by seeded random vectors orthogonalised against the rest (so Q keeps full width).
 * R is returned so that Y ≈ Q R holds in both branches (R is not triangular in the fallback).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { RandomSource } from '../random.js';
import type { DenseBlock } from './sparse.js';
import { cholesky, gram, multiplySmall, solveUpperRight, timesSmall } from './dense.js';

export interface OrthoResult {
  readonly q: DenseBlock;
  /** l×l row-major, Y = Q R. */
  readonly r: Float64Array;
  /** Number of directions replaced by random ones (0 when Y had full column rank). */
  readonly replaced: number;
}

/** Orthonormalises y in place when possible; the returned q may be y itself. */
export function orthonormalize(y: DenseBlock, random: RandomSource): OrthoResult {
  const l = y.cols;
  const r1 = cholesky(gram(y), l);
  if (r1) {
    solveUpperRight(y, r1);
    const r2 = cholesky(gram(y), l);
    if (r2) {
      solveUpperRight(y, r2);
      return { q: y, r: multiplySmall(r2, r1, l, l, l), replaced: 0 };
    }
    const fb = svqb(y, random);
    return { q: fb.q, r: multiplySmall(fb.r, r1, l, l, l), replaced: fb.replaced };
  }
  return svqb(y, random);
}

function svqb(y: DenseBlock, random: RandomSource): OrthoResult {
  const l = y.cols;
  const g = gram(y);
  const evd = new EigenvalueDecomposition(new Matrix(toRows(g, l)), { assumeSymmetric: true });
  const lambda = evd.realEigenvalues;
  const w = evd.eigenvectorMatrix;
  const maxL = Math.max(...lambda.map((v) => Math.abs(v)), 0);
  const tol = maxL * l * Number.EPSILON * 1e3;
  // Scale eigenvector columns by λ^{-1/2}; negligible directions become zero columns.
  // Largest eigenvalues first, so the random replacements land in the last columns and the
  // Gram–Schmidt clean-up below leaves the good directions (and so Y ≈ QR) intact.
  const order = Array.from({ length: l }, (_, j) => j).sort((a, b) => lambda[b] - lambda[a] || a - b);
  const scaled = new Float64Array(l * l);
  const rMat = new Float64Array(l * l);
  const bad: number[] = [];
  for (let j = 0; j < l; j++) {
    const src = order[j];
    const lam = lambda[src];
    const good = lam > tol;
    if (!good) bad.push(j);
    const s = good ? 1 / Math.sqrt(lam) : 0;
    const rs = good ? Math.sqrt(lam) : 0;
    for (let i = 0; i < l; i++) {
      scaled[i * l + j] = w.get(i, src) * s;
      rMat[j * l + i] = w.get(i, src) * rs; // R = Λ^{1/2} Wᵀ
    }
  }
  const q = timesSmall(y, scaled, l);
  // Re-orthonormalise the good columns once more and fill the bad ones with random directions.
  for (const j of bad) for (let i = 0; i < q.rows; i++) q.data[i * l + j] = random.normal();
  gramSchmidtTwice(q);
  return { q, r: rMat, replaced: bad.length };
}

/** Modified Gram–Schmidt, applied twice ("twice is enough", Giraud et al. 2005), in place. */
export function gramSchmidtTwice(q: DenseBlock): void {
  const { rows, cols: l, data } = q;
  for (let pass = 0; pass < 2; pass++) {
    for (let j = 0; j < l; j++) {
      for (let p = 0; p < j; p++) {
        let dot = 0;
        for (let i = 0; i < rows; i++) dot += data[i * l + p] * data[i * l + j];
        for (let i = 0; i < rows; i++) data[i * l + j] -= dot * data[i * l + p];
      }
      let ss = 0;
      for (let i = 0; i < rows; i++) ss += data[i * l + j] ** 2;
      const norm = Math.sqrt(ss);
      for (let i = 0; i < rows; i++) data[i * l + j] = norm > 0 ? data[i * l + j] / norm : 0;
    }
  }
}

function toRows(a: Float64Array, l: number): number[][] {
  const rows: number[][] = [];
  for (let i = 0; i < l; i++) rows.push(Array.from(a.subarray(i * l, (i + 1) * l)));
  return rows;
}
