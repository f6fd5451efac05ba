/**
 * Dot products of signed 8-bit code rows with one vector of signed 16-bit whole numbers, in exact
 * integer arithmetic: out[j] = codes[j] · q for j in [r0, r1), stored as f64 (exact). The
 * integer twin of ./codeDots.ts for screening (../../../index/search/conceptCodes.ts quantises the
 * query to whole numbers and bounds what that costs): no conversion to floating point in the
 * loop, and i32x4.dot_i16x8_s multiplies and adds pairs in one instruction.
 *
 * Arguments (byte offsets into the one shared memory):
 *   codes  i8[n × k]   row-major, k codes a row
 *   q      i16[k]
 *   out    f64[n]      entries r0 … r1 − 1 are written
 * The sum is exact when k · 127 · max|q| < 2^31 (the caller keeps max|q| within that); the order of
 * operations then does not matter: codes widened to i16, pairs multiplied and added into eight i32
 * lanes (two registers), the lanes added, then the last k mod 16 products.
 */
export function code_dots_int(codes: usize, q: usize, k: i32, r0: i32, r1: i32, out: usize): void {
  for (let j = r0; j < r1; j++) {
    let pv = codes + <usize>j * k;
    const rowEnd = pv + k;
    const end = pv + (k & -16); // the whole blocks of sixteen columns
    let pq = q;
    let acc0 = i32x4.splat(0), acc1 = i32x4.splat(0);
    for (; pv < end; pv += 16, pq += 32) {
      const b = v128.load(pv);
      acc0 = i32x4.add(acc0, i32x4.dot_i16x8_s(i16x8.extend_low_i8x16_s(b), v128.load(pq)));
      acc1 = i32x4.add(acc1, i32x4.dot_i16x8_s(i16x8.extend_high_i8x16_s(b), v128.load(pq, 16)));
    }
    const s = i32x4.add(acc0, acc1);
    let r = i32x4.extract_lane(s, 0) + i32x4.extract_lane(s, 1) + i32x4.extract_lane(s, 2) + i32x4.extract_lane(s, 3);
    for (; pv < rowEnd; pv++, pq += 2) r += <i32>load<i8>(pv) * <i32>load<i16>(pq);
    store<f64>(out + (<usize>j << 3), <f64>r);
  }
}
