/**
 * A fast 32-bit checksum over bytes, word at a time (multiply–rotate mixing in the style of
 * MurmurHash3's block step, Appleby 2011, with its fmix32 finaliser). It detects damaged or
 * truncated index files; it is not a cryptographic hash.
 */
export function checksum32(bytes: Uint8Array): number {
  const words = bytes.length >>> 2;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let h = 0x12345678 ^ bytes.length;
  for (let i = 0; i < words; i++) {
    let k = view.getUint32(i * 4, true);
    k = Math.imul(k, 0xcc9e2d51);
    k = (k << 15) | (k >>> 17);
    k = Math.imul(k, 0x1b873593);
    h ^= k;
    h = (h << 13) | (h >>> 19);
    h = (Math.imul(h, 5) + 0xe6546b64) | 0;
  }
  for (let i = words * 4; i < bytes.length; i++) h = Math.imul(h ^ bytes[i], 0x01000193);
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}
