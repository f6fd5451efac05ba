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
 * Search score: (1 − λ)·cos(q′, d̂) + λ·BM25/max BM25 (lsiIndex.ts); BM25 is a sum over query terms
 * (Bm25Scorer.termScore), so a term's share is (1 − λ)·(concept share) + λ·(its BM25)/max. With
 * feedback (index/search/fusion.ts) the query vector is q′ = s·x/‖x‖ + f: the words keep their
 * shares scaled by s, and (1 − λ)·f·d̂ is reported apart as the feedback part. A search's w_t
 * carries the word's focus weight (index/search/termFocus.ts), as the fold does.
 * The word match may hold the name field (index/search/nameField.ts): BM25 over the words of the
 * files' paths is a sum over query terms as well, so each term's name part joins its lexical share.
 * Nearby score: (1 − μ)·cos + μ·BM25 of the first file's distinctive terms / max (and the name
 * field's two parts, the second over the first file's name words), split the same way.
 * Sections (core/sections) are explained by the same sums with the section's own vector and terms
 * in place of the file's: a section search score is (1 − λ)·cos(q′, ŝ) + λ·BM25(file)/max
 * (sectionSearch.ts), so the concept shares use ŝ and the word-match shares stay the file's; a
 * section's Nearby score is the cosine of two section vectors, split over both sections' terms.
 */
import { NoKnownTermsError } from '../errors.js';
import type { LsiIndex, SearchOptions } from '../index/lsiIndex.js';
import { countOfTerm, type DocTerms } from '../counting/termCounts.js';
import { weightDocument } from '../weighting/termWeighting.js';

/** One side of a similarity: its raw term counts and the unit concept vector scored with. */
export interface ExplainSide {
  readonly terms: DocTerms;
  readonly vector: Float32Array;
}

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
  /** Σ of the shares plus feedback: the score explained. */
  readonly score: number;
  /**
   * The part of the score that comes from feedback rather than from the words (the query moved
   * towards the first pass's best files and the files marked like/unlike; fusion.ts); 0 for pairs.
   */
  readonly feedback: number;
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
  /** The best name-field score of the query (nameField.ts; 0 when none or off). */
  private readonly _namesMax: number;
  /** The name field's query-term weights (coverage, nameField.ts) and their sum. */
  private _namesWeight: ((i: number) => number) | null = null;
  private _namesTotal = 0;
  private readonly _slotOf = new Map<string, number>();
  /** The final query vector minus `scale`·(the text's own unit vector): what feedback added. */
  private readonly _moved: Float64Array | null = null;
  private readonly _scale: number = 1;

  /**
   * blend = false explains the concept cosine of the text alone (no lexical part, no feedback).
   * `feedback` passes the like/unlike files of the search being explained.
   */
  constructor(
    private readonly _index: LsiIndex,
    text: string,
    blend = true,
    feedback: Pick<SearchOptions, 'like' | 'unlike'> = {},
  ) {
    const plan = blend ? _index.searchPlan(text, feedback) : null;
    const q = plan ? plan.terms : _index.queryTerms(text);
    if (q.termIds.length === 0 && !plan) throw new NoKnownTermsError(text);
    const lexQuery = plan ? plan.lexicalQuery : q;
    this._query = lexQuery;
    const side = conceptRows(_index, q, plan?.focus ?? null);
    this._lambda = plan ? plan.lambda : 0;
    this._conceptWeight = (plan ? plan.known : side.known > 0) ? 1 - this._lambda : 0;
    if (plan) {
      this._scale = plan.scale;
      const moved = Float64Array.from(plan.vector);
      for (const { r } of side.rows) if (r) for (let c = 0; c < moved.length; c++) moved[c] -= plan.scale * r[c];
      this._moved = moved;
    }
    // One row per lexical-query term (the text's terms have their concept rows, others none).
    const rowOf = new Map(side.rows.map(({ id, r }) => [id, r]));
    this._rows = Array.from(lexQuery.termIds, (id) => ({ id, r: rowOf.get(id) ?? null }));
    let max = 0;
    let namesMax = 0;
    if (this._lambda > 0) {
      const all = new Float64Array(_index.slots().length);
      _index.bm25().scoreInto(lexQuery, all, _index.ranking.lengthNorm);
      for (const v of all) max = Math.max(max, v);
      if (_index.ranking.nameWeight > 0) {
        const weight = _index.queryWeight(lexQuery);
        namesMax = _index.names().searchScoresInto(lexQuery, weight, 0, all);
        this._namesWeight = weight;
        for (let i = 0; i < lexQuery.termIds.length; i++) this._namesTotal += weight(i);
      }
    }
    this._maxBm25 = max;
    this._namesMax = namesMax;
    _index.slots().forEach((s, i) => s && this._slotOf.set(s.meta.path, i));
  }

  explain(path: string): Explanation {
    return this.explainAgainst(path, this._index.vectorOf(path), null);
  }

  /**
   * A section of `path` as a search result (sectionSearch.ts): the concept shares against the
   * section's vector, a term in both when the section has it; the word-match shares are the file's,
   * as the section's score takes the file's BM25.
   */
  explainSection(path: string, section: ExplainSide): Explanation {
    return this.explainAgainst(path, section.vector, section.terms);
  }

  private explainAgainst(path: string, d: Float32Array, own: DocTerms | null): Explanation {
    const doc = this._index.termsOf(path);
    const slot = this._slotOf.get(path)!;
    const bm25 = this._index.bm25();
    const names = this._index.names();
    const vocab = this._index.vocab;
    const out: TermShare[] = [];
    this._rows.forEach(({ id, r }, i) => {
      const concept = r ? this._conceptWeight * this._scale * dotF(r, d) : 0;
      const tf = countOfTerm(doc, id);
      let lexical =
        this._lambda > 0 && this._maxBm25 > 0
          ? (this._lambda * bm25.termScore(id, this._query.counts[i], tf, slot, this._index.ranking.lengthNorm)) / this._maxBm25
          : 0;
      if (this._lambda > 0 && this._namesMax > 0 && names.declares(slot)) {
        const { nameWeight, nameCoverage } = this._index.ranking;
        const cover =
          nameCoverage > 0 ? Math.pow(names.coverage(this._query, this._namesWeight!, slot, this._namesTotal), nameCoverage) : 1;
        lexical += (this._lambda * nameWeight * cover * names.termScore(id, this._query.counts[i], slot)) / this._namesMax;
      }
      const inBoth = (own ? countOfTerm(own, id) : tf) > 0;
      if (concept !== 0 || lexical !== 0) out.push({ term: vocab.termOf(id), share: concept + lexical, concept, lexical, inBoth });
    });
    return finish(out, this._moved ? this._conceptWeight * dotF(this._moved, d) : 0);
  }
}

/**
 * Why two indexed files are near: shares summing to the nearby score, (1 − μ)·cosine of their
 * concept vectors (each term of either file's symmetric share) + μ·the word match: (1 − ν)·BM25 of
 * A's distinctive terms in B / the best other file's + ν·TF-IDF of A's top terms in B / the best
 * other file's (LsiIndex.nearbyPlan gives μ and ν as it ranks with them). fused = false: the
 * cosine alone (symmetric).
 */
export function explainPair(index: LsiIndex, pathA: string, pathB: string, fused = true): Explanation {
  const a = index.termsOf(pathA);
  const b = index.termsOf(pathB);
  const va = index.vectorOf(pathA);
  const vb = index.vectorOf(pathB);
  // μ: the word match's share, raised by the TF-IDF part when that is taken from the concept part (nearbyPlan).
  const plan = fused && index.ranking.nearbyLexical > 0 ? index.nearbyPlan(pathA) : null;
  const mu = plan ? plan.lexicalShare : 0;
  const merged = new Map<number, { concept: number; lexical: number }>();
  const entry = (id: number): { concept: number; lexical: number } => {
    let e = merged.get(id);
    if (!e) merged.set(id, (e = { concept: 0, lexical: 0 }));
    return e;
  };
  for (const [terms, other] of [
    [a, vb],
    [b, va],
  ] as const) {
    for (const { id, r } of conceptRows(index, terms).rows) if (r) entry(id).concept += (1 - mu) * 0.5 * dotF(r, other);
  }
  if (plan && mu > 0) {
    const { lexicalQuery, max, tfidfShare: nu, tfidfMax, tfidfQuery } = plan;
    const slotB = index.slots().findIndex((s) => s?.meta.path === pathB);
    const bm25 = index.bm25();
    if (max > 0)
      lexicalQuery.termIds.forEach((id, i) => {
        const tf = countOfTerm(b, id);
        if (tf > 0)
          entry(id).lexical +=
            (mu *
              (1 - nu) *
              bm25.termScore(id, lexicalQuery.counts[i], tf, slotB, index.ranking.nearbyLengthNorm, index.ranking.nearbyDelta)) /
            max;
      });
    // The name field's two parts (LsiIndex.nearbyPlan): A's top words in B's name, A's name words in B's text.
    if (plan.names > 0) {
      const names = index.names();
      const { nearbyLengthNorm, nearbyDelta: delta } = index.ranking;
      if (plan.namesMax > 0)
        lexicalQuery.termIds.forEach((id, i) => {
          const part = names.termScore(id, lexicalQuery.counts[i], slotB, delta);
          if (part > 0) entry(id).lexical += (mu * plan.names * part) / plan.namesMax;
        });
      const own = names.namesOf(index.slots().findIndex((s) => s?.meta.path === pathA));
      if (own && plan.ownNameMax > 0)
        own.termIds.forEach((id, i) => {
          const tf = countOfTerm(b, id);
          if (tf > 0)
            entry(id).lexical +=
              (mu * plan.names * bm25.termScore(id, own.counts[i], tf, slotB, nearbyLengthNorm, delta)) / plan.ownNameMax;
        });
    }
    // The TF-IDF part of the word match (LsiIndex.nearbyPlan): every term of its query that B holds.
    if (nu > 0 && tfidfMax > 0)
      tfidfQuery.termIds.forEach((id, i) => {
        const tf = countOfTerm(b, id);
        if (tf > 0) entry(id).lexical += (mu * nu * index.tfidfTermScore(id, tfidfQuery.counts[i], tf, slotB)) / tfidfMax;
      });
  }
  const out: TermShare[] = [];
  for (const [id, { concept, lexical }] of merged) {
    const share = concept + lexical;
    if (share !== 0)
      out.push({ term: index.vocab.termOf(id), share, concept, lexical, inBoth: countOfTerm(a, id) > 0 && countOfTerm(b, id) > 0 });
  }
  return finish(out);
}

/**
 * Why two sides (sections, or a section and a file) are near: the cosine of their concept
 * vectors, each term of either side getting its symmetric share (as explainPair with fused =
 * false), inBoth when both sides have the term. Nearby at a section ranks by this cosine alone.
 */
export function explainSides(index: LsiIndex, a: ExplainSide, b: ExplainSide): Explanation {
  const merged = new Map<number, number>();
  for (const [terms, other] of [
    [a.terms, b.vector],
    [b.terms, a.vector],
  ] as const) {
    for (const { id, r } of conceptRows(index, terms).rows) if (r) merged.set(id, (merged.get(id) ?? 0) + 0.5 * dotF(r, other));
  }
  const out: TermShare[] = [];
  for (const [id, share] of merged) {
    if (share !== 0)
      out.push({
        term: index.vocab.termOf(id),
        share,
        concept: share,
        lexical: 0,
        inBoth: countOfTerm(a.terms, id) > 0 && countOfTerm(b.terms, id) > 0,
      });
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
function conceptRows(
  index: LsiIndex,
  terms: DocTerms,
  focus: ReadonlyMap<number, number> | null = null,
): { rows: { id: number; r: Float64Array | null }[]; known: number } {
  const model = index.model;
  const k = model.k;
  const w = weightDocument(terms, model.columnOf, model.weights, model.scheme);
  const weightOf = new Map<number, number>();
  for (let i = 0; i < w.columns.length; i++) weightOf.set(w.columns[i], w.values[i] * (focus?.get(model.keptIds[w.columns[i]]) ?? 1));
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

function finish(terms: TermShare[], feedback = 0): Explanation {
  terms.sort((x, y) => Math.abs(y.share) - Math.abs(x.share) || (x.term < y.term ? -1 : x.term > y.term ? 1 : 0));
  let score = feedback;
  for (const t of terms) score += t.share;
  return { score, terms, feedback };
}
