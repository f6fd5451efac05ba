/**
 * Sparse × dense product of a row range with an f32 dense block: Y[r0:r1] = M[r0:r1] · X, each
 * number of X promoted exactly to f64, f64 stored values, one stored entry at a time (y += v·x,
 * the order of spmm's grouped = 0 and of spmmRows' plain loop in ../../kernels.ts, so the same
 * bits as spmm on an f64 copy of X, whatever the copy's column blocks).
 *
 * Arguments (byte offsets into the one shared memory, row-major arrays):
 *   indptr   i32[rows + 1]  CSR row pointers of M
 *   indices  i32[nnz]       CSR column of each stored entry
 *   values   f64[nnz]
 *   x        f32[cols × l]  the dense block X
 *   y        f64[rows × l]  output; rows r0 … r1 − 1 are overwritten, no other byte is touched
 * Each row of Y is updated two columns at a time (two f32 promoted to one f64x2), then an odd
 * last column alone.
 * Use: the sections' fold, U_kᵀd̂ for a chunk of sections with U_k kept in f32 in the executor's
 * memory (../../../sections/sectionVectors.ts), so no f64 column block of it is gathered per chunk.
 */
export function spmm_x32(indptr: usize, indices: usize, values: usize, x: usize, l: i32, y: usize, r0: i32, r1: i32): void {
  const rowBytes = <usize>l << 3;
  const xRowBytes = <usize>l << 2;
  const pairs = <usize>(l >> 1);
  for (let i = r0; i < r1; i++) {
    const yo = y + <usize>i * rowBytes;
    for (let c: usize = 0; c < rowBytes; c += 8) store<f64>(yo + c, 0.0);
    const p0 = load<i32>(indptr + (<usize>i << 2));
    const p1 = load<i32>(indptr + (<usize>i << 2), 4);
    for (let p = p0; p < p1; p++) {
      const s = load<f64>(values + (<usize>p << 3));
      const xp = x + <usize>load<i32>(indices + (<usize>p << 2)) * xRowBytes;
      const v = f64x2.splat(s);
      for (let j: usize = 0; j < pairs; j++) {
        const xv = f64x2.promote_low_f32x4(v128.load64_zero(xp + (j << 3)));
        const at = yo + (j << 4);
        v128.store(at, f64x2.add(v128.load(at), f64x2.mul(v, xv)));
      }
      if (l & 1) {
        const at = yo + (pairs << 4);
        store<f64>(at, load<f64>(at) + s * <f64>load<f32>(xp + (pairs << 3)));
      }
    }
  }
}
