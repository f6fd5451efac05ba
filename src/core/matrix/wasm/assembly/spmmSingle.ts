/**
 * Sparse × dense product of a row range in single precision: Y[r0:r1] = M[r0:r1] · X with f32
 * stored values, an f32 X, an f32 Y and f32 sums, four columns at a time (f32x4). The order of
 * spmm's grouped mode: per column, y = 0, then y += ((v0·x0 + v1·x1) + v2·x2) + v3·x3 for each
 * four stored entries, then y += v·x for the rest; columns past the last four alone, in the same
 * order. Every operation is one IEEE single-precision operation (no fused multiply-add), so the
 * twin in JavaScript (spmmSingleRows in ../../kernels.ts, each step rounded by Math.fround) gives
 * the same bits.
 *
 * Arguments (byte offsets into the one shared memory, row-major arrays):
 *   indptr   i32[rows + 1]  CSR row pointers of M
 *   indices  i32[nnz]       CSR column of each stored entry
 *   values   f32[nnz]
 *   x        f32[cols × l]  the dense block X
 *   y        f32[rows × l]  output; rows r0 … r1 − 1 are overwritten, no other byte is touched
 * Use: the power iterations of the randomized SVD (../../../svd/randomizedSvd.ts), whose
 * rounding (a relative 10⁻⁷ per operation) only perturbs the basis being refined; the
 * Rayleigh–Ritz products that give the singular values stay in f64 (spmm.ts). Twice the lanes
 * of f64x2 and half the bytes of X per stored entry: on the Linux tree's matrix a product took
 * 55–59 ms against 120–170 ms in f64 (one thread).
 */
export function spmm_single(indptr: usize, indices: usize, values: usize, x: usize, l: i32, y: usize, r0: i32, r1: i32): void {
  const rowBytes = <usize>l << 2;
  const quadBytes = <usize>(l >> 2) << 4; // bytes covered by whole groups of four columns
  for (let i = r0; i < r1; i++) {
    const yo = y + <usize>i * rowBytes;
    for (let c: usize = 0; c < rowBytes; c += 4) store<f32>(yo + c, 0.0);
    let p = load<i32>(indptr + (<usize>i << 2));
    const p1 = load<i32>(indptr + (<usize>i << 2), 4);

    // Four stored entries at a time.
    for (; p + 4 <= p1; p += 4) {
      const at = values + (<usize>p << 2);
      const s0 = load<f32>(at), s1 = load<f32>(at, 4), s2 = load<f32>(at, 8), s3 = load<f32>(at, 12);
      const ip = indices + (<usize>p << 2);
      const x0 = x + <usize>load<i32>(ip) * rowBytes, x1 = x + <usize>load<i32>(ip, 4) * rowBytes;
      const x2 = x + <usize>load<i32>(ip, 8) * rowBytes, x3 = x + <usize>load<i32>(ip, 12) * rowBytes;
      const v0 = f32x4.splat(s0), v1 = f32x4.splat(s1), v2 = f32x4.splat(s2), v3 = f32x4.splat(s3);
      let c: usize = 0;
      for (; c < quadBytes; c += 16) {
        let sum = f32x4.add(f32x4.mul(v0, v128.load(x0 + c)), f32x4.mul(v1, v128.load(x1 + c)));
        sum = f32x4.add(sum, f32x4.mul(v2, v128.load(x2 + c)));
        sum = f32x4.add(sum, f32x4.mul(v3, v128.load(x3 + c)));
        v128.store(yo + c, f32x4.add(v128.load(yo + c), sum));
      }
      for (; c < rowBytes; c += 4) {
        let sum = s0 * load<f32>(x0 + c) + s1 * load<f32>(x1 + c);
        sum = sum + s2 * load<f32>(x2 + c);
        sum = sum + s3 * load<f32>(x3 + c);
        store<f32>(yo + c, load<f32>(yo + c) + sum);
      }
    }

    // The remaining entries one by one.
    for (; p < p1; p++) {
      const s = load<f32>(values + (<usize>p << 2));
      const xp = x + <usize>load<i32>(indices + (<usize>p << 2)) * rowBytes;
      const v = f32x4.splat(s);
      let c: usize = 0;
      for (; c < quadBytes; c += 16) v128.store(yo + c, f32x4.add(v128.load(yo + c), f32x4.mul(v, v128.load(xp + c))));
      for (; c < rowBytes; c += 4) store<f32>(yo + c, load<f32>(yo + c) + s * load<f32>(xp + c));
    }
  }
}
