/**
 * The documents' concept vectors as one contiguous row-major f32 block (k numbers per slot, each
 * row a unit vector or zeros), with the dot product of one vector against every row in a single
 * pass: cosine ranking for unit vectors is exactly this product (Deerwester et al. 1990 rank by
 * cosine in the reduced space).
 *
 * Where WebAssembly SIMD and shared memory exist, the block lives in its own shared WebAssembly
 * memory and the products run in the SIMD kernel of ../matrix/wasm/dotKernel.ts; elsewhere
 * dotRows below runs the same operations in the same order, so both give the same bits.
 * Memory layout: [16 bytes unused][query, k f64][rows, capacity × k f32][scores, capacity f64].
 * A shared memory never detaches earlier views when it grows, so views handed out stay valid. Its
 * maximum is reserved as twice the first size; growing past it moves the rows to a new memory
 * (earlier views then keep the old numbers, as a copied plain array would).
 */
import { dotModule, instantiateDots, type DotKernelExports } from '../../matrix/wasm/dotKernel.js';

const PAGE = 65536;
const align16 = (bytes: number): number => Math.ceil(bytes / 16) * 16;
/** Most bytes one wasm32 memory can address. */
const WASM_LIMIT = 2 ** 32;

export interface ConceptRowsOptions {
  /** Use the WebAssembly kernel when available. @default true */
  wasm: boolean;
}

export const DEFAULT_CONCEPT_ROWS_OPTIONS: Readonly<ConceptRowsOptions> = Object.freeze({ wasm: true });

/** Dot products of q with rows [0, n) of a k-wide f32 block, in the order the SIMD kernel uses. */
export function dotRows(rows: Float32Array, k: number, n: number, q: ArrayLike<number>, out: Float64Array): void {
  const k8 = k - (k & 7);
  for (let j = 0, o = 0; j < n; j++, o += k) {
    let s0 = 0,
      s1 = 0,
      s2 = 0,
      s3 = 0,
      s4 = 0,
      s5 = 0,
      s6 = 0,
      s7 = 0;
    for (let c = 0; c < k8; c += 8) {
      const p = o + c;
      s0 += rows[p] * q[c];
      s1 += rows[p + 1] * q[c + 1];
      s2 += rows[p + 2] * q[c + 2];
      s3 += rows[p + 3] * q[c + 3];
      s4 += rows[p + 4] * q[c + 4];
      s5 += rows[p + 5] * q[c + 5];
      s6 += rows[p + 6] * q[c + 6];
      s7 += rows[p + 7] * q[c + 7];
    }
    let r = s0 + s2 + (s4 + s6) + (s1 + s3 + (s5 + s7));
    for (let c = k8; c < k; c++) r += rows[o + c] * q[c];
    out[j] = r;
  }
}

interface WasmStore {
  readonly memory: WebAssembly.Memory;
  readonly kernel: DotKernelExports;
  readonly maxBytes: number;
}

/** A shared memory for at least bytes, with room reserved to double; null if refused. */
function wasmStore(module: WebAssembly.Module, bytes: number): WasmStore | null {
  const maxBytes = Math.min(WASM_LIMIT, Math.max(2 * bytes, 16 * PAGE));
  try {
    const memory = new WebAssembly.Memory({ initial: Math.ceil(bytes / PAGE), maximum: maxBytes / PAGE, shared: true });
    return { memory, kernel: instantiateDots(module, memory), maxBytes };
  } catch {
    return null;
  }
}

export class ConceptRows {
  private _capacity = 0;
  private _rows: Float32Array;
  private _scores: Float64Array;
  private _query: Float64Array;
  private _wasm: WasmStore | null;
  private readonly _module: WebAssembly.Module | null;

  /** capacity slots, filled from initial (row-major, capacity × k or fewer numbers) when given. */
  constructor(
    readonly k: number,
    capacity: number,
    initial?: Float32Array,
    options: Partial<ConceptRowsOptions> = {},
  ) {
    const { wasm } = { ...DEFAULT_CONCEPT_ROWS_OPTIONS, ...options };
    const bytes = ConceptRows.bytesFor(k, capacity);
    this._module = wasm && k > 0 && bytes <= WASM_LIMIT ? dotModule() : null;
    this._wasm = this._module ? wasmStore(this._module, bytes) : null;
    this._rows = new Float32Array(0);
    this._scores = new Float64Array(0);
    this._query = new Float64Array(k);
    this.grow(capacity);
    if (initial) this._rows.set(initial.subarray(0, Math.min(initial.length, this._rows.length)));
  }

  /** True when the SIMD kernel is in use. */
  get usesWasm(): boolean {
    return this._wasm !== null;
  }

  get capacity(): number {
    return this._capacity;
  }

  /** All rows (capacity × k); a view that later growth does not invalidate but does not extend. */
  get rows(): Float32Array {
    return this._rows;
  }

  /** Makes room for at least slots rows (grown by half again, to keep appends cheap). */
  ensureCapacity(slots: number): void {
    if (slots > this._capacity) this.grow(Math.max(slots, Math.ceil(this._capacity * 1.5)));
  }

  /**
   * The bytes of rows [0, slots) to be written in place (little-endian f32, k a row), for a reader
   * that fills them straight from a saved file: no copy of the vectors is ever held beside them.
   */
  rowBytes(slots: number): Uint8Array {
    if (slots > this._capacity) throw new RangeError(`rows ${slots} exceed capacity ${this._capacity}`);
    return new Uint8Array(this._rows.buffer, this._rows.byteOffset, slots * this.k * 4);
  }

  setRow(slot: number, vector: Float32Array): void {
    this._rows.set(vector.subarray(0, this.k), slot * this.k);
  }

  clearRow(slot: number): void {
    this._rows.fill(0, slot * this.k, (slot + 1) * this.k);
  }

  /**
   * Dot products of q (k numbers) with rows [0, n). The result is a view reused by the next call:
   * copy what must outlive it.
   */
  dots(q: ArrayLike<number>, n: number): Float64Array {
    if (n > this._capacity) throw new RangeError(`rows ${n} exceed capacity ${this._capacity}`);
    const out = this._scores.subarray(0, n);
    if (this._wasm) {
      for (let c = 0; c < this.k; c++) this._query[c] = q[c];
      this._wasm.kernel.dots(this._rows.byteOffset, this._query.byteOffset, this.k, 0, n, out.byteOffset);
    } else {
      dotRows(this._rows, this.k, n, q, out);
    }
    return out;
  }

  /**
   * Dot products of q with the listed rows only (the first count of slots), each the same bits as
   * dots() gives; read them at those slots of the returned view (other entries are stale).
   */
  dotsAt(q: ArrayLike<number>, slots: Int32Array, count: number): Float64Array {
    const out = this._scores;
    if (this._wasm) {
      for (let c = 0; c < this.k; c++) this._query[c] = q[c];
      const kernel = this._wasm.kernel;
      for (let i = 0; i < count; i++)
        kernel.dots(this._rows.byteOffset, this._query.byteOffset, this.k, slots[i], slots[i] + 1, out.byteOffset);
    } else {
      for (let i = 0; i < count; i++) dotRows(this._rows.subarray(slots[i] * this.k), this.k, 1, q, out.subarray(slots[i]));
    }
    return out;
  }

  private static bytesFor(k: number, capacity: number): number {
    return align16(align16(16 + k * 8) + capacity * k * 4) + capacity * 8;
  }

  private grow(capacity: number): void {
    const k = this.k;
    if (!this._wasm) {
      const rows = new Float32Array(capacity * k);
      rows.set(this._rows);
      this._rows = rows;
      this._scores = new Float64Array(capacity);
      this._capacity = capacity;
      return;
    }
    const need = ConceptRows.bytesFor(k, capacity);
    if (need > WASM_LIMIT) throw new RangeError(`concept vectors of ${capacity} documents do not fit one WebAssembly memory`);
    const old = this._capacity;
    if (need > this._wasm.maxBytes) {
      const moved = wasmStore(this._module!, need);
      if (!moved) throw new RangeError(`no memory for the concept vectors of ${capacity} documents`);
      new Float32Array(moved.memory.buffer, align16(16 + k * 8), old * k).set(this._rows.subarray(0, old * k));
      this._wasm = moved;
    }
    const memory = this._wasm.memory;
    const have = memory.buffer.byteLength;
    if (need > have) memory.grow(Math.ceil((need - have) / PAGE));
    const buffer = memory.buffer;
    const queryAt = 16;
    const rowsAt = align16(queryAt + k * 8);
    const scoresAt = align16(rowsAt + capacity * k * 4);
    this._query = new Float64Array(buffer, queryAt, k);
    // Rows keep their place; the score scratch moves up past them (and is cleared where it was).
    this._rows = new Float32Array(buffer, rowsAt, capacity * k);
    if (old > 0) this._rows.fill(0, old * k);
    this._scores = new Float64Array(buffer, scoresAt, capacity);
    this._capacity = capacity;
  }
}
