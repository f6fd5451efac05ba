/**
 * The passage of a file that best matches a search, shown beside each result (with the query's
 * words marked) and used to open the file at that place. core/text/passage.ts picks a readable
 * window of text; here a window is scored as
 *   (share of the query's BM25 idf mass whose terms occur in it) + (cosine of its concept vector
 *   with the query's),
 * so a window that shares words wins, and among windows without shared words the one closest in
 * meaning wins. Equal weights for the two parts are common practice, not from a source.
 */
import { projectTerms } from '../../core/index/model/conceptModel.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { choosePassage, type PassageScorer } from '../../core/text/passage.js';

export interface LineMatch {
  /** Zero-based line number where the passage starts. */
  readonly line: number;
  /** The passage, cleaned and shortened. */
  readonly text: string;
  /** [start, end) ranges of text holding the query's words. */
  readonly highlights: readonly (readonly [number, number])[];
}

/** A scorer of text windows for one query (build once per query, use for every result). */
export function queryScorer(index: LsiIndex, query: string): PassageScorer {
  const q = index.queryTerms(query);
  const qVector = projectTerms(index.model, q).vector;
  const bm25 = index.bm25();
  const idf = new Map<number, number>();
  let idfTotal = 0;
  for (const t of q.termIds) {
    const w = bm25.idf(t);
    idf.set(t, w);
    idfTotal += w;
  }
  const wordCache = new Map<string, boolean>();
  return {
    score(text) {
      const terms = index.queryTerms(text);
      if (terms.termIds.length === 0) return 0;
      let shared = 0;
      for (const t of terms.termIds) shared += idf.get(t) ?? 0;
      const v = projectTerms(index.model, terms).vector;
      let cos = 0;
      for (let c = 0; c < v.length; c++) cos += v[c] * qVector[c];
      return (idfTotal > 0 ? shared / idfTotal : 0) + Math.max(0, cos);
    },
    isQueryWord(word) {
      const lower = word.toLowerCase();
      let hit = wordCache.get(lower);
      if (hit === undefined) {
        hit = index.queryTerms(lower).termIds.some((t) => idf.has(t));
        wordCache.set(lower, hit);
      }
      return hit;
    },
  };
}

export function bestMatchingLine(fileText: string, index: LsiIndex, query: string, scorer = queryScorer(index, query)): LineMatch {
  return choosePassage(fileText, scorer);
}
