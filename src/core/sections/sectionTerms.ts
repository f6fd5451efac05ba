/**
 * A section as the explanations see it (core/explain): its raw term counts, counted again from the
 * file's text exactly as the section was folded (sectionVectors.ts: the section's lines, the
 * index's tokenizer, the vocabulary not grown), beside the concept vector the index keeps for it.
 * The index file keeps no per-section counts (they would cost more than the vectors), so the
 * text is read again. When the text no longer gives the stored vector (the file was edited and
 * not yet folded in), the counts would explain another score: null then, rather than a wrong why.
 */
import { countTerms, type DocTerms } from '../counting/termCounts.js';
import type { ExplainSide } from '../explain/explain.js';
import { projectTerms } from '../index/model/conceptModel.js';
import type { LsiIndex } from '../index/lsiIndex.js';
import { tokenize } from '../text/tokenize.js';
import { splitLines } from './splitSections.js';
import { foldContextOf } from './sectionVectors.js';

/** A section's side, with where it is. */
export interface SectionSide extends ExplainSide {
  readonly path: string;
  readonly index: number;
  readonly start: number;
  readonly end: number;
  readonly title: string;
}

/**
 * Cosine below which the recounted text is taken to be another text than the one folded
 * (f32 storage rounds at about 1e-7; an edit of one word moves a section far more). Common practice.
 */
export const SAME_SECTION_COSINE = 1 - 1e-4;

/** The counts of lines [start, end) of a text, as the section fold counts them. */
export function sectionTermCounts(
  index: Pick<LsiIndex, 'model' | 'vocab' | 'settings'>,
  text: string,
  start: number,
  end: number,
): DocTerms {
  const ctx = foldContextOf(index);
  return countTerms(tokenize(splitLines(text).slice(start, end).join('\n'), ctx.tokenize), ctx.vocab, false);
}

/**
 * The side of section `at` of an indexed file, from the file's current text; null when the index
 * has no such section or the text no longer gives its stored vector.
 */
export function sectionSide(index: LsiIndex, path: string, at: number, text: string): SectionSide | null {
  const f = index.sections.get(path);
  if (!f || at < 0 || at >= f.starts.length) return null;
  const k = index.k;
  const vector = f.vectors.subarray(at * k, (at + 1) * k);
  const terms = sectionTermCounts(index, text, f.starts[at], f.ends[at]);
  const again = projectTerms(index.model, terms).vector;
  let dot = 0;
  let stored = 0;
  let fresh = 0;
  for (let c = 0; c < k; c++) {
    dot += again[c] * vector[c];
    stored += vector[c] * vector[c];
    fresh += again[c] * again[c];
  }
  const same = stored === 0 && fresh === 0 ? true : dot >= SAME_SECTION_COSINE * Math.sqrt(stored * fresh) && stored > 0;
  if (!same) return null;
  return { path, index: at, start: f.starts[at], end: f.ends[at], title: f.titles[at], terms, vector };
}

/** The whole file's side (its stored counts and concept vector). */
export function fileSide(index: LsiIndex, path: string): ExplainSide {
  return { terms: index.termsOf(path), vector: index.vectorOf(path) };
}
