/**
 * Suggested links: for a note, the notes nearest in meaning (the index's Nearby ranking: concept
 * cosine blended with the BM25 of the note's distinctive words, LsiIndex.nearby) that it does not
 * link to and that do not link to it (linkGraph.ts), each with its score and the words behind it
 * (core/explain, exact shares of the score). Only scores at or above `minScore` are suggested,
 * so a note with nothing close enough gets none.
 *
 * Defaults, and where they come from (test/core/links/suggestLinks.eval.test.ts: a fifth of the
 * links of a Debian documentation tree hidden, suggestions scored on finding them):
 * - top 5: the evaluation's cut-off (a hidden link counts as found in the top 5 of either end).
 * - minScore 0.6: the threshold with the best F1 (hidden links among the top-5 suggestions) on
 *   python-django-doc (0.62–0.63 over three splits), rounded down, then checked on cmake-doc,
 *   which it was not fitted on: F1 above no threshold there, near cmake-doc's own best. The scores
 *   of linked pairs are spread alike in both trees (quartiles ≈ 0.25 / 0.41 / 0.61), which is why
 *   one threshold can serve both. cmake-doc's own fit (0.77) is not used: on django-doc it
 *   silences 60% of the notes and loses F1 (template-like reference pages score high together).
 */
import { InvalidInputError } from '../errors.js';
import { explainPair, topShares, type TermShare } from '../explain/explain.js';
import type { LsiIndex } from '../index/lsiIndex.js';
import type { LinkGraph } from './linkGraph.js';

export interface SuggestOptions {
  /** Suggestions per note at most. @default 5 */
  readonly top: number;
  /** The least score worth suggesting (Nearby's blended score). @default DEFAULT_MIN_SCORE */
  readonly minScore: number;
  /** Words behind each suggestion (largest shares first). @default 5 */
  readonly words: number;
}

/** Calibrated on the hidden-link evaluation (see the header and the evaluation test). */
export const DEFAULT_MIN_SCORE = 0.6;

export const DEFAULT_SUGGEST_OPTIONS: SuggestOptions = { top: 5, minScore: DEFAULT_MIN_SCORE, words: 5 };

export interface LinkSuggestion {
  /** The suggested note's key. */
  readonly path: string;
  /** Nearby's score for the pair. */
  readonly score: number;
  /** The terms contributing most to the score (index terms: stems when stemming is on). */
  readonly terms: readonly TermShare[];
}

/** Nearby's candidates for a note that are notes and not linked either way (no threshold, no words). */
export function unlinkedNeighbours(
  index: LsiIndex,
  graph: LinkGraph,
  key: string,
  top: number,
): { path: string; score: number }[] {
  if (!Number.isInteger(top) || top < 1) throw new InvalidInputError(`top must be a positive whole number, got ${top}`);
  return index
    .nearby(key, { top, filter: (p) => p !== key && graph.notes.has(p) && !graph.linked(key, p) })
    .map((h) => ({ path: h.path, score: h.score }));
}

/** The links worth suggesting for one note, best first; [] when none reaches minScore. */
export function suggestLinks(index: LsiIndex, graph: LinkGraph, key: string, options: Partial<SuggestOptions> = {}): LinkSuggestion[] {
  const o = { ...DEFAULT_SUGGEST_OPTIONS, ...options };
  if (!(o.minScore >= -1 && o.minScore <= 1)) throw new InvalidInputError(`minScore must lie in [-1, 1], got ${o.minScore}`);
  if (!index.has(key)) return [];
  return unlinkedNeighbours(index, graph, key, o.top)
    .filter((h) => h.score >= o.minScore)
    .map((h) => ({ ...h, terms: o.words > 0 ? topShares(explainPair(index, key, h.path), o.words).top : [] }));
}

export interface CollectionSuggestion extends LinkSuggestion {
  /** The note the link would be written in (the pair's other end is `path`). */
  readonly from: string;
}

/**
 * Suggestions for every note of the collection, each pair once (under the note where it ranks
 * higher; ties: the first key), strongest first.
 */
export function suggestAllLinks(index: LsiIndex, graph: LinkGraph, options: Partial<SuggestOptions> = {}): CollectionSuggestion[] {
  const o = { ...DEFAULT_SUGGEST_OPTIONS, ...options };
  const best = new Map<string, { from: string; path: string; score: number; rank: number }>();
  for (const key of graph.notes.keys().sort()) {
    if (!index.has(key)) continue;
    unlinkedNeighbours(index, graph, key, o.top).forEach((h, rank) => {
      if (h.score < o.minScore) return;
      const id = key < h.path ? `${key}\0${h.path}` : `${h.path}\0${key}`;
      const had = best.get(id);
      if (!had || rank < had.rank) best.set(id, { from: key, path: h.path, score: h.score, rank });
    });
  }
  return [...best.values()]
    .sort((a, b) => b.score - a.score || (a.from < b.from ? -1 : a.from > b.from ? 1 : a.path < b.path ? -1 : 1))
    .map(({ from, path, score }) => ({
      from,
      path,
      score,
      terms: o.words > 0 ? topShares(explainPair(index, from, path), o.words).top : [],
    }));
}
