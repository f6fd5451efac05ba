/** Shared test inputs for the topics tests: seeded orthonormal bases and dense helpers. */
import { Matrix, QrDecomposition } from 'ml-matrix';
import { createRandom } from '../../../src/core/random.js';

/** An n × k row-major matrix with orthonormal columns (ml-matrix QR of a seeded Gaussian). */
export function orthonormalBasis(n: number, k: number, seed: number): Float64Array {
  const r = createRandom(seed);
  const g = new Matrix(n, k);
  for (let i = 0; i < n; i++) for (let c = 0; c < k; c++) g.set(i, c, r.normal());
  const q = new QrDecomposition(g).orthogonalMatrix;
  const out = new Float64Array(n * k);
  for (let i = 0; i < n; i++) for (let c = 0; c < k; c++) out[i * k + c] = q.get(i, c);
  return out;
}
