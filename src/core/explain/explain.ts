/**
 * "Why do these match?": exact per-term decompositions of the scores the index reports.
 *
 * Concept part. A text's concept vector is x = Σ_t w_t·S·u_t over its model terms t, where w is
 * its weighted unit term vector (weightDocument), u_t the row of U_k for t and S = Σ^{α−1} the
 * axis scale (conceptModel.ts); the unit vector is x/‖x‖. Its cosine with a unit file vector d̂ is
 * therefore a sum over the text's terms:
 *     cos = Σ_t  w_t·(S·u_t · d̂)/‖x‖,
 * each term's share being exact (no approximation; only rounding of the stored Float32 vectors).
 * A share can be negative (a term pulling the other way), and a term absent from the file can
 * contribute (through the terms it co-occurs with): that is what the concept space adds.
 * Two files: cos(â, b̂) decomposes over a's terms and, equally, over b's; the symmetric share is
 * the mean of the two, so each term of either file gets a share and they still sum to the cosine.
 * Search score: (1 − λ)·cos + λ·BM25/max BM25 (lsiIndex.ts); BM25 is a sum over query terms
 * (Bm25Scorer.termScore), so a term's share is (1 − λ)·(concept share) + λ·(its BM25)/max.
 */
import { NoKnownTermsError } from '../errors.js';
import type { LsiIndex } from '../index/lsiIndex.js';
import type { DocTerms } from '../counting/termCounts.js';
import { weightDocument } from '../weighting/termWeighting.js';

export interface TermShare {
  /** The index term (a stem when stemming is on). */
  readonly term: string;
  /** This term's part of the score (concept + lexical). */
  readonly share: number;
  /** Part from the concept-space cosine (already multiplied by its blend weight). */
  readonly concept: number;
  /** Part from BM25 (already multiplied by its blend weight and divided by the best BM25). */
  readonly lexical: number;
  /** True when the term occurs in both sides (query and file, or both files). */
  readonly inBoth: boolean;
}

export interface Explanation {
  /** Σ of the shares: the score explained. */
  readonly score: number;
  /** Every contributing term, largest |share| first (ties: term order). */
  readonly terms: readonly TermShare[];
}

/** Explains search results of one query; build once per query, then call explain per file. */
export class QueryExplainer {
  private readonly _query: DocTerms;
  private readonly _rows: { id: number; r: Float64Array | null }[];
  private readonly _conceptWeight: number;
  private readonly _lambda: number;
  private readonly _maxBm25: number;
  private readonly _slotOf = new Map<string, number>();

  /** blend = false explains the concept cosine alone (as nearby-style scores). */
  constructor(private readonly _index: LsiIndex, text: string, blend = true) {
    const q = _index.queryTerms(text);
    if (q.termIds.length === 0) throw new NoKnownTermsError(text);
    this._query = q;
    const side = conceptRows(_index, q);
    this._rows = side.rows;
    this._lambda = blend ? _index.settings.lexicalBlend : 0;
    this._conceptWeight = side.known > 0 ? 1 - this._lambda : 0;
    let max = 0;
    if (this._lambda > 0) {
      const all = new Float64Array(_index.slots().length);
      _index.bm25().scoreInto(q, all);
      for (const v of all) max = Math.max(max, v);
    }
    this._maxBm25 = max;
    _index.slots().forEach((s, i) => s && this._slotOf.set(s.meta.path, i));
  }

  explain(path: string): Explanation {
    const d = this._index.vectorOf(path);
    const doc = this._index.termsOf(path);
    const slot = this._slotOf.get(path)!;
    const bm25 = this._index.bm25();
    const vocab = this._index.vocab;
    const out: TermShare[] = [];
    this._rows.forEach(({ id, r }, i) => {
      const concept = r ? this._conceptWeight * dotF(r, d) : 0;
      const tf = countOf(doc, id);
      const lexical = this._lambda > 0 && this._maxBm25 > 0 ? (this._lambda * bm25.termScore(id, this._query.counts[i], tf, slot)) / this._maxBm25 : 0;
      if (concept !== 0 || lexical !== 0) out.push({ term: vocab.termOf(id), share: concept + lexical, concept, lexical, inBoth: tf > 0 });
    });
    return finish(out);
  }
}

/** Why two indexed files are near in concept space: shares summing to the cosine of their vectors. */
export function explainPair(index: LsiIndex, pathA: string, pathB: string): Explanation {
  const a = index.termsOf(pathA);
  const b = index.termsOf(pathB);
  const va = index.vectorOf(pathA);
  const vb = index.vectorOf(pathB);
  const merged = new Map<number, number>();
  for (const [terms, other] of [[a, vb], [b, va]] as const) {
    for (const { id, r } of conceptRows(index, terms).rows) if (r) merged.set(id, (merged.get(id) ?? 0) + 0.5 * dotF(r, other));
  }
  const out: TermShare[] = [];
  for (const [id, share] of merged) {
    if (share !== 0) out.push({ term: index.vocab.termOf(id), share, concept: share, lexical: 0, inBoth: countOf(a, id) > 0 && countOf(b, id) > 0 });
  }
  return finish(out);
}

/** The largest shares, and the rest summed, for display. */
export function topShares(e: Explanation, count: number): { top: TermShare[]; rest: number; restTerms: number } {
  const top = e.terms.slice(0, count);
  let rest = 0;
  for (let i = count; i < e.terms.length; i++) rest += e.terms[i].share;
  return { top, rest, restTerms: Math.max(0, e.terms.length - count) };
}

/**
 * For each term of a text (vocabulary ids ascending): r_t = w_t·S·u_t/‖x‖ (null for terms outside
 * the model), so that r_t·d̂ is the term's share of the cosine with any unit file vector d̂.
 */
function conceptRows(index: LsiIndex, terms: DocTerms): { rows: { id: number; r: Float64Array | null }[]; known: number } {
  const model = index.model;
  const k = model.k;
  const w = weightDocument(terms, model.columnOf, model.weights, model.scheme);
  const weightOf = new Map<number, number>();
  for (let i = 0; i < w.columns.length; i++) weightOf.set(w.columns[i], w.values[i]);
  const x = new Float64Array(k);
  const rows: { id: number; r: Float64Array | null }[] = [];
  for (const id of terms.termIds) {
    const col = id < model.columnOf.length ? model.columnOf[id] : -1;
    const wt = col >= 0 ? weightOf.get(col) : undefined;
    if (wt === undefined) {
      rows.push({ id, r: null });
      continue;
    }
    const r = new Float64Array(k);
    for (let c = 0; c < k; c++) {
      r[c] = wt * model.axisScale[c] * model.termVectors[col * k + c];
      x[c] += r[c];
    }
    rows.push({ id, r });
  }
  let ss = 0;
  for (let c = 0; c < k; c++) ss += x[c] * x[c];
  const norm = Math.sqrt(ss);
  for (const row of rows) {
    if (!row.r) continue;
    if (norm > 0) for (let c = 0; c < k; c++) row.r[c] /= norm;
    else row.r = null;
  }
  return { rows, known: w.columns.length };
}

function dotF(r: Float64Array, d: Float32Array): number {
  let s = 0;
  for (let c = 0; c < r.length; c++) s += r[c] * d[c];
  return s;
}

/** Count of a vocabulary id in a document (binary search; ids are ascending). */
function countOf(doc: DocTerms, id: number): number {
  let lo = 0;
  let hi = doc.termIds.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const v = doc.termIds[mid];
    if (v === id) return doc.counts[mid];
    if (v < id) lo = mid + 1;
    else hi = mid - 1;
  }
  return 0;
}

function finish(terms: TermShare[]): Explanation {
  terms.sort((x, y) => Math.abs(y.share) - Math.abs(x.share) || (x.term < y.term ? -1 : x.term > y.term ? 1 : 0));
  let score = 0;
  for (const t of terms) score += t.share;
  return { score, terms };
}
