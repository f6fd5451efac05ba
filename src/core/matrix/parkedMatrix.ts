/**
 * A CSR matrix's entries (column indices and values) parked in a spill while nothing reads them:
 * the SVD's passes run on the executor's own copy of the weighted matrix, and the caller's arrays
 * (175 MB on the Linux tree: 14.6 M entries of i32 and f64) are needed again only for the big-side
 * vectors and the files' projection. parkMatrix writes them and puts empty arrays in their place
 * (the same object: whoever holds the matrix sees them come back); unparkMatrix reads them back,
 * the same bits, and gives the spill back. A failed write leaves the matrix as it was.
 */
import type { ByteSpill, OpenSpill } from '../sections/types.js';
import type { CsrMatrix } from './sparse.js';

/** Park from this many bytes of entries on (below it the file costs more than it saves; a round number, not tuned). */
export const PARK_MATRIX_FROM_BYTES = 64 * 1024 * 1024;

/** Bytes per read or write call (below the 2 GB a single call may move). */
const RUN_BYTES = 256 * 1024 * 1024;

type Swappable = { indices: Int32Array; values: Float64Array | Float32Array };

const parked = new WeakMap<CsrMatrix, { spill: ByteSpill; length: number; f32: boolean }>();

/** Parks the entries of m in a spill from `open`; false (m as it was) below fromBytes or without a spill. */
export function parkMatrix(m: CsrMatrix, open: OpenSpill, fromBytes = PARK_MATRIX_FROM_BYTES): boolean {
  const length = m.indices.length;
  if (parked.has(m) || length !== m.values.length || length * (4 + m.values.BYTES_PER_ELEMENT) < fromBytes) return false;
  const spill = open();
  if (!spill) return false;
  try {
    writeInRuns(spill, m.indices, 0);
    writeInRuns(spill, m.values, 4 * length);
  } catch (err) {
    spill.close();
    throw err;
  }
  const f32 = m.values instanceof Float32Array;
  parked.set(m, { spill, length, f32 });
  const s = m as unknown as Swappable;
  s.indices = new Int32Array(0);
  s.values = f32 ? new Float32Array(0) : new Float64Array(0);
  return true;
}

/** Reads parked entries back into m (nothing when they were not parked) and gives the spill back. */
export function unparkMatrix(m: CsrMatrix): void {
  const p = parked.get(m);
  if (!p) return;
  parked.delete(m);
  try {
    const indices = new Int32Array(p.length);
    const values = p.f32 ? new Float32Array(p.length) : new Float64Array(p.length);
    readInRuns(p.spill, indices, 0);
    readInRuns(p.spill, values, 4 * p.length);
    const s = m as unknown as Swappable;
    s.indices = indices;
    s.values = values;
  } finally {
    p.spill.close();
  }
}

/** Gives the spill of a parked matrix back without reading it (a failed or cancelled build). */
export function dropParkedMatrix(m: CsrMatrix): void {
  parked.get(m)?.spill.close();
  parked.delete(m);
}

/** Writes an array's bytes to a spill from `position` on, in calls of at most RUN_BYTES. */
export function writeInRuns(spill: ByteSpill, a: ArrayBufferView, position: number): void {
  const bytes = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  for (let from = 0; from < bytes.length; from += RUN_BYTES)
    spill.write(bytes.subarray(from, Math.min(bytes.length, from + RUN_BYTES)), position + from);
}

/** Fills an array's bytes from a spill from `position` on, in calls of at most RUN_BYTES. */
export function readInRuns(spill: ByteSpill, into: ArrayBufferView, position: number): void {
  const bytes = new Uint8Array(into.buffer, into.byteOffset, into.byteLength);
  for (let from = 0; from < bytes.length; from += RUN_BYTES)
    spill.read(bytes.subarray(from, Math.min(bytes.length, from + RUN_BYTES)), position + from);
}
