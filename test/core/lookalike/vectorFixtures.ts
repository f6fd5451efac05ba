/** Seeded vectors with known cosines, for the SimHash and paraphrase tests. */
import type { RandomSource } from '../../../src/core/random.js';

export function randomUnit(dims: number, rng: RandomSource): Float64Array {
  const v = Float64Array.from({ length: dims }, () => rng.normal());
  const n = Math.hypot(...v);
  return v.map((x) => x / n);
}

/** A unit vector at exactly the given cosine to unit vector u (Gram–Schmidt on a random direction). */
export function atCosine(u: Float64Array, cosine: number, rng: RandomSource): Float64Array {
  const w = randomUnit(u.length, rng);
  let dot = 0;
  for (let d = 0; d < u.length; d++) dot += w[d] * u[d];
  const perp = w.map((x, d) => x - dot * u[d]);
  const pn = Math.hypot(...perp);
  const sin = Math.sqrt(1 - cosine * cosine);
  return u.map((x, d) => cosine * x + (sin * perp[d]) / pn);
}

export function cosineOf(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let dot = 0;
  let na = 0;
  let nb = 0;
  for (let d = 0; d < a.length; d++) {
    dot += a[d] * b[d];
    na += a[d] * a[d];
    nb += b[d] * b[d];
  }
  return dot / Math.sqrt(na * nb);
}
