/**
 * An 8-bit copy of the concept vectors for screening: row j is stored as codes c_j ∈ [−127, 127]
 * with one scale s_j = max|v_j|/127 (symmetric per-row quantisation, common practice), together
 * with e_j = ‖v_j − s_j c_j‖₂ and n_j = ‖s_j c_j‖₂, both rounded up. A query q is quantised the same
 * way to whole numbers: q = σ·w + ρ with w_i = round(q_i/σ), |w_i| ≤ W, so the kernel sums
 * S_j = c_j·w exactly in integers (../matrix/wasm/assembly/codeDotsInt.ts; W keeps k·127·W below
 * 2^31). Then v_j·q = s_j·σ·S_j + s_j(c_j·ρ) + (v_j − s_j c_j)·q, and by Cauchy–Schwarz the product
 * lies within center_j ± radius_j, center_j = s_j·σ·S_j and radius_j = n_j‖ρ‖₂ + e_j‖q‖₂ (plus the
 * f64 rounding of center_j), so rows whose bound cannot reach a top place need no exact product.
 * Reads a quarter of the bytes of the f32 rows. Only available with WebAssembly SIMD.
 * Memory layout: [16 bytes][query, k i16 (room for k f32)][codes, capacity × k i8][sums, capacity f64].
 */
import { codeDotModule, instantiateCodeDots, type CodeDotKernelExports } from '../../matrix/wasm/codeDotKernel.js';

const PAGE = 65536;
const WASM_LIMIT = 2 ** 32;
/** Bytes reserved (the maximum) of each memory made here. */
const RESERVED = new WeakMap<WebAssembly.Memory, number>();
const align16 = (bytes: number): number => Math.ceil(bytes / 16) * 16;
/** Largest |w_i| of the quantised query (i16), lowered so that k·127·W stays below 2^31. */
const QUERY_MAX = 32767;
/** Relative bound on the f64 rounding of center_j = s_j·(σ·S_j) (two roundings of 2^−53, generous). */
const CENTER_ROUNDING = 2 ** -50;
/** Relative slack that covers the f64 rounding of the bound arithmetic itself (generous). */
const SLACK = 1e-9;
/** Rows coded by one step of fill (a look at the caller's budget after each). */
const FILL_ROWS = 512;

export class ConceptCodes {
  private _memory: WebAssembly.Memory;
  private _kernel: CodeDotKernelExports;
  private _capacity = 0;
  private _filled = 0;
  private _codes: Int8Array = new Int8Array(0);
  private _query!: Int16Array;
  private _sums: Float64Array = new Float64Array(0);
  private _scales: Float64Array = new Float64Array(0);
  private _errors: Float64Array = new Float64Array(0);
  private _norms: Float64Array = new Float64Array(0);
  private _center = new Float64Array(0);
  private _radius = new Float64Array(0);

  /** The codes of a block, or null where WebAssembly SIMD or memory is not available. */
  static create(k: number, capacity: number, rows: Float32Array, n: number): ConceptCodes | null {
    const codes = ConceptCodes.empty(k, capacity);
    codes?.fill(rows, n, () => true);
    return codes;
  }

  /** Zero codes for capacity rows (fill them with setRows), or null as for create. */
  static empty(k: number, capacity: number): ConceptCodes | null {
    const module = k > 0 ? codeDotModule() : null;
    if (!module || ConceptCodes.bytesFor(k, capacity) > WASM_LIMIT) return null;
    try {
      const memory = ConceptCodes.memoryFor(ConceptCodes.bytesFor(k, capacity));
      const codes = new ConceptCodes(k, memory, instantiateCodeDots(module, memory), module);
      codes.ensureCapacity(capacity);
      return codes;
    } catch {
      return null;
    }
  }

  private constructor(
    readonly k: number,
    memory: WebAssembly.Memory,
    kernel: CodeDotKernelExports,
    private readonly _module: WebAssembly.Module,
  ) {
    this._memory = memory;
    this._kernel = kernel;
  }

  /** Rows [0, filled) have been coded by fill (or setRow at the end of them). */
  get filled(): number {
    return this._filled;
  }

  /** Codes rows [filled, n) of the block, FILL_ROWS at a time while more() says so (at least once); true when done. */
  fill(rows: Float32Array, n: number, more: () => boolean): boolean {
    for (;;) {
      const to = Math.min(n, this._filled + FILL_ROWS);
      this.setRows(rows, this._filled, to);
      this._filled = Math.max(this._filled, to);
      if (to >= n) return true;
      if (!more()) return false;
    }
  }

  setRow(slot: number, v: ArrayLike<number>): void {
    if (slot === this._filled) this._filled++;
    const k = this.k;
    let max = 0;
    for (let c = 0; c < k; c++) max = Math.max(max, Math.abs(v[c]));
    const s = max / 127;
    let err = 0;
    let norm = 0;
    for (let c = 0; c < k; c++) {
      const code = s > 0 ? Math.max(-127, Math.min(127, Math.round(v[c] / s))) : 0;
      this._codes[slot * k + c] = code;
      const d = v[c] - s * code;
      err += d * d;
      const x = s * code;
      norm += x * x;
    }
    this._scales[slot] = s;
    this._errors[slot] = Math.sqrt(err) * (1 + SLACK) + Number.MIN_VALUE;
    this._norms[slot] = Math.sqrt(norm) * (1 + SLACK);
  }

  /** setRow for rows [from, to) of a row-major block (k numbers a row): the same codes, one tight loop. */
  setRows(rows: Float32Array, from: number, to: number): void {
    codeRows(rows, this.k, from, to, this._codes, this._scales, this._errors, this._norms);
  }

  /** setRows for `count` rows of a block whose row 0 goes to `slot` (rows [slot, slot + count)). */
  setRowsAt(slot: number, rows: Float32Array, count: number): void {
    const k = this.k;
    const [codes, scales, errors, norms] = [this._codes, this._scales, this._errors, this._norms];
    codeRows(rows, k, 0, count, codes.subarray(slot * k), scales.subarray(slot), errors.subarray(slot), norms.subarray(slot));
    this._filled = Math.max(this._filled, slot + count);
  }

  /**
   * Rows [slot, slot + count) as writable views: their codes (count × k, row-major) and their
   * scales, errors and norms (count each). For a caller that keeps the coded rows elsewhere (a
   * file) and loads the rows a request bounds (then bounds(q, n) over rows [0, n)). Valid until the
   * capacity changes.
   */
  rowsAt(slot: number, count: number): CodedRows {
    if (!(Number.isInteger(slot) && Number.isInteger(count) && slot >= 0 && count >= 0 && slot + count <= this._capacity))
      throw new RangeError(`rows ${slot}…${slot + count - 1} are outside the ${this._capacity} coded rows`);
    const k = this.k;
    this._filled = Math.max(this._filled, slot + count);
    return {
      codes: this._codes.subarray(slot * k, (slot + count) * k),
      scales: this._scales.subarray(slot, slot + count),
      errors: this._errors.subarray(slot, slot + count),
      norms: this._norms.subarray(slot, slot + count),
    };
  }

  /**
   * bounds() for the rows of the runs [from_r, to_r), r < runs, only: entries outside them are left
   * as they were. Views (row-indexed) reused by the next call.
   */
  boundsRuns(q: ArrayLike<number>, from: Int32Array, to: Int32Array, runs: number): { center: Float64Array; radius: Float64Array } {
    const query = this.loadQuery(q);
    for (let r = 0; r < runs; r++) {
      const [a, b] = [from[r], to[r]];
      this._kernel.code_dots_int(this._codes.byteOffset, this._query.byteOffset, this.k, a, b, this._sums.byteOffset);
      this.boundRows(query, this._center, this._radius, a, b);
    }
    return { center: this._center, radius: this._radius };
  }

  /** Quantises q into the kernel's memory (w); its scale σ and the query's terms of every row's bound. */
  private loadQuery(q: ArrayLike<number>): Query {
    const k = this.k;
    const most = Math.min(QUERY_MAX, Math.floor((2 ** 31 - 1) / (127 * k)));
    let max = 0;
    for (let c = 0; c < k; c++) max = Math.max(max, Math.abs(q[c]));
    const sigma = max / most;
    let l2 = 0;
    let rest = 0;
    for (let c = 0; c < k; c++) {
      const w = sigma > 0 ? Math.max(-most, Math.min(most, Math.round(q[c] / sigma))) : 0;
      this._query[c] = w;
      const d = q[c] - sigma * w;
      l2 += q[c] * q[c];
      rest += d * d;
    }
    // ‖ρ‖ and ‖q‖ rounded up; 1e-300 covers an underflow of the tiny d·d.
    return { sigma, norm2: Math.sqrt(l2) * (1 + SLACK), rest: Math.sqrt(rest) * (1 + SLACK) + 1e-300 };
  }

  /** center and radius of rows [from, to) from the kernel's sums (see the header). */
  private boundRows(query: Query, center: Float64Array, radius: Float64Array, from: number, to: number): void {
    const { sigma, norm2, rest } = query;
    const [sums, scales, errors, norms] = [this._sums, this._scales, this._errors, this._norms];
    for (let j = from; j < to; j++) {
      const c = scales[j] * (sigma * sums[j]);
      center[j] = c;
      radius[j] = (norms[j] * rest + errors[j] * norm2) * (1 + SLACK) + Math.abs(c) * CENTER_ROUNDING + 1e-300;
    }
  }

  clearRow(slot: number): void {
    this._codes.fill(0, slot * this.k, (slot + 1) * this.k);
    this._scales[slot] = 0;
    this._errors[slot] = 0;
    this._norms[slot] = 0;
  }

  ensureCapacity(slots: number): void {
    if (slots <= this._capacity) return;
    const capacity = Math.max(slots, Math.ceil(this._capacity * 1.5));
    const k = this.k;
    const need = ConceptCodes.bytesFor(k, capacity);
    if (need > WASM_LIMIT) throw new RangeError(`screening codes of ${capacity} documents do not fit one WebAssembly memory`);
    const old = this._capacity;
    if (need > ConceptCodes.maxBytesFor(this._memory)) {
      // Past the reserved maximum: a new memory, the codes copied over (views of the old stay).
      const memory = ConceptCodes.memoryFor(need);
      new Int8Array(memory.buffer, align16(16 + 4 * k), old * k).set(this._codes.subarray(0, old * k));
      this._memory = memory;
      this._kernel = instantiateCodeDots(this._module, memory);
    }
    const have = this._memory.buffer.byteLength;
    if (need > have) this._memory.grow(Math.ceil((need - have) / PAGE));
    const buffer = this._memory.buffer;
    this._query = new Int16Array(buffer, 16, k);
    this._codes = new Int8Array(buffer, align16(16 + 4 * k), capacity * k);
    this._codes.fill(0, old * k); // the old sums scratch lay here
    this._sums = new Float64Array(buffer, align16(align16(16 + 4 * k) + capacity * k), capacity);
    const grow = (a: Float64Array): Float64Array => {
      const b = new Float64Array(capacity);
      b.set(a);
      return b;
    };
    this._scales = grow(this._scales);
    this._errors = grow(this._errors);
    this._norms = grow(this._norms);
    this._center = new Float64Array(capacity);
    this._radius = new Float64Array(capacity);
    this._capacity = capacity;
  }

  /**
   * For rows [0, n): v_j·q lies in [center_j − radius_j, center_j + radius_j]. Views reused by the
   * next call.
   */
  bounds(q: ArrayLike<number>, n: number): { center: Float64Array; radius: Float64Array } {
    const query = this.loadQuery(q);
    this._kernel.code_dots_int(this._codes.byteOffset, this._query.byteOffset, this.k, 0, n, this._sums.byteOffset);
    const center = this._center.subarray(0, n);
    const radius = this._radius.subarray(0, n);
    this.boundRows(query, center, radius, 0, n);
    return { center, radius };
  }

  /** A shared memory of at least bytes, reserving room to double. */
  private static memoryFor(bytes: number): WebAssembly.Memory {
    const maxBytes = Math.min(WASM_LIMIT, Math.max(2 * bytes, 16 * PAGE));
    const memory = new WebAssembly.Memory({ initial: Math.ceil(bytes / PAGE), maximum: maxBytes / PAGE, shared: true });
    RESERVED.set(memory, maxBytes);
    return memory;
  }

  private static maxBytesFor(memory: WebAssembly.Memory): number {
    return RESERVED.get(memory) ?? 0;
  }

  private static bytesFor(k: number, capacity: number): number {
    return align16(align16(16 + 4 * k) + capacity * k) + capacity * 8;
  }
}

/**
 * Math.round(x) (the nearest integer, halves up) for |x| ≤ 128, without its cost in the engine:
 * truncating fl(x + 128.5) (positive) floors it; fl only rounds up and by less than 1, so the result
 * is the right integer or one more, and c − 0.5 > x (exact for such c) tells which. The sign of a
 * zero may differ (−0 for x ∈ [−0.5, 0)), which the codes and error sums do not see.
 */
export function roundHalfUp(x: number): number {
  const c = ((x + 128.5) | 0) - 128;
  return c - 0.5 > x ? c - 1 : c;
}

/**
 * The arithmetic of setRow, in the same order, over a Float32Array block with no per-row views
 * (rows [from, to) of the block; codes at the same row positions of the outputs). Plain code, no
 * WebAssembly: a writer of saved codes uses it too (../../sections/savedLists.ts).
 */
export function codeRows(
  rows: Float32Array,
  k: number,
  from: number,
  to: number,
  codes: Int8Array,
  scales: Float64Array,
  errors: Float64Array,
  norms: Float64Array,
): void {
  for (let j = from; j < to; j++) {
    const base = j * k;
    let max = 0;
    for (let c = base; c < base + k; c++) {
      const a = Math.abs(rows[c]);
      if (a > max) max = a;
    }
    const s = max / 127;
    let err = 0;
    let norm = 0;
    if (s > 0) {
      for (let c = base; c < base + k; c++) {
        const v = rows[c];
        let code = roundHalfUp(v / s);
        if (code > 127) code = 127;
        else if (code < -127) code = -127;
        codes[c] = code;
        const d = v - s * code;
        err += d * d;
        const x = s * code;
        norm += x * x;
      }
    } else {
      for (let c = base; c < base + k; c++) {
        const v = rows[c];
        codes[c] = 0;
        err += v * v;
      }
    }
    scales[j] = s;
    errors[j] = Math.sqrt(err) * (1 + SLACK) + Number.MIN_VALUE;
    norms[j] = Math.sqrt(norm) * (1 + SLACK);
  }
}

/** A quantised query's scale σ, ‖q‖₂ and ‖ρ‖₂ (both rounded up). */
interface Query {
  readonly sigma: number;
  readonly norm2: number;
  readonly rest: number;
}

/** Views of coded rows (ConceptCodes.rowsAt): codes row-major, then one scale, error and norm a row. */
export interface CodedRows {
  readonly codes: Int8Array;
  readonly scales: Float64Array;
  readonly errors: Float64Array;
  readonly norms: Float64Array;
}
