import { describe, expect, it } from 'vitest';
import { decodeQuantizedRows, dequantizeRow, encodeQuantizedRows, quantizeRows } from '../../../src/core/map/quantize.js';
import { createRandom } from '../../../src/core/random.js';

describe('int8 row quantisation', () => {
  const rng = createRandom(4);
  const rows = 50;
  const cols = 24;
  const data = Float32Array.from({ length: rows * cols }, () => rng.normal());

  it('keeps every entry within half a quantisation step', () => {
    const q = quantizeRows(data, rows, cols);
    const out = new Float32Array(cols);
    for (let r = 0; r < rows; r++) {
      dequantizeRow(q, r, out);
      for (let c = 0; c < cols; c++) expect(Math.abs(out[c] - data[r * cols + c])).toBeLessThanOrEqual(q.scales[r] / 2 + 1e-7);
    }
  });

  it('keeps each row’s direction: cosine to the original above 0.999', () => {
    const q = quantizeRows(data, rows, cols);
    const out = new Float32Array(cols);
    for (let r = 0; r < rows; r++) {
      dequantizeRow(q, r, out);
      let dot = 0;
      let a = 0;
      let b = 0;
      for (let c = 0; c < cols; c++) {
        dot += out[c] * data[r * cols + c];
        a += out[c] ** 2;
        b += data[r * cols + c] ** 2;
      }
      expect(dot / Math.sqrt(a * b)).toBeGreaterThan(0.999);
    }
  });

  it('survives the JSON form unchanged and leaves zero rows at zero', () => {
    const withZero = Float32Array.from(data);
    withZero.fill(0, 0, cols);
    const q = quantizeRows(withZero, rows, cols);
    const back = decodeQuantizedRows(JSON.parse(JSON.stringify(encodeQuantizedRows(q))));
    expect(Array.from(back.values)).toEqual(Array.from(q.values));
    expect(Array.from(back.scales)).toEqual(Array.from(q.scales));
    expect(back.scales[0]).toBe(0);
  });
});
