/**
 * A weighted matrix's entries parked in a spill during the SVD's passes (src/core/matrix/parkedMatrix.ts):
 * emptied while parked, read back with the same bits into the same object, the spill given back,
 * nothing parked below the threshold or without a spill. Matrix: the log-entropy weighted matrix of
 * CRAN abstracts (test/fixtures/corpora/cran), as the build makes it.
 */
import { describe, expect, it } from 'vitest';
import { dropParkedMatrix, parkMatrix, unparkMatrix } from '../../../src/core/matrix/parkedMatrix.js';
import { memorySpill } from '../../helpers/memorySpill.js';
import { weightedCorpus } from '../../helpers/weightedCorpus.js';
import { loadCollection } from '../../helpers/shared.js';

function matrix() {
  return weightedCorpus(
    loadCollection('cran')
      .docs.slice(0, 150)
      .map((d) => d.text),
  ).matrix;
}

describe('parkMatrix', () => {
  it('empties the entries while parked and reads them back with the same bits', () => {
    const m = matrix();
    const indices = m.indices.slice();
    const values = Float64Array.from(m.values);
    expect(indices.length).toBeGreaterThan(1000);
    const { open, closes } = memorySpill();
    expect(parkMatrix(m, open, 0)).toBe(true);
    expect(m.indices.length).toBe(0);
    expect(m.values.length).toBe(0);
    unparkMatrix(m);
    expect(closes()).toBe(1);
    expect(Buffer.from(m.indices.buffer).equals(Buffer.from(indices.buffer))).toBe(true);
    expect(Buffer.from(m.values.buffer).equals(Buffer.from(values.buffer))).toBe(true);
    expect(m.values).toBeInstanceOf(Float64Array);
    unparkMatrix(m); // not parked: nothing happens
    expect(closes()).toBe(1);
  });

  it('parks nothing below the threshold or without a spill, and drop gives the spill back', () => {
    const m = matrix();
    const n = m.indices.length;
    const { open, closes } = memorySpill();
    expect(parkMatrix(m, open, Number.MAX_SAFE_INTEGER)).toBe(false);
    expect(parkMatrix(m, () => null, 0)).toBe(false);
    expect(m.indices.length).toBe(n);
    expect(parkMatrix(m, open, 0)).toBe(true);
    dropParkedMatrix(m);
    expect(closes()).toBe(1);
  });
});
