/**
 * Vocabulary pruning by document frequency, as gensim's filter_extremes does (Řehůřek & Sojka
 * 2010): keep a term seen in at least minDocs documents and in at most maxDocFraction of them,
 * then keep the maxTerms most frequent (ties broken by term id, so the result is deterministic).
 *
 * Defaults: minDocs 2 (a term in one file links nothing), maxDocFraction 0.5 (as gensim's
 * no_above), maxTerms 100 000 (gensim's keep_n; memory grows with terms × k).
 * Small collections: if these rules leave no term at all (one or two files), every term is kept,
 * so a one-file workspace still indexes.
 */
import { InvalidInputError } from '../errors.js';
import type { DocTerms } from '../counting/termCounts.js';

export interface PruneOptions {
  /** @default 2 */
  minDocs: number;
  /** @default 0.5 */
  maxDocFraction: number;
  /** @default 100000 */
  maxTerms: number;
}

export const DEFAULT_PRUNE_OPTIONS: Readonly<PruneOptions> = Object.freeze({ minDocs: 2, maxDocFraction: 0.5, maxTerms: 100_000 });

export interface PrunedVocabulary {
  /** Kept vocabulary ids, ascending: model column c is vocabulary id keptIds[c]. */
  readonly keptIds: Int32Array;
  /** Vocabulary id → model column, or -1. */
  readonly columnOf: Int32Array;
  /** Document frequency of every vocabulary id. */
  readonly docFreq: Int32Array;
  /** True when the thresholds were relaxed because they left no term. */
  readonly relaxed: boolean;
}

export function documentFrequencies(docs: readonly DocTerms[], vocabSize: number): Int32Array {
  const df = new Int32Array(vocabSize);
  for (const d of docs) for (let i = 0; i < d.termIds.length; i++) df[d.termIds[i]]++;
  return df;
}

export function pruneVocabulary(docs: readonly DocTerms[], vocabSize: number, options: Partial<PruneOptions> = {}): PrunedVocabulary {
  const o = { ...DEFAULT_PRUNE_OPTIONS, ...options };
  if (!(o.minDocs >= 1) || !(o.maxDocFraction > 0 && o.maxDocFraction <= 1) || !(o.maxTerms >= 1)) {
    throw new InvalidInputError('pruning needs minDocs ≥ 1, 0 < maxDocFraction ≤ 1 and maxTerms ≥ 1');
  }
  const df = documentFrequencies(docs, vocabSize);
  const n = docs.length;
  const pick = (minDocs: number, maxDocs: number): number[] => {
    const ids: number[] = [];
    for (let t = 0; t < vocabSize; t++) if (df[t] >= minDocs && df[t] <= maxDocs) ids.push(t);
    return ids;
  };
  let relaxed = false;
  let ids = pick(o.minDocs, Math.floor(o.maxDocFraction * n));
  if (ids.length === 0) {
    relaxed = true;
    ids = pick(1, n);
  }
  if (ids.length > o.maxTerms) {
    ids.sort((a, b) => df[b] - df[a] || a - b);
    ids = ids.slice(0, o.maxTerms);
  }
  const keptIds = Int32Array.from(ids).sort();
  const columnOf = new Int32Array(vocabSize).fill(-1);
  for (let c = 0; c < keptIds.length; c++) columnOf[keptIds[c]] = c;
  return { keptIds, columnOf, docFreq: df, relaxed };
}
