/**
 * Scaled unit rows: out[j] = (y[j] ∘ s) / ‖y[j] ∘ s‖₂ in f32, for rows j in [r0, r1): the last step
 * of folding a document into the concept space (Berry, Dumais & O'Brien 1995: Σ_k^{α−1} U_kᵀ w,
 * normalised), for a block of folded rows at once (../../../sections/sectionVectors.ts). A row
 * whose scaled norm is 0 is written as zeros. The plain-loop twin is unitRowsInto (../../kernels.ts).
 *
 * Arguments (byte offsets into the one shared memory):
 *   y    f64[n × k]  row-major
 *   s    f64[k]      one scale a column
 *   out  f32[n × k]  rows r0 … r1 − 1 are written
 * Order of operations (the arithmetic of a plain loop, so both give the same bits): v_c = y_c · s_c
 * in f64; ss = (…((v_0² + v_1²) + v_2²) …) one column at a time; norm = √ss; out_c = f32(v_c / norm),
 * rounded once to the nearest f32. Only the elementwise steps use f64x2 lanes (each lane rounds as
 * the scalar step would); the sum of squares stays one running sum in column order.
 */
export function unit_rows(y: usize, s: usize, k: i32, out: usize, r0: i32, r1: i32): void {
  const inBytes = <usize>k << 3;
  const outBytes = <usize>k << 2;
  const pairs = <usize>(k & -2) << 3; // bytes of the whole pairs of columns
  for (let j = r0; j < r1; j++) {
    const row = y + <usize>j * inBytes;
    const to = out + <usize>j * outBytes;
    let ss = 0.0;
    for (let c: usize = 0; c < inBytes; c += 8) {
      const v = load<f64>(row + c) * load<f64>(s + c);
      ss = ss + v * v;
    }
    const norm = sqrt<f64>(ss);
    if (norm == 0) {
      for (let c: usize = 0; c < outBytes; c += 4) store<f32>(to + c, 0);
      continue;
    }
    const n2 = f64x2.splat(norm);
    let c: usize = 0;
    for (; c < pairs; c += 16) {
      const q = f64x2.div(f64x2.mul(v128.load(row + c), v128.load(s + c)), n2);
      v128.store64_lane(to + (c >> 1), f32x4.demote_f64x2_zero(q), 0);
    }
    for (; c < inBytes; c += 8) store<f32>(to + (c >> 1), <f32>((load<f64>(row + c) * load<f64>(s + c)) / norm));
  }
}
