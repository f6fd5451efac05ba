/**
 * The line of a file that best matches a search, shown beside each result and used to open the
 * file at that place. Each non-blank line is scored as
 *   (share of the query's BM25 idf mass whose terms occur in the line) + (cosine of the line's
 *   concept vector with the query's),
 * so a line that shares words wins, and among lines without shared words the one closest in
 * meaning wins. Equal weights for the two parts are common practice, not from a source.
 */
import { projectTerms } from '../../core/index/model/conceptModel.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';

export interface LineMatch {
  /** Zero-based line number. */
  readonly line: number;
  /** The line, trimmed and shortened to MAX_LINE_CHARS. */
  readonly text: string;
}

/** Longest line text returned (common practice for a one-line description). */
export const MAX_LINE_CHARS = 120;
/** Lines looked at per file (keeps a huge file from stalling a search). */
export const MAX_LINES_SCANNED = 20_000;

export function bestMatchingLine(fileText: string, index: LsiIndex, query: string): LineMatch {
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
  const lines = fileText.split(/\r?\n/, MAX_LINES_SCANNED);
  let best = -1;
  let bestScore = 0;
  let firstText = -1;
  for (let i = 0; i < lines.length; i++) {
    const trimmed = lines[i].trim();
    if (trimmed.length < 2) continue;
    if (firstText < 0) firstText = i;
    const terms = index.queryTerms(trimmed);
    if (terms.termIds.length === 0) continue;
    let shared = 0;
    for (const t of terms.termIds) shared += idf.get(t) ?? 0;
    const v = projectTerms(index.model, terms).vector;
    let cos = 0;
    for (let c = 0; c < v.length; c++) cos += v[c] * qVector[c];
    const score = (idfTotal > 0 ? shared / idfTotal : 0) + Math.max(0, cos);
    if (score > bestScore) {
      bestScore = score;
      best = i;
    }
  }
  const line = best >= 0 ? best : Math.max(0, firstText);
  return { line, text: shorten(lines[line]?.trim() ?? '') };
}

function shorten(s: string): string {
  return s.length <= MAX_LINE_CHARS ? s : `${s.slice(0, MAX_LINE_CHARS - 1)}…`;
}
