/**
 * CRC-32 as zlib, PNG and gzip compute it (ISO 3309 / ITU-T V.42: reflected polynomial
 * 0xEDB88320, initial and final value 0xFFFFFFFF), table-driven, eight bytes per step ("slicing by
 * eight", Kounavis & Berry 2005). Chosen for files other programs write (a Python cluster job
 * computes it with zlib.crc32): it detects every change confined to 32 consecutive bits, so any
 * single damaged byte.
 */

const TABLES: Uint32Array = (() => {
  const t = new Uint32Array(8 * 256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  for (let n = 0; n < 256; n++) for (let s = 1; s < 8; s++) t[s * 256 + n] = (t[(s - 1) * 256 + n] >>> 8) ^ t[t[(s - 1) * 256 + n] & 0xff];
  return t;
})();

/** CRC-32 of bytes, continuing from `previous` (the CRC of the bytes before; 0 to start). */
export function crc32(bytes: Uint8Array, previous = 0): number {
  const t = TABLES;
  let c = ~previous >>> 0;
  let i = 0;
  const n = bytes.length;
  for (; i + 8 <= n; i += 8) {
    const a = (c ^ (bytes[i] | (bytes[i + 1] << 8) | (bytes[i + 2] << 16) | (bytes[i + 3] << 24))) >>> 0;
    c =
      t[7 * 256 + (a & 0xff)] ^
      t[6 * 256 + ((a >>> 8) & 0xff)] ^
      t[5 * 256 + ((a >>> 16) & 0xff)] ^
      t[4 * 256 + (a >>> 24)] ^
      t[3 * 256 + bytes[i + 4]] ^
      t[2 * 256 + bytes[i + 5]] ^
      t[256 + bytes[i + 6]] ^
      t[bytes[i + 7]];
  }
  for (; i < n; i++) c = t[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return ~c >>> 0;
}
