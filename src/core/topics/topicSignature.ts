/**
 * How a topic is described (topics.ts): term contrast and the "picks first" ranking.
 *
 * - termContrast: for each topic T and term t, mean weight of t over T's files minus its mean
 *   weight over the other files (weights are the unit log-entropy or tf-idf rows of the index).
 *   A difference of means is the simplest distinctiveness score (our choice; it favours terms
 *   frequent inside and rare outside, as class-based tf-idf variants do). With one topic the
 *   outside mean is 0.
 * - rankWithPicks: from a ranked candidate list, keep the top 3·count, move CUR's picks to the
 *   front (keeping their order), and return count of them.
 */
import type { CsrMatrix } from '../matrix/sparse.js';

/** topics × cols row-major contrast; rows with topic −1 (unplaced) count as outside every topic. */
export function termContrast(a: CsrMatrix, topicOfRow: Int32Array, topics: number): Float64Array {
  const m = a.cols;
  const sums = new Float64Array(topics * m);
  const total = new Float64Array(m);
  const size = new Float64Array(topics);
  for (let i = 0; i < a.rows; i++) {
    const t = topicOfRow[i];
    if (t >= 0) size[t]++;
    for (let p = a.indptr[i]; p < a.indptr[i + 1]; p++) {
      total[a.indices[p]] += a.values[p];
      if (t >= 0) sums[t * m + a.indices[p]] += a.values[p];
    }
  }
  const out = new Float64Array(topics * m);
  for (let t = 0; t < topics; t++) {
    const inside = size[t];
    const outside = a.rows - inside;
    for (let c = 0; c < m; c++) {
      const s = sums[t * m + c];
      out[t * m + c] = (inside > 0 ? s / inside : 0) - (outside > 0 ? (total[c] - s) / outside : 0);
    }
  }
  return out;
}

export function rankWithPicks<T>(ranked: readonly T[], picked: (x: T) => boolean, count: number): T[] {
  const pool = ranked.slice(0, 3 * count);
  const first = pool.filter(picked);
  const rest = pool.filter((x) => !picked(x));
  return [...first, ...rest].slice(0, count);
}
