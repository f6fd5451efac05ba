/**
 * Query-term focus: how tightly the documents holding a word sit together in the concept space,
 * used to weigh a query's words against each other. A word whose documents point every which way
 * ("happens", "bad" in `badRequest` beside "bad weather") says little about what is sought; one
 * whose documents share a direction says much. The measure is the mean resultant length of the
 * holders' unit concept vectors, r = ‖Σ_j v_j‖ / m (directional statistics: Mardia & Jupp 2000,
 * "Directional Statistics", §2.3.1), whose square relates to their mean pairwise cosine
 * ((m·r)² − m)/(m(m − 1)) — the cohesion of the word's documents, in the spirit of the term
 * discrimination value (Salton, Yang & Yu 1975, "A theory of term importance in automatic text
 * analysis": a good index term makes its documents alike and sets them apart from the rest).
 * A word held by one document has r = 1.
 *
 * A query's word weights are (r_t / max_q r)^p, relative to its most focused word, so a one-word
 * query is unchanged and no collection-wide constant enters; p = 0 turns the weighting off.
 * Words no document holds weigh 1.
 */

export interface TermFocusOptions {
  /** Exponent p of (r_t / max r); 0 = off. @default 1 */
  power: number;
}

export const DEFAULT_TERM_FOCUS_OPTIONS: Readonly<TermFocusOptions> = Object.freeze({ power: 1 });

/**
 * Mean resultant length of the unit rows (k numbers each, in `rows`) of the slots that
 * `holders` visits; 1 when none.
 */
export function meanResultant(rows: Float32Array, k: number, holders: (visit: (slot: number) => void) => void): number {
  const acc = new Float64Array(k);
  let m = 0;
  holders((slot) => {
    const o = slot * k;
    for (let c = 0; c < k; c++) acc[c] += rows[o + c];
    m++;
  });
  if (m === 0) return 1;
  let ss = 0;
  for (let c = 0; c < k; c++) ss += acc[c] * acc[c];
  return Math.min(1, Math.sqrt(ss) / m);
}

/** Each word's weight (r_t / max r)^power, aligned with `resultants`. */
export function focusWeights(resultants: readonly number[], options: Partial<TermFocusOptions> = {}): number[] {
  const { power } = { ...DEFAULT_TERM_FOCUS_OPTIONS, ...options };
  const max = Math.max(0, ...resultants);
  if (power === 0 || !(max > 0)) return resultants.map(() => 1);
  return resultants.map((r) => Math.pow(Math.max(r, 0) / max, power));
}
