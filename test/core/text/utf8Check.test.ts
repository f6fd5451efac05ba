import { describe, expect, it } from 'vitest';
import { isWellFormedUtf8 } from '../../../src/core/text/utf8Check.js';
import { createRandom } from '../../../src/core/random.js';

// Reference: the WHATWG Encoding Standard's UTF-8 decoder, as Node's TextDecoder with fatal: true
// implements it (it throws exactly on ill-formed input); the sequences below are those of the
// Unicode Standard 15.0, chapter 3.9, Table 3-7 ("Well-Formed UTF-8 Byte Sequences") and its edges.
const fatal = new TextDecoder('utf-8', { fatal: true });
const decoderSays = (bytes: Uint8Array): boolean => {
  try {
    fatal.decode(bytes);
    return true;
  } catch {
    return false;
  }
};

/** Every placement of a sequence: alone, after ASCII of each alignment, inside a long ASCII run. */
function placements(seq: number[]): Uint8Array[] {
  const out: Uint8Array[] = [Uint8Array.from(seq)];
  for (let pad = 0; pad < 8; pad++) {
    out.push(Uint8Array.from([...Array(pad).fill(0x61), ...seq]));
    out.push(Uint8Array.from([...Array(67 + pad).fill(0x61), ...seq, ...Array(70).fill(0x62)]));
  }
  // A view at an odd offset of a larger buffer (the 32-bit skip must start where the words align).
  const wide = new Uint8Array(200).fill(0x63);
  wide.set(seq, 101);
  out.push(wide.subarray(3, 190));
  return out;
}

// Table 3-7's rows: the first and last sequence of each row are well-formed.
const WELL_FORMED: [string, number[]][] = [
  ['U+0000', [0x00]],
  ['U+007F', [0x7f]],
  ['U+0080', [0xc2, 0x80]],
  ['U+07FF', [0xdf, 0xbf]],
  ['U+0800', [0xe0, 0xa0, 0x80]],
  ['U+0FFF', [0xe0, 0xbf, 0xbf]],
  ['U+1000', [0xe1, 0x80, 0x80]],
  ['U+CFFF', [0xec, 0xbf, 0xbf]],
  ['U+D000', [0xed, 0x80, 0x80]],
  ['U+D7FF', [0xed, 0x9f, 0xbf]],
  ['U+E000', [0xee, 0x80, 0x80]],
  ['U+FFFF', [0xef, 0xbf, 0xbf]],
  ['U+10000', [0xf0, 0x90, 0x80, 0x80]],
  ['U+3FFFF', [0xf0, 0xbf, 0xbf, 0xbf]],
  ['U+40000', [0xf1, 0x80, 0x80, 0x80]],
  ['U+FFFFF', [0xf3, 0xbf, 0xbf, 0xbf]],
  ['U+100000', [0xf4, 0x80, 0x80, 0x80]],
  ['U+10FFFF', [0xf4, 0x8f, 0xbf, 0xbf]],
];

// Outside Table 3-7 (each named by why).
const ILL_FORMED: [string, number[]][] = [
  ['overlong U+0000 in two bytes (C0)', [0xc0, 0x80]],
  ['overlong U+007F in two bytes (C1)', [0xc1, 0xbf]],
  ['overlong U+07FF in three bytes (E0 9F)', [0xe0, 0x9f, 0xbf]],
  ['overlong U+FFFF in four bytes (F0 8F)', [0xf0, 0x8f, 0xbf, 0xbf]],
  ['high surrogate U+D800 (ED A0)', [0xed, 0xa0, 0x80]],
  ['low surrogate U+DFFF (ED BF)', [0xed, 0xbf, 0xbf]],
  ['surrogate pair encoded as two sequences', [0xed, 0xa0, 0xbd, 0xed, 0xb2, 0xa9]],
  ['U+110000 (F4 90)', [0xf4, 0x90, 0x80, 0x80]],
  ['lead byte F5', [0xf5, 0x80, 0x80, 0x80]],
  ['lead byte F8 (old five-byte form)', [0xf8, 0x88, 0x80, 0x80, 0x80]],
  ['lead byte FF', [0xff]],
  ['stray continuation byte', [0x80]],
  ['stray continuation after a full sequence', [0xc3, 0xa9, 0xbf]],
  ['two-byte sequence cut short', [0xc3]],
  ['three-byte sequence cut after two', [0xe2, 0x82]],
  ['four-byte sequence cut after three', [0xf0, 0x9f, 0x98]],
  ['continuation replaced by ASCII', [0xe2, 0x41, 0x82]],
  ['four-byte lead followed by a new lead', [0xf0, 0x9f, 0xc3, 0xa9]],
];

describe('isWellFormedUtf8', () => {
  it('accepts the first and last sequence of every row of Table 3-7 wherever it lies', () => {
    for (const [, seq] of WELL_FORMED)
      for (const bytes of placements(seq)) {
        expect(decoderSays(bytes)).toBe(true); // the reference agrees that the row is well-formed
        expect(isWellFormedUtf8(bytes)).toBe(true);
      }
  });

  it('refuses overlongs, surrogates, code points above U+10FFFF, stray and truncated sequences', () => {
    for (const [, seq] of ILL_FORMED)
      for (const bytes of placements(seq)) {
        expect(decoderSays(bytes)).toBe(false);
        expect(isWellFormedUtf8(bytes)).toBe(false);
      }
  });

  it('agrees with a fatal TextDecoder on every two-byte input and on lead bytes with every second byte', () => {
    let disagreements = 0;
    for (let a = 0; a < 256; a++)
      for (let b = 0; b < 256; b++) {
        const two = Uint8Array.from([a, b]);
        if (isWellFormedUtf8(two) !== decoderSays(two)) disagreements++;
        for (const tail of [
          [0x80, 0x80],
          [0xbf, 0xbf],
        ]) {
          const four = Uint8Array.from([a, b, ...tail]);
          if (isWellFormedUtf8(four) !== decoderSays(four)) disagreements++;
        }
      }
    expect(disagreements).toBe(0);
  });

  it('agrees with a fatal TextDecoder on random text with damage', () => {
    const rng = createRandom(13);
    const text = 'path/to/file_ä.c\0Überblick — 设置 🙂 \u{10ffff} struct foo {\0';
    const clean = new TextEncoder().encode(text.repeat(40));
    let disagreements = 0;
    let refused = 0;
    for (let trial = 0; trial < 2000; trial++) {
      const bytes = clean.slice(rng.nextUint32() % 5);
      const flips = trial % 3;
      for (let f = 0; f < flips; f++) bytes[rng.nextUint32() % bytes.length] = rng.nextUint32() & 0xff;
      const cut = trial % 7 === 0 ? bytes.subarray(0, rng.nextUint32() % bytes.length) : bytes;
      const expected = decoderSays(cut);
      if (!expected) refused++;
      if (isWellFormedUtf8(cut) !== expected) disagreements++;
    }
    expect(disagreements).toBe(0);
    expect(refused).toBeGreaterThan(500); // the damage does produce ill-formed input
  });
});
