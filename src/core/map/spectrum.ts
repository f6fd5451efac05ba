/**
 * The series the spectrum tab draws: singular values σ_i, each factor's share of the matrix's
 * energy σ_i²/‖A‖²_F, and the cumulative share Σ_{j≤i} σ_j²/‖A‖²_F (by the Eckart–Young theorem,
 * the share of ‖A‖²_F a rank-i truncation keeps).
 */
import { InvalidInputError } from '../errors.js';

export interface SpectrumSeries {
  readonly values: Float64Array;
  readonly share: Float64Array;
  readonly cumulative: Float64Array;
  /** The chosen number of factors. */
  readonly k: number;
  readonly totalEnergy: number;
}

export function spectrumSeries(singularValues: ArrayLike<number>, totalEnergy: number, k: number): SpectrumSeries {
  if (!(totalEnergy > 0) || !Number.isFinite(totalEnergy))
    throw new InvalidInputError(`total energy must be a positive number, got ${totalEnergy}`);
  const n = singularValues.length;
  const values = Float64Array.from(singularValues);
  const share = new Float64Array(n);
  const cumulative = new Float64Array(n);
  let run = 0;
  for (let i = 0; i < n; i++) {
    share[i] = (values[i] * values[i]) / totalEnergy;
    run += share[i];
    cumulative[i] = run;
  }
  return { values, share, cumulative, k, totalEnergy };
}
