import { describe, expect, it } from 'vitest';
import { dotModule, instantiateDots } from '../../../../src/core/matrix/wasm/dotKernel.js';

describe('dotKernel', () => {
  it('writes the dot product of exactly the rows asked for, summed in the documented order', () => {
    const memory = new WebAssembly.Memory({ initial: 1, maximum: 16, shared: true });
    const kernel = instantiateDots(dotModule()!, memory);
    const k = 11; // one block of eight and a tail of three
    const rows = new Float32Array(memory.buffer, 1024, 6 * k);
    const q = new Float64Array(memory.buffer, 512, k);
    const out = new Float64Array(memory.buffer, 4096, 6);
    // Small integers: every product and sum is exact, so any order gives the brute-force value.
    for (let i = 0; i < rows.length; i++) rows[i] = (i % 7) - 3;
    for (let c = 0; c < k; c++) q[c] = c - 5;
    out.fill(-1);
    kernel.dots(rows.byteOffset, q.byteOffset, k, 2, 5, out.byteOffset);
    for (let j = 0; j < 6; j++) {
      let ref = 0;
      for (let c = 0; c < k; c++) ref += rows[j * k + c] * q[c];
      expect(out[j]).toBe(j >= 2 && j < 5 ? ref : -1);
    }
  });

  it('rounds like ((s0 + s2) + (s4 + s6)) + ((s1 + s3) + (s5 + s7)) over eight running sums', () => {
    const memory = new WebAssembly.Memory({ initial: 1, maximum: 16, shared: true });
    const kernel = instantiateDots(dotModule()!, memory);
    const rows = new Float32Array(memory.buffer, 1024, 8);
    const q = new Float64Array(memory.buffer, 512, 8);
    const out = new Float64Array(memory.buffer, 4096, 1);
    // Products (2^53, 1, 0, 1, 0, 0, 0, 0): left to right, 2^53 + 1 rounds to 2^53 (ties to even)
    // twice; the documented order adds 1 + 1 first and gives 2^53 + 2 exactly.
    rows.set([1, 1, 0, 1, 0, 0, 0, 0]);
    q.set([2 ** 53, 1, 0, 1, 0, 0, 0, 0]);
    kernel.dots(rows.byteOffset, q.byteOffset, 8, 0, 1, out.byteOffset);
    expect(out[0]).toBe(2 ** 53 + 2);
    let leftToRight = 0;
    for (let c = 0; c < 8; c++) leftToRight += rows[c] * q[c];
    expect(leftToRight).toBe(2 ** 53);
  });
});
