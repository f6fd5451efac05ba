/**
 * A concept model from singular factors computed elsewhere (for example by a cluster engine from
 * the Matrix Market export), for the same weighted term-document matrix A = U Σ Vᵀ (terms ×
 * documents): U is terms × k, Σ holds k values, V is documents × k. The factors are checked before
 * they replace the model's own:
 *   - shapes against the model's terms and the index's documents;
 *   - finite values, σ ≥ 0; columns are put in descending σ order (ARPACK returns ascending);
 *   - U orthonormal (max |UᵀU − I| ≤ ORTHO_TOLERANCE), since documents and queries are folded in
 *     as Uᵀd;
 *   - fit: ‖AᵀU − VΣ‖_F/‖Σ‖_F and ‖AV − UΣ‖_F/‖Σ‖_F, the smaller at most FIT_TOLERANCE, so
 *     factors of another matrix (or in another row order) are refused. Exact solvers give ≈1e-6;
 *     randomized ones are exact on one side (Halko et al. 2011, Alg. 5.1).
 * The sign convention of randomizedSvd (largest |entry| of each term vector positive) is applied.
 */
import { InvalidInputError } from '../../errors.js';
import type { ConceptModel } from './conceptModel.js';
import { serialExecutor } from '../../matrix/executor.js';
import { transposeCsr, type CsrMatrix } from '../../matrix/sparse.js';
import { flipSigns } from '../../svd/randomizedSvd.js';

/** Largest tolerated |UᵀU − I| entry (common practice for factors stored in text: ~1e-6 is typical). */
export const ORTHO_TOLERANCE = 1e-4;
/** Largest tolerated relative residual of the better-fitting side (our choice: mismatches give ≈1). */
export const FIT_TOLERANCE = 0.1;

export interface ExternalFactors {
  readonly k: number;
  /** terms × k, row-major. */
  readonly u: Float64Array;
  readonly s: Float64Array;
  /** documents × k, row-major. */
  readonly v: Float64Array;
}

export interface FactorReport {
  readonly k: number;
  readonly orthogonalityError: number;
  /** ‖AᵀU − VΣ‖_F / ‖Σ‖_F (document side). */
  readonly documentResidual: number;
  /** ‖AV − UΣ‖_F / ‖Σ‖_F (term side). */
  readonly termResidual: number;
}

/**
 * @param matrix the weighted document-major matrix (documents × terms, Aᵀ) the factors belong to.
 * @param conceptScaling the index's exponent α (axis scale σ^{α−1}).
 */
export function modelFromFactors(
  model: ConceptModel,
  matrix: CsrMatrix,
  f: ExternalFactors,
  conceptScaling: number,
): { model: ConceptModel; report: FactorReport } {
  const terms = matrix.cols;
  const docs = matrix.rows;
  const k = f.k;
  if (!(k >= 1) || f.s.length !== k) throw new InvalidInputError(`S holds ${f.s.length} values but U and V have ${k} columns`);
  if (f.u.length !== terms * k) throw new InvalidInputError(`U must have ${terms} rows (one per term of the model) and ${k} columns`);
  if (f.v.length !== docs * k) throw new InvalidInputError(`V must have ${docs} rows (one per indexed file) and ${k} columns`);
  if (k > Math.min(terms, docs)) throw new InvalidInputError(`k = ${k} exceeds what a ${terms}×${docs} matrix allows`);
  for (const [name, arr] of [
    ['U', f.u],
    ['S', f.s],
    ['V', f.v],
  ] as const) {
    for (let i = 0; i < arr.length; i++)
      if (!Number.isFinite(arr[i])) throw new InvalidInputError(`${name} holds a value that is not a finite number`);
  }
  for (let c = 0; c < k; c++) if (f.s[c] < 0) throw new InvalidInputError('singular values must be ≥ 0');
  const order = Array.from({ length: k }, (_, c) => c).sort((a, b) => f.s[b] - f.s[a] || a - b);
  const s = Float64Array.from(order, (c) => f.s[c]);
  const u = permuteColumns(f.u, terms, k, order);
  const v = permuteColumns(f.v, docs, k, order);
  flipSigns({ rows: docs, cols: k, data: v }, { rows: terms, cols: k, data: u });

  const utu = serialExecutor.cross(u, u, terms, k);
  let ortho = 0;
  for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) ortho = Math.max(ortho, Math.abs(utu[a * k + b] - (a === b ? 1 : 0)));
  if (ortho > ORTHO_TOLERANCE)
    throw new InvalidInputError(`the columns of U are not orthonormal (largest |UᵀU − I| entry ${ortho.toExponential(2)})`);

  // Aᵀ U (documents × k) is M U for the document-major M; A V is Mᵀ V.
  const mu = new Float64Array(docs * k);
  serialExecutor.spmm(matrix, u, k, mu);
  const mtv = new Float64Array(terms * k);
  serialExecutor.spmm(transposeCsr(matrix), v, k, mtv);
  let norm = 0;
  for (let c = 0; c < k; c++) norm += s[c] * s[c];
  const residual = (prod: Float64Array, other: Float64Array, rows: number): number => {
    let r = 0;
    for (let i = 0; i < rows; i++) for (let c = 0; c < k; c++) r += (prod[i * k + c] - other[i * k + c] * s[c]) ** 2;
    return norm > 0 ? Math.sqrt(r / norm) : Math.sqrt(r);
  };
  const report: FactorReport = {
    k,
    orthogonalityError: ortho,
    documentResidual: residual(mu, v, docs),
    termResidual: residual(mtv, u, terms),
  };
  const fit = Math.min(report.documentResidual, report.termResidual);
  if (!(fit <= FIT_TOLERANCE)) {
    throw new InvalidInputError(
      `the factors do not fit this index's matrix (relative residual ${fit.toExponential(2)}); were they computed from this export, with rows in the same order?`,
    );
  }

  // Residual of build documents: 1 − ‖Uᵀd̂‖² for each unit row d̂ (empty rows skipped).
  let residualSum = 0;
  let counted = 0;
  for (let i = 0; i < docs; i++) {
    if (matrix.indptr[i + 1] === matrix.indptr[i]) continue;
    let inside = 0;
    for (let c = 0; c < k; c++) inside += mu[i * k + c] ** 2;
    residualSum += Math.max(0, 1 - inside);
    counted++;
  }
  const next: ConceptModel = {
    ...model,
    k,
    kChoice: { k, requested: k, clamped: false },
    termVectors: Float32Array.from(u),
    singularValues: s,
    axisScale: Float64Array.from(s, (x) => (x > 0 ? Math.pow(x, conceptScaling - 1) : 0)),
    residualMean: counted > 0 ? residualSum / counted : 0,
  };
  return { model: next, report };
}

function permuteColumns(a: Float64Array, rows: number, k: number, order: readonly number[]): Float64Array {
  const out = new Float64Array(rows * k);
  for (let i = 0; i < rows; i++) for (let c = 0; c < k; c++) out[i * k + c] = a[i * k + order[c]];
  return out;
}
