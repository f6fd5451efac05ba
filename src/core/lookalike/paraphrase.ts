/**
 * High-cosine pairs among concept vectors: the search behind "same content, different words".
 *
 * - Up to allPairsLimit vectors: every pair's cosine (exact; n²/2 dot products).
 * - Above it: SimHash bands (Charikar 2002, simhash.ts) → LSH candidates (banding.ts) → exact
 *   cosine for each candidate. With the defaults (24 bands × 16 bits) a pair at cosine 0.95 is a
 *   candidate with probability ≈ 0.99 and one at 0.3 with ≈ 0.006 [E arithmetic]; misses are
 *   possible, false positives are not (every reported pair's cosine is exact).
 * Cosine is computed as u·v / (|u||v|), so vectors need not be exactly unit length; zero or
 * non-finite vectors are left out.
 */
import { bandCandidates } from './banding.js';
import { simhashBands } from './simhash.js';

export interface CosinePairParams {
  readonly threshold: number;
  readonly allPairsLimit: number;
  readonly simhashBands: number;
  readonly simhashBitsPerBand: number;
  readonly maxBucketSize: number;
  readonly seed: number;
}

/** Pairs of row indices (left < right) with cosine ≥ threshold. */
export interface CosinePairs {
  readonly left: number[];
  readonly right: number[];
  readonly cosine: number[];
  readonly candidates: number;
  readonly mode: 'all-pairs' | 'simhash';
}

/** Pairs among the listed rows (ascending row indices) of a row-major n×dims block. */
export function findHighCosinePairs(vectors: Float32Array, dims: number, rows: readonly number[], params: CosinePairParams): CosinePairs {
  const usable: number[] = [];
  const norms = new Map<number, number>();
  for (const r of rows) {
    let s = 0;
    for (let d = 0; d < dims; d++) s += vectors[r * dims + d] * vectors[r * dims + d];
    if (s > 0 && Number.isFinite(s)) {
      usable.push(r);
      norms.set(r, Math.sqrt(s));
    }
  }
  const out: CosinePairs = { left: [], right: [], cosine: [], candidates: 0, mode: 'all-pairs' };
  const check = (a: number, b: number): void => {
    let dot = 0;
    const ao = a * dims;
    const bo = b * dims;
    for (let d = 0; d < dims; d++) dot += vectors[ao + d] * vectors[bo + d];
    const c = dot / ((norms.get(a) as number) * (norms.get(b) as number));
    if (c >= params.threshold) {
      out.left.push(a);
      out.right.push(b);
      out.cosine.push(Math.min(1, c));
    }
  };
  const n = usable.length;
  if (n <= params.allPairsLimit) {
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) check(usable[p], usable[q]);
    return { ...out, candidates: (n * (n - 1)) / 2 };
  }
  const words = simhashBands(vectors, dims, Int32Array.from(usable), {
    bands: params.simhashBands,
    bitsPerBand: params.simhashBitsPerBand,
    seed: params.seed,
  });
  const cand = bandCandidates(words, n, params.simhashBands, {
    bands: params.simhashBands,
    rows: 1,
    maxBucketSize: params.maxBucketSize,
  });
  const order = Array.from({ length: cand.count }, (_, t) => t).sort(
    (x, y) => cand.left[x] - cand.left[y] || cand.right[x] - cand.right[y],
  );
  for (const t of order) check(usable[cand.left[t]], usable[cand.right[t]]);
  return { ...out, candidates: cand.count, mode: 'simhash' };
}
