/**
 * Typed arrays carved out of one shared WebAssembly memory, so the SIMD kernels (and worker
 * threads that instantiate the same module on the same memory) can reach them by byte offset.
 * A bump allocator: mark() and release(mark) free everything allocated in between, which is how
 * one SVD hands its scratch back. The memory is shared even on one thread because growing a
 * shared memory never detaches the buffers of earlier arrays.
 */
import { instantiateKernelModule, kernelModule, MAX_PAGES, type KernelModuleExports } from './kernelModule.js';

export { kernelModule };

const PAGE = 65536;
const ALIGN = 16;
const GROW_SLACK_PAGES = 64;

/** The exports the executors use (./assembly/spmm.ts, spmmX32.ts, spmmSingle.ts, cross.ts, times.ts, copyColumns.ts, unitRows.ts, fileRows.ts). */
export type KernelExports = Pick<
  KernelModuleExports,
  'spmm' | 'spmm_f32' | 'spmm_x32' | 'spmm_single' | 'cross' | 'times' | 'copy_columns' | 'copy_columns_cast' | 'unit_rows' | 'file_rows'
>;

export function instantiateKernels(module: WebAssembly.Module, memory: WebAssembly.Memory): KernelExports {
  return instantiateKernelModule(module, memory);
}

export class WasmArena {
  readonly memory: WebAssembly.Memory;
  private top = ALIGN;
  /** Bytes below this offset may hold old data; above it the memory is as grown (zero). */
  private clean = 0;
  private readonly buffers = new WeakSet<ArrayBufferLike>();

  constructor(memory?: WebAssembly.Memory) {
    this.memory = memory ?? new WebAssembly.Memory({ initial: 16, maximum: MAX_PAGES, shared: true });
    this.buffers.add(this.memory.buffer);
  }

  mark(): number {
    return this.top;
  }

  release(mark: number): void {
    this.top = Math.min(this.top, Math.max(ALIGN, mark));
  }

  float64(n: number): Float64Array {
    const p = this.alloc(n * 8);
    return this.zeroed(new Float64Array(this.memory.buffer, p, n), p);
  }

  float32(n: number): Float32Array {
    const p = this.alloc(n * 4);
    return this.zeroed(new Float32Array(this.memory.buffer, p, n), p);
  }

  int32(n: number): Int32Array {
    const p = this.alloc(n * 4);
    return this.zeroed(new Int32Array(this.memory.buffer, p, n), p);
  }

  /** Memory above the highest point ever handed out is still zero from growing; below it, clear. */
  private zeroed<T extends Float64Array | Float32Array | Int32Array>(a: T, p: number): T {
    if (p < this.clean) a.subarray(0, Math.ceil((Math.min(this.clean, p + a.byteLength) - p) / a.BYTES_PER_ELEMENT)).fill(0);
    this.clean = Math.max(this.clean, p + a.byteLength);
    return a;
  }

  /** The byte offset of an array that lives in this memory, or -1. */
  offsetOf(a: ArrayBufferView): number {
    return this.buffers.has(a.buffer) ? a.byteOffset : -1;
  }

  private alloc(bytes: number): number {
    const p = this.top;
    const end = p + Math.ceil(Math.max(bytes, 1) / ALIGN) * ALIGN;
    const have = this.memory.buffer.byteLength;
    if (end > have) {
      // Grow by what is needed plus a little (reserved address space makes growing cheap).
      this.memory.grow(Math.ceil((end - have) / PAGE) + GROW_SLACK_PAGES);
      this.buffers.add(this.memory.buffer);
    }
    this.top = end;
    return p;
  }
}
