/**
 * A local index in a shared concept space: instead of decomposing its own matrix, the index takes
 * the vocabulary, global term weights, U and Σ of a portable concept model (conceptFile.ts) and
 * folds every one of its files in (folding-in, Berry, Dumais & O'Brien 1995: d̂ ↦ Σ^{α−1}Uᵀd̂ with
 * the model's frozen weights, exactly as a query or an edited file is folded in). Search, Nearby,
 * topics and the map then work in the organisation's concepts; later edits fold in as usual.
 * The index's vocabulary becomes the union of its own terms and the model's (both in code-unit
 * order), so a model term no local file uses still counts in queries.
 */
import { InvalidInputError } from '../../errors.js';
import { projectMatrixRows, weightedMatrix, type BuildProgress, type ConceptModel } from './conceptModel.js';
import type { DocSlot } from '../lsiIndex.js';
import type { IndexSettings } from './settings.js';
import { Vocabulary, type DocTerms } from '../../counting/termCounts.js';
import { serialExecutor } from '../../matrix/executor.js';
import type { PortableModel } from '../persistence/conceptFile.js';

export interface AdoptedModel {
  readonly vocab: Vocabulary;
  readonly slots: DocSlot[];
  readonly model: ConceptModel;
  readonly vectors: Float32Array;
}

/**
 * The key a shared model adds to the index's settings: its file's CRC-32 (the file's last four
 * bytes), so a different model means a rebuild, and the key can be read without decoding the file.
 */
export function sharedModelKey(model: PortableModel): string {
  return model.checksum.toString(16).padStart(8, '0');
}

/**
 * @param vocab the build's vocabulary, every id used and terms ascending in code-unit order
 *   (as IndexBuilder numbers it); slots' terms refer to it.
 */
export function adoptSharedModel(
  shared: PortableModel,
  vocab: Vocabulary,
  slots: readonly DocSlot[],
  settings: IndexSettings,
  progress: BuildProgress = {},
): AdoptedModel {
  if (shared.tokenize.stem !== settings.tokenize.stem || shared.tokenize.keepCompounds !== settings.tokenize.keepCompounds) {
    throw new InvalidInputError(
      `the shared concept model was counted with tokenizer options ${JSON.stringify(shared.tokenize)}, this index uses ${JSON.stringify(settings.tokenize)}`,
    );
  }
  progress.onProgress?.('weighting', 0, 1);
  const local = vocab.terms;
  const model = shared.terms;
  // Merge two ascending lists: local id → union id, model column → union id.
  const union: string[] = [];
  const localToUnion = new Int32Array(local.length);
  const keptIds = new Int32Array(model.length);
  let i = 0;
  let j = 0;
  while (i < local.length || j < model.length) {
    if (j >= model.length || (i < local.length && local[i] < model[j])) {
      localToUnion[i++] = union.length;
      union.push(local[i - 1]);
    } else if (i >= local.length || model[j] < local[i]) {
      keptIds[j++] = union.length;
      union.push(model[j - 1]);
    } else {
      localToUnion[i++] = union.length;
      keptIds[j++] = union.length;
      union.push(model[j - 1]);
    }
  }
  const columnOf = new Int32Array(union.length).fill(-1);
  for (let c = 0; c < keptIds.length; c++) columnOf[keptIds[c]] = c;
  // The mapping is increasing, so each file's term ids stay ascending.
  const remapped: DocSlot[] = slots.map((s) => ({ meta: s.meta, terms: remap(s.terms, localToUnion), folded: false, residual: 0 }));
  const docs = remapped.map((s) => s.terms);
  const { matrix, frobeniusSquared } = weightedMatrix(docs, columnOf, shared.weights, shared.weighting);
  const k = shared.k;
  const next: ConceptModel = {
    scheme: shared.weighting,
    k,
    kChoice: { k, requested: k, clamped: false },
    keptIds,
    columnOf,
    weights: shared.weights,
    termVectors: shared.termVectors,
    singularValues: shared.singularValues,
    axisScale: Float64Array.from(shared.singularValues, (s) => (s > 0 ? Math.pow(s, settings.conceptScaling - 1) : 0)),
    frobeniusSquared,
    residualMean: 0,
    nonZeros: matrix.indices.length,
    pruneRelaxed: false,
  };
  progress.onProgress?.('weighting', 1, 1);
  // Residual of each file: 1 − ‖Uᵀd̂‖² (the part of it the shared concepts cannot see).
  const inside = new Float64Array(matrix.rows * k);
  serialExecutor.spmm(matrix, Float64Array.from(shared.termVectors), k, inside, true);
  let sum = 0;
  let counted = 0;
  for (let r = 0; r < matrix.rows; r++) {
    if (matrix.indptr[r + 1] === matrix.indptr[r]) {
      remapped[r] = { ...remapped[r], residual: 1 };
      continue;
    }
    let ss = 0;
    for (let c = 0; c < k; c++) ss += inside[r * k + c] ** 2;
    const res = Math.max(0, 1 - ss);
    remapped[r] = { ...remapped[r], residual: res };
    sum += res;
    counted++;
  }
  const adopted: ConceptModel = { ...next, residualMean: counted > 0 ? sum / counted : 0 };
  progress.onProgress?.('svd', 1, 1);
  const vectors = projectMatrixRows(adopted, matrix, progress.executor);
  return { vocab: new Vocabulary(union), slots: remapped, model: adopted, vectors };
}

function remap(t: DocTerms, map: Int32Array): DocTerms {
  const termIds = new Int32Array(t.termIds.length);
  for (let i = 0; i < termIds.length; i++) termIds[i] = map[t.termIds[i]];
  return { termIds, counts: t.counts, length: t.length };
}
