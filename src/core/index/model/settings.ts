/**
 * Index settings: one object, with exported defaults, shared by the command line, the worker and
 * the editor. Every field is stored in the saved index, so a change of settings forces a rebuild.
 */
import { DEFAULT_PRUNE_OPTIONS, type PruneOptions } from '../../weighting/prune.js';
import type { WeightingScheme } from '../../weighting/termWeighting.js';
import { DEFAULT_TOKENIZE_OPTIONS, type TokenizeOptions } from '../../text/tokenize.js';
import { DEFAULT_SEED } from '../../random.js';
import { DEFAULT_SVD_OPTIONS } from '../../svd/randomizedSvd.js';

export interface IndexSettings {
  /** @default 'log-entropy' */
  weighting: WeightingScheme;
  /** Concept dimensions, or 'auto' (see svd/chooseK.ts). @default 'auto' */
  k: number | 'auto';
  /** @default DEFAULT_SEED */
  seed: number;
  /** Power iterations of the randomized SVD (shifted: svd/dynamicShift.ts). @default 4 */
  powerIterations: number;
  prune: PruneOptions;
  tokenize: TokenizeOptions;
  /**
   * Exponent α for concept coordinates Σ^α Vᵀ (documents) and Σ^{α-1}Uᵀq (queries, folded docs):
   * 1 is the classic LSI document space (Deerwester et al. 1990). @default 1
   */
  conceptScaling: number;
  /**
   * Share of the lexical BM25 score in search ranking, 0…1 (0 = pure LSI). A blend of LSI with a
   * lexical score follows Kontostathis (2007, essential-dimensions LSI). @default 0.5
   */
  lexicalBlend: number;
  /**
   * A shared concept model (src/core/model/conceptFile.ts) the index folds its files into instead
   * of decomposing its own matrix: where the file is and which model it was (sharedModelKey).
   * Absent: a local SVD. @default undefined
   */
  sharedModel?: { readonly path: string; readonly key: string };
}

export const DEFAULT_INDEX_SETTINGS: Readonly<IndexSettings> = Object.freeze({
  weighting: 'log-entropy',
  k: 'auto',
  seed: DEFAULT_SEED,
  powerIterations: DEFAULT_SVD_OPTIONS.powerIterations,
  prune: DEFAULT_PRUNE_OPTIONS,
  tokenize: DEFAULT_TOKENIZE_OPTIONS,
  conceptScaling: 1,
  lexicalBlend: 0.5,
});

export function resolveSettings(partial: Partial<IndexSettings> = {}): IndexSettings {
  return {
    ...DEFAULT_INDEX_SETTINGS,
    ...partial,
    prune: { ...DEFAULT_INDEX_SETTINGS.prune, ...(partial.prune ?? {}) },
    tokenize: { ...DEFAULT_INDEX_SETTINGS.tokenize, ...(partial.tokenize ?? {}) },
  };
}

/** Settings that change the concept model (a difference means a rebuild, not a fold-in). */
export function modelSettingsKey(s: IndexSettings): string {
  const key: unknown[] = [s.weighting, s.k, s.seed, s.powerIterations, s.prune, s.tokenize, s.conceptScaling];
  if (s.sharedModel) key.push(s.sharedModel.key);
  return JSON.stringify(key);
}
