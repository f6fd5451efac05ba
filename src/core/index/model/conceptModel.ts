/**
 * The frozen concept model of a build: pruned vocabulary, global term weights, the term factor
 * U_k and singular values Σ_k of the weighted term-document matrix (latent semantic indexing,
 * Deerwester et al. 1990), and the projection ("folding-in", Berry, Dumais & O'Brien 1995) of any
 * document or query into the k-dimensional concept space with those frozen weights.
 */
import { CancelledError, EmptyCorpusError } from '../../errors.js';
import { serialExecutor, type MatrixExecutor } from '../../matrix/executor.js';
import { copyCsr, csrRows, type CsrMatrix } from '../../matrix/sparse.js';
import { createWasmExecutor } from '../../matrix/wasm/wasmExecutor.js';
import { chooseK, type ChosenK } from '../../svd/chooseK.js';
import { dropSmallSide, finishSvd, randomizedSvdSmallSide, type SvdResult, type SvdSmallSide } from '../../svd/randomizedSvd.js';
import { pruneVocabulary } from '../../weighting/prune.js';
import { globalWeights, localWeight, weightDocument, weightRowInto, type WeightingScheme } from '../../weighting/termWeighting.js';
import type { PortableModel } from '../persistence/conceptFile.js';
import type { IndexSettings } from './settings.js';
import type { DocTerms } from '../../counting/termCounts.js';
import type { OpenSpill } from '../../sections/types.js';
import { dropParkedMatrix, parkMatrix, unparkMatrix } from '../../matrix/parkedMatrix.js';

export interface ConceptModel {
  readonly scheme: WeightingScheme;
  readonly k: number;
  readonly kChoice: ChosenK;
  /** Model column → vocabulary id (ascending). */
  readonly keptIds: Int32Array;
  /** Vocabulary id → model column or -1; ids beyond its length are unknown to the model. */
  readonly columnOf: Int32Array;
  /** Global weight per model column. */
  readonly weights: Float64Array;
  /** U_k: one row of k numbers per model column. */
  readonly termVectors: Float32Array;
  readonly singularValues: Float64Array;
  /** Σ_k^{α-1}, the per-axis factor applied to U_kᵀx (α = conceptScaling). */
  readonly axisScale: Float64Array;
  /** ‖A‖²_F of the weighted, normalised matrix (the number of non-empty documents). */
  readonly frobeniusSquared: number;
  /** Mean share of a build document's weighted vector lying outside span(U_k). */
  readonly residualMean: number;
  /** Stored entries of the weighted term-document matrix at build time. */
  readonly nonZeros: number;
  /** True when pruning thresholds were relaxed (tiny collections). */
  readonly pruneRelaxed: boolean;
}

export interface Projection {
  /** Unit concept vector (all zeros when the text has no model term). */
  readonly vector: Float32Array;
  /** 1 − ‖U_kᵀd̂‖² for the unit weighted vector d̂: the part the concept space cannot see. */
  readonly residual: number;
  /** Number of model terms present. */
  readonly knownTerms: number;
}

export interface BuildProgress {
  onProgress?: (stage: 'weighting' | 'svd', done: number, total: number) => void;
  signal?: { readonly aborted: boolean };
  /** Runs the SVD's large products (threads from src/node; default: this thread). */
  executor?: MatrixExecutor;
  /**
   * Called once the SVD's passes over the matrix are done and again before the files' projection:
   * the executor for the step that follows (the big-side vectors, then the projection), so a
   * caller can let the previous one go with the memory it grew to (WebAssembly memory never
   * shrinks) and what the step before left behind. Default: `executor`.
   */
  freshExecutor?: () => MatrixExecutor | undefined;
  /** A shared concept model to fold the files into instead of a local SVD (model/adoptModel.ts). */
  sharedModel?: PortableModel;
  /**
   * Called once the weighted matrix is made, with the documents' raw counts: the build reads them
   * no more, so a caller may keep them elsewhere until it needs them again (src/node/parkedCounts.ts).
   */
  onWeighted?: (docs: readonly DocTerms[]) => void;
  /**
   * Where the weighted matrix's entries wait while the SVD's passes run on the executor's copy of
   * them (a scratch file from src/node; parkedMatrix.ts). Without one, or where it gives null, they stay.
   */
  spill?: OpenSpill;
  /**
   * Called once the weighted matrix's entries are in the spill, before the SVD's first pass: their
   * arrays are garbage from then on, and nothing the passes do brings a collection about (they
   * allocate in the executor's memory), so a caller may collect them here, before the passes'
   * blocks come on top (on the Linux tree they stayed through the first pass: 175 MB).
   */
  onParked?: () => void;
  /** Park the weighted matrix's entries from this many bytes on (default PARK_MATRIX_FROM_BYTES; tests set it low). */
  parkFromBytes?: number;
}

export function buildConceptModel(
  docs: readonly DocTerms[],
  vocabSize: number,
  settings: IndexSettings,
  progress: BuildProgress = {},
): ConceptModel {
  return buildModelAndMatrix(docs, vocabSize, settings, progress).model;
}

/**
 * The model and the unit concept vector of every document, exactly as projectTerms would give
 * them one by one (rows of a k-wide block, in document order), computed as one sparse product.
 */
export function buildConceptModelAndVectors(
  docs: readonly DocTerms[],
  vocabSize: number,
  settings: IndexSettings,
  progress: BuildProgress = {},
): { model: ConceptModel; vectors: Float32Array } {
  const { model, matrix } = buildModelAndMatrix(docs, vocabSize, settings, progress);
  return { model, vectors: projectMatrixRows(model, matrix, progress.freshExecutor ? progress.freshExecutor() : progress.executor) };
}

function buildModelAndMatrix(
  docs: readonly DocTerms[],
  vocabSize: number,
  settings: IndexSettings,
  progress: BuildProgress,
): { model: ConceptModel; matrix: CsrMatrix } {
  if (docs.length === 0) throw new EmptyCorpusError('There are no files to index.');
  const pruned = pruneVocabulary(docs, vocabSize, settings.prune);
  const m = pruned.keptIds.length;
  if (m === 0) throw new EmptyCorpusError('The files contain no indexable words.');
  progress.onProgress?.('weighting', 0, 1);
  const weights = globalWeights(docs, pruned.columnOf, m, settings.weighting);
  const { matrix, frobeniusSquared: frob } = weightedMatrix(docs, pruned.columnOf, weights, settings.weighting);
  const { indptr } = matrix;
  const nnz = matrix.indices.length;
  if (nnz === 0) throw new EmptyCorpusError('After weighting, no file has an indexable word.');
  progress.onWeighted?.(docs);
  progress.onProgress?.('weighting', 1, 1);
  if (progress.signal?.aborted) throw new CancelledError();

  const kChoice = chooseK(settings.k, docs.length, m);
  let part: SvdSmallSide;
  try {
    part = svdPasses(matrix, kChoice.k, settings, progress);
  } catch (err) {
    dropParkedMatrix(matrix);
    throw err;
  }
  let svd: SvdResult<Float32Array>;
  try {
    // The passes' executor goes first (with the memory it grew to), then the entries come back
    // from the spill (when they were parked) for the big side and the projection.
    const executor = progress.freshExecutor ? progress.freshExecutor() : progress.executor;
    unparkMatrix(matrix);
    // The model stores f32 term vectors: rounding on the way out of the executor's memory saves
    // the f64 copy at the build's memory peak.
    svd = finishSvd(matrix, part, { executor, factors: 'f32' });
  } finally {
    dropSmallSide(part);
  }
  const k = svd.k;
  const termVectors = svd.v;
  const axisScale = Float64Array.from(svd.s, (s) => (s > 0 ? Math.pow(s, settings.conceptScaling - 1) : 0));
  // Residual of build documents: ‖U_kᵀd̂‖² = Σ_c (σ_c v_ic)² for a unit row d̂ of the matrix.
  let residualSum = 0;
  let counted = 0;
  for (let i = 0; i < docs.length; i++) {
    if (indptr[i + 1] === indptr[i]) continue;
    let inside = 0;
    for (let c = 0; c < k; c++) inside += (svd.s[c] * svd.u[i * k + c]) ** 2;
    residualSum += Math.max(0, 1 - inside);
    counted++;
  }
  const model: ConceptModel = {
    scheme: settings.weighting,
    k,
    kChoice,
    keptIds: pruned.keptIds,
    columnOf: pruned.columnOf,
    weights,
    termVectors,
    singularValues: svd.s,
    axisScale,
    frobeniusSquared: frob,
    residualMean: counted > 0 ? residualSum / counted : 0,
    pruneRelaxed: pruned.relaxed,
    nonZeros: nnz,
  };
  return { model, matrix };
}

/**
 * The SVD's passes over the matrix, in a function of their own: nothing of this frame (the
 * options naming the first executor) outlives them, so freshExecutor can let that executor go.
 */
function svdPasses(matrix: CsrMatrix, k: number, settings: IndexSettings, progress: BuildProgress): SvdSmallSide {
  return randomizedSvdSmallSide(matrix, {
    k,
    seed: settings.seed,
    powerIterations: settings.powerIterations,
    signal: progress.signal,
    executor: progress.executor,
    onProgress: (done, total) => progress.onProgress?.('svd', done, total),
    onCopied: progress.spill
      ? () => void (parkMatrix(matrix, progress.spill!, progress.parkFromBytes) && progress.onParked?.())
      : undefined,
    // QW waits in a scratch file from the end of the passes to the big side.
    spill: progress.spill,
  });
}

/**
 * projectTerms(model, row).vector for every row of a weighted matrix built with the model's
 * weights: U_kᵀd̂ by the executor's sequential sparse product (each row adds its terms one at a
 * time, in order, as projectTerms does, so the bits agree), then the same axis scaling and
 * normalisation (the executor's unitRows) into the f32 result. The rows go to the executor in
 * blocks of about rowBytes of f64 sums and their f32 unit rows (each row's own CSR entries copied
 * beside them as f64), the term vectors in blocks of columns of at most blockBytes as f64, or
 * whole as f32 when the rows take several blocks (wholeTermVectorsForProjection): each output
 * number is the same sum whatever the blocks, so the bits do not change. Neither an f64
 * copy of the whole matrix (175 MB on the Linux tree's 14.6 M entries) nor all n × k f64 sums
 * (181 MB at 78,301 files and k = 289) is ever held, nor one f64 copy of all term vectors
 * (terms × k × 8 bytes: 231 MB on 100,000 terms at k = 289).
 */
export function projectMatrixRows(
  model: ConceptModel,
  matrix: CsrMatrix,
  executor?: MatrixExecutor,
  blockBytes = PROJECTION_BLOCK_BYTES,
  rowBytes = PROJECTION_ROW_BYTES,
): Float32Array {
  const ex = executor ?? createWasmExecutor() ?? serialExecutor;
  const k = model.k;
  const n = matrix.rows;
  const terms = matrix.cols;
  const out = new Float32Array(n * k);
  const width = Math.max(1, Math.min(k, Math.floor(blockBytes / (8 * Math.max(1, terms)))));
  // Each row: k f64 sums and, once scaled and normalised in the executor's memory, k f32 numbers.
  const rowsPer = Math.max(1, Math.floor(rowBytes / (12 * Math.max(1, k))));
  // U_k whole as f32 (read where it lies by the sequential product: the same sums) when the rows
  // take several blocks, each of which would gather all of U_k into f64 blocks again
  // (wholeTermVectorsForProjection); the serial executor reads the model's own array.
  const whole = ex === serialExecutor ? model.termVectors : wholeTermVectorsForProjection(n, rowsPer) ? ex.float32(terms * k) : undefined;
  if (whole && whole !== model.termVectors) whole.set(model.termVectors.subarray(0, terms * k));
  for (let r0 = 0; r0 < n; r0 += rowsPer) {
    const r1 = Math.min(n, r0 + rowsPer);
    const run = (): void => {
      const block = csrRows(matrix, r0, r1);
      // In the executor's memory: after an SVD, memory it has already grown to and no longer uses.
      const m = ex === serialExecutor ? block : copyCsr(block, ex, 'f64');
      const acc = ex.float64((r1 - r0) * k);
      if (whole) ex.spmm(m, whole, k, acc, true);
      else blockedTermProduct(ex, m, model.termVectors, k, width, ex.float64(terms * width), ex.float64((r1 - r0) * width), acc);
      ex.unitRows(acc, r1 - r0, k, model.axisScale, out.subarray(r0 * k, r1 * k));
    };
    if (ex.scoped) ex.scoped(run);
    else run();
  }
  return out;
}

/**
 * Whether the files' projection gives the executor one f32 copy of U_k rather than f64 column
 * blocks gathered for each block of rows: when there are several blocks of rows, whose gathers
 * would add up to more than one copy (on the whole Linux tree, 9 blocks gathered 100,000 term rows
 * × 289 numbers each, 2.1 s on the calling thread). With one block, the blocks cost one gather
 * and less memory (the Documentation folder's 8,863 files). Our rule, from that cost, not tuned.
 */
export function wholeTermVectorsForProjection(rows: number, rowsPerBlock: number): boolean {
  return rows > rowsPerBlock;
}

/**
 * Bytes of f64 sums (and their f32 unit rows) of the files' projection held at once (our choice: a
 * few blocks of rows on the Linux tree, so the term vectors are put into f64 blocks a few times
 * over, not once per file).
 */
export const PROJECTION_ROW_BYTES = 32 * 1024 * 1024;

/**
 * acc (m.rows × k) = m · termVectors (terms × k), the term vectors handed to the executor in
 * column blocks of `width` through tv (m.cols × width) and part (m.rows × width): each output
 * column is the same sum whatever the block, so the bits do not depend on the width. With
 * termOf, column t of m is row termOf[t] of termVectors (a matrix whose columns were renumbered
 * to the terms it uses: only those rows are gathered; the sums are the same, term for term).
 */
export function blockedTermProduct(
  ex: MatrixExecutor,
  m: CsrMatrix,
  termVectors: ArrayLike<number>,
  k: number,
  width: number,
  tv: Float64Array,
  part: Float64Array,
  acc: Float64Array,
  termOf?: Int32Array,
): void {
  const terms = m.cols;
  const n = m.rows;
  for (let c0 = 0; c0 < k; c0 += width) {
    const w = Math.min(width, k - c0);
    const tvw = tv.subarray(0, terms * w);
    for (let t = 0, d = 0; t < terms; t++) {
      const src = (termOf ? termOf[t] : t) * k + c0;
      for (let j = 0; j < w; j++) tvw[d++] = termVectors[src + j];
    }
    const pw = part.subarray(0, n * w);
    ex.spmm(m, tvw, w, pw, true);
    for (let i = 0; i < n; i++) for (let j = 0; j < w; j++) acc[i * k + c0 + j] = pw[i * w + j];
  }
}

/**
 * Bytes of f64 term vectors handed to the executor at once (our choice: 10 column blocks at k = 200
 * on 50k terms; 8 MB rather than 16 left the build's peak 8 MB lower at the same bits).
 */
export const PROJECTION_BLOCK_BYTES = 8 * 1024 * 1024;

/**
 * The weighted, document-normalised matrix in document-major CSR form (row i = document i,
 * column c = model column c): the transpose of the term-document matrix A. Each row holds the
 * numbers weightDocument gives that document, computed straight into the matrix's arrays: a
 * first pass counts each row's entries, so no document gets arrays of its own (on a large tree,
 * tens of thousands of small arrays left the allocator's heap full of holes once they went).
 */
export function weightedMatrix(
  docs: readonly DocTerms[],
  columnOf: Int32Array,
  weights: Float64Array,
  scheme: WeightingScheme,
): { matrix: CsrMatrix; frobeniusSquared: number } {
  const known = columnOf.length;
  const indptr = new Int32Array(docs.length + 1);
  for (let r = 0; r < docs.length; r++) {
    const { termIds, counts } = docs[r];
    let n = 0;
    for (let i = 0; i < termIds.length; i++) {
      const id = termIds[i];
      const c = id < known ? columnOf[id] : -1;
      if (c >= 0 && localWeight(counts[i], scheme) * weights[c] !== 0) n++;
    }
    indptr[r + 1] = indptr[r] + n;
  }
  const nnz = indptr[docs.length];
  const indices = new Int32Array(nnz);
  const values = new Float64Array(nnz);
  let frob = 0;
  for (let r = 0; r < docs.length; r++) {
    const { termIds, counts } = docs[r];
    const start = indptr[r];
    const end = weightRowInto(termIds, counts, 0, termIds.length, columnOf, weights, scheme, indices, values, start);
    if (end !== indptr[r + 1]) throw new Error('a weighted row changed length between the two passes (a bug)');
    for (let q = start; q < end; q++) frob += values[q] * values[q];
  }
  return { matrix: { rows: docs.length, cols: weights.length, indptr, indices, values }, frobeniusSquared: frob };
}

/** The weighted matrix of an index's current documents under its frozen model (holes skipped). */
export function modelMatrix(model: ConceptModel, docs: readonly DocTerms[]): CsrMatrix {
  return weightedMatrix(docs, model.columnOf, model.weights, model.scheme).matrix;
}

/**
 * Folds a document or query into the concept space with the model's frozen weights; `scale`, when
 * given, multiplies each term's weight (by vocabulary id) before the fold (query-term weighting).
 */
export function projectTerms(model: ConceptModel, terms: DocTerms, scale?: (termId: number) => number): Projection {
  const w = weightDocument(terms, model.columnOf, model.weights, model.scheme);
  const k = model.k;
  // Read once: a reopened model's termVectors is an accessor until filled (persist.ts), and a
  // property read per multiply-add cost most of a fold's time.
  const termVectors = model.termVectors;
  const axisScale = model.axisScale;
  const acc = new Float64Array(k);
  for (let i = 0; i < w.columns.length; i++) {
    const v = scale ? w.values[i] * scale(model.keptIds[w.columns[i]]) : w.values[i];
    const o = w.columns[i] * k;
    for (let c = 0; c < k; c++) acc[c] += v * termVectors[o + c];
  }
  let inside = 0;
  for (let c = 0; c < k; c++) inside += acc[c] * acc[c];
  let ss = 0;
  for (let c = 0; c < k; c++) {
    acc[c] *= axisScale[c];
    ss += acc[c] * acc[c];
  }
  const norm = Math.sqrt(ss);
  const vector = new Float32Array(k);
  if (norm > 0) for (let c = 0; c < k; c++) vector[c] = acc[c] / norm;
  return { vector, residual: w.columns.length > 0 ? Math.max(0, 1 - inside) : 1, knownTerms: w.columns.length };
}
