/**
 * Columns of a row range copied between two row-major f64 blocks of different widths: for every
 * row i in [r0, r1), the w numbers at src + i·srcStride go to dst + i·dstStride (strides in
 * numbers). The WebAssembly twin of copyColumnRun's loop in ../../executor.ts (the SVD's columnBlock):
 * a copy, so the bits are the source's whatever the route.
 *
 * Arguments (byte offsets into the one shared memory):
 *   src   f64, the first number of row 0's run (the block's start plus its first column)
 *   dst   f64, likewise
 * Two numbers at a time (one v128), the odd last one alone.
 * Use: a column block of the SVD's basis Q gathered for a product, and the product's result
 * scattered back (Halko, Martinsson & Tropp 2011, the power iterations done block by block).
 */
export function copy_columns(src: usize, srcStride: i32, dst: usize, dstStride: i32, w: i32, r0: i32, r1: i32): void {
  const srcRowBytes = <usize>srcStride << 3;
  const dstRowBytes = <usize>dstStride << 3;
  const pairBytes = <usize>(w & ~1) << 3;
  let s = src + <usize>r0 * srcRowBytes;
  let d = dst + <usize>r0 * dstRowBytes;
  for (let i = r0; i < r1; i++, s += srcRowBytes, d += dstRowBytes) {
    for (let o: usize = 0; o < pairBytes; o += 16) v128.store(d + o, v128.load(s + o));
    if (w & 1) store<f64>(d + pairBytes, load<f64>(s + pairBytes));
  }
}

/**
 * copy_columns between an f64 and an f32 block: toSingle 1 copies f64 numbers
 * into an f32 block (each rounded to nearest, ties to even, as a Float32Array stores them),
 * toSingle 0 copies f32 numbers into an f64 block (promoted exactly). Strides in numbers.
 * Use: a column block of the SVD's f64 basis Q handed to spmm_single, and its f32 result put back.
 */
export function copy_columns_cast(src: usize, srcStride: i32, dst: usize, dstStride: i32, w: i32, r0: i32, r1: i32, toSingle: i32): void {
  const pairs = <usize>(w >> 1);
  const wide = toSingle != 0 ? src : dst;
  const narrow = toSingle != 0 ? dst : src;
  const wideStride = <usize>(toSingle != 0 ? srcStride : dstStride) << 3;
  const narrowStride = <usize>(toSingle != 0 ? dstStride : srcStride) << 2;
  let f = wide + <usize>r0 * wideStride;
  let n = narrow + <usize>r0 * narrowStride;
  for (let i = r0; i < r1; i++, f += wideStride, n += narrowStride) {
    if (toSingle != 0) {
      for (let j: usize = 0; j < pairs; j++) v128.store64_lane(n + (j << 3), f32x4.demote_f64x2_zero(v128.load(f + (j << 4))), 0);
      if (w & 1) store<f32>(n + (pairs << 3), <f32>load<f64>(f + (pairs << 4)));
    } else {
      for (let j: usize = 0; j < pairs; j++) v128.store(f + (j << 4), f64x2.promote_low_f32x4(v128.load64_zero(n + (j << 3))));
      if (w & 1) store<f64>(f + (pairs << 4), <f64>load<f32>(n + (pairs << 3)));
    }
  }
}
