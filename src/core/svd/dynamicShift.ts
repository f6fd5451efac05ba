/**
 * Dynamic shifts for the power iterations of a randomized SVD (Feng, Yu, Xie & Tang 2024,
 * "Algorithm 1043: Faster Randomized SVD with Dynamic Shifts", ACM Transactions on Mathematical
 * Software, doi:10.1145/3660629). A power iteration applies (AAᵀ − αI) to the basis Q instead of
 * AAᵀ: the same eigenvectors, with eigenvalues σᵢ² − α. While α ≤ σ_l²/2 (l the basis width), every
 * eigenvalue beyond the l-th stays at most σ_l² − α in magnitude, so the basis still converges to
 * the leading l directions, and the ratio that sets the speed for σ_k, (σ_{l+1}² − α)/(σ_k² − α),
 * is smaller than σ_{l+1}²/σ_k².
 *
 * The rule: α starts at 0; after each iteration, ŝ = the smallest singular value of the block
 * (AAᵀ − αI)Q just formed (an estimate from below of σ_l² − α), and α becomes (α + ŝ)/2 when
 * ŝ > α, which keeps α at most about σ_l²/2. No extra pass over the matrix: ŝ comes from the
 * l × l factor R that CholeskyQR forms anyway (R's singular values are the block's), as
 * 1 / ‖R⁻¹‖₂, with ‖R⁻¹‖₂ by ESTIMATE_STEPS steps of the power method on R⁻ᵀR⁻¹ from a fixed
 * start (deterministic; it approaches ‖R⁻¹‖₂ from below, so ŝ may come out a little high:
 * 0–1.9% at 50 steps in numpy on the linux-source-6.1 Documentation matrix and on its drivers/net
 * folder, up to 3.5% at 20; a shift that much past σ_l²/2 only slows directions beyond the l-th).
 *
 * Measured there (numpy against ARPACK, k = 200, l = 300, seeds 0–2, worst of the 200 values):
 * 4 shifted iterations 0.70–0.71% and 0.55–0.66%, against 0.80–0.81% and 0.62–0.75% for 5
 * unshifted ones: one iteration (two passes over the matrix) fewer for the same accuracy.
 */

/** Power-method steps of the estimate of ‖R⁻¹‖₂ (our choice: measured above). */
export const ESTIMATE_STEPS = 50;

/**
 * The smallest singular value of an l × l factor R, given (R⁻¹)ᵀ row-major (as CholeskyQR
 * hands it over): 1 / ‖R⁻¹‖₂, the norm by the power method. 0 when R⁻¹ is not finite.
 */
export function smallestSingularValue(inverseT: Float64Array, l: number, steps = ESTIMATE_STEPS): number {
  // x = R⁻¹ = inverseTᵀ: (x v)_i = Σ_j inverseT[j l + i] v_j, (xᵀ u)_j = Σ_i inverseT[j l + i] u_i.
  const v = new Float64Array(l).fill(1 / Math.sqrt(l));
  const u = new Float64Array(l);
  let norm = 0;
  for (let step = 0; step <= steps; step++) {
    u.fill(0);
    for (let j = 0; j < l; j++) {
      const vj = v[j];
      if (vj === 0) continue;
      const o = j * l;
      for (let i = 0; i < l; i++) u[i] += inverseT[o + i] * vj;
    }
    let uu = 0;
    for (let i = 0; i < l; i++) uu += u[i] * u[i];
    norm = Math.sqrt(uu);
    if (!(norm > 0 && Number.isFinite(norm))) return 0;
    if (step === steps) break;
    // v = xᵀu / ‖xᵀu‖.
    let vv = 0;
    for (let j = 0; j < l; j++) {
      const o = j * l;
      let s = 0;
      for (let i = 0; i < l; i++) s += inverseT[o + i] * u[i];
      v[j] = s;
      vv += s * s;
    }
    const vn = Math.sqrt(vv);
    if (!(vn > 0 && Number.isFinite(vn))) return 0;
    for (let j = 0; j < l; j++) v[j] /= vn;
  }
  return 1 / norm;
}

/** The shift for the next iteration: (α + ŝ)/2 when ŝ > α, else α (ŝ as above). */
export function nextShift(alpha: number, smallest: number): number {
  return smallest > alpha ? (alpha + smallest) / 2 : alpha;
}
