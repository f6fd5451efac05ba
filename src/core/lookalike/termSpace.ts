/**
 * The full weighted term space of the look-alike finder and each file's nearest neighbours in it.
 *
 * Weights: sublinear tf (1 + ln tf) times smoothed idf ln((1 + n)/(1 + df)) + 1, each row L2-
 * normalised (Salton & Buckley 1988; as scikit-learn's TfidfVectorizer(sublinear_tf=True)).
 * Terms: the index tokenizer (text/tokenize.ts: stop words dropped, Porter stems).
 *
 * Neighbours: for each file, candidates are gathered through an inverted index over the terms that
 * occur in at most maxDf files (frequent terms would make this step quadratic; they still count in
 * every cosine), then the best `candidates` of them are scored by their exact cosine over all terms
 * and the top `k` kept. A pair that shares only frequent terms can be missed; it has a low cosine.
 */
import { tokenize } from '../text/tokenize.js';

export interface TermSpace {
  readonly n: number;
  /** CSR rows: row i holds terms[rowStart[i] .. rowStart[i+1]) ascending, with weights. */
  readonly rowStart: Int32Array;
  readonly terms: Int32Array;
  readonly weights: Float32Array;
  /** Files holding each term. */
  readonly df: Int32Array;
}

/** Raw term counts of one file: term ids ascending (any id space), counts aligned. */
export interface TermCountRow {
  readonly termIds: ArrayLike<number>;
  readonly counts: ArrayLike<number>;
}

/** Texts → L2-normalised sublinear TF-IDF rows (the texts are tokenized here). */
export function buildTermSpace(texts: readonly string[], idfPower = 1): TermSpace {
  return termSpaceFromCounts(termCountsOf(texts), idfPower);
}

/** Texts → raw term counts, one row per text (ids in order of first appearance across the texts). */
export function termCountsOf(texts: readonly string[]): TermCountRow[] {
  const ids = new Map<string, number>();
  const rows: TermCountRow[] = [];
  for (const text of texts) {
    const counts = new Map<number, number>();
    for (const tok of tokenize(text)) {
      let id = ids.get(tok);
      if (id === undefined) {
        id = ids.size;
        ids.set(tok, id);
      }
      counts.set(id, (counts.get(id) ?? 0) + 1);
    }
    const termIds = Int32Array.from(counts.keys()).sort();
    rows.push({ termIds, counts: Float64Array.from(termIds, (t) => counts.get(t) as number) });
  }
  return rows;
}

/**
 * Term counts already made (an index's stored raw counts) → L2-normalised sublinear TF-IDF rows.
 * Ids must ascend within a row; zero or negative counts are left out.
 */
export function termSpaceFromCounts(rows: readonly TermCountRow[], idfPower = 1): TermSpace {
  const n = rows.length;
  let maxId = -1;
  const rowStart = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) {
    const { termIds, counts } = rows[i];
    let kept = 0;
    for (let p = 0; p < termIds.length; p++) {
      if (counts[p] > 0) {
        kept++;
        if (termIds[p] > maxId) maxId = termIds[p];
      }
    }
    rowStart[i + 1] = rowStart[i] + kept;
  }
  const df = new Int32Array(maxId + 1);
  const terms = new Int32Array(rowStart[n]);
  const raw = new Float64Array(rowStart[n]);
  for (let i = 0; i < n; i++) {
    const { termIds, counts } = rows[i];
    let q = rowStart[i];
    for (let p = 0; p < termIds.length; p++) {
      if (!(counts[p] > 0)) continue;
      terms[q] = termIds[p];
      raw[q++] = counts[p];
      df[termIds[p]]++;
    }
  }
  const weights = new Float32Array(rowStart[n]);
  for (let i = 0; i < n; i++) {
    let norm = 0;
    for (let p = rowStart[i]; p < rowStart[i + 1]; p++) {
      raw[p] = (1 + Math.log(raw[p])) * (Math.log((1 + n) / (1 + df[terms[p]])) + 1) ** idfPower;
      norm += raw[p] * raw[p];
    }
    norm = Math.sqrt(norm) || 1;
    for (let p = rowStart[i]; p < rowStart[i + 1]; p++) weights[p] = raw[p] / norm;
  }
  return { n, rowStart, terms, weights, df };
}

/** Exact cosine of two rows (merge of the sorted term lists). */
export function rowCosine(s: TermSpace, a: number, b: number): number {
  let p = s.rowStart[a];
  const pe = s.rowStart[a + 1];
  let q = s.rowStart[b];
  const qe = s.rowStart[b + 1];
  let dot = 0;
  while (p < pe && q < qe) {
    const x = s.terms[p];
    const y = s.terms[q];
    if (x === y) {
      dot += s.weights[p++] * s.weights[q++];
    } else if (x < y) p++;
    else q++;
  }
  return dot;
}

export interface NeighbourParams {
  /** Neighbours kept per file. */
  readonly k: number;
  /** Candidates per file rescored by exact cosine. */
  readonly candidates: number;
  /** Terms in more than this many files are left out of candidate gathering. */
  readonly maxDf: number;
}

/** Each listed row's top-k neighbours among the listed rows: n×k row indices (-1 = none) and cosines. */
export interface Neighbours {
  readonly k: number;
  readonly index: Int32Array;
  readonly cosine: Float32Array;
}

export function termNeighbours(s: TermSpace, params: NeighbourParams): Neighbours {
  const { n } = s;
  const { k, candidates, maxDf } = params;
  // Inverted index over the gathering terms.
  const postStart = new Int32Array(s.df.length + 1);
  for (let t = 0; t < s.df.length; t++) postStart[t + 1] = postStart[t] + (s.df[t] <= maxDf ? s.df[t] : 0);
  const postDoc = new Int32Array(postStart[s.df.length]);
  const postW = new Float32Array(postStart[s.df.length]);
  const fill = postStart.slice(0, s.df.length);
  for (let i = 0; i < n; i++) {
    for (let p = s.rowStart[i]; p < s.rowStart[i + 1]; p++) {
      const t = s.terms[p];
      if (s.df[t] > maxDf) continue;
      postDoc[fill[t]] = i;
      postW[fill[t]++] = s.weights[p];
    }
  }
  const index = new Int32Array(n * k).fill(-1);
  const cosine = new Float32Array(n * k);
  const acc = new Float64Array(n);
  const touched = new Int32Array(n);
  const heap = new Int32Array(candidates);
  for (let i = 0; i < n; i++) {
    let nt = 0;
    for (let p = s.rowStart[i]; p < s.rowStart[i + 1]; p++) {
      const t = s.terms[p];
      if (s.df[t] > maxDf) continue;
      const w = s.weights[p];
      for (let q = postStart[t]; q < postStart[t + 1]; q++) {
        const d = postDoc[q];
        if (d === i) continue;
        if (acc[d] === 0) touched[nt++] = d;
        acc[d] += w * postW[q];
      }
    }
    const cand = topCandidates(touched, nt, acc, candidates, heap);
    for (let c = 0; c < nt; c++) acc[touched[c]] = 0;
    const scored = cand.map((d) => ({ d, c: rowCosine(s, i, d) }));
    scored.sort((x, y) => y.c - x.c || x.d - y.d);
    for (let r = 0; r < Math.min(k, scored.length); r++) {
      index[i * k + r] = scored[r].d;
      cosine[i * k + r] = scored[r].c;
    }
  }
  return { k, index, cosine };
}

/**
 * The `size` touched rows with the highest acc (ties: lower row first), as a full sort would give
 * them, kept in a bounded min-heap: O(nt log size) instead of sorting all nt rows.
 */
function topCandidates(touched: Int32Array, nt: number, acc: Float64Array, size: number, heap: Int32Array): number[] {
  // worse(a, b): a ranks below b.
  const worse = (a: number, b: number): boolean => acc[a] < acc[b] || (acc[a] === acc[b] && a > b);
  let h = 0;
  const down = (from: number): void => {
    let at = from;
    for (;;) {
      const l = 2 * at + 1;
      if (l >= h) return;
      const c = l + 1 < h && worse(heap[l + 1], heap[l]) ? l + 1 : l;
      if (!worse(heap[c], heap[at])) return;
      const t = heap[c];
      heap[c] = heap[at];
      heap[at] = t;
      at = c;
    }
  };
  for (let t = 0; t < nt; t++) {
    const d = touched[t];
    if (h < size) {
      let at = h++;
      heap[at] = d;
      while (at > 0) {
        const up = (at - 1) >> 1;
        if (!worse(heap[at], heap[up])) break;
        const x = heap[up];
        heap[up] = heap[at];
        heap[at] = x;
        at = up;
      }
    } else if (size > 0 && worse(heap[0], d)) {
      heap[0] = d;
      down(0);
    }
  }
  return Array.from(heap.subarray(0, h));
}
