/**
 * Suggested links: for a note, the notes nearest in meaning (ranked as Nearby ranks them: concept
 * cosine blended with the BM25 of the note's distinctive words, LsiIndex.nearby) that it does not
 * link to and that do not link to it (linkGraph.ts), each with its similarity (the cosine of the
 * two notes' concept vectors) and the words behind it (core/explain: each term's exact share of
 * that cosine). Only notes whose similarity reaches `minSimilarity` are suggested, so a note with
 * nothing close enough gets none. The threshold is on the cosine, not on Nearby's blended score:
 * the blend's word-match part is divided by the best other note's, so the first neighbour always
 * gets it whole, however far it is (a note foreign to the collection scored 0.65–0.81).
 *
 * Defaults, and where they come from (test/core/links/suggestLinks.eval.test.ts: a fifth of the
 * links of a Debian documentation tree hidden, suggestions scored on finding them):
 * - top 5: the evaluation's cut-off (a hidden link counts as found in the top 5 of either end).
 * - minSimilarity 0.43: the similarity with the best F1 (hidden links among the top-5
 *   suggestions) is 0.38–0.52 on python-django-doc (three splits, mean 0.434) and 0.427 on
 *   cmake-doc; each tree's fit, used on the other, beats no threshold there and comes near that
 *   tree's own best; 0.43 is the mean of the two fits, rounded.
 */
import { InvalidInputError } from '../errors.js';
import { explainPair, topShares, type TermShare } from '../explain/explain.js';
import type { LsiIndex } from '../index/lsiIndex.js';
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
export const DEFAULT_MIN_SIMILARITY = 0.43;

export const DEFAULT_SUGGEST_OPTIONS: SuggestOptions = { top: 5, minSimilarity: DEFAULT_MIN_SIMILARITY, words: 5 };

export interface LinkSuggestion {
  /** The suggested note's key. */
  readonly path: string;
  /** Nearby's score for the pair (what the suggestions are ranked by). */
  readonly score: number;
  /** The cosine of the two notes' concept vectors (what the threshold applies to). */
  readonly similarity: number;
  /** The terms contributing most to the similarity (index terms: stems when stemming is on). */
  readonly terms: readonly TermShare[];
}

/** Nearby's candidates for a note that are notes and not linked either way (no threshold, no words). */
export function unlinkedNeighbours(
  index: LsiIndex,
  graph: LinkGraph,
  key: string,
  top: number,
): { path: string; score: number; similarity: number }[] {
  if (!Number.isInteger(top) || top < 1) throw new InvalidInputError(`top must be a positive whole number, got ${top}`);
  return index
    .nearby(key, { top, filter: (p) => p !== key && graph.notes.has(p) && !graph.linked(key, p) })
    .map((h) => ({ path: h.path, score: h.score, similarity: h.conceptScore }));
}

/** The links worth suggesting for one note, best first; [] when none reaches minSimilarity. */
export function suggestLinks(index: LsiIndex, graph: LinkGraph, key: string, options: Partial<SuggestOptions> = {}): LinkSuggestion[] {
  const o = { ...DEFAULT_SUGGEST_OPTIONS, ...options };
  if (!(o.minSimilarity >= -1 && o.minSimilarity <= 1))
    throw new InvalidInputError(`minSimilarity must lie in [-1, 1], got ${o.minSimilarity}`);
  if (!index.has(key)) return [];
  return unlinkedNeighbours(index, graph, key, o.top)
    .filter((h) => h.similarity >= o.minSimilarity)
    .map((h) => ({ ...h, terms: o.words > 0 ? topShares(explainPair(index, key, h.path, false), o.words).top : [] }));
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
      terms: o.words > 0 ? topShares(explainPair(index, from, path, false), o.words).top : [],
    }));
}
