/**
 * One WebAssembly SIMD function, dots(rows, q, k, r0, r1, out): for each row j in [r0, r1) of a
 * row-major f32 block (k numbers a row, starting at byte offset rows), the dot product with a
 * k-long f64 vector at q, stored as f64 at out + 8j. Encoded with encoder.ts (WebAssembly Core
 * Specification 2.0 §5 and the fixed-width SIMD opcodes); the memory is the shared one encoder.ts
 * imports.
 *
 * Order of operations (so a plain loop can give the same bits, see conceptRows.ts): f32 entries
 * are promoted to f64 (exact), multiplied in f64 (exact for f32 × f32 inputs, rounded once
 * otherwise), and summed by eight running sums s_0…s_7, s_l taking columns c ≡ l (mod 8) of the
 * first k − k mod 8 columns; then ((s0 + s2) + (s4 + s6)) + ((s1 + s3) + (s5 + s7)), then the last
 * k mod 8 products added one by one. Four f64x2 accumulators hold (s0, s1) … (s6, s7).
 */
import { F64, FunctionBuilder, I32, V128, encodeModule } from './encoder.js';
import { MAX_PAGES } from './simdKernels.js';

// Opcodes (WebAssembly Core Specification 2.0 §5.4; SIMD §5.4.8).
const F32_LOAD = 0x2a, F64_LOAD = 0x2b, F64_STORE = 0x39, F64_PROMOTE_F32 = 0xbb;
const I32_ADD = 0x6a, I32_MUL = 0x6c, I32_SHL = 0x74, I32_AND = 0x71, I32_LT_S = 0x48, I32_LT_U = 0x49;
const F64_ADD = 0xa0, F64_MUL = 0xa2;
const V128_LOAD = 0x00, V128_LOAD64_ZERO = 0x5d, F64X2_PROMOTE_LOW_F32X4 = 0x5f, F64X2_EXTRACT_LANE = 0x21;
const F64X2_SPLAT = 0x14, F64X2_ADD = 0xf0, F64X2_MUL = 0xf2;

export interface DotKernelExports {
  dots(rows: number, q: number, k: number, r0: number, r1: number, out: number): void;
}

function dots(): FunctionBuilder {
  const f = new FunctionBuilder('dots', [I32, I32, I32, I32, I32, I32], []);
  const [rows, q, k, r0, r1, out] = [0, 1, 2, 3, 4, 5];
  const j = f.local(I32), pv = f.local(I32), pq = f.local(I32), end = f.local(I32), rowEnd = f.local(I32), rowBytes = f.local(I32);
  const r = f.local(F64);
  const acc = [f.local(V128), f.local(V128), f.local(V128), f.local(V128)];
  f.get(k).i32(2).op(I32_SHL).set(rowBytes);
  f.get(r0).set(j);
  f.whileLoop(() => f.get(j).get(r1).op(I32_LT_S), () => {
    f.get(rows).get(j).get(rowBytes).op(I32_MUL).op(I32_ADD).tee(pv).get(rowBytes).op(I32_ADD).set(rowEnd);
    f.get(pv).get(k).i32(-8).op(I32_AND).i32(2).op(I32_SHL).op(I32_ADD).set(end);
    f.get(q).set(pq);
    for (const a of acc) f.f64(0).simd(F64X2_SPLAT).set(a);
    f.whileLoop(() => f.get(pv).get(end).op(I32_LT_U), () => {
      acc.forEach((a, m) => {
        // a = a + promote(v[c + 2m], v[c + 2m + 1]) × (q[c + 2m], q[c + 2m + 1])
        f.get(a);
        f.get(pv).simd(V128_LOAD64_ZERO, 3, 8 * m).simd(F64X2_PROMOTE_LOW_F32X4);
        f.get(pq).simdMem(V128_LOAD, 16 * m);
        f.simd(F64X2_MUL).simd(F64X2_ADD).set(a);
      });
      f.get(pv).i32(32).op(I32_ADD).set(pv);
      f.get(pq).i32(64).op(I32_ADD).set(pq);
    });
    f.get(acc[0]).get(acc[1]).simd(F64X2_ADD).get(acc[2]).get(acc[3]).simd(F64X2_ADD).simd(F64X2_ADD).set(acc[0]);
    f.get(acc[0]).simd(F64X2_EXTRACT_LANE, 0).get(acc[0]).simd(F64X2_EXTRACT_LANE, 1).op(F64_ADD).set(r);
    f.whileLoop(() => f.get(pv).get(rowEnd).op(I32_LT_U), () => {
      f.get(r).get(pv).mem(F32_LOAD, 2).op(F64_PROMOTE_F32).get(pq).mem(F64_LOAD, 3).op(F64_MUL).op(F64_ADD).set(r);
      f.get(pv).i32(4).op(I32_ADD).set(pv);
      f.get(pq).i32(8).op(I32_ADD).set(pq);
    });
    f.get(out).get(j).i32(3).op(I32_SHL).op(I32_ADD).get(r).mem(F64_STORE, 3);
    f.get(j).i32(1).op(I32_ADD).set(j);
  });
  return f;
}

/** The module's bytes (imports one shared memory of up to MAX_PAGES pages). */
export function dotModuleBytes(): Uint8Array<ArrayBuffer> {
  return encodeModule([dots()], { minPages: 1, maxPages: MAX_PAGES });
}

let compiled: WebAssembly.Module | null | undefined;

/** The compiled module, or null where WebAssembly SIMD or shared memory is unavailable. */
export function dotModule(): WebAssembly.Module | null {
  if (compiled !== undefined) return compiled;
  try {
    const bytes = dotModuleBytes();
    compiled = typeof SharedArrayBuffer === 'function' && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
  } catch {
    compiled = null;
  }
  return compiled;
}

export function instantiateDots(module: WebAssembly.Module, memory: WebAssembly.Memory): DotKernelExports {
  return new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as DotKernelExports;
}
