/**
 * The weighted document-term matrix a build makes of a list of texts (tokenize + countTerms, the
 * default pruning, global weights, weightedMatrix), for tests that need a real term-document
 * matrix: the texts come from the collections in test/fixtures/corpora.
 */
import { countTerms, Vocabulary } from '../../src/core/counting/termCounts.js';
import { weightedMatrix } from '../../src/core/index/model/conceptModel.js';
import type { CsrMatrix } from '../../src/core/matrix/sparse.js';
import { tokenize } from '../../src/core/text/tokenize.js';
import { pruneVocabulary } from '../../src/core/weighting/prune.js';
import { globalWeights, type WeightingScheme } from '../../src/core/weighting/termWeighting.js';

/** Rows = texts, columns = the kept terms (their number: `terms`). */
export function weightedCorpus(texts: readonly string[], scheme: WeightingScheme = 'log-entropy'): { matrix: CsrMatrix; terms: number } {
  const vocab = new Vocabulary();
  const docs = texts.map((t) => countTerms(tokenize(t), vocab, true));
  const pruned = pruneVocabulary(docs, vocab.size);
  const weights = globalWeights(docs, pruned.columnOf, pruned.keptIds.length, scheme);
  return { matrix: weightedMatrix(docs, pruned.columnOf, weights, scheme).matrix, terms: pruned.keptIds.length };
}
