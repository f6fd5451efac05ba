/**
 * CUR decomposition A ≈ C·U·R from actual columns and rows of a sparse matrix (Mahoney & Drineas
 * 2009, PNAS 106(3):697–702; Drineas, Mahoney & Muthukrishnan 2008, SIMAX 30(2)).
 *
 * 1. Top-k singular vectors of A (given, or by randomizedSvd); k is cut to the numerical rank.
 * 2. Leverage scores of columns (from V_k) and rows (from U_k) (leverage.ts).
 * 3. Selection, one of:
 *    - 'deim' (default; Sorensen & Embree 2016, deim.ts) or 'pivoted-qr' (pivotedQr.ts): k
 *      deterministic picks on each side, padded with the top leverage scores to 2k (our choice);
 *    - 'column-select' (PNAS ColumnSelect) or 'with-replacement' (DMM 2008): leverage sampling with
 *      c = ⌈k·max(1, ln k)/ε²⌉ on both sides, the published bound being
 *      ‖A − CUR‖_F ≤ (2 + ε)·‖A − A_k‖_F with high probability (PNAS).
 * 4. U = C⁺AR⁺ and the errors (curMiddle.ts), reported against the rank-k tail
 *    ‖A − A_k‖²_F = ‖A‖²_F − Σ_{i≤k} σ_i². With a randomized SVD each σ_i is a lower bound on the
 *    true one, so this tail is an upper bound and the ratio can only be understated slightly.
 * Defaults: rank 10 (our choice), ε = 1 (Orange3's default), seed DEFAULT_SEED.
 * Orientation: for the index's document-major matrix, rows are files and columns are terms.
 */
import { InvalidInputError } from '../errors.js';
import type { CsrMatrix } from '../matrix/sparse.js';
import { createRandom, DEFAULT_SEED } from '../random.js';
import { randomizedSvd, type SvdResult } from '../svd/randomizedSvd.js';
import { curFactors } from './curMiddle.js';
import { deimIndices } from './deim.js';
import { columnSelect, leverageScores, padWithLeverage, sampleSize, sampleWithReplacement, type Picks } from './leverage.js';
import { pivotedQrIndices } from './pivotedQr.js';

export type CurMethod = 'deim' | 'pivoted-qr' | 'column-select' | 'with-replacement';
export const CUR_METHODS: readonly CurMethod[] = ['deim', 'pivoted-qr', 'column-select', 'with-replacement'];

export interface CurOptions {
  /** Rank k of the leverage scores and of the reference error. @default 10 */
  rank: number;
  /** @default 'deim' */
  method: CurMethod;
  /** Accuracy ε of the sampling methods (sets c). @default 1 */
  epsilon: number;
  /** Columns wanted: deterministic padding target (default 2k) or sample size c (default from ε). */
  columnCount?: number;
  /** Rows wanted, as columnCount. */
  rowCount?: number;
  /** @default DEFAULT_SEED */
  seed: number;
  /** Compute ‖A − CC⁺A‖ (error.columnsOnly; NaN when false). @default true */
  columnError: boolean;
}

export const DEFAULT_CUR_OPTIONS: Readonly<CurOptions> = Object.freeze({
  rank: 10,
  method: 'deim',
  epsilon: 1,
  seed: DEFAULT_SEED,
  columnError: true,
});

export interface CurError {
  /** ‖A − CUR‖_F. */
  readonly frobenius: number;
  /** ‖A − CC⁺A‖_F (the chosen columns alone; NaN when options.columnError is false). */
  readonly columnsOnly: number;
  /** ‖A − A_k‖_F, the best rank-k error (from the singular values). */
  readonly rankTail: number;
  /** frobenius / rankTail; null when A has rank ≤ k (tail zero). */
  readonly ratio: number | null;
  /** ‖A‖_F. */
  readonly matrixNorm: number;
}

export interface CurResult {
  readonly method: CurMethod;
  /** Rank actually used (the requested rank cut to the matrix's numerical rank). */
  readonly rank: number;
  readonly columns: Picks;
  readonly rows: Picks;
  /** Leverage score of every column and every row (each sums to 1). */
  readonly columnLeverage: Float64Array;
  readonly rowLeverage: Float64Array;
  /** U (columns.indices.length × rows.indices.length, row-major). */
  readonly middle: Float64Array;
  readonly error: CurError;
}

export function curDecomposition(a: CsrMatrix, options: Partial<CurOptions> = {}, svd?: SvdResult): CurResult {
  const o = { ...DEFAULT_CUR_OPTIONS, ...options };
  if (!CUR_METHODS.includes(o.method))
    throw new InvalidInputError(`CUR method must be one of ${CUR_METHODS.join(', ')}, got "${String(o.method)}"`);
  if (!Number.isInteger(o.rank) || o.rank < 1) throw new InvalidInputError(`CUR rank must be a positive whole number, got ${o.rank}`);
  if (a.rows === 0 || a.cols === 0 || a.values.length === 0)
    throw new InvalidInputError('CUR needs a matrix with at least one non-zero entry');
  const want = Math.min(o.rank, a.rows, a.cols);
  const f = svd && svd.k >= want && svd.rows === a.rows && svd.cols === a.cols ? svd : randomizedSvd(a, { k: want, seed: o.seed });
  let k = Math.min(want, f.k);
  while (k > 1 && !(f.s[k - 1] > f.s[0] * 1e-10)) k--;
  const colLev = leverageScores(f.v, a.cols, f.k, k);
  const rowLev = leverageScores(f.u, a.rows, f.k, k);
  const random = createRandom(o.seed);
  let columns: Picks;
  let rows: Picks;
  if (o.method === 'deim' || o.method === 'pivoted-qr') {
    const pick = o.method === 'deim' ? deimIndices : pivotedQrIndices;
    columns = padWithLeverage(pick(f.v, a.cols, f.k, k), colLev, Math.min(a.cols, o.columnCount ?? 2 * k));
    rows = padWithLeverage(pick(f.u, a.rows, f.k, k), rowLev, Math.min(a.rows, o.rowCount ?? 2 * k));
  } else {
    const sample = o.method === 'column-select' ? columnSelect : sampleWithReplacement;
    columns = sample(colLev, o.columnCount ?? sampleSize(k, o.epsilon), random);
    rows = sample(rowLev, o.rowCount ?? sampleSize(k, o.epsilon), random);
  }
  const fac = curFactors(a, columns, rows, o.columnError);
  let top = 0;
  for (let i = 0; i < k; i++) top += f.s[i] * f.s[i];
  const tailSquared = Math.max(0, fac.frobeniusSquared - top);
  const frobenius = Math.sqrt(fac.errorSquared);
  const rankTail = Math.sqrt(tailSquared);
  return {
    method: o.method,
    rank: k,
    columns,
    rows,
    columnLeverage: colLev,
    rowLeverage: rowLev,
    middle: fac.middle,
    error: {
      frobenius,
      columnsOnly: Math.sqrt(fac.columnErrorSquared),
      rankTail,
      ratio: tailSquared > 1e-12 * fac.frobeniusSquared ? frobenius / rankTail : null,
      matrixNorm: Math.sqrt(fac.frobeniusSquared),
    },
  };
}
