/**
 * One WebAssembly SIMD function, code_dots(codes, q, k, r0, r1, out): for each row j in [r0, r1)
 * of a row-major block of signed 8-bit codes (k a row), the dot product with a k-long f32 vector
 * at q, summed in f32 and stored (promoted) as f64 at out + 8j. Used to screen rows cheaply (a
 * quarter of the bytes of f32 rows) before exact products; the caller bounds the f32 rounding
 * (Higham 2002, "Accuracy and Stability of Numerical Algorithms", §3.1: |error| ≤ γ_n Σ|x_i y_i|
 * with n = k additions in the longest chain). Encoded with encoder.ts (WebAssembly Core
 * Specification 2.0 §5 and the fixed-width SIMD opcodes); one imported shared memory.
 */
import { FunctionBuilder, I32, V128, encodeModule } from './encoder.js';
import { MAX_PAGES } from './simdKernels.js';

const F32 = 0x7d;
// Opcodes (WebAssembly Core Specification 2.0 §5.4; SIMD §5.4.8).
const I32_LOAD8_S = 0x2c, F32_LOAD = 0x2a, F64_STORE = 0x39, F64_PROMOTE_F32 = 0xbb, F32_CONVERT_I32_S = 0xb2;
const I32_ADD = 0x6a, I32_MUL = 0x6c, I32_SHL = 0x74, I32_AND = 0x71, I32_LT_S = 0x48, I32_LT_U = 0x49;
const F32_ADD = 0x92, F32_MUL = 0x94;
const V128_LOAD = 0x00, F32X4_SPLAT = 0x13, F32X4_EXTRACT_LANE = 0x1f, F32X4_ADD = 0xe4, F32X4_MUL = 0xe6, F32X4_CONVERT_I32X4_S = 0xfa;
const I16X8_EXTEND_LOW_I8X16_S = 0x87, I16X8_EXTEND_HIGH_I8X16_S = 0x88, I32X4_EXTEND_LOW_I16X8_S = 0xa7, I32X4_EXTEND_HIGH_I16X8_S = 0xa8;

export interface CodeDotKernelExports {
  code_dots(codes: number, q: number, k: number, r0: number, r1: number, out: number): void;
}

function codeDots(): FunctionBuilder {
  const f = new FunctionBuilder('code_dots', [I32, I32, I32, I32, I32, I32], []);
  const [codes, q, k, r0, r1, out] = [0, 1, 2, 3, 4, 5];
  const j = f.local(I32), pv = f.local(I32), pq = f.local(I32), end = f.local(I32), rowEnd = f.local(I32);
  const bytes16 = f.local(V128), half = f.local(V128), r = f.local(F32);
  const acc = [f.local(V128), f.local(V128), f.local(V128), f.local(V128)];
  f.get(r0).set(j);
  f.whileLoop(() => f.get(j).get(r1).op(I32_LT_S), () => {
    f.get(codes).get(j).get(k).op(I32_MUL).op(I32_ADD).tee(pv).get(k).op(I32_ADD).set(rowEnd);
    f.get(pv).get(k).i32(-16).op(I32_AND).op(I32_ADD).set(end);
    f.get(q).set(pq);
    for (const a of acc) f.op(0x43, 0, 0, 0, 0).simd(F32X4_SPLAT).set(a); // f32.const 0
    f.whileLoop(() => f.get(pv).get(end).op(I32_LT_U), () => {
      f.get(pv).simdMem(V128_LOAD).set(bytes16);
      for (let h = 0; h < 2; h++) {
        f.get(bytes16).simd(h === 0 ? I16X8_EXTEND_LOW_I8X16_S : I16X8_EXTEND_HIGH_I8X16_S).set(half);
        for (let g = 0; g < 2; g++) {
          const a = acc[2 * h + g];
          f.get(a);
          f.get(half).simd(g === 0 ? I32X4_EXTEND_LOW_I16X8_S : I32X4_EXTEND_HIGH_I16X8_S).simd(F32X4_CONVERT_I32X4_S);
          f.get(pq).simdMem(V128_LOAD, 16 * (2 * h + g));
          f.simd(F32X4_MUL).simd(F32X4_ADD).set(a);
        }
      }
      f.get(pv).i32(16).op(I32_ADD).set(pv);
      f.get(pq).i32(64).op(I32_ADD).set(pq);
    });
    f.get(acc[0]).get(acc[1]).simd(F32X4_ADD).get(acc[2]).get(acc[3]).simd(F32X4_ADD).simd(F32X4_ADD).set(acc[0]);
    f.get(acc[0]).simd(F32X4_EXTRACT_LANE, 0).get(acc[0]).simd(F32X4_EXTRACT_LANE, 1).op(F32_ADD);
    f.get(acc[0]).simd(F32X4_EXTRACT_LANE, 2).get(acc[0]).simd(F32X4_EXTRACT_LANE, 3).op(F32_ADD).op(F32_ADD).set(r);
    f.whileLoop(() => f.get(pv).get(rowEnd).op(I32_LT_U), () => {
      f.get(r).get(pv).mem(I32_LOAD8_S, 0).op(F32_CONVERT_I32_S).get(pq).mem(F32_LOAD, 2).op(F32_MUL).op(F32_ADD).set(r);
      f.get(pv).i32(1).op(I32_ADD).set(pv);
      f.get(pq).i32(4).op(I32_ADD).set(pq);
    });
    f.get(out).get(j).i32(3).op(I32_SHL).op(I32_ADD).get(r).op(F64_PROMOTE_F32).mem(F64_STORE, 3);
    f.get(j).i32(1).op(I32_ADD).set(j);
  });
  return f;
}

export function codeDotModuleBytes(): Uint8Array<ArrayBuffer> {
  return encodeModule([codeDots()], { minPages: 1, maxPages: MAX_PAGES });
}

let compiled: WebAssembly.Module | null | undefined;

/** The compiled module, or null where WebAssembly SIMD or shared memory is unavailable. */
export function codeDotModule(): WebAssembly.Module | null {
  if (compiled !== undefined) return compiled;
  try {
    const bytes = codeDotModuleBytes();
    compiled = typeof SharedArrayBuffer === 'function' && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
  } catch {
    compiled = null;
  }
  return compiled;
}

export function instantiateCodeDots(module: WebAssembly.Module, memory: WebAssembly.Memory): CodeDotKernelExports {
  return new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as CodeDotKernelExports;
}
