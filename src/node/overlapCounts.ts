/**
 * The index's stored raw term counts as input for the overlap finder (core/lookalike): each file's
 * counts, and the index's own tokenizer and vocabulary applied to one line (to take boilerplate
 * lines out). With these the finder's full term space costs no second tokenization of the folder.
 */
import { countTerms } from '../core/counting/termCounts.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import type { LookalikeInput } from '../core/lookalike/index.js';
import { tokenize } from '../core/text/tokenize.js';

/** files (ids = index paths) with their stored counts and the line counter. */
export function withIndexCounts(index: LsiIndex, files: LookalikeInput['files']): LookalikeInput {
  return {
    files,
    termCounts: files.map((f) => index.termsOf(f.id)),
    countLine: (line) => countTerms(tokenize(line, index.settings.tokenize), index.vocab, false),
  };
}
