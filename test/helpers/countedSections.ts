/**
 * Files' section counts as a tokenizing thread gives them: each file cut by splitSections, each
 * section counted by countTerms(tokenize(...)), all files' ids and counts in one shared pair of
 * arrays (offsets absolute). Used by the tests of the sections fold and of parking the counts.
 */
import { countTerms, type Vocabulary } from '../../src/core/counting/termCounts.js';
import { splitLines, splitSections } from '../../src/core/sections/splitSections.js';
import type { SectionOptions } from '../../src/core/sections/types.js';
import type { CountedSections } from '../../src/core/sections/sectionVectors.js';
import { tokenize, type TokenizeOptions } from '../../src/core/text/tokenize.js';

export interface CountSectionsOptions {
  /** Add unseen terms to the vocabulary (true) or drop them (false, as a built index counts). */
  readonly grow: boolean;
  readonly tokenize?: Partial<TokenizeOptions>;
  readonly split?: Partial<SectionOptions>;
}

/** One CountedSections per file, in the order given, sharing one pair of id and count arrays. */
export function countSections(
  files: readonly { readonly path: string; readonly text: string }[],
  vocab: Vocabulary,
  options: CountSectionsOptions,
): CountedSections[] {
  const ids: number[] = [];
  const counts: number[] = [];
  const parts = files.map(({ path, text }) => {
    const lines = splitLines(text);
    const cut = splitSections(path, text, options.split).sections;
    const offsets = new Int32Array(cut.length + 1);
    offsets[0] = ids.length;
    cut.forEach((s, i) => {
      const t = countTerms(tokenize(lines.slice(s.start, s.end).join('\n'), options.tokenize), vocab, options.grow);
      ids.push(...t.termIds);
      counts.push(...t.counts);
      offsets[i + 1] = ids.length;
    });
    return { cut, offsets };
  });
  const termIds = Int32Array.from(ids);
  const shared = Float32Array.from(counts);
  return parts.map(({ cut, offsets }) => ({
    starts: Int32Array.from(cut, (s) => s.start),
    ends: Int32Array.from(cut, (s) => s.end),
    titles: cut.map((s) => s.title),
    offsets,
    termIds,
    counts: shared,
  }));
}
