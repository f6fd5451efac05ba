/**
 * The "why" of search and nearby results, computed in the worker beside the results: the terms
 * that contribute most to each score (core/explain/explain.ts, exact shares of the score), under
 * readable words. Kept cheap: one explainer per query, the top WHY_TERMS terms per result, the
 * rest summed. An explanation that fails leaves its result without one rather than failing it.
 */
import { explainPair, explainSides, QueryExplainer, topShares, type Explanation } from '../../core/explain/explain.js';
import type { LsiIndex, SearchOptions } from '../../core/index/lsiIndex.js';
import { sharedConcepts, sharedSectionConcepts, type SharedConcepts } from '../../core/explain/sharedConcepts.js';
import { sectionSide, type SectionSide } from '../../core/sections/sectionTerms.js';
import type { SectionHit } from '../../core/sections/sectionStore.js';
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
    attempt(() =>
      withConcepts(
        toWhy(explainPair(index, subject, p), wordFor),
        attempt(() => sharedConcepts(index, subject, p)),
        wordFor,
      ),
    ),
  );
}

/** A file's current text by key (undefined when it cannot be read). */
export type TextOf = (path: string) => string | undefined;

/** A section hit's side from its file's text (undefined when unreadable or edited since it was folded). */
function sideOf(index: LsiIndex, hit: Pick<SectionHit, 'path' | 'index'>, textOf: TextOf): SectionSide | undefined {
  const text = textOf(hit.path);
  return text === undefined ? undefined : (sectionSide(index, hit.path, hit.index, text) ?? undefined);
}

/** Why each section matches a query: concept shares against the section's own vector and terms, word-match shares the file's. */
export function sectionSearchWhy(
  index: LsiIndex,
  query: string,
  hits: readonly SectionHit[],
  textOf: TextOf,
  wordFor: WordFor,
  feedback: Pick<SearchOptions, 'like' | 'unlike'> = {},
): (Why | undefined)[] {
  if (hits.length === 0) return [];
  let explainer: QueryExplainer;
  try {
    explainer = new QueryExplainer(index, query, true, feedback);
  } catch {
    return hits.map(() => undefined);
  }
  return hits.map((h) =>
    attempt(() => {
      const side = sideOf(index, h, textOf);
      return side ? toWhy(explainer.explainSection(h.path, side), wordFor) : undefined;
    }),
  );
}

/** Why each section is near the section at the cursor: the two sections' terms and the concepts they share. */
export function sectionNearbyWhy(
  index: LsiIndex,
  from: SectionHit,
  hits: readonly SectionHit[],
  textOf: TextOf,
  wordFor: WordFor,
): (Why | undefined)[] {
  const a = attempt(() => sideOf(index, from, textOf));
  return hits.map((h) =>
    attempt(() => {
      const b = a && sideOf(index, h, textOf);
      if (!a || !b) return undefined;
      return withConcepts(
        toWhy(explainSides(index, a, b), wordFor),
        attempt(() => sharedSectionConcepts(index, a, b)),
        wordFor,
      );
    }),
  );
}

function withConcepts(why: Why, shared: SharedConcepts | undefined, wordFor: WordFor): Why {
  if (!shared) return why;
  return {
    ...why,
    concepts: shared.concepts.map((c) => ({ words: c.terms.map(wordFor), share: c.share })),
    conceptRest: shared.rest,
    wordMatch: shared.wordMatch,
  };
}

function attempt<T>(f: () => T): T | undefined {
  try {
    return f();
  } catch {
    return undefined;
  }
}
