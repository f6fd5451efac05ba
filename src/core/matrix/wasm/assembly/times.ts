/**
 * Small right product of a row range: OUT[r0:r1] = Y[r0:r1] · W, with Y rows × l and W l × c (c
 * small, the SVD's l × l factors), the WebAssembly SIMD counterpart of timesSmallRows in
 * ../../kernels.ts. Every entry is the running sum s = s + y[i][a]·w[a][b] over a = 0, 1, …, so
 * it has the bits of the plain loop.
 *
 * Arguments (byte offsets into the one shared memory, row-major arrays):
 *   y      f64[rows × l]
 *   w      f64[l × c]      W itself, not transposed (the caller transposes)
 *   upper  1: W is upper triangular (w[a][b] = 0 for a > b), so column b sums only a ≤ b (a tile
 *          of columns b … b + 3 sums a < b + 4, adding exact zeros beyond its own column)
 *   out    f64[rows × c]   output, rows r0 … r1 − 1
 * Columns are produced from the last to the first, so with an upper-triangular W and c = l,
 * out may be y itself: column b reads only columns ≤ b of its row, not yet overwritten.
 * Rows go four at a time; per four rows the columns past the last multiple of 4 are done one by
 * one, then 4-column tiles from the top down, each held in eight f64x2 registers (row k of the
 * tile in acc[2k], acc[2k + 1]). Rows past the last multiple of 4 are done one entry at a time.
 * Use: Q = Y R⁻¹ of CholeskyQR (Fukaya et al. 2014; ../../choleskyQr.ts, in place with the upper
 * triangular R⁻¹) and the small-side vectors QW of the Rayleigh–Ritz step.
 */

/** The number of rows of W column b (or of a tile ending before column bEnd) that can be nonzero. */
@inline function rowsOfW(bEnd: i32, l: i32, upper: i32): i32 {
  return upper != 0 ? min(bEnd, l) : l;
}

/** Entries out[i][b] for rows [i0, i1) and columns c − 1 down to b0, one at a time. */
function entries(y: usize, l: i32, w: usize, c: i32, upper: i32, out: usize, i0: i32, i1: i32, b0: i32): void {
  for (let i = i0; i < i1; i++) {
    const yRow = y + ((<usize>i * l) << 3);
    const outRow = out + ((<usize>i * c) << 3);
    for (let b = c - 1; b >= b0; b--) {
      const end = rowsOfW(b + 1, l, upper);
      let s = 0.0;
      for (let a = 0; a < end; a++) s = s + load<f64>(yRow + (<usize>a << 3)) * load<f64>(w + ((<usize>a * c + b) << 3));
      store<f64>(outRow + (<usize>b << 3), s);
    }
  }
}

export function times(y: usize, l: i32, w: usize, c: i32, upper: i32, out: usize, r0: i32, r1: i32): void {
  const yRowBytes = <usize>l << 3;
  const wRowBytes = <usize>c << 3;
  const c4 = c - (c & 3); // columns below c4 go in whole 4-column tiles
  let i = r0;
  for (; i + 4 <= r1; i += 4) {
    entries(y, l, w, c, upper, out, i, i + 4, c4);
    const y0 = y + <usize>i * yRowBytes, y1 = y0 + yRowBytes, y2 = y1 + yRowBytes, y3 = y2 + yRowBytes;
    const out0 = out + <usize>i * wRowBytes;
    for (let b = c4 - 4; b >= 0; b -= 4) {
      let acc0 = f64x2.splat(0), acc1 = f64x2.splat(0), acc2 = f64x2.splat(0), acc3 = f64x2.splat(0);
      let acc4 = f64x2.splat(0), acc5 = f64x2.splat(0), acc6 = f64x2.splat(0), acc7 = f64x2.splat(0);
      const end = rowsOfW(b + 4, l, upper);
      const wb = w + (<usize>b << 3);
      for (let a = 0; a < end; a++) {
        const wa = wb + <usize>a * wRowBytes;
        const w01 = v128.load(wa), w23 = v128.load(wa, 16);
        const ya = <usize>a << 3;
        const v0 = f64x2.splat(load<f64>(y0 + ya));
        acc0 = f64x2.add(acc0, f64x2.mul(v0, w01));
        acc1 = f64x2.add(acc1, f64x2.mul(v0, w23));
        const v1 = f64x2.splat(load<f64>(y1 + ya));
        acc2 = f64x2.add(acc2, f64x2.mul(v1, w01));
        acc3 = f64x2.add(acc3, f64x2.mul(v1, w23));
        const v2 = f64x2.splat(load<f64>(y2 + ya));
        acc4 = f64x2.add(acc4, f64x2.mul(v2, w01));
        acc5 = f64x2.add(acc5, f64x2.mul(v2, w23));
        const v3 = f64x2.splat(load<f64>(y3 + ya));
        acc6 = f64x2.add(acc6, f64x2.mul(v3, w01));
        acc7 = f64x2.add(acc7, f64x2.mul(v3, w23));
      }
      let t = out0 + (<usize>b << 3);
      v128.store(t, acc0);
      v128.store(t, acc1, 16);
      t += wRowBytes;
      v128.store(t, acc2);
      v128.store(t, acc3, 16);
      t += wRowBytes;
      v128.store(t, acc4);
      v128.store(t, acc5, 16);
      t += wRowBytes;
      v128.store(t, acc6);
      v128.store(t, acc7, 16);
    }
  }
  entries(y, l, w, c, upper, out, i, r1, 0);
}
