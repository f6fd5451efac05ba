/**
 * Sparse × dense product of a row range: Y[r0:r1] = M[r0:r1] · X, the WebAssembly SIMD twin of
 * spmmRows in ../../kernels.ts, with the same IEEE operations in the same order (so the same bits).
 *
 * Arguments (byte offsets into the one shared memory, row-major arrays):
 *   indptr   i32[rows + 1]  CSR row pointers of M
 *   indices  i32[nnz]       CSR column of each stored entry
 *   values   f64[nnz] (spmm) or f32[nnz] (spmm_f32, each promoted exactly to f64)
 *   x        f64[cols × l]  the dense block X
 *   y        f64[rows × l]  output; rows r0 … r1 − 1 are overwritten, no other byte is touched
 *   grouped  1: four stored entries per step, y += ((v0·x0 + v1·x1) + v2·x2) + v3·x3, then the
 *            rest one by one; 0: one entry at a time, y += v·x (the order of a plain loop)
 * Each row of Y is updated two columns at a time (f64x2), then an odd last column alone.
 * Use: the products Y = AΩ, Z = AᵀQ, Y = AZ of the randomized SVD (Halko, Martinsson & Tropp
 * 2011, SIAM Review 53(2), Algorithm 4.4; ../../../svd/randomizedSvd.ts).
 */

/** Stored entry p of the values array, as f64 (f32 values are promoted, which is exact). */
@inline function entry<T>(values: usize, p: i32): f64 {
  return <f64>load<T>(values + (<usize>p << alignof<T>()));
}

/** The X row of stored entry p: x + indices[p] · (l · 8). */
@inline function xRow(indices: usize, p: i32, x: usize, rowBytes: usize): usize {
  return x + <usize>load<i32>(indices + (<usize>p << 2)) * rowBytes;
}

@inline function spmmRows<T>(indptr: usize, indices: usize, values: usize, x: usize, l: i32, y: usize, r0: i32, r1: i32, grouped: i32): void {
  const rowBytes = <usize>l << 3;
  const pairBytes = <usize>(l >> 1) << 4; // bytes covered by whole column pairs
  for (let i = r0; i < r1; i++) {
    const yo = y + <usize>i * rowBytes;
    for (let c: usize = 0; c < rowBytes; c += 8) store<f64>(yo + c, 0.0);
    let p = load<i32>(indptr + (<usize>i << 2));
    const p1 = load<i32>(indptr + (<usize>i << 2), 4);

    // Four stored entries at a time.
    while (grouped != 0 && p + 4 <= p1) {
      const s0 = entry<T>(values, p), s1 = entry<T>(values, p + 1), s2 = entry<T>(values, p + 2), s3 = entry<T>(values, p + 3);
      const x0 = xRow(indices, p, x, rowBytes), x1 = xRow(indices, p + 1, x, rowBytes);
      const x2 = xRow(indices, p + 2, x, rowBytes), x3 = xRow(indices, p + 3, x, rowBytes);
      const v0 = f64x2.splat(s0), v1 = f64x2.splat(s1), v2 = f64x2.splat(s2), v3 = f64x2.splat(s3);
      let c: usize = 0;
      for (; c < pairBytes; c += 16) {
        let sum = f64x2.add(f64x2.mul(v0, v128.load(x0 + c)), f64x2.mul(v1, v128.load(x1 + c)));
        sum = f64x2.add(sum, f64x2.mul(v2, v128.load(x2 + c)));
        sum = f64x2.add(sum, f64x2.mul(v3, v128.load(x3 + c)));
        v128.store(yo + c, f64x2.add(v128.load(yo + c), sum));
      }
      if (c < rowBytes) {
        let sum = s0 * load<f64>(x0 + c) + s1 * load<f64>(x1 + c);
        sum = sum + s2 * load<f64>(x2 + c);
        sum = sum + s3 * load<f64>(x3 + c);
        store<f64>(yo + c, load<f64>(yo + c) + sum);
      }
      p += 4;
    }

    // The remaining entries one by one.
    for (; p < p1; p++) {
      const s = entry<T>(values, p);
      const xp = xRow(indices, p, x, rowBytes);
      const v = f64x2.splat(s);
      let c: usize = 0;
      for (; c < pairBytes; c += 16) v128.store(yo + c, f64x2.add(v128.load(yo + c), f64x2.mul(v, v128.load(xp + c))));
      if (c < rowBytes) store<f64>(yo + c, load<f64>(yo + c) + s * load<f64>(xp + c));
    }
  }
}

/** Y[r0:r1] = M[r0:r1] · X with f64 stored values. */
export function spmm(indptr: usize, indices: usize, values: usize, x: usize, l: i32, y: usize, r0: i32, r1: i32, grouped: i32): void {
  spmmRows<f64>(indptr, indices, values, x, l, y, r0, r1, grouped);
}

/** Y[r0:r1] = M[r0:r1] · X with f32 stored values. */
export function spmm_f32(indptr: usize, indices: usize, values: usize, x: usize, l: i32, y: usize, r0: i32, r1: i32, grouped: i32): void {
  spmmRows<f32>(indptr, indices, values, x, l, y, r0, r1, grouped);
}
