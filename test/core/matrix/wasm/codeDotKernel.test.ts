import { describe, expect, it } from 'vitest';
import { codeDotModule, instantiateCodeDots } from '../../../../src/core/matrix/wasm/codeDotKernel.js';
import { createRandom } from '../../../../src/core/random.js';

describe('codeDotKernel', () => {
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

  it('rounds like the documented order: sixteen f32 running sums, (acc0 + acc1) + (acc2 + acc3), (l0 + l1) + (l2 + l3), then the tail', () => {
    const memory = new WebAssembly.Memory({ initial: 4, maximum: 16, shared: true });
    const kernel = instantiateCodeDots(codeDotModule()!, memory);
    const rnd = createRandom(3);
    for (const k of [16, 37, 100, 7]) {
      const n = 40;
      const codes = new Int8Array(memory.buffer, 65536, n * k);
      const q = new Float32Array(memory.buffer, 1024, k);
      const out = new Float64Array(memory.buffer, 16384, n);
      for (let i = 0; i < codes.length; i++) codes[i] = (rnd.nextUint32() % 255) - 127;
      for (let c = 0; c < k; c++) q[c] = rnd.normal() * 10 ** ((c % 5) - 2); // mixed magnitudes: rounding matters
      kernel.code_dots(codes.byteOffset, q.byteOffset, k, 0, n, out.byteOffset);
      // f32 arithmetic emulated with Math.fround: an f32 sum or product computed in f64 and rounded
      // once is the correctly rounded f32 result (f64 has more than 2·24 + 2 significand bits;
      // Figueroa 1995, "When is double rounding innocuous?", SIGNUM Newsletter 30(3)).
      const f = Math.fround;
      const k16 = k - (k % 16);
      for (let j = 0; j < n; j++) {
        const t = new Array<number>(16).fill(0);
        for (let c = 0; c < k16; c++) t[c % 16] = f(t[c % 16] + f(codes[j * k + c] * q[c]));
        const lane = [0, 1, 2, 3].map((m) => f(f(t[m] + t[4 + m]) + f(t[8 + m] + t[12 + m])));
        let r = f(f(lane[0] + lane[1]) + f(lane[2] + lane[3]));
        for (let c = k16; c < k; c++) r = f(r + f(codes[j * k + c] * q[c]));
        expect(Object.is(out[j], r)).toBe(true);
      }
    }
  });

  it('code_dots_int: the exact integer dot product of 8-bit codes and 16-bit whole numbers at their extremes, for exactly the rows asked for', () => {
    const memory = new WebAssembly.Memory({ initial: 8, maximum: 16, shared: true });
    const kernel = instantiateCodeDots(codeDotModule()!, memory);
    const rnd = createRandom(5);
    // k = 289: 127 · 32767 · 289 < 2^31, the largest sums the caller allows (conceptCodes.ts).
    for (const k of [16, 37, 289, 7]) {
      const n = 30;
      const codes = new Int8Array(memory.buffer, 65536, n * k);
      const q = new Int16Array(memory.buffer, 1024, k);
      const out = new Float64Array(memory.buffer, 16384, n);
      for (let i = 0; i < codes.length; i++) codes[i] = (rnd.nextUint32() % 255) - 127;
      for (let c = 0; c < k; c++) q[c] = (rnd.nextUint32() % 65535) - 32767;
      codes.fill(127, 0, k); // row 1 and row 2: every product at its largest, of either sign
      q.fill(32767);
      codes.fill(-127, k, 2 * k);
      out.fill(-1);
      kernel.code_dots_int(codes.byteOffset, q.byteOffset, k, 0, n - 1, out.byteOffset);
      for (let j = 0; j < n; j++) {
        let ref = 0;
        for (let c = 0; c < k; c++) ref += codes[j * k + c] * q[c]; // exact in f64 (below 2^53)
        expect(out[j]).toBe(j < n - 1 ? ref : -1);
      }
      expect(Math.abs(out[0])).toBe(127 * 32767 * k);
    }
  });
});
