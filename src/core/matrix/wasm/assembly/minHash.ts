/**
 * MinHash signature of one set of 32-bit keys (../../../lookalike/minhash.ts): for each of the
 * k hash functions h_i(x) = ⌊((a_i·x + b_i) mod 2⁶⁴) / 2³²⌋ (Dietzfelbinger's multiply-add-shift),
 * the least h_i over the keys. The plain twin is the signature loop of minhash.ts, which forms the
 * same 64-bit product from exact float pieces; here it is one u64 multiply and add, which wrap
 * modulo 2⁶⁴ as the definition says, so both give the same numbers.
 *
 * Arguments (byte offsets into the one shared memory):
 *   keys    u32[n]
 *   params  u64[2k]  a_0, b_0, a_1, b_1, … (a = aHi·2³² + aLo, b = bHi·2³² + bLo)
 *   out     u32[k]   the signature
 */
export function min_hash(keys: usize, n: i32, params: usize, k: i32, out: usize): void {
  const end = keys + (<usize>n << 2);
  for (let i = 0; i < k; i++) {
    const a = load<u64>(params + (<usize>i << 4));
    const b = load<u64>(params + (<usize>i << 4) + 8);
    let best: u32 = 0xffffffff;
    for (let p = keys; p < end; p += 4) {
      const h = <u32>((a * <u64>load<u32>(p) + b) >> 32);
      best = h < best ? h : best;
    }
    store<u32>(out + (<usize>i << 2), best);
  }
}
