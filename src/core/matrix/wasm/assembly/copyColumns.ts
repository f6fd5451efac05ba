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
