/**
 * Statistical leverage scores and leverage-score sampling of columns (or rows) of a matrix, the
 * selection step of CUR (Mahoney & Drineas 2009, PNAS 106(3):697–702; Drineas, Mahoney &
 * Muthukrishnan 2008, SIMAX 30(2)).
 *
 * - Leverage of index j from the top-k singular vectors V_k (one row per column of A):
 *   π_j = (1/k)·Σ_ξ (v_j^ξ)², so Σ_j π_j = 1.
 * - 'column-select' (PNAS ColumnSelect): keep j independently with p_j = min(1, c·π_j), so about c
 *   are kept in expectation; a kept index is scaled by 1/√p_j (E[CCᵀ] = AAᵀ).
 * - 'with-replacement' (Drineas, Kannan & Mahoney 2006; DMM 2008): c independent draws with
 *   probability π_j; an index drawn t times is kept once and scaled by √(t/(c·π_j)), which keeps
 *   CCᵀ equal to the sum over all draws (Drineas, Kannan & Mahoney 2006, SICOMP 36(1)).
 * Scaling never changes the span of the picks, hence never the CUR product C·C⁺·A·R⁺·R.
 * Sample size c = ⌈k·max(1, ln k)/ε²⌉ (the constant Orange3 uses for the O(k log k/ε²) of the
 * paper; the max(1, ·) avoids selecting nothing at k = 1, our choice).
 */
import { InvalidInputError } from '../errors.js';
import type { RandomSource } from '../random.js';

/** Chosen indices of one side (columns or rows) with the scale applied to each. */
export interface Picks {
  /** Chosen indices, ascending. */
  readonly indices: Int32Array;
  /** How many times each index was drawn (1 unless sampled with replacement). */
  readonly counts: Int32Array;
  /** Factor each chosen column (row) is multiplied by in C (R). */
  readonly scales: Float64Array;
}

/**
 * Leverage scores of the n rows of a row-major factor (n × stride), using its first k columns.
 * Rows of V_k give column leverage; rows of U_k give row leverage.
 */
export function leverageScores(factor: Float64Array | Float32Array, n: number, stride: number, k: number): Float64Array {
  if (!(k >= 1 && k <= stride) || factor.length < n * stride)
    throw new InvalidInputError(`leverage needs 1 ≤ k ≤ ${stride} and an n×${stride} factor`);
  const pi = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    const o = j * stride;
    for (let c = 0; c < k; c++) s += factor[o + c] * factor[o + c];
    pi[j] = s / k;
  }
  return pi;
}

/** The published sample size c = ⌈k·max(1, ln k)/ε²⌉. */
export function sampleSize(k: number, epsilon: number): number {
  if (!(epsilon > 0)) throw new InvalidInputError(`epsilon must be positive, got ${epsilon}`);
  return Math.ceil((k * Math.max(1, Math.log(k))) / (epsilon * epsilon));
}

/** ColumnSelect: keep j with probability min(1, c·π_j), independently. */
export function columnSelect(pi: Float64Array, c: number, random: RandomSource): Picks {
  const idx: number[] = [];
  const scales: number[] = [];
  for (let j = 0; j < pi.length; j++) {
    const p = Math.min(1, c * pi[j]);
    if (p > 0 && random.next() < p) {
      idx.push(j);
      scales.push(1 / Math.sqrt(p));
    }
  }
  return { indices: Int32Array.from(idx), counts: new Int32Array(idx.length).fill(1), scales: Float64Array.from(scales) };
}

/** c i.i.d. draws with probability π_j (normalised), repeats merged with scale √(t/(c·π_j)). */
export function sampleWithReplacement(pi: Float64Array, c: number, random: RandomSource): Picks {
  const n = pi.length;
  const cumulative = new Float64Array(n);
  let total = 0;
  for (let j = 0; j < n; j++) cumulative[j] = total += pi[j];
  if (!(total > 0)) throw new InvalidInputError('leverage scores are all zero: nothing to sample');
  const drawn = new Map<number, number>();
  for (let d = 0; d < c; d++) {
    const u = random.next() * total;
    let lo = 0;
    let hi = n - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (cumulative[mid] <= u) lo = mid + 1;
      else hi = mid;
    }
    drawn.set(lo, (drawn.get(lo) ?? 0) + 1);
  }
  const indices = Int32Array.from(drawn.keys()).sort();
  const counts = Int32Array.from(indices, (j) => drawn.get(j)!);
  const scales = Float64Array.from(indices, (j, i) => Math.sqrt(counts[i] / (c * (pi[j] / total))));
  return { indices, counts, scales };
}

/**
 * Deterministic picks padded with the highest-leverage indices not yet chosen, up to target
 * (our choice); ties go to the lower index. Scales are 1.
 */
export function padWithLeverage(chosen: readonly number[], pi: Float64Array, target: number): Picks {
  const set = new Set(chosen);
  if (set.size < target) {
    const order = Array.from(pi.keys()).sort((a, b) => pi[b] - pi[a] || a - b);
    for (const j of order) {
      if (set.size >= target) break;
      if (pi[j] > 0) set.add(j);
    }
  }
  const indices = Int32Array.from(set).sort();
  return { indices, counts: new Int32Array(indices.length).fill(1), scales: new Float64Array(indices.length).fill(1) };
}
