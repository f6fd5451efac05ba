/**
 * Gram block of a row range: G = A[r0:r1]ᵀ · B[r0:r1] (l × l), the WebAssembly SIMD twin of
 * crossRows in ../../kernels.ts, with the same IEEE operations in the same order (so the same bits):
 * every entry is the running sum s = s + a·b over the rows, from row r0 down to row r1 − 1.
 *
 * Arguments (byte offsets into the one shared memory, row-major arrays):
 *   a, b       f64[rows × l]  the two blocks (the same offset for AᵀA)
 *   g          f64[l × l]     output; with symmetric = 1 only the diagonal and the upper
 *                             triangle are written (the caller mirrors them), else every entry
 * Full 4 × 4 tiles of G are held in eight f64x2 registers (row p + k of the tile in acc[2k] and
 * acc[2k + 1]); tiles cut by the edge of G (when l is not a multiple of 4) are summed one entry
 * at a time.
 * Use: the Gram matrix YᵀY of CholeskyQR (Fukaya, Nakatsukasa, Yanagisawa & Yamamoto 2014;
 * ../../choleskyQr.ts) and ZᵀZ of the Rayleigh–Ritz step (Halko et al. 2011, Algorithm 5.1).
 */

/** One 4 × 4 tile of G at (p, q): rows o = r0·l … r1·l of A and B, step l (byte offsets). */
@inline function fullTile(a: usize, b: usize, l: i32, o0: usize, o1: usize, p: i32, q: i32, g: usize): void {
  const rowBytes = <usize>l << 3;
  let acc0 = f64x2.splat(0), acc1 = f64x2.splat(0), acc2 = f64x2.splat(0), acc3 = f64x2.splat(0);
  let acc4 = f64x2.splat(0), acc5 = f64x2.splat(0), acc6 = f64x2.splat(0), acc7 = f64x2.splat(0);
  const ap = a + (<usize>p << 3);
  const bq = b + (<usize>q << 3);
  for (let o = o0; o < o1; o += rowBytes) {
    const a0 = f64x2.splat(load<f64>(ap + o)), a1 = f64x2.splat(load<f64>(ap + o, 8));
    const a2 = f64x2.splat(load<f64>(ap + o, 16)), a3 = f64x2.splat(load<f64>(ap + o, 24));
    const b01 = v128.load(bq + o), b23 = v128.load(bq + o, 16);
    acc0 = f64x2.add(acc0, f64x2.mul(a0, b01));
    acc1 = f64x2.add(acc1, f64x2.mul(a0, b23));
    acc2 = f64x2.add(acc2, f64x2.mul(a1, b01));
    acc3 = f64x2.add(acc3, f64x2.mul(a1, b23));
    acc4 = f64x2.add(acc4, f64x2.mul(a2, b01));
    acc5 = f64x2.add(acc5, f64x2.mul(a2, b23));
    acc6 = f64x2.add(acc6, f64x2.mul(a3, b01));
    acc7 = f64x2.add(acc7, f64x2.mul(a3, b23));
  }
  let t = g + ((<usize>p * l + q) << 3);
  v128.store(t, acc0);
  v128.store(t, acc1, 16);
  t += rowBytes;
  v128.store(t, acc2);
  v128.store(t, acc3, 16);
  t += rowBytes;
  v128.store(t, acc4);
  v128.store(t, acc5, 16);
  t += rowBytes;
  v128.store(t, acc6);
  v128.store(t, acc7, 16);
}

/** Entries (pp, qq) of G for pp in [p, min(p + 4, l)), qq in [q, min(q + 4, l)), one at a time. */
@inline function edgeTile(a: usize, b: usize, l: i32, o0: usize, o1: usize, p: i32, q: i32, g: usize): void {
  const rowBytes = <usize>l << 3;
  const pe = min(p + 4, l);
  const qe = min(q + 4, l);
  for (let pp = p; pp < pe; pp++) {
    for (let qq = q; qq < qe; qq++) {
      let s = 0.0;
      for (let o = o0; o < o1; o += rowBytes) s = s + load<f64>(a + o + (<usize>pp << 3)) * load<f64>(b + o + (<usize>qq << 3));
      store<f64>(g + ((<usize>pp * l + qq) << 3), s);
    }
  }
}

export function cross(a: usize, b: usize, l: i32, r0: i32, r1: i32, g: usize, symmetric: i32): void {
  const rowBytes = <usize>l << 3;
  const o0 = <usize>r0 * rowBytes;
  const o1 = <usize>r1 * rowBytes;
  const l4 = l - (l & 3); // tiles starting below l4 are whole
  for (let p = 0; p < l; p += 4) {
    for (let q = symmetric != 0 ? p : 0; q < l; q += 4) {
      if (p < l4 && q < l4) fullTile(a, b, l, o0, o1, p, q, g);
      else edgeTile(a, b, l, o0, o1, p, q, g);
    }
  }
}
