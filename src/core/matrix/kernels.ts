/**
 * Row-range kernels: the units of work the SVD hands to an executor (serial, or threads over
 * shared memory). Each kernel reads and writes flat row-major arrays and touches only the output
 * rows (or the block partial) it is given, so a fixed split into tasks gives the same bits
 * whichever thread runs which task. Hand-unrolled loops (common practice for JIT-compiled typed
 * array code): four sparse entries per step in the sparse product, 4×4 register tiles in the
 * Gram kernels, 4 rows × 2 columns in the small right products.
 *
 * Kernels take no module imports so that worker threads can run the very same code.
 */

export type FloatArray = Float64Array | Float32Array;

/** Rows per block of a seeded Gaussian block: block b draws from its own stream (see gaussianBlock). */
export const GAUSSIAN_BLOCK_ROWS = 2048;

/**
 * Fills rows [b·GAUSSIAN_BLOCK_ROWS, …) of a rows × l block with N(0, 1) numbers from the
 * stream seeded by (seed, b), so blocks can be drawn on any thread, in any order, with the same
 * result. Marsaglia's polar method (Marsaglia & Bray 1964): two normals per accepted pair of
 * uniforms with one log and one square root, no sine or cosine (about 1.6× faster here than
 * Box–Muller). The uniforms are createRandom's stream (random.ts: xoshiro128**, Blackman & Vigna
 * 2021, seeded by splitmix32), the same numbers, drawn by this function's own copy of the
 * generator, whose draws stay signed 32-bit integers until used: createRandom's nextUint32 hands
 * each draw back as an unsigned number, boxed above 2³⁰, and the block took twice as long (this
 * file takes no imports; the tests check that the two streams agree).
 */
export function gaussianBlock(out: Float64Array, rows: number, l: number, seed: number, b: number): void {
  // splitmix32 expands the block's seed into the four state words, as createRandom does.
  let x = (Math.imul(seed ^ 0x5bd1e995, 0x9e3779b1) + Math.imul(b + 1, 0x85ebca6b)) >>> 0;
  const split = (): number => {
    x = (x + 0x9e3779b9) >>> 0;
    let z = x;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) | 0;
  };
  let s0 = split();
  let s1 = split();
  let s2 = split();
  let s3 = split();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  const end = Math.min(rows, (b + 1) * GAUSSIAN_BLOCK_ROWS) * l;
  const scale = 2 / 4294967296;
  let i = b * GAUSSIAN_BLOCK_ROWS * l;
  // One xoshiro128** step: r = rotl(s1·5, 7)·9 as a signed 32-bit integer, then the state update.
  const next = (): number => {
    const m = Math.imul(s1, 5);
    const r = Math.imul((m << 7) | (m >>> 25), 9);
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = (s3 << 11) | (s3 >>> 21);
    return r;
  };
  while (i < end) {
    const r1 = next();
    const r2 = next();
    const u = (r1 >>> 0) * scale - 1;
    const v = (r2 >>> 0) * scale - 1;
    const s = u * u + v * v;
    if (s >= 1 || s === 0) continue;
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    out[i++] = u * f;
    if (i < end) out[i++] = v * f;
  }
}

/**
 * y[r0:r1] = M[r0:r1] · X, where M is CSR (rows × cols) and X is cols × l, Y is rows × l.
 * grouped = false adds one stored entry at a time (y += v·x), the order of a plain loop.
 */
export function spmmRows(
  indptr: Int32Array,
  indices: Int32Array,
  values: FloatArray,
  x: FloatArray,
  l: number,
  y: FloatArray,
  r0: number,
  r1: number,
  grouped = true,
): void {
  productRows(indptr, indices, values, x, l, y, r0, r1, grouped, exact);
}

/**
 * spmmRows in single precision, the twin of the WebAssembly kernel spmm_single
 * (wasm/assembly/spmmSingle.ts): f32 stored values, X, Y and sums, the grouped order. Each
 * product and sum is rounded to f32 as it is formed (Math.fround of the f64 result of two f32
 * numbers is the correctly rounded f32 result, and a Float32Array store rounds the last sum), so
 * the bits are the kernel's.
 */
export function spmmSingleRows(
  indptr: Int32Array,
  indices: Int32Array,
  values: Float32Array,
  x: Float32Array,
  l: number,
  y: Float32Array,
  r0: number,
  r1: number,
): void {
  productRows(indptr, indices, values, x, l, y, r0, r1, true, Math.fround);
}

const exact = (v: number): number => v;

/** The rows of M·X with each product and partial sum passed through `round` (exact: f64). */
function productRows(
  indptr: Int32Array,
  indices: Int32Array,
  values: FloatArray,
  x: FloatArray,
  l: number,
  y: FloatArray,
  r0: number,
  r1: number,
  grouped: boolean,
  round: (v: number) => number,
): void {
  for (let i = r0; i < r1; i++) {
    const yo = i * l;
    const yEnd = yo + l;
    for (let c = yo; c < yEnd; c++) y[c] = 0;
    const p1 = indptr[i + 1];
    let p = indptr[i];
    for (; grouped && p + 4 <= p1; p += 4) {
      const v0 = values[p],
        v1 = values[p + 1],
        v2 = values[p + 2],
        v3 = values[p + 3];
      const x0 = indices[p] * l - yo,
        x1 = indices[p + 1] * l - yo,
        x2 = indices[p + 2] * l - yo,
        x3 = indices[p + 3] * l - yo;
      for (let c = yo; c < yEnd; c++) {
        let sum = round(round(v0 * x[x0 + c]) + round(v1 * x[x1 + c]));
        sum = round(sum + round(v2 * x[x2 + c]));
        y[c] += round(sum + round(v3 * x[x3 + c]));
      }
    }
    for (; p < p1; p++) {
      const v = values[p];
      const xo = indices[p] * l - yo;
      for (let c = yo; c < yEnd; c++) y[c] += round(v * x[xo + c]);
    }
  }
}

/**
 * g = A[r0:r1]ᵀ B[r0:r1] (l × l, row-major, overwritten). When symmetric (a and b the same
 * block) only the upper triangle and diagonal are computed; the caller mirrors them.
 */
export function crossRows(a: FloatArray, b: FloatArray, l: number, r0: number, r1: number, g: Float64Array, symmetric: boolean): void {
  g.fill(0);
  const o0 = r0 * l;
  const o1 = r1 * l;
  const l4 = l - (l % 4);
  for (let p = 0; p < l; p += 4) {
    const pFull = p < l4;
    for (let q = symmetric ? p : 0; q < l; q += 4) {
      if (pFull && q < l4) {
        let g00 = 0,
          g01 = 0,
          g02 = 0,
          g03 = 0,
          g10 = 0,
          g11 = 0,
          g12 = 0,
          g13 = 0;
        let g20 = 0,
          g21 = 0,
          g22 = 0,
          g23 = 0,
          g30 = 0,
          g31 = 0,
          g32 = 0,
          g33 = 0;
        for (let o = o0; o < o1; o += l) {
          const a0 = a[o + p],
            a1 = a[o + p + 1],
            a2 = a[o + p + 2],
            a3 = a[o + p + 3];
          const b0 = b[o + q],
            b1 = b[o + q + 1],
            b2 = b[o + q + 2],
            b3 = b[o + q + 3];
          g00 += a0 * b0;
          g01 += a0 * b1;
          g02 += a0 * b2;
          g03 += a0 * b3;
          g10 += a1 * b0;
          g11 += a1 * b1;
          g12 += a1 * b2;
          g13 += a1 * b3;
          g20 += a2 * b0;
          g21 += a2 * b1;
          g22 += a2 * b2;
          g23 += a2 * b3;
          g30 += a3 * b0;
          g31 += a3 * b1;
          g32 += a3 * b2;
          g33 += a3 * b3;
        }
        let t = p * l + q;
        g[t] = g00;
        g[t + 1] = g01;
        g[t + 2] = g02;
        g[t + 3] = g03;
        t += l;
        g[t] = g10;
        g[t + 1] = g11;
        g[t + 2] = g12;
        g[t + 3] = g13;
        t += l;
        g[t] = g20;
        g[t + 1] = g21;
        g[t + 2] = g22;
        g[t + 3] = g23;
        t += l;
        g[t] = g30;
        g[t + 1] = g31;
        g[t + 2] = g32;
        g[t + 3] = g33;
      } else {
        const pe = Math.min(p + 4, l);
        const qe = Math.min(q + 4, l);
        for (let pp = p; pp < pe; pp++)
          for (let qq = q; qq < qe; qq++) {
            let s = 0;
            for (let o = o0; o < o1; o += l) s += a[o + pp] * b[o + qq];
            g[pp * l + qq] = s;
          }
      }
    }
  }
}

/**
 * out[r0:r1] = Y[r0:r1] · W, where Y is rows × l and W is l × c, given transposed (wt is c × l,
 * row-major). With upper = true, W is upper triangular (w[a][b] = 0 for a > b) and only a ≤ b is
 * read. Columns are produced from the last to the first, so with an upper-triangular W and
 * c = l, out may be y itself (column b needs only columns ≤ b, not yet overwritten).
 */
export function timesSmallRows(
  y: FloatArray,
  l: number,
  wt: Float64Array,
  c: number,
  upper: boolean,
  out: FloatArray,
  r0: number,
  r1: number,
): void {
  let i = r0;
  for (; i + 4 <= r1; i += 4) {
    const y0 = i * l,
      y1 = y0 + l,
      y2 = y1 + l,
      y3 = y2 + l;
    const z0 = i * c,
      z1 = z0 + c,
      z2 = z1 + c,
      z3 = z2 + c;
    // An odd last column first, then pairs from the top down.
    if (c % 2 === 1) {
      const b = c - 1;
      const w0 = b * l;
      const end = upper ? Math.min(b + 1, l) : l;
      let s0 = 0,
        s1 = 0,
        s2 = 0,
        s3 = 0;
      for (let a = 0; a < end; a++) {
        const u = wt[w0 + a];
        s0 += y[y0 + a] * u;
        s1 += y[y1 + a] * u;
        s2 += y[y2 + a] * u;
        s3 += y[y3 + a] * u;
      }
      out[z0 + b] = s0;
      out[z1 + b] = s1;
      out[z2 + b] = s2;
      out[z3 + b] = s3;
    }
    for (let b = c - (c % 2) - 2; b >= 0; b -= 2) {
      const w0 = b * l,
        w1 = w0 + l;
      const end = upper ? Math.min(b + 2, l) : l;
      let s0 = 0,
        s1 = 0,
        s2 = 0,
        s3 = 0,
        t0 = 0,
        t1 = 0,
        t2 = 0,
        t3 = 0;
      for (let a = 0; a < end; a++) {
        const u = wt[w0 + a],
          v = wt[w1 + a];
        const x0 = y[y0 + a],
          x1 = y[y1 + a],
          x2 = y[y2 + a],
          x3 = y[y3 + a];
        s0 += x0 * u;
        s1 += x1 * u;
        s2 += x2 * u;
        s3 += x3 * u;
        t0 += x0 * v;
        t1 += x1 * v;
        t2 += x2 * v;
        t3 += x3 * v;
      }
      out[z0 + b] = s0;
      out[z1 + b] = s1;
      out[z2 + b] = s2;
      out[z3 + b] = s3;
      out[z0 + b + 1] = t0;
      out[z1 + b + 1] = t1;
      out[z2 + b + 1] = t2;
      out[z3 + b + 1] = t3;
    }
  }
  for (; i < r1; i++) {
    const yo = i * l;
    const zo = i * c;
    for (let b = c - 1; b >= 0; b--) {
      const w0 = b * l;
      const end = upper ? Math.min(b + 1, l) : l;
      let s = 0;
      for (let a = 0; a < end; a++) s += y[yo + a] * wt[w0 + a];
      out[zo + b] = s;
    }
  }
}

/**
 * out[r0:r1] = each row of y (rows × k, row-major) times s elementwise, over its norm, in f32; a
 * row whose scaled norm is 0 is written as zeros. The order of operations of
 * wasm/assembly/unitRows.ts (v_c = y_c · s_c; one running sum of squares in column order;
 * f32(v_c / √ss)), which is projectTerms' normalisation, so all give the same bits.
 */
export function unitRowsInto(y: FloatArray, s: Float64Array, k: number, out: Float32Array, r0: number, r1: number): void {
  for (let j = r0; j < r1; j++) {
    const o = j * k;
    let ss = 0;
    for (let c = 0; c < k; c++) {
      const v = y[o + c] * s[c];
      ss += v * v;
    }
    const norm = Math.sqrt(ss);
    if (norm === 0) out.fill(0, o, o + k);
    else for (let c = 0; c < k; c++) out[o + c] = (y[o + c] * s[c]) / norm;
  }
}
