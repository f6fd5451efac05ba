/**
 * dots(rows, q, k, r0, r1, out): for each row j in [r0, r1) of a row-major f32 block (k numbers
 * a row), the dot product with a k-long f64 vector q, stored as f64 at out + 8j, summed in the
 * order documented in ./assembly/dots.ts (so a plain loop can give the same bits, see
 * conceptRows.ts). One export of the kernel module (kernelModule.ts).
 */
import { instantiateKernelModule, kernelModule, type KernelModuleExports } from './kernelModule.js';

export type DotKernelExports = Pick<KernelModuleExports, 'dots'>;

/** The compiled kernel module, or null where WebAssembly SIMD or shared memory is unavailable. */
export function dotModule(): WebAssembly.Module | null {
  return kernelModule();
}

export function instantiateDots(module: WebAssembly.Module, memory: WebAssembly.Memory): DotKernelExports {
  return instantiateKernelModule(module, memory);
}
