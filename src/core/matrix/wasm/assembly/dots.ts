/**
 * Dot products of f32 rows with one f64 vector: out[j] = rows[j] · q for j in [r0, r1), the scores
 * of the concept-space search (../../../index/search/conceptRows.ts holds the plain-loop twin).
 *
 * Arguments (byte offsets into the one shared memory):
 *   rows  f32[n × k]  row-major, k numbers a row
 *   q     f64[k]
 *   out   f64[n]      entries r0 … r1 − 1 are written
 * Order of operations (so a plain loop can give the same bits): f32 entries are promoted to f64
 * (exact), multiplied in f64 (exact for f32 × f32 inputs, rounded once otherwise), and summed by
 * eight running sums s_0 … s_7, s_m taking the columns c ≡ m (mod 8) of the first k − k mod 8
 * columns; then ((s0 + s2) + (s4 + s6)) + ((s1 + s3) + (s5 + s7)); then the last k mod 8
 * products added one by one. Four f64x2 registers hold (s0, s1), (s2, s3), (s4, s5), (s6, s7).
 */

/** The dot product of the f32 row at pv (k numbers) with the f64 vector at pq, in the order above. */
@inline
export function rowDot(pv: usize, pq: usize, k: i32): f64 {
  const rowEnd = pv + (<usize>k << 2);
  const end = pv + (<usize>(k & -8) << 2); // the whole blocks of eight columns
  let s01 = f64x2.splat(0), s23 = f64x2.splat(0), s45 = f64x2.splat(0), s67 = f64x2.splat(0);
  for (; pv < end; pv += 32, pq += 64) {
    // Two f32 entries at a time, promoted to an f64x2, times two entries of q.
    s01 = f64x2.add(s01, f64x2.mul(f64x2.promote_low_f32x4(v128.load64_zero(pv)), v128.load(pq)));
    s23 = f64x2.add(s23, f64x2.mul(f64x2.promote_low_f32x4(v128.load64_zero(pv, 8)), v128.load(pq, 16)));
    s45 = f64x2.add(s45, f64x2.mul(f64x2.promote_low_f32x4(v128.load64_zero(pv, 16)), v128.load(pq, 32)));
    s67 = f64x2.add(s67, f64x2.mul(f64x2.promote_low_f32x4(v128.load64_zero(pv, 24)), v128.load(pq, 48)));
  }
  const s = f64x2.add(f64x2.add(s01, s23), f64x2.add(s45, s67));
  let r = f64x2.extract_lane(s, 0) + f64x2.extract_lane(s, 1);
  for (; pv < rowEnd; pv += 4, pq += 8) r = r + <f64>load<f32>(pv) * load<f64>(pq);
  return r;
}

export function dots(rows: usize, q: usize, k: i32, r0: i32, r1: i32, out: usize): void {
  const rowBytes = <usize>k << 2;
  for (let j = r0; j < r1; j++) store<f64>(out + (<usize>j << 3), rowDot(rows + <usize>j * rowBytes, q, k));
}
