/**
 * What the spectrum means for a person: how much of the weighted term–document matrix's energy
 * (Σσ²/‖A‖²_F, Eckart & Young 1936: the best rank-k approximation keeps exactly this share) the
 * index's k concepts keep, why a share well under half is normal for text, and whether more
 * concepts would change much, judged by what the last tenth of the kept concepts adds (and, when
 * more singular values were computed than kept, what the next ones would add). LSI keeps a few
 * hundred concepts on large collections and is not meant to keep most of the energy: the rest is
 * mostly what is particular to single files (Deerwester et al. 1990; Landauer & Dumais 1997).
 * The 2-point threshold for "little to gain" is common practice, not from a source.
 */

export interface SpectrumGuidance {
  /** One sentence: k and the share it keeps, in plain words. */
  readonly summary: string;
  /** What that means, and what more or fewer concepts would change. */
  readonly advice: string;
  /** Energy share kept by k concepts (0–1). */
  readonly kept: number;
  /** Percentage points the last tenth of the kept concepts adds. */
  readonly tailPoints: number;
}

/** Below this many percentage points from the last tenth of the concepts, more concepts add little. */
export const LITTLE_GAIN_POINTS = 2;

export function spectrumGuidance(singularValues: readonly number[], totalEnergy: number, k: number): SpectrumGuidance {
  const energy = (from: number, to: number) => {
    let s = 0;
    for (let i = from; i < Math.min(to, singularValues.length); i++) s += singularValues[i] ** 2;
    return totalEnergy > 0 ? s / totalEnergy : 0;
  };
  const kk = Math.min(k, singularValues.length);
  const kept = energy(0, kk);
  const tenth = Math.max(1, Math.round(kk / 10));
  const tailPoints = 100 * energy(kk - tenth, kk);
  const pct = (x: number) => `${(100 * x).toFixed(1)}%`;
  const summary =
    `The index describes each file by k = ${k} concepts, which keep ${pct(kept)} of the weighted word counts' variation (energy). ` +
    'For text a share well under half is normal: the rest is mostly what is particular to single files — names, spellings, one-off wording — which search by meaning is meant to look past.';
  const beyond = singularValues.length > kk ? energy(kk, singularValues.length) : null;
  const next =
    beyond === null ? '' : ` The next ${singularValues.length - kk} concepts computed would add ${(100 * beyond).toFixed(1)} points.`;
  const advice =
    tailPoints < LITTLE_GAIN_POINTS
      ? `k looks large enough: the last ${tenth} of the ${k} concepts add only ${tailPoints.toFixed(1)} points.${next} More concepts would mostly separate single files, making results closer to exact word matching; fewer would merge neighbouring topics. To change k, set undertone.dimensions (default "auto").`
      : `More concepts could still tell finer topics apart: the last ${tenth} of the ${k} concepts add ${tailPoints.toFixed(1)} points.${next} Try a larger undertone.dimensions (for example ${Math.round(k * 1.5)}) if related files seem mixed up; fewer concepts would merge neighbouring topics.`;
  return { summary, advice, kept, tailPoints };
}
