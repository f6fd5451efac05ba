/**
 * The row-range kernels of kernels.ts as WebAssembly SIMD (f64x2) functions over one shared
 * memory. Pointers are byte offsets into that memory; all floats are f64. Each output entry is
 * formed by the same sequence of IEEE operations as in kernels.ts (no fused multiply-add; the
 * same association order), so both give the same bits. times reads W untransposed (l × c) and
 * fills columns from the top down, so out may be y for an upper-triangular W with c = l.
 *
 * Exports: spmm(indptr, indices, values, x, l, y, r0, r1, grouped) and spmm_f32 (f32 values),
 *          cross(a, b, l, r0, r1, g, symmetric),
 *          times(y, l, w, c, upper, out, r0, r1).
 */
import { F64, FunctionBuilder, I32, V128, encodeModule } from './encoder.js';

// Opcodes (WebAssembly Core Specification 2.0 §5.4; SIMD §5.4.8).
const I32_LOAD = 0x28, F32_LOAD = 0x2a, F64_LOAD = 0x2b, F64_STORE = 0x39, F64_PROMOTE_F32 = 0xbb;
const I32_ADD = 0x6a, I32_SUB = 0x6b, I32_MUL = 0x6c, I32_SHL = 0x74, I32_LT_S = 0x48, I32_LE_S = 0x4c;
const F64_ADD = 0xa0, F64_MUL = 0xa2, SELECT = 0x1b;
const V128_LOAD = 0x00, V128_STORE = 0x0b, F64X2_SPLAT = 0x14, F64X2_ADD = 0xf0, F64X2_MUL = 0xf2;

/** Largest memory the module may use: 65536 pages of 64 KiB (4 GiB, the wasm32 limit). */
export const MAX_PAGES = 65536;

/** The sparse product; valuesF32 reads the stored entries as f32 (promoted exactly to f64). */
function spmm(name: string, valuesF32: boolean): FunctionBuilder {
  const f = new FunctionBuilder(name, [I32, I32, I32, I32, I32, I32, I32, I32, I32], []);
  const [indptr, indices, values, x, l, y, r0, r1, grouped] = [0, 1, 2, 3, 4, 5, 6, 7, 8];
  const l8 = f.local(I32), i = f.local(I32), yo = f.local(I32), p = f.local(I32), p1 = f.local(I32), c = f.local(I32), pairs = f.local(I32);
  const xs = [f.local(I32), f.local(I32), f.local(I32), f.local(I32)];
  const vs = [f.local(V128), f.local(V128), f.local(V128), f.local(V128)];
  const ss = [f.local(F64), f.local(F64), f.local(F64), f.local(F64)];
  f.get(l).i32(3).op(I32_SHL).set(l8);
  f.get(l).i32(1).op(0x76).i32(4).op(I32_SHL).set(pairs); // (l >> 1) * 16: bytes covered by pairs
  f.get(r0).set(i);
  const loadEntry = (k: number): void => {
    // v_k = values[p + k]; x_k = x + indices[p + k] * l8
    if (valuesF32) f.get(values).get(p).i32(2).op(I32_SHL).op(I32_ADD).mem(F32_LOAD, 2, k * 4).op(F64_PROMOTE_F32);
    else f.get(values).get(p).i32(3).op(I32_SHL).op(I32_ADD).mem(F64_LOAD, 3, k * 8);
    f.tee(ss[k]).simd(F64X2_SPLAT).set(vs[k]);
    f.get(x).get(indices).get(p).i32(2).op(I32_SHL).op(I32_ADD).mem(I32_LOAD, 2, k * 4).get(l8).op(I32_MUL).op(I32_ADD).set(xs[k]);
  };
  const rowUpdate = (n: number): void => {
    // y[c] = y[c] + (((v0 x0[c] + v1 x1[c]) + v2 x2[c]) + v3 x3[c]), two columns at a time.
    f.i32(0).set(c);
    f.whileLoop(() => f.get(c).get(pairs).op(I32_LT_S), () => {
      f.get(yo).get(c).op(I32_ADD);
      f.get(yo).get(c).op(I32_ADD).simdMem(V128_LOAD);
      for (let k = 0; k < n; k++) {
        f.get(vs[k]).get(xs[k]).get(c).op(I32_ADD).simdMem(V128_LOAD).simd(F64X2_MUL);
        if (k > 0) f.simd(F64X2_ADD);
      }
      f.simd(F64X2_ADD).simdMem(V128_STORE);
      f.get(c).i32(16).op(I32_ADD).set(c);
    });
    f.ifThen(() => f.get(c).get(l8).op(I32_LT_S), () => {
      f.get(yo).get(c).op(I32_ADD);
      f.get(yo).get(c).op(I32_ADD).mem(F64_LOAD, 3);
      for (let k = 0; k < n; k++) {
        f.get(ss[k]).get(xs[k]).get(c).op(I32_ADD).mem(F64_LOAD, 3).op(F64_MUL);
        if (k > 0) f.op(F64_ADD);
      }
      f.op(F64_ADD).mem(F64_STORE, 3);
    });
  };
  f.whileLoop(() => f.get(i).get(r1).op(I32_LT_S), () => {
    f.get(y).get(i).get(l8).op(I32_MUL).op(I32_ADD).set(yo);
    f.i32(0).set(c);
    f.whileLoop(() => f.get(c).get(l8).op(I32_LT_S), () => {
      f.get(yo).get(c).op(I32_ADD).f64(0).mem(F64_STORE, 3);
      f.get(c).i32(8).op(I32_ADD).set(c);
    });
    f.get(indptr).get(i).i32(2).op(I32_SHL).op(I32_ADD).mem(I32_LOAD, 2, 0).set(p);
    f.get(indptr).get(i).i32(2).op(I32_SHL).op(I32_ADD).mem(I32_LOAD, 2, 4).set(p1);
    f.whileLoop(() => f.get(p).i32(4).op(I32_ADD).get(p1).op(I32_LE_S).get(grouped).op(0x71), () => {
      for (let k = 0; k < 4; k++) loadEntry(k);
      rowUpdate(4);
      f.get(p).i32(4).op(I32_ADD).set(p);
    });
    f.whileLoop(() => f.get(p).get(p1).op(I32_LT_S), () => {
      loadEntry(0);
      rowUpdate(1);
      f.get(p).i32(1).op(I32_ADD).set(p);
    });
    f.get(i).i32(1).op(I32_ADD).set(i);
  });
  return f;
}

export function kernelModuleBytes(): Uint8Array<ArrayBuffer> {
  return encodeModule([spmm('spmm', false), spmm('spmm_f32', true), cross(), times()], { minPages: 1, maxPages: MAX_PAGES });
}

function cross(): FunctionBuilder {
  const f = new FunctionBuilder('cross', [I32, I32, I32, I32, I32, I32, I32], []);
  const [a, b, l, r0, r1, g, symmetric] = [0, 1, 2, 3, 4, 5, 6];
  const l8 = f.local(I32), l4 = f.local(I32), p = f.local(I32), q = f.local(I32), o = f.local(I32), o1 = f.local(I32), t = f.local(I32);
  const pe = f.local(I32), qe = f.local(I32), pp = f.local(I32), qq = f.local(I32);
  const s = f.local(F64);
  const acc = Array.from({ length: 8 }, () => f.local(V128));
  const av = [f.local(V128), f.local(V128), f.local(V128), f.local(V128)];
  const b01 = f.local(V128), b23 = f.local(V128);
  f.get(l).i32(3).op(I32_SHL).set(l8);
  f.get(l).get(l).i32(3).op(0x71).op(I32_SUB).set(l4); // l - (l & 3)
  f.i32(0).set(p);
  f.whileLoop(() => f.get(p).get(l).op(I32_LT_S), () => {
    // q starts at p for a symmetric product, else at 0.
    f.get(p).i32(0).get(symmetric).op(SELECT).set(q);
    f.whileLoop(() => f.get(q).get(l).op(I32_LT_S), () => {
      // Full 4×4 tile when p + 4 ≤ l4 and q + 4 ≤ l4 (p and q are multiples of 4).
      f.get(p).get(l4).op(I32_LT_S).get(q).get(l4).op(I32_LT_S).op(0x71);
      f.op(0x04, 0x40); // if
      for (const v of acc) f.f64(0).simd(F64X2_SPLAT).set(v);
      f.get(r0).get(l8).op(I32_MUL).set(o);
      f.get(r1).get(l8).op(I32_MUL).set(o1);
      f.whileLoop(() => f.get(o).get(o1).op(I32_LT_S), () => {
        for (let k = 0; k < 4; k++) f.get(a).get(o).op(I32_ADD).get(p).i32(3).op(I32_SHL).op(I32_ADD).mem(F64_LOAD, 3, k * 8).simd(F64X2_SPLAT).set(av[k]);
        f.get(b).get(o).op(I32_ADD).get(q).i32(3).op(I32_SHL).op(I32_ADD).tee(t).simdMem(V128_LOAD).set(b01);
        f.get(t).simdMem(V128_LOAD, 16).set(b23);
        for (let k = 0; k < 4; k++) {
          f.get(acc[2 * k]).get(av[k]).get(b01).simd(F64X2_MUL).simd(F64X2_ADD).set(acc[2 * k]);
          f.get(acc[2 * k + 1]).get(av[k]).get(b23).simd(F64X2_MUL).simd(F64X2_ADD).set(acc[2 * k + 1]);
        }
        f.get(o).get(l8).op(I32_ADD).set(o);
      });
      for (let k = 0; k < 4; k++) {
        // g[(p + k) l + q …]
        f.get(g).get(p).i32(k).op(I32_ADD).get(l).op(I32_MUL).get(q).op(I32_ADD).i32(3).op(I32_SHL).op(I32_ADD).tee(t);
        f.get(acc[2 * k]).simdMem(V128_STORE);
        f.get(t).get(acc[2 * k + 1]).simdMem(V128_STORE, 16);
      }
      f.op(0x05); // else: scalar edge tile
      f.get(p).i32(4).op(I32_ADD).tee(pe).get(l).get(pe).get(l).op(I32_LT_S).op(SELECT).set(pe);
      f.get(q).i32(4).op(I32_ADD).tee(qe).get(l).get(qe).get(l).op(I32_LT_S).op(SELECT).set(qe);
      f.get(p).set(pp);
      f.whileLoop(() => f.get(pp).get(pe).op(I32_LT_S), () => {
        f.get(q).set(qq);
        f.whileLoop(() => f.get(qq).get(qe).op(I32_LT_S), () => {
          f.f64(0).set(s);
          f.get(r0).get(l8).op(I32_MUL).set(o);
          f.get(r1).get(l8).op(I32_MUL).set(o1);
          f.whileLoop(() => f.get(o).get(o1).op(I32_LT_S), () => {
            f.get(s);
            f.get(a).get(o).op(I32_ADD).get(pp).i32(3).op(I32_SHL).op(I32_ADD).mem(F64_LOAD, 3);
            f.get(b).get(o).op(I32_ADD).get(qq).i32(3).op(I32_SHL).op(I32_ADD).mem(F64_LOAD, 3);
            f.op(F64_MUL).op(F64_ADD).set(s);
            f.get(o).get(l8).op(I32_ADD).set(o);
          });
          f.get(g).get(pp).get(l).op(I32_MUL).get(qq).op(I32_ADD).i32(3).op(I32_SHL).op(I32_ADD).get(s).mem(F64_STORE, 3);
          f.get(qq).i32(1).op(I32_ADD).set(qq);
        });
        f.get(pp).i32(1).op(I32_ADD).set(pp);
      });
      f.op(0x0b); // end if
      f.get(q).i32(4).op(I32_ADD).set(q);
    });
    f.get(p).i32(4).op(I32_ADD).set(p);
  });
  return f;
}

function times(): FunctionBuilder {
  const f = new FunctionBuilder('times', [I32, I32, I32, I32, I32, I32, I32, I32], []);
  const [y, l, w, c, upper, out, r0, r1] = [0, 1, 2, 3, 4, 5, 6, 7];
  const l8 = f.local(I32), c8 = f.local(I32), i = f.local(I32), b = f.local(I32), a = f.local(I32), end = f.local(I32), t = f.local(I32), yrow = f.local(I32);
  const s = f.local(F64);
  const acc = Array.from({ length: 8 }, () => f.local(V128));
  const w01 = f.local(V128), w23 = f.local(V128), yv = f.local(V128);
  f.get(l).i32(3).op(I32_SHL).set(l8);
  f.get(c).i32(3).op(I32_SHL).set(c8);
  // end = upper ? min(limit, l) : l
  const setEnd = (limit: () => void): void => {
    limit();
    f.tee(end).get(l).get(end).get(l).op(I32_LT_S).op(SELECT).get(l).get(upper).op(SELECT).set(end);
  };
  /** out[row i, col b] for rows [from, to) one at a time (scalar). */
  const scalarEntries = (rowFrom: () => void, rowTo: () => void, colFrom: () => void): void => {
    rowFrom();
    f.set(i);
    f.whileLoop(() => { f.get(i); rowTo(); f.op(I32_LT_S); }, () => {
      f.get(y).get(i).get(l8).op(I32_MUL).op(I32_ADD).set(yrow);
      // Columns from c − 1 down to colFrom (top down, so out may be y for an upper W).
      f.get(c).i32(1).op(I32_SUB).set(b);
      f.whileLoop(() => { colFrom(); f.get(b).op(I32_LE_S); }, () => {
        setEnd(() => f.get(b).i32(1).op(I32_ADD));
        f.f64(0).set(s).i32(0).set(a);
        f.whileLoop(() => f.get(a).get(end).op(I32_LT_S), () => {
          f.get(s);
          f.get(yrow).get(a).i32(3).op(I32_SHL).op(I32_ADD).mem(F64_LOAD, 3);
          f.get(w).get(a).get(c8).op(I32_MUL).op(I32_ADD).get(b).i32(3).op(I32_SHL).op(I32_ADD).mem(F64_LOAD, 3);
          f.op(F64_MUL).op(F64_ADD).set(s);
          f.get(a).i32(1).op(I32_ADD).set(a);
        });
        f.get(out).get(i).get(c8).op(I32_MUL).op(I32_ADD).get(b).i32(3).op(I32_SHL).op(I32_ADD).get(s).mem(F64_STORE, 3);
        f.get(b).i32(1).op(I32_SUB).set(b);
      });
      f.get(i).i32(1).op(I32_ADD).set(i);
    });
  };
  const tile = f.local(I32);
  f.get(r0).set(tile);
  f.whileLoop(() => f.get(tile).i32(4).op(I32_ADD).get(r1).op(I32_LE_S), () => {
    // Leftover top columns of this 4-row tile first, then 4-column tiles from the top down.
    scalarEntries(() => f.get(tile), () => f.get(tile).i32(4).op(I32_ADD), () => f.get(c).get(c).i32(3).op(0x71).op(I32_SUB));
    f.get(c).get(c).i32(3).op(0x71).op(I32_SUB).i32(4).op(I32_SUB).set(b);
    f.whileLoop(() => f.i32(0).get(b).op(I32_LE_S), () => {
      for (const v of acc) f.f64(0).simd(F64X2_SPLAT).set(v);
      setEnd(() => f.get(b).i32(4).op(I32_ADD));
      f.i32(0).set(a);
      f.whileLoop(() => f.get(a).get(end).op(I32_LT_S), () => {
        f.get(w).get(a).get(c8).op(I32_MUL).op(I32_ADD).get(b).i32(3).op(I32_SHL).op(I32_ADD).tee(t).simdMem(V128_LOAD).set(w01);
        f.get(t).simdMem(V128_LOAD, 16).set(w23);
        for (let k = 0; k < 4; k++) {
          f.get(y).get(tile).i32(k).op(I32_ADD).get(l8).op(I32_MUL).op(I32_ADD).get(a).i32(3).op(I32_SHL).op(I32_ADD).mem(F64_LOAD, 3).simd(F64X2_SPLAT).set(yv);
          f.get(acc[2 * k]).get(yv).get(w01).simd(F64X2_MUL).simd(F64X2_ADD).set(acc[2 * k]);
          f.get(acc[2 * k + 1]).get(yv).get(w23).simd(F64X2_MUL).simd(F64X2_ADD).set(acc[2 * k + 1]);
        }
        f.get(a).i32(1).op(I32_ADD).set(a);
      });
      for (let k = 0; k < 4; k++) {
        f.get(out).get(tile).i32(k).op(I32_ADD).get(c8).op(I32_MUL).op(I32_ADD).get(b).i32(3).op(I32_SHL).op(I32_ADD).tee(t);
        f.get(acc[2 * k]).simdMem(V128_STORE);
        f.get(t).get(acc[2 * k + 1]).simdMem(V128_STORE, 16);
      }
      f.get(b).i32(4).op(I32_SUB).set(b);
    });
    f.get(tile).i32(4).op(I32_ADD).set(tile);
  });
  // Leftover rows.
  scalarEntries(() => f.get(tile), () => f.get(r1), () => f.i32(0));
  return f;
}
