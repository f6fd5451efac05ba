/**
 * The "why" of search and nearby results, computed in the worker beside the results: the terms
 * that contribute most to each score (core/explain/explain.ts, exact shares of the score), under
 * readable words. Kept cheap: one explainer per query, the top WHY_TERMS terms per result, the
 * rest summed. An explanation that fails leaves its result without one rather than failing it.
 */
import { explainPair, QueryExplainer, topShares, type Explanation } from '../../core/explain/explain.js';
import type { LsiIndex, SearchOptions } from '../../core/index/lsiIndex.js';
import { sharedConcepts } from '../../core/explain/sharedConcepts.js';
import type { Why } from './insightProtocol.js';
import type { WordFor } from './wordForms.js';

/** Terms shown per result (a tooltip's worth; the brief's "top 5"). */
export const WHY_TERMS = 5;

export function toWhy(e: Explanation, wordFor: WordFor, count = WHY_TERMS): Why {
  const { top, rest, restTerms } = topShares(e, count);
  // The feedback part (fusion.ts) counts with the rest, so the parts still add up to the score.
  return {
    score: e.score,
    terms: top.map((t) => ({ word: wordFor(t.term), share: t.share, inBoth: t.inBoth })),
    rest: rest + e.feedback,
    restTerms,
  };
}

/** Why each file matches a query (blended score: concept cosine and BM25, as search ranks). */
export function searchWhy(
  index: LsiIndex,
  query: string,
  paths: readonly string[],
  wordFor: WordFor,
  feedback: Pick<SearchOptions, 'like' | 'unlike'> = {},
): (Why | undefined)[] {
  if (paths.length === 0) return [];
  let explainer: QueryExplainer;
  try {
    explainer = new QueryExplainer(index, query, true, feedback);
  } catch {
    return paths.map(() => undefined);
  }
  return paths.map((p) => attempt(() => toWhy(explainer.explain(p), wordFor)));
}

/** Why each file is near the subject file (cosine of their concept vectors): by term, and by the concepts both share. */
export function nearbyWhy(index: LsiIndex, subject: string, paths: readonly string[], wordFor: WordFor): (Why | undefined)[] {
  return paths.map((p) =>
    attempt(() => {
      const why = toWhy(explainPair(index, subject, p), wordFor);
      const shared = attempt(() => sharedConcepts(index, subject, p));
      if (!shared) return why;
      return {
        ...why,
        concepts: shared.concepts.map((c) => ({ words: c.terms.map(wordFor), share: c.share })),
        conceptRest: shared.rest,
        wordMatch: shared.wordMatch,
      };
    }),
  );
}

function attempt<T>(f: () => T): T | undefined {
  try {
    return f();
  } catch {
    return undefined;
  }
}
