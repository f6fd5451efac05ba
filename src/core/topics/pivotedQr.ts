/**
 * Column-pivoted QR selection (Businger & Golub 1965) on the k × n matrix V_kᵀ, done as modified
 * Gram–Schmidt on its n columns (the rows of the n × k basis): repeatedly pick the column with
 * the largest remaining norm, then remove its direction from every other column. The first k
 * pivots are the classic rank-revealing choice of k representative indices (Chan 1987, "Rank
 * revealing QR factorizations", Linear Algebra Appl. 88/89; from memory).
 * ml-matrix's QrDecomposition does not pivot, hence this small routine. Cost O(n·k²).
 * Deterministic: ties go to the lower index. Stops early when every remaining norm is below
 * 1e-10 of the first pivot's (the basis has lower numerical rank than k).
 */
import { InvalidInputError } from '../errors.js';

/** Pivot order (first k) of column-pivoted QR of the transpose of a row-major n × stride basis. */
export function pivotedQrIndices(basis: Float64Array | Float32Array, n: number, stride: number, k: number): number[] {
  if (!(k >= 1 && k <= stride && k <= n) || basis.length < n * stride)
    throw new InvalidInputError(`pivoted QR needs 1 ≤ k ≤ min(${n}, ${stride})`);
  const work = new Float64Array(n * k);
  const norms = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let c = 0; c < k; c++) {
      const v = basis[i * stride + c];
      work[i * k + c] = v;
      s += v * v;
    }
    norms[i] = s;
  }
  const used = new Uint8Array(n);
  const chosen: number[] = [];
  const q = new Float64Array(k);
  let first = 0;
  for (let step = 0; step < k; step++) {
    let piv = -1;
    for (let i = 0; i < n; i++) if (!used[i] && (piv < 0 || norms[i] > norms[piv])) piv = i;
    if (piv < 0) break;
    // Recompute the pivot's norm exactly (the running norms lose accuracy by cancellation).
    let s = 0;
    for (let c = 0; c < k; c++) s += work[piv * k + c] ** 2;
    if (step === 0) first = s;
    if (!(s > first * 1e-20) || s === 0) break;
    const norm = Math.sqrt(s);
    for (let c = 0; c < k; c++) q[c] = work[piv * k + c] / norm;
    used[piv] = 1;
    chosen.push(piv);
    for (let i = 0; i < n; i++) {
      if (used[i]) continue;
      const o = i * k;
      let d = 0;
      for (let c = 0; c < k; c++) d += q[c] * work[o + c];
      if (d === 0) continue;
      let ss = 0;
      for (let c = 0; c < k; c++) {
        work[o + c] -= d * q[c];
        ss += work[o + c] * work[o + c];
      }
      norms[i] = ss;
    }
  }
  return chosen;
}
