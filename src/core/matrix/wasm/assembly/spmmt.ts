/**
 * Transposed sparse × dense product by scattering: Y[j0:j1] = (Mᵀ X)[j0:j1] for M (rows × cols,
 * CSR, f32 stored values) and X (rows × l), without a transposed copy of M, with the IEEE
 * operations of spmm (./spmm.ts, grouped) over the rows of Mᵀ, in the same order (so the same
 * bits as spmm_f32 on transposeCsr(M)). Row j of Mᵀ holds column j's entries in ascending row
 * order: spmm adds them four at a time, y += ((v0·x0 + v1·x1) + v2·x2) + v3·x3, then the last
 * n mod 4 (n the column's entry count) one by one. Here M's rows are walked in ascending order,
 * so column j's entries come in that same order; entry r of the column (r counted in rank[j])
 * starts a partial sum in pend (r mod 4 = 0), adds to it (1, 2), or ends it, y += pend + v·x
 * (3); entries r ≥ n − n mod 4 are added to y one by one.
 *
 * Arguments (byte offsets into the one shared memory, row-major arrays):
 *   lo, hi   i32[rows]      the stored entries of row i looked at are lo[i] … hi[i] − 1 (all of
 *                           them: lo = indptr, hi = indptr + 4 bytes; a split into tasks by
 *                           columns passes where each row's columns j0 and j1 begin)
 *   indices  i32[nnz]       CSR column of each stored entry (ascending within a row)
 *   values   f32[nnz]       each promoted exactly to f64
 *   x        f64[rows × l]
 *   y        f64[cols × l]  output; rows j0 … j1 − 1 are overwritten, no other byte is touched
 *   counts   i32[cols]      stored entries of each column of M
 *   rank     i32[cols]      scratch: entries of column j seen so far (entries j0 … j1 − 1 reset)
 *   pend     f64[cols × l]  scratch: partial sums of the open group of four (rows j0 … j1 − 1)
 * Use: Z = AᵀQ of the randomized SVD's passes with A's copy only (Halko, Martinsson & Tropp
 * 2011, Algorithm 4.4; ../../../svd/randomizedSvd.ts): Aᵀ is not held as well.
 */
export function spmmt_f32(
  lo: usize, hi: usize, rows: i32, indices: usize, values: usize, x: usize, l: i32, y: usize,
  counts: usize, rank: usize, pend: usize, j0: i32, j1: i32,
): void {
  const rowBytes = <usize>l << 3;
  const pairBytes = <usize>(l >> 1) << 4; // bytes covered by whole column pairs
  for (let j = j0; j < j1; j++) {
    store<i32>(rank + (<usize>j << 2), 0);
    const yo = y + <usize>j * rowBytes;
    for (let c: usize = 0; c < rowBytes; c += 8) store<f64>(yo + c, 0.0);
  }
  for (let i = 0; i < rows; i++) {
    let p = load<i32>(lo + (<usize>i << 2));
    const p1 = load<i32>(hi + (<usize>i << 2));
    const xo = x + <usize>i * rowBytes;
    for (; p < p1; p++) {
      const j = load<i32>(indices + (<usize>p << 2));
      const s = <f64>load<f32>(values + (<usize>p << 2));
      const rp = rank + (<usize>j << 2);
      const r = load<i32>(rp);
      store<i32>(rp, r + 1);
      const n = load<i32>(counts + (<usize>j << 2));
      const yo = y + <usize>j * rowBytes;
      const v = f64x2.splat(s);
      let c: usize = 0;
      if (r >= n - (n & 3)) {
        // The last n mod 4 entries: y += v·x.
        for (; c < pairBytes; c += 16) v128.store(yo + c, f64x2.add(v128.load(yo + c), f64x2.mul(v, v128.load(xo + c))));
        if (c < rowBytes) store<f64>(yo + c, load<f64>(yo + c) + s * load<f64>(xo + c));
        continue;
      }
      const po = pend + <usize>j * rowBytes;
      const g = r & 3;
      if (g == 0) {
        for (; c < pairBytes; c += 16) v128.store(po + c, f64x2.mul(v, v128.load(xo + c)));
        if (c < rowBytes) store<f64>(po + c, s * load<f64>(xo + c));
      } else if (g < 3) {
        for (; c < pairBytes; c += 16) v128.store(po + c, f64x2.add(v128.load(po + c), f64x2.mul(v, v128.load(xo + c))));
        if (c < rowBytes) store<f64>(po + c, load<f64>(po + c) + s * load<f64>(xo + c));
      } else {
        for (; c < pairBytes; c += 16)
          v128.store(yo + c, f64x2.add(v128.load(yo + c), f64x2.add(v128.load(po + c), f64x2.mul(v, v128.load(xo + c)))));
        if (c < rowBytes) store<f64>(yo + c, load<f64>(yo + c) + (load<f64>(po + c) + s * load<f64>(xo + c)));
      }
    }
  }
}
