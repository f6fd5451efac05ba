import { describe, expect, it } from 'vitest';
import { instantiateKernelModule, kernelModule, kernelModuleBytes, MAX_PAGES } from '../../../../src/core/matrix/wasm/kernelModule.js';

describe('kernelModule', () => {
  it('decodes to a module WebAssembly accepts, importing only one shared memory and exporting the fourteen kernels', () => {
    const bytes = kernelModuleBytes();
    expect(Array.from(bytes.subarray(0, 4))).toEqual([0x00, 0x61, 0x73, 0x6d]); // "\0asm" (WebAssembly Core Specification 2.0 §5.5.16)
    expect(WebAssembly.validate(bytes)).toBe(true);
    const module = kernelModule();
    expect(module).not.toBeNull();
    expect(WebAssembly.Module.imports(module!)).toEqual([{ module: 'env', name: 'memory', kind: 'memory' }]);
    expect(
      WebAssembly.Module.exports(module!)
        .map((e) => `${e.kind} ${e.name}`)
        .sort(),
    ).toEqual(
      [
        'code_dots',
        'code_dots_int',
        'copy_columns',
        'copy_columns_cast',
        'cross',
        'dots',
        'file_rows',
        'min_hash',
        'spmm',
        'spmm_f32',
        'spmm_single',
        'spmm_x32',
        'times',
        'unit_rows',
      ].map((n) => `function ${n}`),
    );
  });

  it('instantiates on a shared memory of any size up to MAX_PAGES and leaves the memory untouched', () => {
    for (const maximum of [1, 16, MAX_PAGES]) {
      const memory = new WebAssembly.Memory({ initial: 1, maximum, shared: true });
      const k = instantiateKernelModule(kernelModule()!, memory);
      expect(typeof k.spmm).toBe('function');
      expect(new Uint8Array(memory.buffer).every((b) => b === 0)).toBe(true); // no data segments
    }
    // An unshared memory is refused: the module declares its memory shared.
    expect(() => instantiateKernelModule(kernelModule()!, new WebAssembly.Memory({ initial: 1, maximum: 16 }))).toThrow();
  });
});
