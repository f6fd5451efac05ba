/**
 * Exact-copy key: MurmurHash3_x86_128 (see murmur3.ts) of the UTF-8 bytes of the normalised text.
 *
 * Normalisation (our own choice, common practice for "same file, different editor settings"):
 * drop a leading byte-order mark, turn CRLF and lone CR into LF, Unicode NFC, strip trailing
 * spaces/tabs on every line, and strip blank lines at the start and end. Anything else (indent,
 * inner blank lines, case) still makes two files different.
 *
 * With 128 bits, the chance that any two of n distinct texts collide is about n²/2¹²⁹
 * (birthday bound): below 10⁻²⁸ for a million files, so a key match is treated as equality.
 */
import { murmur3x86_128 } from './murmur3.js';

const encoder = new TextEncoder();

/** The text that the content hash sees (rules in the header). */
export function normaliseForHash(text: string): string {
  let t = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  t = t.replace(/\r\n?/g, '\n').normalize('NFC');
  t = t.replace(/[ \t\f\v]+$/gm, '');
  return t.replace(/^\n+/, '').replace(/\n+$/, '');
}

/** True when the text holds nothing but whitespace (such files are counted, never grouped). */
export function isBlankText(text: string): boolean {
  return !/\S/.test(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
}

/** 32 lowercase hex digits: the four 32-bit MurmurHash3_x86_128 words h1..h4 in order. */
export function contentHash(text: string): string {
  const [h1, h2, h3, h4] = murmur3x86_128(encoder.encode(normaliseForHash(text)));
  return hex8(h1) + hex8(h2) + hex8(h3) + hex8(h4);
}

function hex8(v: number): string {
  return v.toString(16).padStart(8, '0');
}
