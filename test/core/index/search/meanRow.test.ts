/**
 * The mean row's squared norm kept in blocks (meanRow.ts). References: the definition ‖(1/m)·Σ x_j‖²
 * computed directly (in f64, to 1e-12), and a fresh MeanRow on the same rows (the same bits after
 * any edit: an index opened from its file must answer as the live one). Random unit rows from the
 * seeded source (invented data, only to exercise the arithmetic).
 */
import { describe, expect, it } from 'vitest';
import { MeanRow } from '../../../../src/core/index/search/meanRow.js';
import { createRandom } from '../../../../src/core/random.js';

function unitRows(n: number, k: number, seed: number): Float32Array {
  const random = createRandom(seed);
  const rows = new Float32Array(n * k);
  for (let j = 0; j < n; j++) {
    let ss = 0;
    for (let c = 0; c < k; c++) ss += (rows[j * k + c] = random.next() - 0.5) ** 2;
    for (let c = 0; c < k; c++) rows[j * k + c] /= Math.sqrt(ss);
  }
  return rows;
}

function direct(rows: Float32Array, k: number, occupied: boolean[]): number {
  const sum = new Float64Array(k);
  let m = 0;
  occupied.forEach((o, j) => {
    if (!o) return;
    m++;
    for (let c = 0; c < k; c++) sum[c] += rows[j * k + c];
  });
  return sum.reduce((s, x) => s + (x / Math.max(m, 1)) ** 2, 0);
}

describe('MeanRow', () => {
  const k = 7;

  it('gives ‖mean row‖² as the definition does, with holes skipped and 0 for no rows', () => {
    const n = 103;
    const rows = unitRows(n, k, 5);
    const occupied = Array.from({ length: n }, (_, j) => j % 9 !== 4);
    const got = new MeanRow(k, 8).normSquared(rows, n, (j) => occupied[j]);
    expect(Math.abs(got - direct(rows, k, occupied))).toBeLessThan(1e-12);
    expect(new MeanRow(k, 8).normSquared(rows, n, () => false)).toBe(0);
  });

  it('after edits in place, appended rows and removals, gives the bits a fresh one gives', () => {
    const n = 90;
    const rows = unitRows(n + 10, k, 6);
    const occupied = Array.from({ length: n + 10 }, (_, j) => j < n);
    const kept = new MeanRow(k, 8);
    const fresh = () => new MeanRow(k, 8).normSquared(rows, occupied.length, (j) => occupied[j]);
    kept.normSquared(rows, occupied.length, (j) => occupied[j]);
    // A file saved again: its row changes in place.
    rows.set(unitRows(1, k, 7), 17 * k);
    kept.touched(17);
    expect(kept.normSquared(rows, occupied.length, (j) => occupied[j])).toBe(fresh());
    // Unchanged without a touch: the kept value.
    const before = kept.normSquared(rows, occupied.length, (j) => occupied[j]);
    expect(kept.normSquared(rows, occupied.length, (j) => occupied[j])).toBe(before);
    // New files at the end, then a removal that shifts every later block.
    for (let j = n; j < n + 10; j++) {
      occupied[j] = true;
      kept.touched(j);
    }
    expect(kept.normSquared(rows, occupied.length, (j) => occupied[j])).toBe(fresh());
    occupied[3] = false;
    kept.touched(3);
    expect(kept.normSquared(rows, occupied.length, (j) => occupied[j])).toBe(fresh());
    expect(Math.abs(fresh() - direct(rows, k, occupied))).toBeLessThan(1e-12);
  });

  it('gives the same bits with the holes taken out (an index saved without them and opened again)', () => {
    const n = 70;
    const rows = unitRows(n, k, 8);
    const occupied = Array.from({ length: n }, (_, j) => j % 5 !== 2);
    const withHoles = new MeanRow(k, 8).normSquared(rows, n, (j) => occupied[j]);
    const packed = new Float32Array(occupied.filter(Boolean).length * k);
    let m = 0;
    occupied.forEach((o, j) => {
      if (o) packed.set(rows.subarray(j * k, (j + 1) * k), k * m++);
    });
    expect(new MeanRow(k, 8).normSquared(packed, m, () => true)).toBe(withHoles);
  });

  it('adds only the touched blocks again after in-place saves, with the bits of a fresh sum', () => {
    const n = 60;
    const rows = unitRows(n, k, 9);
    const occupied = Array.from({ length: n }, (_, j) => j % 7 !== 3);
    const kept = new MeanRow(k, 8);
    const fresh = () => new MeanRow(k, 8).normSquared(rows, n, (j) => occupied[j]);
    kept.normSquared(rows, n, (j) => occupied[j]);
    // Saves in place in two blocks: the fast path must match a full recount bit for bit.
    for (const j of [0, 40, 41]) {
      rows.set(unitRows(1, k, 100 + j), j * k);
      kept.touched(j, true);
    }
    const afterSaves = kept.normSquared(rows, n, (j) => occupied[j]);
    expect(afterSaves).toBe(fresh());
    expect(Math.abs(afterSaves - direct(rows, k, occupied))).toBeLessThan(1e-12);
    // An in-place save followed by a removal in the same read: the blocks are cut again.
    rows.set(unitRows(1, k, 200), 5 * k);
    kept.touched(5, true);
    occupied[12] = false;
    kept.touched(12);
    expect(kept.normSquared(rows, n, (j) => occupied[j])).toBe(fresh());
    // And in place again after that cut.
    rows.set(unitRows(1, k, 201), 55 * k);
    kept.touched(55, true);
    expect(kept.normSquared(rows, n, (j) => occupied[j])).toBe(fresh());
  });
});
