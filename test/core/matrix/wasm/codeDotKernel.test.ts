import { describe, expect, it } from 'vitest';
import { codeDotModule, codeDotModuleBytes, instantiateCodeDots } from '../../../../src/core/matrix/wasm/codeDotKernel.js';

describe('codeDotKernel', () => {
  it('encodes a module WebAssembly accepts', () => {
    expect(WebAssembly.validate(codeDotModuleBytes())).toBe(true);
    expect(codeDotModule()).not.toBeNull();
  });

  it('gives the exact dot product of 8-bit codes and small whole numbers, for exactly the rows asked for', () => {
    const memory = new WebAssembly.Memory({ initial: 1, maximum: 16, shared: true });
    const kernel = instantiateCodeDots(codeDotModule()!, memory);
    const k = 37; // two blocks of sixteen and a tail of five
    const codes = new Int8Array(memory.buffer, 1024, 6 * k);
    const q = new Float32Array(memory.buffer, 256, k);
    const out = new Float64Array(memory.buffer, 8192, 6);
    for (let i = 0; i < codes.length; i++) codes[i] = ((i * 37) % 255) - 127; // covers −127…127
    for (let c = 0; c < k; c++) q[c] = c - 18;
    out.fill(-1);
    kernel.code_dots(codes.byteOffset, q.byteOffset, k, 1, 5, out.byteOffset);
    // Whole numbers below 2^24 in every partial sum: f32 arithmetic is exact, so the brute-force
    // sum is the expected value.
    for (let j = 0; j < 6; j++) {
      let ref = 0;
      for (let c = 0; c < k; c++) ref += codes[j * k + c] * q[c];
      expect(out[j]).toBe(j >= 1 && j < 5 ? ref : -1);
    }
  });
});
