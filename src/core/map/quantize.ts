/**
 * Symmetric int8 quantisation per row, for embedding vectors in the standalone map: row i is
 * stored as round(127·x/max|x_i|) with scale max|x_i|/127, so each entry is off by at most half
 * a step (scale/2) and a row's direction survives to about 1e-2 relative error (common practice
 * for embedding storage). Rows of zeros get scale 0.
 */
import { InvalidInputError } from '../errors.js';
import { base64ToFloat32, decodeBase64, encodeBase64, float32ToBase64 } from './base64.js';

export interface QuantizedRows {
  readonly rows: number;
  readonly cols: number;
  readonly values: Int8Array;
  readonly scales: Float32Array;
}

/** JSON form: both arrays as base64. */
export interface QuantizedRowsData {
  readonly rows: number;
  readonly cols: number;
  readonly values: string;
  readonly scales: string;
}

export function quantizeRows(data: ArrayLike<number>, rows: number, cols: number): QuantizedRows {
  if (data.length !== rows * cols) throw new InvalidInputError(`expected ${rows}×${cols} numbers, got ${data.length}`);
  const values = new Int8Array(rows * cols);
  const scales = new Float32Array(rows);
  for (let r = 0; r < rows; r++) {
    const o = r * cols;
    let big = 0;
    for (let c = 0; c < cols; c++) big = Math.max(big, Math.abs(data[o + c]));
    if (big === 0) continue;
    scales[r] = big / 127;
    const f = 127 / big;
    for (let c = 0; c < cols; c++) values[o + c] = Math.round(data[o + c] * f);
  }
  return { rows, cols, values, scales };
}

/** Row r back in floating point, into out (cols numbers). */
export function dequantizeRow(q: QuantizedRows, r: number, out: Float32Array | Float64Array): void {
  const s = q.scales[r];
  const o = r * q.cols;
  for (let c = 0; c < q.cols; c++) out[c] = q.values[o + c] * s;
}

export function encodeQuantizedRows(q: QuantizedRows): QuantizedRowsData {
  const bytes = new Uint8Array(q.values.buffer, q.values.byteOffset, q.values.byteLength);
  return { rows: q.rows, cols: q.cols, values: encodeBase64(bytes), scales: float32ToBase64(q.scales) };
}

export function decodeQuantizedRows(d: QuantizedRowsData): QuantizedRows {
  const bytes = decodeBase64(d.values);
  const scales = base64ToFloat32(d.scales);
  if (bytes.length !== d.rows * d.cols || scales.length !== d.rows) {
    throw new InvalidInputError(`quantised data does not hold ${d.rows}×${d.cols} values with one scale per row`);
  }
  return { rows: d.rows, cols: d.cols, values: new Int8Array(bytes.buffer, bytes.byteOffset, bytes.length), scales };
}
