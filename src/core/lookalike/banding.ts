/**
 * LSH banding for candidate pairs (Indyk & Motwani 1998; Leskovec, Rajaraman & Ullman, "Mining of
 * Massive Datasets", ch. 3.4). Each item's signature of b·r words is cut into b bands of r rows;
 * items whose band rows are all equal share a bucket, and any two items sharing a bucket in some
 * band become a candidate pair. For MinHash signatures of two sets with Jaccard s, the chance of
 * becoming a candidate is 1 − (1 − s^r)^b; the same holds for any signature whose entries agree
 * independently with probability s (SimHash bands use one row of packed bits).
 *
 * Work: one hash-map pass per band (O(n·b)), plus the pairs inside shared buckets.
 * Giant buckets: a bucket holding more than maxBucketSize items (default 100; common practice,
 * our choice) does not emit all of its m(m−1)/2 pairs. Its members are ordered by their whole
 * signature (lexicographic, one global order shared by all bands) and each is paired only with the
 * next CAPPED_NEIGHBOURS (10, our choice) members in that order: the "sorted neighbourhood" idea of
 * Hernández & Stolfo 1995 (from memory). Work stays O(m · 10) per band; members with similar
 * signatures sit close in that order, so union-find still joins them through chains, but such a
 * bucket's pair list is partial. Exact copies never get here: they are grouped by content hash
 * first and only one copy is banded.
 */
import { InvalidInputError } from '../errors.js';
import { murmur3Words32 } from './murmur3.js';

/** Neighbours each member of an over-full bucket is paired with (sorted-neighbourhood window). */
export const CAPPED_NEIGHBOURS = 10;

export interface BandingParams {
  readonly bands: number;
  readonly rows: number;
  /** Buckets larger than this are paired by sorted neighbourhood instead of all pairs. */
  readonly maxBucketSize: number;
}

/** Candidate pairs (left[i] < right[i], item indices), each pair once. */
export interface CandidatePairs {
  readonly left: Uint32Array;
  readonly right: Uint32Array;
  readonly count: number;
  /** Buckets (over all bands) that exceeded maxBucketSize. */
  readonly cappedBuckets: number;
}

/** P[candidate] = 1 − (1 − s^r)^b for per-row agreement probability s. */
export function candidateProbability(s: number, bands: number, rows: number): number {
  return 1 - Math.pow(1 - Math.pow(s, rows), bands);
}

/**
 * Candidate pairs from signatures stored row-major: item i owns
 * signatures[i·width .. i·width + width), and band t reads columns [t·rows, (t+1)·rows).
 */
export function bandCandidates(signatures: Uint32Array, items: number, width: number, params: BandingParams): CandidatePairs {
  const { bands, rows, maxBucketSize } = params;
  if (bands * rows > width || signatures.length !== items * width) {
    throw new InvalidInputError(`banding needs ${items}×${width} signature words with bands·rows ≤ ${width}`);
  }
  if (maxBucketSize < 2) throw new InvalidInputError(`maxBucketSize must be at least 2, got ${maxBucketSize}`);
  const seen = new Set<number>();
  const left: number[] = [];
  const right: number[] = [];
  let cappedBuckets = 0;
  const add = (i: number, j: number): void => {
    const lo = i < j ? i : j;
    const hi = i < j ? j : i;
    const key = lo * items + hi;
    if (seen.has(key)) return;
    seen.add(key);
    left.push(lo);
    right.push(hi);
  };
  // Global lexicographic rank of every signature, computed the first time a bucket is capped.
  let rank: Int32Array | null = null;
  const rankOf = (): Int32Array => {
    if (rank) return rank;
    const order = Array.from({ length: items }, (_, i) => i).sort((i, j) => {
      for (let c = 0; c < width; c++) {
        const d = signatures[i * width + c] - signatures[j * width + c];
        if (d !== 0) return d;
      }
      return i - j;
    });
    rank = new Int32Array(items);
    order.forEach((item, r) => ((rank as Int32Array)[item] = r));
    return rank;
  };

  const bucketOf = new Int32Array(items);
  const members = new Int32Array(items);
  for (let t = 0; t < bands; t++) {
    const ids = new Map<number, number>();
    for (let i = 0; i < items; i++) {
      const start = i * width + t * rows;
      const h1 = murmur3Words32(signatures, start, rows, 2 * t);
      const h2 = murmur3Words32(signatures, start, rows, 2 * t + 1);
      const key = h1 * 2097152 + (h2 >>> 11); // 53-bit bucket key
      let id = ids.get(key);
      if (id === undefined) {
        id = ids.size;
        ids.set(key, id);
      }
      bucketOf[i] = id;
    }
    const buckets = ids.size;
    if (buckets === items) continue;
    // Counting sort of items by bucket: members of bucket k are members[offsets[k]..offsets[k+1]).
    const offsets = new Int32Array(buckets + 1);
    for (let i = 0; i < items; i++) offsets[bucketOf[i] + 1]++;
    for (let k = 0; k < buckets; k++) offsets[k + 1] += offsets[k];
    const cursor = offsets.slice(0, buckets);
    for (let i = 0; i < items; i++) members[cursor[bucketOf[i]]++] = i;
    for (let k = 0; k < buckets; k++) {
      const from = offsets[k];
      const size = offsets[k + 1] - from;
      if (size < 2) continue;
      if (size <= maxBucketSize) {
        for (let p = from; p < from + size; p++) for (let q = p + 1; q < from + size; q++) add(members[p], members[q]);
        continue;
      }
      cappedBuckets++;
      const r = rankOf();
      const order = Array.from(members.subarray(from, from + size)).sort((i, j) => r[i] - r[j]);
      for (let p = 0; p < size; p++) {
        for (let q = p + 1; q <= Math.min(size - 1, p + CAPPED_NEIGHBOURS); q++) add(order[p], order[q]);
      }
    }
  }
  return { left: Uint32Array.from(left), right: Uint32Array.from(right), count: left.length, cappedBuckets };
}
