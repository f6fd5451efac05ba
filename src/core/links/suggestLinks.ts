/**
 * Suggested links: for a note, the notes nearest in meaning (ranked as Nearby ranks them: concept
 * cosine blended with the BM25 of the note's distinctive words, LsiIndex.nearby, but with classic
 * BM25 where Nearby takes BM25L: LINKS_WORD_MATCH_DELTA) that it does not
 * link to and that do not link to it (linkGraph.ts), each with its similarity and the words behind
 * it (core/explain: each term's exact share of the concept cosine). Only notes whose similarity
 * reaches `minSimilarity` are suggested, so a note with nothing close enough gets none.
 *
 * Similarity = cos(â, b̂) · ‖U_kᵀa‖ · ‖U_kᵀb‖ for the unit weighted term vectors a, b: the concept
 * cosine, discounted by how much of each note the concept space holds (the fold-in residual,
 * Berry, Dumais & O'Brien 1995). Not Nearby's blended score, whose word-match part is divided by
 * the best other note's (the first neighbour always gets it whole), and not the bare concept
 * cosine, which is high for a text the space barely holds: in the evaluation, abstracts on
 * aeronautics (Cranfield collection) added to the Django manual had bare cosines up to 0.45 with
 * Django pages and discounted similarities below 0.15.
 *
 * Defaults, and where they come from (test/core/links/suggestLinks.eval.test.ts: a fifth of the
 * links of a Debian documentation tree hidden, suggestions scored on finding them):
 * - top 5: the evaluation's cut-off (a hidden link counts as found in the top 5 of either end).
 * - minSimilarity 0.24: the similarity with the best F1 (hidden links, cut with their visible
 *   words, among the top-5 suggestions) is 0.220 on python-django-doc (mean of three splits),
 *   0.199 on cmake-doc and 0.289 on sphinx-doc (mean of three splits); each tree's threshold
 *   chosen on the other two (their mean) beats no threshold on it; 0.24 is the mean of the three
 *   fits, rounded.
 */
import { InvalidInputError } from '../errors.js';
import { explainPair, topShares, type Explanation, type TermShare } from '../explain/explain.js';
import type { LsiIndex } from '../index/lsiIndex.js';
import { projectTerms } from '../index/model/conceptModel.js';
import type { LinkGraph } from './linkGraph.js';

export interface SuggestOptions {
  /** Suggestions per note at most. @default 5 */
  readonly top: number;
  /** The least similarity (concept cosine) worth suggesting. @default DEFAULT_MIN_SIMILARITY */
  readonly minSimilarity: number;
  /** Words behind each suggestion (largest shares first). @default 5 */
  readonly words: number;
}

/** Calibrated on the hidden-link evaluation (see the header and the evaluation test). */
export const DEFAULT_MIN_SIMILARITY = 0.24;

/**
 * BM25L's δ of the word match that ranks the candidates (LsiIndex.nearby, wordMatchDelta): 0,
 * classic BM25, explicitly, not Nearby's default 0.5. The threshold above was calibrated with δ 0;
 * with δ 0.5 the best-F1 similarity on cmake-doc falls from .199 to .151 and the threshold fitted on
 * the other two trees no longer beats no threshold there (F1 .1012 against .1037; docs/ranking-checks.md,
 * second round), so the suggestions keep the word match they were measured with.
 */
export const LINKS_WORD_MATCH_DELTA = 0;

/**
 * The word match's TF-IDF share (LsiIndex.nearby, wordMatchTfidf): 0, BM25 alone, as the threshold
 * above was calibrated; Nearby's opt-in 0.1 came later (docs/ranking-checks.md, fourth round).
 */
export const LINKS_WORD_MATCH_TFIDF = 0;

/**
 * The name field's weight in the word match (LsiIndex.nearby, wordMatchNames): 0, as the threshold
 * above was calibrated without it; Nearby's 0.35 came later (docs/ranking-checks.md, sixth round).
 */
export const LINKS_WORD_MATCH_NAMES = 0;

/**
 * How many of a note's most distinctive terms form the word match's query (LsiIndex.nearby,
 * wordMatchTerms): 40, as the threshold above was calibrated; Nearby's 80 came later (README,
 * "Ranking checks", seventh round).
 */
export const LINKS_WORD_MATCH_TERMS = 40;

export const DEFAULT_SUGGEST_OPTIONS: SuggestOptions = { top: 5, minSimilarity: DEFAULT_MIN_SIMILARITY, words: 5 };

export interface LinkSuggestion {
  /** The suggested note's key. */
  readonly path: string;
  /** Nearby's score for the pair (what the suggestions are ranked by). */
  readonly score: number;
  /** The concept cosine discounted by how much of each note the space holds (the header; what the threshold applies to). */
  readonly similarity: number;
  /** The terms contributing most to the similarity (index terms: stems when stemming is on). */
  readonly terms: readonly TermShare[];
}

/**
 * How much of a note the concept space holds: ‖U_kᵀw‖ for its unit weighted term vector w
 * (1 − the fold-in residual, conceptModel.ts projectTerms), square-rooted to a length.
 */
export function spaceShare(index: LsiIndex, key: string): number {
  return Math.sqrt(Math.max(0, 1 - projectTerms(index.model, index.termsOf(key)).residual));
}

/**
 * The words behind a pair's similarity: the exact term shares of the concept cosine (explainPair,
 * unfused), discounted by the same factor as the similarity, so they still add up to it.
 */
export function explainSimilarity(index: LsiIndex, a: string, b: string): Explanation {
  const f = spaceShare(index, a) * spaceShare(index, b);
  const e = explainPair(index, a, b, false);
  return {
    score: e.score * f,
    feedback: 0,
    terms: e.terms.map((t) => ({ ...t, share: t.share * f, concept: t.concept * f })),
  };
}

/** Nearby's candidates for a note that are notes and not linked either way (no threshold, no words). */
export function unlinkedNeighbours(
  index: LsiIndex,
  graph: LinkGraph,
  key: string,
  top: number,
): { path: string; score: number; similarity: number }[] {
  if (!Number.isInteger(top) || top < 1) throw new InvalidInputError(`top must be a positive whole number, got ${top}`);
  const own = spaceShare(index, key);
  return index
    .nearby(key, {
      top,
      filter: (p) => p !== key && graph.notes.has(p) && !graph.linked(key, p),
      wordMatchDelta: LINKS_WORD_MATCH_DELTA,
      wordMatchTfidf: LINKS_WORD_MATCH_TFIDF,
      wordMatchNames: LINKS_WORD_MATCH_NAMES,
      wordMatchTerms: LINKS_WORD_MATCH_TERMS,
    })
    .map((h) => ({ path: h.path, score: h.score, similarity: h.conceptScore * own * spaceShare(index, h.path) }));
}

/** The links worth suggesting for one note, best first; [] when none reaches minSimilarity. */
export function suggestLinks(index: LsiIndex, graph: LinkGraph, key: string, options: Partial<SuggestOptions> = {}): LinkSuggestion[] {
  const o = { ...DEFAULT_SUGGEST_OPTIONS, ...options };
  if (!(o.minSimilarity >= -1 && o.minSimilarity <= 1))
    throw new InvalidInputError(`minSimilarity must lie in [-1, 1], got ${o.minSimilarity}`);
  if (!index.has(key)) return [];
  return unlinkedNeighbours(index, graph, key, o.top)
    .filter((h) => h.similarity >= o.minSimilarity)
    .map((h) => ({ ...h, terms: o.words > 0 ? topShares(explainSimilarity(index, key, h.path), o.words).top : [] }));
}

export interface CollectionSuggestion extends LinkSuggestion {
  /** The note the link would be written in (the pair's other end is `path`). */
  readonly from: string;
}

/**
 * Suggestions for every note of the collection, each pair once (under the note where it ranks
 * higher; ties: the first key), most similar first.
 */
export function suggestAllLinks(index: LsiIndex, graph: LinkGraph, options: Partial<SuggestOptions> = {}): CollectionSuggestion[] {
  const o = { ...DEFAULT_SUGGEST_OPTIONS, ...options };
  const best = new Map<string, { from: string; path: string; score: number; similarity: number; rank: number }>();
  for (const key of graph.notes.keys().sort()) {
    if (!index.has(key)) continue;
    unlinkedNeighbours(index, graph, key, o.top).forEach((h, rank) => {
      if (h.similarity < o.minSimilarity) return;
      const id = key < h.path ? `${key}\0${h.path}` : `${h.path}\0${key}`;
      const had = best.get(id);
      if (!had || rank < had.rank) best.set(id, { from: key, path: h.path, score: h.score, similarity: h.similarity, rank });
    });
  }
  return [...best.values()]
    .sort((a, b) => b.similarity - a.similarity || (a.from < b.from ? -1 : a.from > b.from ? 1 : a.path < b.path ? -1 : 1))
    .map(({ from, path, score, similarity }) => ({
      from,
      path,
      score,
      similarity,
      terms: o.words > 0 ? topShares(explainSimilarity(index, from, path), o.words).top : [],
    }));
}
