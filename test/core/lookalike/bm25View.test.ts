/**
 * The BM25 second view (bm25View.ts) against the weights written out here from Robertson &
 * Zaragoza 2009 ("The probabilistic relevance framework: BM25 and beyond", eq. 3.15 for the
 * saturated tf with length normalisation, and the idf ln(1 + (N − n + 0.5)/(n + 0.5)) used by
 * Lucene and most BM25 implementations): a brute-force reference on strings, for a three-file
 * folder, compared with the view's cosines.
 */
import { describe, expect, it } from 'vitest';
import { bm25View, DEFAULT_BM25_PARAMS } from '../../../src/core/lookalike/bm25View.js';
import type { TermCountRow } from '../../../src/core/lookalike/termSpace.js';

const docs = [
  ['ferry', 'ferry', 'tide', 'berth'],
  ['ferry', 'tide', 'tide', 'tide', 'ramp', 'gust'],
  ['gust', 'wind', 'wind'],
];

function reference(k1: number, b: number): Map<string, number>[] {
  const n = docs.length;
  const df = new Map<string, number>();
  for (const d of docs) for (const t of new Set(d)) df.set(t, (df.get(t) ?? 0) + 1);
  const avg = docs.reduce((s, d) => s + d.length, 0) / n;
  return docs.map((d) => {
    const tf = new Map<string, number>();
    for (const t of d) tf.set(t, (tf.get(t) ?? 0) + 1);
    const w = new Map<string, number>();
    for (const [t, f] of tf) {
      const idf = Math.log(1 + (n - df.get(t)! + 0.5) / (df.get(t)! + 0.5));
      w.set(t, (idf * f * (k1 + 1)) / (f + k1 * (1 - b + (b * d.length) / avg)));
    }
    const norm = Math.sqrt([...w.values()].reduce((s, x) => s + x * x, 0));
    for (const [t, x] of w) w.set(t, x / norm);
    return w;
  });
}

describe('bm25View', () => {
  const vocab = [...new Set(docs.flat())].sort();
  const rows: TermCountRow[] = docs.map((d) => {
    const ids = [...new Set(d)].map((t) => vocab.indexOf(t)).sort((x, y) => x - y);
    return { termIds: Int32Array.from(ids), counts: Float64Array.from(ids, (i) => d.filter((t) => t === vocab[i]).length) };
  });
  const df = vocab.map((t) => docs.filter((d) => d.includes(t)).length);

  it('gives the cosine of the BM25-weighted rows (k1 1.2, b 0.75 by default)', () => {
    const ref = reference(DEFAULT_BM25_PARAMS.k1, DEFAULT_BM25_PARAMS.b);
    const view = bm25View(rows, df);
    for (let a = 0; a < 3; a++)
      for (let c = 0; c < 3; c++) {
        let dot = 0;
        for (const [t, w] of ref[a]) dot += w * (ref[c].get(t) ?? 0);
        expect(view.cosine(a, c)).toBeCloseTo(dot, 10);
      }
    expect(view.cosine(0, 0)).toBeCloseTo(1, 12);
    expect(view.cosine(0, 2)).toBe(0);
  });

  it('follows k1 and b, and ignores zero counts', () => {
    const ref = reference(2, 0);
    let dot = 0;
    for (const [t, w] of ref[0]) dot += w * (ref[1].get(t) ?? 0);
    expect(bm25View(rows, df, { k1: 2, b: 0 }).cosine(0, 1)).toBeCloseTo(dot, 10);
    const withZero = rows.map((r, i) =>
      i === 2 ? { termIds: Int32Array.from([...Array.from(r.termIds), 99]), counts: Float64Array.from([...Array.from(r.counts), 0]) } : r,
    );
    expect(bm25View(withZero, [...df, ...new Array(100 - df.length).fill(0)]).cosine(1, 2)).toBeCloseTo(
      bm25View(rows, df).cosine(1, 2),
      12,
    );
  });
});
