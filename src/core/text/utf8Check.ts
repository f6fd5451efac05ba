/**
 * Whether bytes are well-formed UTF-8, without decoding them to a string: a saved index checks
 * its section titles (33 MB on the Linux tree) this way on every reopen, where a fatal
 * TextDecoder would build a string of the whole table only to throw it away.
 *
 * The accepted sequences are exactly those of the Unicode Standard's table of well-formed UTF-8
 * byte sequences (The Unicode Standard, Version 15.0, chapter 3.9, Table 3-7):
 *
 *   U+0000..U+007F      00..7F
 *   U+0080..U+07FF      C2..DF  80..BF
 *   U+0800..U+0FFF      E0      A0..BF  80..BF
 *   U+1000..U+CFFF      E1..EC  80..BF  80..BF
 *   U+D000..U+D7FF      ED      80..9F  80..BF
 *   U+E000..U+FFFF      EE..EF  80..BF  80..BF
 *   U+10000..U+3FFFF    F0      90..BF  80..BF  80..BF
 *   U+40000..U+FFFFF    F1..F3  80..BF  80..BF  80..BF
 *   U+100000..U+10FFFF  F4      80..8F  80..BF  80..BF
 *
 * so overlong forms (C0, C1, E0 80..9F, F0 80..8F), surrogates (ED A0..BF), code points above
 * U+10FFFF (F4 90.., F5..FF), stray continuation bytes and truncated sequences are all refused:
 * the same verdict as `new TextDecoder('utf-8', { fatal: true })`. Runs of ASCII are skipped four
 * bytes at a time through a 32-bit view where the bytes are aligned (most titles and paths are
 * ASCII).
 */

/** True when bytes are well-formed UTF-8 (Table 3-7 of the Unicode Standard); decodes nothing. */
export function isWellFormedUtf8(bytes: Uint8Array): boolean {
  const n = bytes.length;
  let i = 0;
  // The 32-bit view: words whose four bytes are all ASCII (no high bit) are skipped whole.
  const lead = (4 - (bytes.byteOffset & 3)) & 3;
  const words = n >= 64 && lead < n ? new Uint32Array(bytes.buffer, bytes.byteOffset + lead, (n - lead) >>> 2) : new Uint32Array(0);
  const wordsEnd = lead + words.length * 4;
  while (i < n) {
    const b = bytes[i];
    if (b < 0x80) {
      i++;
      if (i >= lead && i < wordsEnd && ((i - lead) & 3) === 0) {
        let w = (i - lead) >>> 2;
        while (w < words.length && (words[w] & 0x80808080) === 0) w++;
        i = lead + w * 4;
      }
      continue;
    }
    if (b < 0xc2) return false; // a continuation byte without a lead, or an overlong C0/C1
    if (b < 0xe0) {
      if (i + 1 >= n || (bytes[i + 1] & 0xc0) !== 0x80) return false;
      i += 2;
      continue;
    }
    if (b < 0xf0) {
      if (i + 2 >= n) return false;
      const b1 = bytes[i + 1];
      const lo = b === 0xe0 ? 0xa0 : 0x80;
      const hi = b === 0xed ? 0x9f : 0xbf;
      if (b1 < lo || b1 > hi || (bytes[i + 2] & 0xc0) !== 0x80) return false;
      i += 3;
      continue;
    }
    if (b > 0xf4 || i + 3 >= n) return false;
    const b1 = bytes[i + 1];
    const lo = b === 0xf0 ? 0x90 : 0x80;
    const hi = b === 0xf4 ? 0x8f : 0xbf;
    if (b1 < lo || b1 > hi || (bytes[i + 2] & 0xc0) !== 0x80 || (bytes[i + 3] & 0xc0) !== 0x80) return false;
    i += 4;
  }
  return true;
}
