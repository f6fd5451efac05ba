import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { compileKernels, KERNEL_MODULE, renderKernelModule } from '../../../../scripts/build-kernels.mjs';
import { kernelModuleBytes } from '../../../../src/core/matrix/wasm/kernelModule.js';

describe('kernelsWasm (generated)', () => {
  it('holds exactly what the AssemblyScript sources compile to (run `npm run build:kernels` after changing them)', async () => {
    const bytes = await compileKernels();
    expect(Buffer.from(kernelModuleBytes()).equals(Buffer.from(bytes))).toBe(true);
    expect(readFileSync(join(__dirname, '../../../..', KERNEL_MODULE), 'utf8')).toBe(renderKernelModule(bytes));
  });
});
