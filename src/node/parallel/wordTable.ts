/**
 * Open-addressing hash table (linear probing) from a run of UTF-16 code units to one int32
 * value, for the tokenizing threads' caches (wordCounter.ts): words → their terms, lowercase
 * tokens → their term id. Keys live in one pooled Uint16Array (no string per key, so no cached
 * key keeps a file's text alive); lookups hash (FNV-1a over the code units, computed by the
 * caller while scanning) and compare code units in place, so a repeated word costs no substring.
 * A slot holds its entry's hash beside the entry number, and an entry's key position, length and
 * value sit side by side, so a lookup touches few cache lines. Cleared when it holds `limit`
 * keys, which bounds memory on huge trees.
 */

export const FNV_OFFSET = 0x811c9dc5 | 0;
export const FNV_PRIME = 0x01000193;

export class WordTable {
  size = 0;
  private units: Uint16Array<ArrayBuffer>;
  private used = 0;
  /** Entry e: key units[rec[3e], rec[3e] + rec[3e + 1]), value rec[3e + 2]. */
  private rec: Int32Array<ArrayBuffer>;
  /** Slot s: entry + 1 (0: empty) at 2s, the entry's hash at 2s + 1. */
  private slots: Int32Array<ArrayBuffer>;

  /** `expected`: keys to make room for up front (a power of two; the table grows past it as needed). */
  constructor(
    private readonly limit: number,
    expected = 1 << 12,
  ) {
    this.units = mappedUint16(16 * expected);
    this.rec = mappedInt32(3 * expected);
    this.slots = mappedInt32(4 * expected);
  }

  value(e: number): number {
    return this.rec[3 * e + 2];
  }

  /** The entry of src[start, end) (hash h), or -1. */
  find(src: Uint16Array, start: number, end: number, h: number): number {
    const slots = this.slots;
    const mask = (slots.length >> 1) - 1;
    const len = end - start;
    for (let s = h & mask; ; s = (s + 1) & mask) {
      const e1 = slots[2 * s];
      if (e1 === 0) return -1;
      if (slots[2 * s + 1] !== h) continue;
      const r = 3 * (e1 - 1);
      if (this.rec[r + 1] !== len) continue;
      const u0 = this.rec[r];
      const units = this.units;
      let i = 0;
      while (i < len && units[u0 + i] === src[start + i]) i++;
      if (i === len) return e1 - 1;
    }
  }

  /** Adds src[start, end) (hash h, not present) with its value; returns the entry. */
  insert(src: Uint16Array, start: number, end: number, h: number, value: number): number {
    if (this.size >= this.limit) this.clear();
    if ((this.size + 1) * 2 > this.slots.length >> 1) this.rehash();
    const e = this.size;
    if (3 * e + 3 > this.rec.length) this.rec = grow32(this.rec, 3 * e + 3);
    const len = end - start;
    if (this.used + len > this.units.length) {
      const n = Math.max(this.used + len, this.units.length * 2);
      const room = this.units.buffer.byteLength >> 1;
      if (room >= n) this.units = new Uint16Array(this.units.buffer, 0, Math.min(room, 2 * n));
      else {
        const grown = mappedUint16(n);
        grown.set(this.units.subarray(0, this.used));
        this.units = grown;
      }
    }
    const units = this.units;
    for (let i = 0, at = this.used; i < len; i++) units[at + i] = src[start + i];
    this.rec[3 * e] = this.used;
    this.rec[3 * e + 1] = len;
    this.rec[3 * e + 2] = value;
    this.used += len;
    this.size = e + 1;
    this.place(this.slots, e, h);
    return e;
  }

  /**
   * Every key as code units, key e being units[starts[e], starts[e + 1]) (keys are stored one
   * after the other from the last clear on). Views the table's units: valid until the next insert.
   */
  keys(): { units: Uint16Array; starts: Int32Array } {
    const starts = new Int32Array(this.size + 1);
    for (let e = 0; e < this.size; e++) starts[e] = this.rec[3 * e];
    starts[this.size] = this.used;
    return { units: this.units.subarray(0, this.used), starts };
  }

  /** The string of key e. */
  keyString(e: number): string {
    const at = this.rec[3 * e];
    const end = at + this.rec[3 * e + 1];
    let s = '';
    for (let a = at; a < end; a += 4096)
      s += String.fromCharCode.apply(null, this.units.subarray(a, Math.min(end, a + 4096)) as unknown as number[]);
    return s;
  }

  clear(): void {
    this.size = 0;
    this.used = 0;
    this.slots.fill(0);
  }

  private place(slots: Int32Array, e: number, h: number): void {
    const mask = (slots.length >> 1) - 1;
    let s = h & mask;
    while (slots[2 * s] !== 0) s = (s + 1) & mask;
    slots[2 * s] = e + 1;
    slots[2 * s + 1] = h;
  }

  /** Twice the slots (each entry's hash is kept in its old slot). */
  private rehash(): void {
    const old = this.slots;
    const slots = mappedInt32(2 * old.length);
    for (let s = 0; s < old.length; s += 2) if (old[s] !== 0) this.place(slots, old[s] - 1, old[s + 1]);
    this.slots = slots;
  }
}

/**
 * a with room for at least `atLeast` elements (twice its length at least). An array in a mapping
 * of its own (mappedInt32) usually has room past its end: it is lengthened in place, with no
 * copy and no new buffer (each new buffer of 32 MiB would also press the collector to run).
 */
export function grow32(a: Int32Array<ArrayBuffer>, atLeast: number): Int32Array<ArrayBuffer> {
  const n = Math.max(atLeast, a.length * 2);
  if (a.byteOffset === 0 && a.buffer.byteLength >= 4 * n) return new Int32Array(a.buffer, 0, Math.min(a.buffer.byteLength >> 2, 2 * n));
  const b = mappedInt32(n);
  b.set(a);
  return b;
}

/** a (bytes) lengthened to `length` elements, in place when its mapping has room (as grow32). */
export function grow8(a: Uint8Array<ArrayBuffer>, length: number): Uint8Array<ArrayBuffer> {
  if (length <= a.length) return a;
  if (a.byteOffset === 0 && a.buffer.byteLength >= length) return new Uint8Array(a.buffer, 0, length);
  const b =
    length < MAPPED_FROM_BYTES ? new Uint8Array(length) : new Uint8Array(new ArrayBuffer(Math.max(length, OWN_MAPPING_BYTES)), 0, length);
  b.set(a);
  return b;
}

/**
 * Allocations of at least this many bytes are mapped on their own by glibc's malloc whatever its
 * adaptive threshold (M_MMAP_THRESHOLD rises as mapped blocks are freed, up to 32 MiB on 64-bit
 * systems: glibc malloc/malloc.c, DEFAULT_MMAP_THRESHOLD_MAX), and unmapped when freed.
 */
const OWN_MAPPING_BYTES = 32 * 1024 * 1024 + 4096;
/**
 * Below this many bytes an array is allocated as usual; and everywhere but on Linux (other
 * allocators map large blocks apart anyway, and Windows would commit the whole buffer).
 */
const MAPPED_FROM_BYTES = process.platform === 'linux' ? 256 * 1024 : Infinity;

/**
 * An array of n elements that a tokenizing thread grows or hands over: from MAPPED_FROM_BYTES on,
 * in a buffer of at least OWN_MAPPING_BYTES, so it lies in a mapping of its own instead of the
 * thread's malloc arena. Freed arena memory stays resident after the thread ends (glibc trims an
 * arena only from its top, and only past a threshold that grows to 64 MiB); a mapping goes back
 * to the system when freed. Only the pages written count as resident (fresh mapped pages are
 * zero, so calloc does not touch them).
 */
export function mappedInt32(n: number): Int32Array<ArrayBuffer> {
  return n * 4 < MAPPED_FROM_BYTES ? new Int32Array(n) : new Int32Array(new ArrayBuffer(Math.max(n * 4, OWN_MAPPING_BYTES)), 0, n);
}

export function mappedUint16(n: number): Uint16Array<ArrayBuffer> {
  return n * 2 < MAPPED_FROM_BYTES ? new Uint16Array(n) : new Uint16Array(new ArrayBuffer(Math.max(n * 2, OWN_MAPPING_BYTES)), 0, n);
}
