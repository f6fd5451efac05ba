/**
 * A second weighting of the look-alike finder's term counts, for checking that two views agree.
 *
 * Each file's row is its BM25 term weights (Robertson & Zaragoza 2009, "The probabilistic
 * relevance framework: BM25 and beyond"): idf ln(1 + (n − df + 0.5)/(df + 0.5)) times the
 * saturated term frequency tf (k1 + 1) / (tf + k1 (1 − b + b · len / avgLen)), with k1 = 1.2 and
 * b = 0.75 (their usual defaults), L2-normalised; two files compare by the cosine of their rows.
 * Against the finder's sublinear TF-IDF space (termSpace.ts) this weighting saturates repeated
 * terms and discounts long files, so a pair that is nearest in both is not an artefact of one
 * weighting. Rows are made on demand and kept: the rule asks for a few files only.
 */
import type { TermCountRow } from './termSpace.js';

export interface Bm25Params {
  /** Term-frequency saturation. @default 1.2 (Robertson & Zaragoza 2009) */
  readonly k1: number;
  /** Length normalisation. @default 0.75 (Robertson & Zaragoza 2009) */
  readonly b: number;
}

export const DEFAULT_BM25_PARAMS: Bm25Params = Object.freeze({ k1: 1.2, b: 0.75 });

export interface Bm25View {
  /** Cosine of files a and b under BM25 weights. */
  readonly cosine: (a: number, b: number) => number;
}

/**
 * rows: each file's raw term counts (ids ascending, zero or negative counts ignored); df: files
 * holding each term id, over the same rows.
 */
export function bm25View(rows: readonly TermCountRow[], df: ArrayLike<number>, params: Bm25Params = DEFAULT_BM25_PARAMS): Bm25View {
  const n = rows.length;
  const lengths = new Float64Array(n);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const { counts } = rows[i];
    let s = 0;
    for (let p = 0; p < counts.length; p++) if (counts[p] > 0) s += counts[p];
    lengths[i] = s;
    total += s;
  }
  const avg = n > 0 && total > 0 ? total / n : 1;
  const cache = new Map<number, { ids: Int32Array; w: Float64Array }>();
  const row = (i: number) => {
    let r = cache.get(i);
    if (r) return r;
    const { termIds, counts } = rows[i];
    const ids: number[] = [];
    const w: number[] = [];
    let norm = 0;
    const lengthNorm = params.k1 * (1 - params.b + (params.b * lengths[i]) / avg);
    for (let p = 0; p < termIds.length; p++) {
      const tf = counts[p];
      if (!(tf > 0)) continue;
      const d = df[termIds[p]];
      const x = Math.log(1 + (n - d + 0.5) / (d + 0.5)) * ((tf * (params.k1 + 1)) / (tf + lengthNorm));
      ids.push(termIds[p]);
      w.push(x);
      norm += x * x;
    }
    norm = Math.sqrt(norm) || 1;
    r = { ids: Int32Array.from(ids), w: Float64Array.from(w, (x) => x / norm) };
    cache.set(i, r);
    return r;
  };
  return {
    cosine(a, b) {
      const x = row(a);
      const y = row(b);
      let p = 0;
      let q = 0;
      let dot = 0;
      while (p < x.ids.length && q < y.ids.length) {
        if (x.ids[p] === y.ids[q]) dot += x.w[p++] * y.w[q++];
        else if (x.ids[p] < y.ids[q]) p++;
        else q++;
      }
      return dot;
    },
  };
}
