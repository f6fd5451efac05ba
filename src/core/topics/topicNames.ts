/**
 * Names that tell sibling topics apart: each topic's terms are scored against its parent (the
 * other files of the parent, its siblings), not against the whole workspace.
 *
 * For a topic T inside parent P (siblings S = P \ T), a term t with document frequencies
 * p_T = df_T/|T| and p_S = (df_S + ½)/(|S| + 1) (add-half smoothing, common practice) scores
 *   'informative':  p_T · ln(p_T / p_S)   when the mean weight of t in T exceeds that in S,
 * the term's share of the Kullback–Leibler divergence between the two occurrence distributions
 * (Carpineto, de Mori, Romano & Bigi 2001, ACM TOIS 19(1), term scoring for query expansion):
 * large for terms that most files of T use and few siblings use;
 *   'contrast' (default): mean weight in T − mean weight in S (the flat view's earlier score).
 * The default is decided on held-out files (scripts/fixtures/topicNamesHeldOut.ts, the protocol of
 * test/core/topics/topicQuality.test.ts: names from every other file, NPMI of the top 10 terms
 * over the rest), one manual choosing and the other checking. Chosen on CMake, where 'contrast'
 * scored above 'informative' in all 6 cases (seeds 0–2, levels 1–2: 0.439, 0.442, 0.445 vs
 * 0.432, 0.417, 0.434 at the first level; 0.389, 0.398, 0.389 vs 0.366, 0.382, 0.354 at the
 * second); checked on Django, where it did too (first level 0.341, 0.347, 0.322 vs 0.349, 0.344,
 * 0.282 — two of three — second level 0.301, 0.245, 0.303 vs 0.233, 0.220, 0.162), and with the
 * count of three draws (topics.ts) in all 6 (measured 2026-12-03 with coherentNames on). With
 * names chosen for co-occurrence (coherentNames.ts), the plain difference of mean weights favours
 * terms many of the topic's files carry, which generalise; the divergence share favours terms
 * its siblings lack, often rare ones (our reading).
 * A term must occur in at least two of the topic's files (one file's word does not describe a group;
 * topics of fewer than 4 files excepted). Terms that are numbers, hexadecimal-looking codes or a single letter never name a topic; markup
 * and file-format words (MARKUP_WORDS, common practice) may appear but only after real words.
 * The top level's parent is the whole workspace.
 */
import type { CsrMatrix } from '../matrix/sparse.js';
import { stemWord } from '../text/tokenize.js';

export type NamingScore = 'informative' | 'contrast';

/** Words of markup, formats and boilerplate that say nothing about a topic on their own (common practice). */
export const MARKUP_WORDS: readonly string[] = [
  'rst',
  'md',
  'txt',
  'html',
  'htm',
  'xml',
  'yaml',
  'yml',
  'json',
  'css',
  'http',
  'https',
  'www',
  'com',
  'org',
  'net',
  'href',
  'src',
  'img',
  'div',
  'span',
  'nbsp',
  'amp',
  'quot',
  'br',
  'li',
  'ul',
  'ol',
  'td',
  'tr',
  'th',
  'px',
  'png',
  'svg',
  'jpg',
  'gif',
  'pdf',
  'toctree',
  'maxdepth',
  'ref',
  'doc',
  'docs',
  'toc',
  'rubric',
  'literalinclude',
  'index',
  'todo',
  'fixme',
  'xxx',
  'spdx',
  'identifier',
  'license',
  'gpl',
  'utf',
  'doctype',
  'file',
  'files',
  'readme',
  'contents',
  'page',
  'section',
  'note',
  'see',
];

let markupStems: Set<string> | null = null;

/** True for a term that names nothing by itself: a number or code, or a single character. */
export function isUnnameable(term: string): boolean {
  const letters = term.replace(/[^\p{L}]/gu, '').length;
  if (letters < 2 && term.length < 2) return true;
  if (/\d/.test(term) && (letters === 0 || /^(0x)?[0-9a-f]+$/i.test(term))) return true;
  return letters === 0;
}

export function isMarkupWord(term: string): boolean {
  markupStems ??= new Set(MARKUP_WORDS.flatMap((w) => [w, stemWord(w)]));
  return markupStems.has(term);
}

/** Scratch sums reused across calls (one per term column). */
export class NameScratch {
  readonly sum: Float64Array;
  readonly df: Float64Array;
  readonly childSum: Float64Array;
  readonly childDf: Float64Array;
  /** Per column: 0 unknown, 1 may name a topic, 2 never names one (isUnnameable, remembered). */
  readonly nameable: Uint8Array;
  constructor(cols: number) {
    this.nameable = new Uint8Array(cols);
    this.sum = new Float64Array(cols);
    this.df = new Float64Array(cols);
    this.childSum = new Float64Array(cols);
    this.childDf = new Float64Array(cols);
  }
}

/** The same terms with markup words moved after the real ones (order kept otherwise). */
export function realWordsFirst<T>(terms: readonly T[], termOf: (t: T) => string): T[] {
  return [...terms.filter((t) => !isMarkupWord(termOf(t))), ...terms.filter((t) => isMarkupWord(termOf(t)))];
}

export interface ScoredTerm {
  readonly col: number;
  readonly score: number;
}

/**
 * For each child (a list of matrix rows), its candidate name terms, best first, at most `keep`.
 * parentRows: every row of the parent (the children's rows and any loosely placed rows that stay
 * with the parent). With one child and no other rows, siblings are empty and p_S is ½.
 */
export function namesAgainstParent(
  a: CsrMatrix,
  parentRows: ArrayLike<number>,
  children: readonly ArrayLike<number>[],
  keep: number,
  score: NamingScore,
  scratch: NameScratch,
  termOf: (col: number) => string,
): ScoredTerm[][] {
  const { sum, df, childSum, childDf, nameable } = scratch;
  const canName = (c: number): boolean => {
    if (nameable[c] === 0) nameable[c] = isUnnameable(termOf(c)) ? 2 : 1;
    return nameable[c] === 1;
  };
  const touched: number[] = [];
  for (let i = 0; i < parentRows.length; i++) {
    const r = parentRows[i];
    for (let p = a.indptr[r]; p < a.indptr[r + 1]; p++) {
      const c = a.indices[p];
      if (df[c] === 0) touched.push(c);
      sum[c] += a.values[p];
      df[c]++;
    }
  }
  const nP = parentRows.length;
  const out: ScoredTerm[][] = [];
  for (const rows of children) {
    const mine: number[] = [];
    for (let i = 0; i < rows.length; i++) {
      const r = rows[i];
      for (let p = a.indptr[r]; p < a.indptr[r + 1]; p++) {
        const c = a.indices[p];
        if (childDf[c] === 0) mine.push(c);
        childSum[c] += a.values[p];
        childDf[c]++;
      }
    }
    const nT = rows.length;
    const nS = nP - nT;
    const scored: ScoredTerm[] = [];
    for (const c of mine) {
      const meanT = childSum[c] / nT;
      const meanS = nS > 0 ? (sum[c] - childSum[c]) / nS : 0;
      if (meanT > meanS && (childDf[c] >= 2 || nT < 4) && canName(c)) {
        let s: number;
        if (score === 'contrast') s = meanT - meanS;
        else {
          const pT = childDf[c] / nT;
          const pS = (df[c] - childDf[c] + 0.5) / (nS + 1);
          s = pT * Math.log(pT / pS);
        }
        if (s > 0) scored.push({ col: c, score: s });
      }
      childSum[c] = 0;
      childDf[c] = 0;
    }
    scored.sort((x, y) => y.score - x.score || x.col - y.col);
    out.push(scored.slice(0, keep));
  }
  for (const c of touched) {
    sum[c] = 0;
    df[c] = 0;
  }
  return out;
}
