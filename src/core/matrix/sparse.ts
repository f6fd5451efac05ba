/**
 * Compressed sparse row matrices on typed arrays, and the two products the SVD needs.
 *
 * The index keeps its weighted matrix document-major: row i of a DocTermMatrix is document i,
 * column j is term j (that is, the transpose of the usual term×document matrix A). Dense blocks
 * are row-major Float64Array with an explicit column count.
 */
import { InvalidInputError } from '../errors.js';

export interface CsrMatrix {
  readonly rows: number;
  readonly cols: number;
  /** rows + 1 offsets into indices/values. */
  readonly indptr: Int32Array;
  /** Column index of each stored entry, ascending within a row. */
  readonly indices: Int32Array;
  readonly values: Float64Array | Float32Array;
}

/** A dense row-major block: rows × cols numbers in data. */
export interface DenseBlock {
  readonly rows: number;
  readonly cols: number;
  readonly data: Float64Array;
}

export function denseBlock(rows: number, cols: number, data?: Float64Array): DenseBlock {
  const d = data ?? new Float64Array(rows * cols);
  if (d.length !== rows * cols) throw new InvalidInputError(`dense block needs ${rows * cols} numbers, got ${d.length}`);
  return { rows, cols, data: d };
}

export function checkCsr(m: CsrMatrix): void {
  if (m.indptr.length !== m.rows + 1) throw new InvalidInputError('CSR indptr must have rows + 1 entries');
  if (m.indptr[0] !== 0 || m.indptr[m.rows] !== m.indices.length || m.indices.length !== m.values.length) {
    throw new InvalidInputError('CSR offsets do not match the stored entries');
  }
}

/** Y = M · X, where M is rows×cols sparse and X is cols×l dense. Y is rows×l. */
export function csrTimesDense(m: CsrMatrix, x: DenseBlock, out?: DenseBlock): DenseBlock {
  if (x.rows !== m.cols) throw new InvalidInputError(`shape mismatch: ${m.rows}x${m.cols} times ${x.rows}x${x.cols}`);
  const l = x.cols;
  const y = out ?? denseBlock(m.rows, l);
  const yd = y.data;
  const xd = x.data;
  const { indptr, indices, values } = m;
  yd.fill(0);
  for (let i = 0; i < m.rows; i++) {
    const yo = i * l;
    for (let p = indptr[i]; p < indptr[i + 1]; p++) {
      const v = values[p];
      const xo = indices[p] * l;
      for (let c = 0; c < l; c++) yd[yo + c] += v * xd[xo + c];
    }
  }
  return y;
}

/** Y = Mᵀ · X, where M is rows×cols sparse and X is rows×l dense. Y is cols×l. */
export function csrTransposeTimesDense(m: CsrMatrix, x: DenseBlock, out?: DenseBlock): DenseBlock {
  if (x.rows !== m.rows) throw new InvalidInputError(`shape mismatch: (${m.rows}x${m.cols})ᵀ times ${x.rows}x${x.cols}`);
  const l = x.cols;
  const y = out ?? denseBlock(m.cols, l);
  const yd = y.data;
  const xd = x.data;
  const { indptr, indices, values } = m;
  yd.fill(0);
  for (let i = 0; i < m.rows; i++) {
    const xo = i * l;
    for (let p = indptr[i]; p < indptr[i + 1]; p++) {
      const v = values[p];
      const yo = indices[p] * l;
      for (let c = 0; c < l; c++) yd[yo + c] += v * xd[xo + c];
    }
  }
  return y;
}

/** Allocators for the arrays of a CSR copy (shared memory when an executor provides it). */
export interface CsrAllocator {
  int32(length: number): Int32Array;
  float64(length: number): Float64Array;
  float32(length: number): Float32Array;
}

const PLAIN_ALLOCATOR: CsrAllocator = {
  int32: (n) => new Int32Array(n),
  float64: (n) => new Float64Array(n),
  float32: (n) => new Float32Array(n),
};

/**
 * The transpose of a CSR matrix, again in CSR form (a counting sort; column order kept). Values
 * keep their element type unless valueType says otherwise.
 */
export function transposeCsr(m: CsrMatrix, alloc: CsrAllocator = PLAIN_ALLOCATOR, valueType?: 'f32' | 'f64'): CsrMatrix {
  const nnz = m.indptr[m.rows];
  const indptr = alloc.int32(m.cols + 1);
  for (let p = 0; p < nnz; p++) indptr[m.indices[p] + 1]++;
  for (let j = 0; j < m.cols; j++) indptr[j + 1] += indptr[j];
  const indices = alloc.int32(nnz);
  const f32 = valueType ? valueType === 'f32' : m.values instanceof Float32Array;
  const values = f32 ? alloc.float32(nnz) : alloc.float64(nnz);
  const next = indptr.slice(0, m.cols);
  for (let i = 0; i < m.rows; i++) {
    for (let p = m.indptr[i]; p < m.indptr[i + 1]; p++) {
      const q = next[m.indices[p]]++;
      indices[q] = i;
      values[q] = m.values[p];
    }
  }
  return { rows: m.cols, cols: m.rows, indptr, indices, values };
}

/** A copy of a CSR matrix in arrays from alloc (values converted to valueType). */
export function copyCsr(m: CsrMatrix, alloc: CsrAllocator, valueType: 'f32' | 'f64'): CsrMatrix {
  const nnz = m.indptr[m.rows];
  const indptr = alloc.int32(m.rows + 1);
  indptr.set(m.indptr);
  const indices = alloc.int32(nnz);
  indices.set(m.indices.subarray(0, nnz));
  const values = valueType === 'f32' ? alloc.float32(nnz) : alloc.float64(nnz);
  values.set(m.values.subarray(0, nnz));
  return { rows: m.rows, cols: m.cols, indptr, indices, values };
}

/** Rows [r0, r1) of a CSR matrix as a CSR matrix of their own (views of its entries, offsets from 0). */
export function csrRows(m: CsrMatrix, r0: number, r1: number): CsrMatrix {
  const p0 = m.indptr[r0];
  const p1 = m.indptr[r1];
  const indptr = new Int32Array(r1 - r0 + 1);
  for (let i = 0; i <= r1 - r0; i++) indptr[i] = m.indptr[r0 + i] - p0;
  return { rows: r1 - r0, cols: m.cols, indptr, indices: m.indices.subarray(p0, p1), values: m.values.subarray(p0, p1) };
}

/** Builds a CSR matrix from a dense row-major array (tests and small examples). */
export function csrFromDense(rows: number, cols: number, data: ArrayLike<number>): CsrMatrix {
  const indptr = new Int32Array(rows + 1);
  const idx: number[] = [];
  const val: number[] = [];
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < cols; j++) {
      const v = data[i * cols + j];
      if (v !== 0) {
        idx.push(j);
        val.push(v);
      }
    }
    indptr[i + 1] = idx.length;
  }
  return { rows, cols, indptr, indices: Int32Array.from(idx), values: Float64Array.from(val) };
}

/** Squared Frobenius norm of a sparse matrix. */
export function csrFrobeniusSquared(m: CsrMatrix): number {
  let s = 0;
  for (let p = 0; p < m.values.length; p++) s += m.values[p] * m.values[p];
  return s;
}
