/**
 * The WebAssembly SIMD kernels as one compiled module. Their source is AssemblyScript in
 * ./assembly (one kernel per file, each with what it computes and its memory layout in its
 * header); `npm run build:kernels` compiles it into ./kernelsWasm.ts (see ./README.md). The module
 * imports one shared memory ("env" "memory", up to MAX_PAGES pages) and keeps nothing in it: every
 * argument is a byte offset the caller chose. Instantiate it on each memory (and on each thread).
 */
import { KERNELS_WASM_BASE64 } from './kernelsWasm.js';

/** Largest memory the module may use: 65536 pages of 64 KiB (4 GiB, the wasm32 limit). */
export const MAX_PAGES = 65536;

/** Every export of the module; pointers are byte offsets, flags 0 or 1. */
export interface KernelModuleExports {
  /** assembly/spmm.ts */
  spmm(indptr: number, indices: number, values: number, x: number, l: number, y: number, r0: number, r1: number, grouped: number): void;
  /** assembly/spmm.ts, with f32 stored values. */
  spmm_f32(indptr: number, indices: number, values: number, x: number, l: number, y: number, r0: number, r1: number, grouped: number): void;
  /** assembly/spmmX32.ts: f64 stored values, an f32 dense block, one entry at a time. */
  spmm_x32(indptr: number, indices: number, values: number, x: number, l: number, y: number, r0: number, r1: number): void;
  /** assembly/cross.ts */
  cross(a: number, b: number, l: number, r0: number, r1: number, g: number, symmetric: number): void;
  /** assembly/times.ts */
  times(y: number, l: number, w: number, c: number, upper: number, out: number, r0: number, r1: number): void;
  /** assembly/spmmSingle.ts: f32 stored values, X, Y and sums. */
  spmm_single(indptr: number, indices: number, values: number, x: number, l: number, y: number, r0: number, r1: number): void;
  /** assembly/copyColumns.ts */
  copy_columns(src: number, srcStride: number, dst: number, dstStride: number, w: number, r0: number, r1: number): void;
  /** assembly/copyColumns.ts: f64 → f32 (toSingle 1) or f32 → f64 (toSingle 0). */
  copy_columns_cast(
    src: number,
    srcStride: number,
    dst: number,
    dstStride: number,
    w: number,
    r0: number,
    r1: number,
    toSingle: number,
  ): void;
  /** assembly/dots.ts */
  dots(rows: number, q: number, k: number, r0: number, r1: number, out: number): void;
  /** assembly/fileRows.ts */
  file_rows(
    rows: number,
    k: number,
    r0: number,
    r1: number,
    groups: number,
    g: number,
    centroids: number,
    starts: number,
    q: number,
    out: number,
  ): void;
  /** assembly/unitRows.ts */
  unit_rows(y: number, s: number, k: number, out: number, r0: number, r1: number): void;
  /** assembly/minHash.ts */
  min_hash(keys: number, n: number, params: number, k: number, out: number): void;
  /** assembly/codeDots.ts */
  code_dots(codes: number, q: number, k: number, r0: number, r1: number, out: number): void;
  /** assembly/codeDotsInt.ts */
  code_dots_int(codes: number, q: number, k: number, r0: number, r1: number, out: number): void;
}

/** The module's bytes, decoded from kernelsWasm.ts. */
export function kernelModuleBytes(): Uint8Array<ArrayBuffer> {
  const text = atob(KERNELS_WASM_BASE64);
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
  return bytes;
}

let compiled: WebAssembly.Module | null | undefined;

/** The compiled module (once per thread), or null where WebAssembly SIMD or shared memory is unavailable. */
export function kernelModule(): WebAssembly.Module | null {
  if (compiled !== undefined) return compiled;
  try {
    const bytes = kernelModuleBytes();
    compiled = typeof SharedArrayBuffer === 'function' && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
  } catch {
    compiled = null;
  }
  return compiled;
}

/** An instance of the module on the given shared memory. */
export function instantiateKernelModule(module: WebAssembly.Module, memory: WebAssembly.Memory): KernelModuleExports {
  return new WebAssembly.Instance(module, { env: { memory } }).exports as unknown as KernelModuleExports;
}
