/**
 * Dot products of signed 8-bit code rows with one f32 vector, summed in f32: out[j] = codes[j] · q
 * for j in [r0, r1), stored promoted to f64. Used to screen rows cheaply (a quarter of the bytes
 * of f32 rows) before exact products (../../../index/search/conceptCodes.ts); the caller bounds the f32
 * rounding (Higham 2002, "Accuracy and Stability of Numerical Algorithms", §3.1:
 * |error| ≤ γ_n Σ|x_i y_i| with n = k additions in the longest chain).
 *
 * Arguments (byte offsets into the one shared memory):
 *   codes  i8[n × k]   row-major, k codes a row
 *   q      f32[k]
 *   out    f64[n]      entries r0 … r1 − 1 are written
 * Order of operations: codes are converted to f32 (exact), multiplied in f32, and summed by
 * sixteen running sums t_0 … t_15, t_m taking the columns c ≡ m (mod 16) of the first
 * k − k mod 16 columns (four f32x4 registers: t_0…t_3, t_4…t_7, t_8…t_11, t_12…t_15); then the
 * registers are added as (acc0 + acc1) + (acc2 + acc3) lane by lane, the four lanes as
 * (l0 + l1) + (l2 + l3), and the last k mod 16 products added one by one.
 */

/** Lanes 0…3 of a vector of sixteen i8 codes widened to four f32 (exact). */
@inline function codes0(b: v128): v128 {
  return f32x4.convert_i32x4_s(i32x4.extend_low_i16x8_s(i16x8.extend_low_i8x16_s(b)));
}
@inline function codes1(b: v128): v128 {
  return f32x4.convert_i32x4_s(i32x4.extend_high_i16x8_s(i16x8.extend_low_i8x16_s(b)));
}
@inline function codes2(b: v128): v128 {
  return f32x4.convert_i32x4_s(i32x4.extend_low_i16x8_s(i16x8.extend_high_i8x16_s(b)));
}
@inline function codes3(b: v128): v128 {
  return f32x4.convert_i32x4_s(i32x4.extend_high_i16x8_s(i16x8.extend_high_i8x16_s(b)));
}

export function code_dots(codes: usize, q: usize, k: i32, r0: i32, r1: i32, out: usize): void {
  for (let j = r0; j < r1; j++) {
    let pv = codes + <usize>j * k;
    const rowEnd = pv + k;
    const end = pv + (k & -16); // the whole blocks of sixteen columns
    let pq = q;
    let acc0 = f32x4.splat(0), acc1 = f32x4.splat(0), acc2 = f32x4.splat(0), acc3 = f32x4.splat(0);
    for (; pv < end; pv += 16, pq += 64) {
      const b = v128.load(pv);
      acc0 = f32x4.add(acc0, f32x4.mul(codes0(b), v128.load(pq)));
      acc1 = f32x4.add(acc1, f32x4.mul(codes1(b), v128.load(pq, 16)));
      acc2 = f32x4.add(acc2, f32x4.mul(codes2(b), v128.load(pq, 32)));
      acc3 = f32x4.add(acc3, f32x4.mul(codes3(b), v128.load(pq, 48)));
    }
    const s = f32x4.add(f32x4.add(acc0, acc1), f32x4.add(acc2, acc3));
    let r = (f32x4.extract_lane(s, 0) + f32x4.extract_lane(s, 1)) + (f32x4.extract_lane(s, 2) + f32x4.extract_lane(s, 3));
    for (; pv < rowEnd; pv++, pq += 4) r = r + <f32>load<i8>(pv) * load<f32>(pq);
    store<f64>(out + (<usize>j << 3), <f64>r);
  }
}
