/**
 * Reference for the name field (src/core/index/search/nameField.ts), written out from the formula:
 * BM25 (Robertson & Zaragoza 2009, eq. 3.15, the non-negative idf ln(1 + (N − df + 0.5)/(df + 0.5));
 * BM25L's c + δ, Lv & Zhai 2011) over the fields alone, df, N (fields with a word) and the average
 * length counted afresh from the fields present; k1 = 1.2, b = 0.75 (bm25.ts's defaults).
 */
import type { DocTerms } from '../../src/core/counting/termCounts.js';
import { DEFAULT_BM25_OPTIONS } from '../../src/core/index/search/bm25.js';

/** A term's count in a field (a plain scan, independent of the code under test). */
function tfIn(d: DocTerms, t: number): number {
  const i = d.termIds.indexOf(t);
  return i < 0 ? 0 : d.counts[i];
}

/** Each field's score for the query (0 for a missing or empty field). */
export function bm25OverFields(fields: readonly (DocTerms | null)[], query: DocTerms, delta = 0): number[] {
  const { k1, b } = DEFAULT_BM25_OPTIONS;
  const present = fields.filter((d): d is DocTerms => d !== null && d.length > 0);
  const n = present.length;
  const avg = present.reduce((s, d) => s + d.length, 0) / Math.max(n, 1);
  return fields.map((d) => {
    if (!d || d.length === 0) return 0;
    let score = 0;
    query.termIds.forEach((t, i) => {
      const tf = tfIn(d, t);
      if (tf === 0) return;
      const df = present.filter((e) => tfIn(e, t) > 0).length;
      const c = tf / (1 - b + (b * d.length) / avg) + delta;
      score += (query.counts[i] * Math.log(1 + (n - df + 0.5) / (df + 0.5)) * (k1 + 1) * c) / (k1 + c);
    });
    return score;
  });
}
