/**
 * "Why is it near?" in concepts: the cosine of two files' unit concept vectors is a sum over the
 * index's k concept axes, cos = Σ_j a_j·b_j (latent semantic indexing, Deerwester et al. 1990),
 * so each axis's part is exact. The axes with the largest parts are the concepts the two files
 * share; each is named by the words that carry it in these two files: their terms ranked by the
 * term's loading on the axis (U_k), signed towards the side of the axis the files lie on, times
 * the term's global weight (so words found in every file, such as a language's function words,
 * rank low), words of both files first and no word naming two concepts. The parts of the other axes are summed, so the column adds up to the score.
 * Nearby's score blends the cosine with a word-match part (LsiIndex.nearby: (1 − μ)·cosine +
 * μ·BM25 of A's distinctive terms in B over the best other file's); the concept parts are
 * weighted by 1 − μ and the word-match part is reported apart, so the parts still add up to it.
 * Sections (sharedSectionConcepts): the same over two section vectors, named by the sections' own
 * terms; Nearby at a section ranks by the cosine alone, so there is no word-match part.
 */
import type { ExplainSide } from './explain.js';
import type { LsiIndex } from '../index/lsiIndex.js';

export interface SharedConcept {
  /** Concept axis (0-based). */
  readonly axis: number;
  /** Its part of the cosine. */
  readonly share: number;
  /** Index terms (stems) naming it, strongest first. */
  readonly terms: readonly string[];
}

export interface SharedConcepts {
  readonly concepts: readonly SharedConcept[];
  /** Sum of the other axes' parts. */
  readonly rest: number;
  /** Nearby's word-match part (μ·normalised BM25); 0 when the index ranks Nearby by concepts alone. */
  readonly wordMatch: number;
  /** The nearby score: concepts + rest + wordMatch. */
  readonly score: number;
}

export interface SharedConceptOptions {
  /** Concepts listed. @default 3 */
  readonly top: number;
  /** Words naming each concept. @default 3 */
  readonly words: number;
}

export const DEFAULT_SHARED_CONCEPT_OPTIONS: SharedConceptOptions = { top: 3, words: 3 };

export function sharedConcepts(index: LsiIndex, a: string, b: string, options: Partial<SharedConceptOptions> = {}): SharedConcepts {
  let mu = index.ranking.nearbyLexical;
  let wordMatch = 0;
  if (mu > 0) {
    // The word match's share as Nearby ranks with it (raised when TF-IDF is taken from the concept part).
    const { lexical, lexicalShare } = index.nearbyPlan(a);
    mu = lexicalShare;
    const slotB = index.slots().findIndex((slot) => slot?.meta.path === b);
    if (slotB >= 0) wordMatch = mu * lexical[slotB];
  }
  const side = (p: string): ExplainSide => ({ terms: index.termsOf(p), vector: index.vectorOf(p) });
  return conceptsOf(index, side(a), side(b), 1 - mu, wordMatch, options);
}

/** The concepts two sections share (their cosine, the score of Nearby at a section), named by their own terms. */
export function sharedSectionConcepts(
  index: LsiIndex,
  a: ExplainSide,
  b: ExplainSide,
  options: Partial<SharedConceptOptions> = {},
): SharedConcepts {
  return conceptsOf(index, a, b, 1, 0, options);
}

function conceptsOf(
  index: LsiIndex,
  a: ExplainSide,
  b: ExplainSide,
  weight: number,
  wordMatch: number,
  options: Partial<SharedConceptOptions>,
): SharedConcepts {
  const o = { ...DEFAULT_SHARED_CONCEPT_OPTIONS, ...options };
  const va = a.vector;
  const vb = b.vector;
  const k = index.k;
  const parts = Array.from({ length: k }, (_, j) => ({ axis: j, share: weight * va[j] * vb[j] }));
  const conceptScore = parts.reduce((s, p) => s + p.share, 0);
  const chosen = [...parts]
    .sort((x, y) => y.share - x.share || x.axis - y.axis)
    .slice(0, o.top)
    .filter((p) => p.share > 0);
  const model = index.model;
  const columns = (side: ExplainSide) => {
    const out = new Set<number>();
    for (const id of side.terms.termIds) {
      const c = id < model.columnOf.length ? model.columnOf[id] : -1;
      if (c >= 0) out.add(c);
    }
    return out;
  };
  const ca = columns(a);
  const cb = columns(b);
  const both = [...ca].filter((c) => cb.has(c));
  const either = [...new Set([...ca, ...cb])];
  const used = new Set<number>();
  const concepts = chosen.map((p) => {
    const sign = va[p.axis] >= 0 ? 1 : -1;
    const load = (c: number) => sign * model.termVectors[c * k + p.axis] * model.weights[c];
    const rank = (cs: number[]) => cs.filter((c) => load(c) > 0 && !used.has(c)).sort((x, y) => load(y) - load(x) || x - y);
    const picked = rank(both).slice(0, o.words);
    for (const c of rank(either)) if (picked.length < o.words && !picked.includes(c)) picked.push(c);
    for (const c of picked) used.add(c);
    return { axis: p.axis, share: p.share, terms: picked.map((c) => index.vocab.termOf(model.keptIds[c])) };
  });
  return { concepts, rest: conceptScore - concepts.reduce((s, c) => s + c.share, 0), wordMatch, score: conceptScore + wordMatch };
}
