/**
 * Section vectors: each section of a file folded into the index's concept space with the frozen
 * model, exactly as a query or an edited file is (Berry, Dumais & O'Brien 1995, "Using linear
 * algebra for intelligent information retrieval", SIAM Review 37(4): d̂ = Σ_k^{α-1} U_kᵀ w(d),
 * normalised). The sections share the files' model, so a section's cosine with a query or with
 * another section is on the same scale as a file's, and the file vectors stay as they are.
 * Counting uses the vocabulary without growing it: a word the model does not know cannot move a
 * concept vector, so a section folded on save equals the one a build would fold from the same text.
 */
import { countTerms, type DocTerms, type Vocabulary } from '../counting/termCounts.js';
import { projectTerms, type ConceptModel } from '../index/model/conceptModel.js';
import { tokenize, type TokenizeOptions } from '../text/tokenize.js';
import { splitLines, splitSections } from './splitSections.js';
import type { Section, SectionOptions } from './types.js';

/** The sections of one file: parallel arrays, f32 vectors (k per section). */
export interface FileSections {
  /** Zero-based first line of each section. */
  readonly starts: Int32Array;
  /** Zero-based line after each section's last. */
  readonly ends: Int32Array;
  readonly titles: readonly string[];
  /** Unit concept vectors, k per section (zeros for a section without a model term). */
  readonly vectors: Float32Array;
}

export interface FoldContext {
  readonly model: ConceptModel;
  readonly vocab: Vocabulary;
  readonly tokenize: Partial<TokenizeOptions>;
  /**
   * Counts a section's text over the vocabulary without growing it; must equal
   * countTerms(tokenize(text, tokenize), vocab, false) (a faster twin, e.g. the build's thread counter).
   */
  readonly count?: (text: string) => DocTerms;
}

/** Splits a file into sections and folds each into the concept space. */
export function foldSections(ctx: FoldContext, path: string, text: string, options: Partial<SectionOptions> = {}): FileSections {
  return foldSectionList(ctx, splitSections(path, text, options).sections, text);
}

/** Folds given sections of a text (line ranges of it) into the concept space. */
export function foldSectionList(ctx: FoldContext, sections: readonly Section[], text: string): FileSections {
  const lines = splitLines(text);
  const k = ctx.model.k;
  const vectors = new Float32Array(sections.length * k);
  const count = ctx.count ?? ((t: string) => countTerms(tokenize(t, ctx.tokenize), ctx.vocab, false));
  sections.forEach((s, i) => {
    const terms = count(lines.slice(s.start, s.end).join('\n'));
    vectors.set(projectTerms(ctx.model, terms).vector, i * k);
  });
  return {
    starts: Int32Array.from(sections, (s) => s.start),
    ends: Int32Array.from(sections, (s) => s.end),
    titles: sections.map((s) => s.title),
    vectors,
  };
}

/** The fold context of an index (anything with its model, vocabulary and tokenizer settings). */
export function foldContextOf(index: {
  readonly model: ConceptModel;
  readonly vocab: Vocabulary;
  readonly settings: { readonly tokenize: Partial<TokenizeOptions> };
}): FoldContext {
  return { model: index.model, vocab: index.vocab, tokenize: index.settings.tokenize };
}
