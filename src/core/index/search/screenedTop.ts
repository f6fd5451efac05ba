/**
 * Exact top-N of score_j = a·(v_j·q) [+ b·extra_j] over accepted rows, with exact products only
 * for rows that can still place: bounds from the 8-bit codes (conceptCodes.ts) give each row a
 * lower and an upper score; T is the N-th best lower bound among accepted rows, and a row whose
 * upper bound is below T is beaten strictly by N accepted rows, so it cannot be among the top N
 * (a branch-and-bound filter, common practice). Candidates get their exact products from the f32
 * rows (the same bits as a full pass), so the ranking and the scores equal those of a full pass.
 */
import type { ConceptCodes } from './conceptCodes.js';
import type { ConceptRows } from './conceptRows.js';
import { topN, type Ranked } from './topN.js';

/** Absolute slack on every bound for the f64 rounding of a·x + b·y (scores are O(1)). */
const SLACK = 1e-12;

export interface ScreenInput {
  readonly codes: ConceptCodes;
  readonly rows: ConceptRows;
  readonly q: Float32Array;
  /** Rows [0, n) are ranked. */
  readonly n: number;
  readonly top: number;
  readonly accept: (slot: number) => boolean;
  /** Weight of the product, > 0. */
  readonly a: number;
  /** When given, score_j = a·(v_j·q) + b·extra_j (the formula of the caller, in this order). */
  readonly extra?: { readonly b: number; readonly values: Float64Array };
}

export interface Screened {
  readonly ranked: Ranked[];
  /** The exact product v_j·q of a ranked slot. */
  product(slot: number): number;
  /** Rows whose exact product was computed. */
  readonly candidates: number;
}

export class ScreenScratch {
  lower = new Float64Array(0);
  score = new Float64Array(0);
  slots = new Int32Array(0);
  fit(n: number): void {
    if (this.lower.length >= n) return;
    const m = Math.ceil(n * 1.25);
    this.lower = new Float64Array(m);
    this.score = new Float64Array(m);
    this.slots = new Int32Array(m);
  }
}

/** The exact top N, or null when fewer than N rows are accepted (then screening saves nothing). */
export function screenedTop(input: ScreenInput, scratch: ScreenScratch): Screened | null {
  const { codes, rows, q, n, top, accept, a, extra } = input;
  if (top <= 0 || !(a > 0)) return null;
  scratch.fit(n);
  const { center, radius } = codes.bounds(q, n);
  const lower = scratch.lower.subarray(0, n);
  lowerBounds(center, radius, a, extra?.b ?? 0, extra?.values ?? null, lower);
  const best = topN(lower, top, accept);
  if (best.length < top) return null;
  const bar = best[top - 1].score;
  const list = scratch.slots;
  const count = candidates(center, radius, a, extra?.b ?? 0, extra?.values ?? null, bar, accept, list);
  const exact = rows.dotsAt(q, list, count);
  const score = scratch.score.subarray(0, n).fill(Number.NaN);
  for (let i = 0; i < count; i++) {
    const j = list[i];
    score[j] = extra ? a * exact[j] + extra.b * extra.values[j] : exact[j];
  }
  const ranked = topN(score, top, accept);
  return { ranked, product: (slot) => exact[slot], candidates: count };
}

function lowerBounds(
  center: Float64Array,
  radius: Float64Array,
  a: number,
  b: number,
  values: Float64Array | null,
  out: Float64Array,
): void {
  for (let j = 0; j < out.length; j++) out[j] = a * (center[j] - radius[j]) + (values ? b * values[j] : 0) - SLACK;
}

function candidates(
  center: Float64Array,
  radius: Float64Array,
  a: number,
  b: number,
  values: Float64Array | null,
  bar: number,
  accept: (slot: number) => boolean,
  out: Int32Array,
): number {
  let count = 0;
  for (let j = 0; j < center.length; j++) {
    const upper = a * (center[j] + radius[j]) + (values ? b * values[j] : 0) + SLACK;
    if (upper >= bar && accept(j)) out[count++] = j;
  }
  return count;
}
