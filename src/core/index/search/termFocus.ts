/**
 * Query-word focus: how tightly the files holding a word sit together in the concept space,
 * beyond what as many files drawn at random would give; a search weighs each query word's part of
 * the concept fold by it. A word whose files point every which way ("happens"; "bad" in
 * `badRequest` beside "bad weather") says little about what is sought; one whose files share a
 * direction says much (the idea of the term discrimination value: a good index term makes its
 * documents alike, Salton, Yang & Yu 1975, "A theory of term importance in automatic text
 * analysis").
 *
 * Measure: the mean resultant length of the holders' unit concept vectors, r = ‖Σ_j v_j‖ / m
 * (directional statistics: Mardia & Jupp 2000, "Directional Statistics", §2.3.1), divided by its
 * chance level. For m unit vectors drawn independently from a collection whose mean vector is μ,
 * E‖Σ v‖² = m + m(m − 1)‖μ‖², so the chance level is √(1/m + (1 − 1/m)‖μ‖²) (our derivation):
 * a word held by few files is not credited for the few alone, and a word spread like the whole
 * collection scores about 1. A query word's weight is (focus_t / max over the query's words)^p,
 * p = 1 (no constant; 1.5 measured slightly better, not adopted as a fitted value; README,
 * "Ranking checks"); p = 0 turns it off. A one-word query is unchanged.
 */

export interface TermFocusOptions {
  /** Exponent p of the relative focus; 0 = off. @default 1 */
  power: number;
}

/**
 * About how many of a word's files give its resultant (every ⌊df/FOCUS_SAMPLE⌋-th; all below twice
 * this). Common practice, not tuned: the sample's r errs by the order of 1/√2048 ≈ 0.02, and a
 * word held by tens of thousands of files then costs a search about a millisecond, not a hundred.
 */
export const FOCUS_SAMPLE = 2048;

export const DEFAULT_TERM_FOCUS_OPTIONS: Readonly<TermFocusOptions> = Object.freeze({ power: 1 });

/** A word's holders: the mean resultant length r of their unit vectors and their number m. */
export interface Resultant {
  readonly r: number;
  readonly m: number;
}

/**
 * Mean resultant length of the unit rows (k numbers each, in `rows`) of the slots that `holders`
 * visits (r = 1 when none).
 */
export function meanResultant(rows: Float32Array, k: number, holders: (visit: (slot: number) => void) => void): Resultant {
  const acc = new Float64Array(k);
  let slots = new Int32Array(256);
  let m = 0;
  holders((slot) => {
    if (m === slots.length) {
      const grown = new Int32Array(2 * m);
      grown.set(slots);
      slots = grown;
    }
    slots[m++] = slot;
  });
  if (m === 0) return { r: 1, m: 0 };
  addRows(rows, k, slots, m, acc);
  let ss = 0;
  for (let c = 0; c < k; c++) ss += acc[c] * acc[c];
  return { r: Math.min(1, Math.sqrt(ss) / m), m };
}

/**
 * acc += the rows (k numbers each) of slots[0…m), in that order. Eight rows a step: ((acc + a) + b)
 * + … is the same sum in the same order as adding one row at a time (the same bits), with an eighth
 * of the passes over acc.
 */
export function addRows(rows: Float32Array, k: number, slots: Int32Array, m: number, acc: Float64Array): void {
  let i = 0;
  for (; i + 8 <= m; i += 8) {
    const a = slots[i] * k;
    const b = slots[i + 1] * k;
    const c2 = slots[i + 2] * k;
    const d = slots[i + 3] * k;
    const e = slots[i + 4] * k;
    const f = slots[i + 5] * k;
    const g = slots[i + 6] * k;
    const h = slots[i + 7] * k;
    for (let c = 0; c < k; c++)
      acc[c] = acc[c] + rows[a + c] + rows[b + c] + rows[c2 + c] + rows[d + c] + rows[e + c] + rows[f + c] + rows[g + c] + rows[h + c];
  }
  for (; i < m; i++) {
    const o = slots[i] * k;
    for (let c = 0; c < k; c++) acc[c] += rows[o + c];
  }
}

/** r over its chance level √(1/m + (1 − 1/m)·‖μ‖²) (1 for a word no file holds). */
export function focusOf({ r, m }: Resultant, meanNormSquared: number): number {
  if (m === 0) return 1;
  const chance = Math.sqrt(1 / m + (1 - 1 / m) * Math.max(0, meanNormSquared));
  return chance > 0 ? r / chance : 1;
}

/** Each word's weight (focus_t / max focus)^p, aligned with `focus`. */
export function focusWeights(focus: readonly number[], options: Partial<TermFocusOptions> = {}): number[] {
  const { power } = { ...DEFAULT_TERM_FOCUS_OPTIONS, ...options };
  const max = Math.max(0, ...focus);
  if (power === 0 || !(max > 0)) return focus.map(() => 1);
  return focus.map((f) => Math.pow(Math.max(f, 0) / max, power));
}
