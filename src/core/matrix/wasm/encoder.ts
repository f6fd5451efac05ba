/**
 * A minimal WebAssembly binary encoder (WebAssembly Core Specification 2.0, §5 "Binary Format",
 * plus the fixed-width SIMD proposal's 0xFD opcodes): enough to write a few numeric kernels as
 * structured code without a toolchain. One imported memory ("env" "memory"), exported functions.
 */

export const I32 = 0x7f;
export const F64 = 0x7c;
export const V128 = 0x7b;

function uleb(n: number): number[] {
  const out: number[] = [];
  do {
    let b = n & 0x7f;
    n >>>= 7;
    if (n !== 0) b |= 0x80;
    out.push(b);
  } while (n !== 0);
  return out;
}

function sleb(n: number): number[] {
  const out: number[] = [];
  for (;;) {
    const b = n & 0x7f;
    n >>= 7;
    if ((n === 0 && (b & 0x40) === 0) || (n === -1 && (b & 0x40) !== 0)) {
      out.push(b);
      return out;
    }
    out.push(b | 0x80);
  }
}

const name = (s: string): number[] => [...uleb(s.length), ...Array.from(s, (c) => c.charCodeAt(0))];
const vec = (items: number[][]): number[] => [...uleb(items.length), ...items.flat()];
const section = (id: number, body: number[]): number[] => [id, ...uleb(body.length), ...body];

/** Body of one function, written with structured helpers. Parameters come first as locals. */
export class FunctionBuilder {
  readonly code: number[] = [];
  private readonly extra: number[] = [];

  constructor(
    readonly exportName: string,
    readonly params: readonly number[],
    readonly results: readonly number[],
  ) {}

  local(type: number): number {
    this.extra.push(type);
    return this.params.length + this.extra.length - 1;
  }

  get(i: number): this { return this.emit(0x20, ...uleb(i)); }
  set(i: number): this { return this.emit(0x21, ...uleb(i)); }
  tee(i: number): this { return this.emit(0x22, ...uleb(i)); }
  i32(v: number): this { return this.emit(0x41, ...sleb(v | 0)); }
  f64(v: number): this {
    const b = new Uint8Array(new Float64Array([v]).buffer);
    return this.emit(0x44, ...b);
  }
  op(...bytes: number[]): this { return this.emit(...bytes); }
  /** A SIMD instruction (0xFD prefix, LEB128 opcode, immediates). */
  simd(opcode: number, ...imm: number[]): this { return this.emit(0xfd, ...uleb(opcode), ...imm); }
  /** Memory access with an alignment exponent and a constant offset. */
  mem(opcode: number, align: number, offset = 0): this { return this.emit(opcode, align, ...uleb(offset)); }
  simdMem(opcode: number, offset = 0): this { return this.emit(0xfd, ...uleb(opcode), 3, ...uleb(offset)); }

  /** while (cond) body — cond leaves an i32 on the stack. */
  whileLoop(cond: () => void, body: () => void): this {
    this.emit(0x02, 0x40, 0x03, 0x40); // block, loop
    cond();
    this.emit(0x45, 0x0d, 1); // i32.eqz; br_if 1 (leave the block)
    body();
    this.emit(0x0c, 0, 0x0b, 0x0b); // br 0 (loop again); end loop; end block
    return this;
  }

  /** if (cond) then — cond leaves an i32 on the stack. */
  ifThen(cond: () => void, then: () => void): this {
    cond();
    this.emit(0x04, 0x40);
    then();
    this.emit(0x0b);
    return this;
  }

  private emit(...bytes: number[]): this {
    for (const b of bytes) this.code.push(b);
    return this;
  }

  encodeBody(): number[] {
    const groups: number[][] = this.extra.map((t) => [1, t]);
    const body = [...vec(groups), ...this.code, 0x0b];
    return [...uleb(body.length), ...body];
  }
}

/** A module importing one shared memory (pages of 64 KiB) and exporting the given functions. */
export function encodeModule(functions: readonly FunctionBuilder[], memory: { minPages: number; maxPages: number }): Uint8Array<ArrayBuffer> {
  const types = functions.map((f) => [0x60, ...vec(f.params.map((p) => [p])), ...vec(f.results.map((r) => [r]))]);
  const imports = vec([[...name('env'), ...name('memory'), 0x02, 0x03, ...uleb(memory.minPages), ...uleb(memory.maxPages)]]);
  const bytes = [
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, vec(types)),
    ...section(2, imports),
    ...section(3, vec(functions.map((_, i) => uleb(i)))),
    ...section(7, vec(functions.map((f, i) => [...name(f.exportName), 0x00, ...uleb(i)]))),
    ...section(10, vec(functions.map((f) => f.encodeBody()))),
  ];
  return Uint8Array.from(bytes);
}
