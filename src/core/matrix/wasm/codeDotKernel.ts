/**
 * code_dots(codes, q, k, r0, r1, out): for each row j in [r0, r1) of a row-major block of signed
 * 8-bit codes (k a row), the dot product with a k-long f32 vector q, summed in f32 (order in
 * ./assembly/codeDots.ts) and stored promoted to f64 at out + 8j. Used to screen rows cheaply
 * before exact products. code_dots_int(codes, q, k, r0, r1, out): the same with q as k signed 16-bit
 * whole numbers, summed exactly in integers (./assembly/codeDotsInt.ts; what conceptCodes.ts
 * screens with). Exports of the kernel module (kernelModule.ts).
 */
import { instantiateKernelModule, kernelModule, type KernelModuleExports } from './kernelModule.js';

export type CodeDotKernelExports = Pick<KernelModuleExports, 'code_dots' | 'code_dots_int'>;

/** The compiled kernel module, or null where WebAssembly SIMD or shared memory is unavailable. */
export function codeDotModule(): WebAssembly.Module | null {
  return kernelModule();
}

export function instantiateCodeDots(module: WebAssembly.Module, memory: WebAssembly.Memory): CodeDotKernelExports {
  return instantiateKernelModule(module, memory);
}
