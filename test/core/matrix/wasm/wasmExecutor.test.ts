import { describe, expect, it } from 'vitest';
import { serialExecutor } from '../../../../src/core/matrix/executor.js';
import { createWasmExecutor } from '../../../../src/core/matrix/wasm/wasmExecutor.js';
import { createRandom } from '../../../../src/core/random.js';
import { SectionLists } from '../../../../src/core/sections/sectionLists.js';
import { columnBlock } from '../../../../src/core/svd/randomizedSvd.js';

// Reference: the plain typed-array executor (its kernels are checked against brute force in
// kernels.test.ts). The SIMD kernels promise the very same IEEE operations, so the same bits.
const wasm = createWasmExecutor();
const rnd = createRandom(5);
const same = (a: ArrayLike<number>, b: ArrayLike<number>): boolean =>
  a.length === b.length && Array.from(a).every((v, i) => Object.is(v, b[i]));

describe.skipIf(!wasm)(`WebAssembly SIMD executor ${wasm ? '' : '(skipped: this runtime lacks WebAssembly SIMD or shared memory)'}`, () => {
  for (const [rows, cols, l] of [
    [37, 29, 7],
    [100, 80, 22],
    [64, 50, 13],
    [5, 3, 1],
  ] as const) {
    it(`gives the serial executor's bits for ${rows}×${cols}, l = ${l}`, () => {
      const ex = wasm!;
      const indptr = [0],
        indices: number[] = [],
        values: number[] = [];
      for (let i = 0; i < rows; i++) {
        for (let j = 0; j < cols; j++)
          if (rnd.next() < 0.25) {
            indices.push(j);
            values.push(rnd.normal());
          }
        indptr.push(indices.length);
      }
      const m = { rows, cols, indptr: Int32Array.from(indptr), indices: Int32Array.from(indices), values: Float64Array.from(values) };
      const x = Float64Array.from({ length: cols * l }, () => rnd.normal());
      for (const sequential of [false, true]) {
        const y1 = new Float64Array(rows * l);
        const y2 = ex.float64(rows * l);
        serialExecutor.spmm(m, x, l, y1, sequential);
        ex.spmm(m, x, l, y2, sequential);
        expect(same(y1, y2)).toBe(true);
        // f32 stored values that live in the arena run the spmm_f32 kernel (promoted exactly).
        const m32 = { ...m, values: ex.float32(values.length) };
        m32.values.set(values);
        const y3 = new Float64Array(rows * l);
        const y4 = ex.float64(rows * l);
        serialExecutor.spmm(m32, x, l, y3, sequential);
        ex.spmm(m32, x, l, y4, sequential);
        expect(same(y3, y4)).toBe(true);
      }
      // Single precision (spmm_single): the plain loop's bits, with X and Y in the arena or not,
      // and with f64 stored values (rounded to f32 first).
      const xs = Float32Array.from(x);
      const ys1 = new Float32Array(rows * l);
      serialExecutor.spmmSingle(m, xs, l, ys1);
      const m32s = { ...m, values: ex.float32(values.length) };
      m32s.values.set(values);
      const xsArena = ex.float32(cols * l);
      xsArena.set(xs);
      const ys2 = ex.float32(rows * l);
      ex.spmmSingle(m32s, xsArena, l, ys2);
      expect(same(ys1, ys2)).toBe(true);
      const ys3 = new Float32Array(rows * l);
      ex.spmmSingle(m, xs, l, ys3);
      expect(same(ys1, ys3)).toBe(true);
      // An f32 X in the arena, sequential, f64 stored values: spmm_x32 reads it where it lies.
      // The same bits as the serial loop over the same f32 X, and as spmm over an f64 copy of X.
      const x32 = ex.float32(cols * l);
      x32.set(x);
      const xWide = Float64Array.from(x32);
      const y5 = new Float64Array(rows * l);
      const y6 = ex.float64(rows * l);
      const y7 = new Float64Array(rows * l);
      serialExecutor.spmm(m, x32, l, y5, true);
      ex.spmm(m, x32, l, y6, true);
      serialExecutor.spmm(m, xWide, l, y7, true);
      expect(same(y5, y6)).toBe(true);
      expect(same(y5, y7)).toBe(true);
      // Not vacuous: X's f64 numbers round when they go to f32, and the products see it.
      const y8 = new Float64Array(rows * l);
      serialExecutor.spmm(m, x, l, y8, true);
      expect(same(y5, y8)).toBe(false);
      const a = Float64Array.from({ length: rows * l }, () => rnd.normal());
      const b = Float64Array.from({ length: rows * l }, () => rnd.normal());
      expect(same(serialExecutor.cross(a, b, rows, l), ex.cross(a, b, rows, l))).toBe(true);
      expect(same(serialExecutor.cross(a, a, rows, l), ex.cross(a, a, rows, l))).toBe(true);
      for (const [c, upper] of [
        [l, false],
        [l, true],
        [3, false],
        [5, false],
      ] as const) {
        const wt = Float64Array.from({ length: c * l }, (_, t) => (upper && Math.floor(t / l) < t % l ? 0 : rnd.normal()));
        const o1 = new Float64Array(rows * c);
        const o2 = new Float64Array(rows * c);
        serialExecutor.timesSmall(a, rows, l, wt, c, upper, o1);
        ex.timesSmall(a, rows, l, wt, c, upper, o2);
        expect(same(o1, o2)).toBe(true);
      }
    });
  }

  it('multiplies in place by an upper-triangular factor with the same bits as out of place', () => {
    const ex = wasm!;
    const rows = 23,
      l = 11;
    const wt = Float64Array.from({ length: l * l }, (_, t) => (Math.floor(t / l) < t % l ? 0 : rnd.normal()));
    const y = ex.float64(rows * l);
    for (let i = 0; i < y.length; i++) y[i] = rnd.normal();
    const want = new Float64Array(rows * l);
    serialExecutor.timesSmall(Float64Array.from(y), rows, l, wt, l, true, want);
    const plain = Float64Array.from(y);
    serialExecutor.timesSmall(plain, rows, l, wt, l, true, plain);
    ex.timesSmall(y, rows, l, wt, l, true, y);
    expect(same(y, want)).toBe(true);
    expect(same(plain, want)).toBe(true);
  });

  it('gathers and scatters column blocks as the plain loops do (odd and even widths, a block at each edge)', () => {
    const ex = wasm!;
    const [rows, l] = [37, 23];
    const src = ex.float64(rows * l);
    for (let i = 0; i < src.length; i++) src[i] = rnd.normal();
    for (const [c0, w] of [
      [0, 5],
      [5, 6],
      [11, 12],
      [22, 1],
      [0, 23],
    ]) {
      const block = ex.float64(rows * w);
      columnBlock(src, block, rows, [l, c0, w], 'gather', ex);
      const plain = new Float64Array(rows * w);
      columnBlock(src, plain, rows, [l, c0, w], 'gather');
      expect(same(block, plain)).toBe(true);
      for (let i = 0; i < rows; i++) for (let j = 0; j < w; j++) expect(Object.is(block[i * w + j], src[i * l + c0 + j])).toBe(true);
      // Back into a blank block of the full width: only those columns change.
      const dst = ex.float64(rows * l);
      const dstPlain = new Float64Array(rows * l);
      columnBlock(dst, block, rows, [l, c0, w], 'scatter', ex);
      columnBlock(dstPlain, block, rows, [l, c0, w], 'scatter');
      expect(same(dst, dstPlain)).toBe(true);
    }
  });

  it('gathers an f64 column block into an f32 block and scatters it back as the plain loops do (rounded, then exact)', () => {
    const ex = wasm!;
    const [rows, l] = [29, 23];
    const src = ex.float64(rows * l);
    for (let i = 0; i < src.length; i++) src[i] = rnd.normal();
    for (const [c0, w] of [
      [0, 5],
      [5, 6],
      [22, 1],
      [0, 23],
    ]) {
      const block = ex.float32(rows * w);
      columnBlock(src, block, rows, [l, c0, w], 'gather', ex);
      const plain = new Float32Array(rows * w);
      columnBlock(src, plain, rows, [l, c0, w], 'gather');
      expect(same(block, plain)).toBe(true);
      for (let i = 0; i < rows; i++) for (let j = 0; j < w; j++) expect(block[i * w + j]).toBe(Math.fround(src[i * l + c0 + j]));
      const dst = ex.float64(rows * l);
      const dstPlain = new Float64Array(rows * l);
      columnBlock(dst, block, rows, [l, c0, w], 'scatter', ex);
      columnBlock(dstPlain, block, rows, [l, c0, w], 'scatter');
      expect(same(dst, dstPlain)).toBe(true);
      for (let i = 0; i < rows; i++) for (let j = 0; j < w; j++) expect(dst[i * l + c0 + j]).toBe(block[i * w + j]);
    }
    // Two f32 arrays: not the kernel's (the caller's plain loop copies them).
    expect(ex.copyColumns({ src: ex.float32(8), srcStride: 4, srcAt: 0, dst: ex.float32(8), dstStride: 4, dstAt: 0, w: 4, rows: 2 })).toBe(
      false,
    );
  });

  it('copies columns only between arrays of its arena, and never past their ends', () => {
    const ex = wasm!;
    const inside = ex.float64(40);
    const run = { src: inside, srcStride: 8, srcAt: 0, dst: ex.float64(20), dstStride: 4, dstAt: 0, w: 4, rows: 5 };
    expect(ex.copyColumns(run)).toBe(true);
    expect(ex.copyColumns({ ...run, src: new Float64Array(40) })).toBe(false);
    expect(() => ex.copyColumns({ ...run, srcAt: 5 })).toThrow(RangeError);
    expect(() => ex.copyColumns({ ...run, dst: ex.float64(19) })).toThrow(RangeError);
  });

  it("scales and normalises rows (unit_rows) with the serial executor's bits, odd k and zero rows included", () => {
    const ex = wasm!;
    for (const [rows, k] of [
      [50, 200],
      [7, 13],
      [3, 1],
    ] as const) {
      const y = Float64Array.from({ length: rows * k }, () => rnd.normal());
      y.fill(0, 0, k); // a zero row
      const s = Float64Array.from({ length: k }, () => rnd.next());
      const one = new Float32Array(rows * k);
      serialExecutor.unitRows(y, rows, k, s, one);
      // Rows outside the arena (scaled where they lie, by the plain twin), then all inside it (the kernel).
      const two = new Float32Array(rows * k).fill(9);
      ex.unitRows(y, rows, k, s, two);
      expect(same(one, two)).toBe(true);
      const [ya, sa, three] = [ex.float64(rows * k), ex.float64(k), ex.float32(rows * k)];
      ya.set(y);
      sa.set(s);
      ex.unitRows(ya, rows, k, sa, three);
      expect(same(one, three)).toBe(true);
      expect(one.some((v) => v !== 0)).toBe(true);
    }
  });

  it('files rows under a two-level quantizer (file_rows) as the section lists file them, and declines arrays outside its memory', () => {
    const ex = wasm!;
    const [n, k, g] = [300, 37, 6];
    const unit = (count: number): Float32Array => {
      const x = Float32Array.from({ length: count * k }, () => rnd.normal());
      for (let r = 0; r < count; r++) {
        const norm = Math.hypot(...x.subarray(r * k, (r + 1) * k));
        for (let c = 0; c < k; c++) x[r * k + c] /= norm;
      }
      return x;
    };
    // Six groups of 1–5 centroids; the lists' own filing (their kernel memory) is the reference.
    const starts = Int32Array.from([0, 3, 4, 9, 11, 16, 19]);
    const lists = SectionLists.restore(k, unit(starts[g]), unit(g), starts);
    const rows = unit(n);
    const expected = new Int32Array(n);
    lists.fileRows(rows, 0, n, expected, 0);
    // A plain argmax (any order of sums: random rows leave no near-ties) agrees with the reference.
    const plain = (a: Float32Array, i: number, b: Float32Array, j: number): number => {
      let s = 0;
      for (let c = 0; c < k; c++) s += a[i * k + c] * b[j * k + c];
      return s;
    };
    for (let r = 0; r < n; r++) {
      let group = 0;
      for (let c = 1; c < g; c++) if (plain(rows, r, lists.groups, c) > plain(rows, r, lists.groups, group)) group = c;
      let best = starts[group];
      for (let c = starts[group] + 1; c < starts[group + 1]; c++)
        if (plain(rows, r, lists.centroids, c) > plain(rows, r, lists.centroids, best)) best = c;
      expect(expected[r]).toBe(best);
    }
    const quantizer = { groups: ex.float32(g * k), centroids: ex.float32(starts[g] * k), starts: ex.int32(g + 1) };
    quantizer.groups.set(lists.groups);
    quantizer.centroids.set(lists.centroids);
    quantizer.starts.set(starts);
    const [inRows, out] = [ex.float32(n * k), ex.int32(n)];
    inRows.set(rows);
    expect(ex.fileRows(inRows, n, k, quantizer, out)).toBe(true);
    expect(Array.from(out)).toEqual(Array.from(expected));
    expect(new Set(out).size).toBeGreaterThan(g);
    // Rows that do not live in the arena: declined, nothing written.
    const outside = new Int32Array(n).fill(-7);
    expect(ex.fileRows(rows, n, k, quantizer, outside)).toBe(false);
    expect(outside.every((v) => v === -7)).toBe(true);
    // Through fileRowsOn, rows anywhere: the same lists.
    const on = new Int32Array(n + 2).fill(-1);
    lists.fileRowsOn(ex, rows, 0, n, on, 2);
    expect(Array.from(on.subarray(2))).toEqual(Array.from(expected));
    expect(() => ex.fileRows(inRows, n + 1, k, quantizer, out)).toThrow(RangeError);
  });

  it('frees scoped arena memory for reuse', () => {
    const ex = wasm!;
    const first = ex.scoped(() => ex.float64(1000).byteOffset);
    const second = ex.scoped(() => ex.float64(1000).byteOffset);
    expect(second).toBe(first);
  });
});
