/**
 * The products k-means spends its time in, for one set of points: every point's dot product with
 * a few centres (points · centresᵀ) and with one of the points. Where WebAssembly SIMD and shared
 * memory are available the points are copied once into a memory of their own and the products
 * run as the SIMD `times` kernel (matrix/wasm/assembly/times.ts), which performs the same IEEE
 * operations in the same order as the plain timesSmallRows (matrix/kernels.ts): the same bits,
 * in 2.5–3.2× less CPU time for 8 and 20 centres (our measurement, 8000 points of 195 numbers,
 * three rounds on a loaded machine: 117–147 ms → 42–47 ms and 238–299 ms → 96–106 ms for ten
 * products), about the same for one.
 * Elsewhere the plain kernel runs on the caller's array. The memory is sized to the points (or
 * to a block of them, RESIDENT_NUMBERS) and dropped with this object (nothing kept between calls).
 */
import { timesSmallRows } from '../matrix/kernels.js';
import { instantiateKernelModule, kernelModule, type KernelModuleExports } from '../matrix/wasm/kernelModule.js';

const PAGE = 65536;

/**
 * Up to this many numbers of points (32 MiB) are copied once and stay in the kernel's memory;
 * more are copied a block of rows at a time for each product with several centres (a copy costs
 * 1/k of the product), so the memory holds a block, not a second copy of every point (our choice).
 */
export const RESIDENT_NUMBERS = 1 << 22;

export class PointProducts {
  private readonly wasm: {
    readonly times: KernelModuleExports['times'];
    readonly f64: Float64Array;
    /** Rows held at a time: n when the points are resident, else a block. */
    readonly rows: number;
    readonly resident: boolean;
    readonly points: number;
    readonly w: number;
    readonly out: number;
    readonly maxK: number;
  } | null;

  /** points: n × dims, row-major; maxK: the most centres one product takes. */
  constructor(
    private readonly points: Float64Array,
    private readonly n: number,
    private readonly dims: number,
    maxK: number,
    residentNumbers = RESIDENT_NUMBERS,
  ) {
    this.wasm = PointProducts.setUp(points, n, dims, Math.max(1, maxK), residentNumbers);
  }

  private static setUp(points: Float64Array, n: number, dims: number, maxK: number, residentNumbers: number) {
    const module = n >= 4 ? kernelModule() : null;
    if (!module) return null;
    const resident = n * dims <= residentNumbers;
    const rows = resident ? n : Math.min(n, Math.max(4, Math.floor(residentNumbers / dims)));
    // Layout (f64 slots): [pad] points rows·dims | w dims·maxK | out rows·maxK.
    const pointsAt = 2;
    const wAt = pointsAt + rows * dims;
    const outAt = wAt + dims * maxK;
    const bytes = (outAt + rows * maxK) * 8;
    const pages = Math.ceil(bytes / PAGE);
    if (pages > 65536) return null;
    try {
      const memory = new WebAssembly.Memory({ initial: pages, maximum: pages, shared: true });
      const f64 = new Float64Array(memory.buffer);
      if (resident) f64.set(points.subarray(0, n * dims), pointsAt);
      const times = instantiateKernelModule(module, memory).times;
      return { times, f64, rows, resident, points: pointsAt, w: wAt, out: outAt, maxK };
    } catch {
      return null; // no memory to be had: the plain kernel
    }
  }

  /** True when the products run on WebAssembly SIMD. */
  get simd(): boolean {
    return this.wasm !== null;
  }

  /** out (n × k, row-major) = points · centresᵀ, centres k × dims row-major. */
  timesCentres(centres: Float64Array, k: number, out: Float64Array): void {
    const w = this.wasm;
    const { n, dims } = this;
    if (!w || k > w.maxK) {
      timesSmallRows(this.points, dims, centres, k, false, out, 0, n);
      return;
    }
    // The kernel takes W (dims × k) itself, not transposed.
    const f = w.f64;
    for (let c = 0; c < k; c++) for (let d = 0; d < dims; d++) f[w.w + d * k + c] = centres[c * dims + d];
    for (let r0 = 0; r0 < n; r0 += w.rows) {
      const rows = Math.min(w.rows, n - r0);
      if (!w.resident) f.set(this.points.subarray(r0 * dims, (r0 + rows) * dims), w.points);
      w.times(w.points * 8, dims, w.w * 8, k, 0, w.out * 8, 0, rows);
      out.set(f.subarray(w.out, w.out + rows * k), r0 * k);
    }
  }

  /** out (n) = points · point j (the plain kernel when the points are not resident: a copy would cost as much as the product). */
  timesPoint(j: number, out: Float64Array): void {
    const w = this.wasm;
    const { n, dims } = this;
    if (!w || !w.resident) {
      timesSmallRows(this.points, dims, this.points.subarray(j * dims, (j + 1) * dims), 1, false, out, 0, n);
      return;
    }
    w.times(w.points * 8, dims, (w.points + j * dims) * 8, 1, 0, w.out * 8, 0, n);
    out.set(w.f64.subarray(w.out, w.out + n));
  }
}
