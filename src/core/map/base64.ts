/**
 * Base64 (RFC 4648 §4, with padding) for embedding typed arrays in JSON, written out because the
 * core may use neither Node's Buffer nor the browser's btoa/atob, and both sides must agree.
 */
import { InvalidInputError } from '../errors.js';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const LOOKUP = new Int16Array(128).fill(-1);
for (let i = 0; i < ALPHABET.length; i++) LOOKUP[ALPHABET.charCodeAt(i)] = i;

export function encodeBase64(bytes: Uint8Array): string {
  const parts: string[] = [];
  const chunk: string[] = [];
  let i = 0;
  for (; i + 2 < bytes.length; i += 3) {
    const v = (bytes[i] << 16) | (bytes[i + 1] << 8) | bytes[i + 2];
    chunk.push(ALPHABET[v >> 18], ALPHABET[(v >> 12) & 63], ALPHABET[(v >> 6) & 63], ALPHABET[v & 63]);
    if (chunk.length >= 8192) parts.push(chunk.splice(0).join(''));
  }
  const rest = bytes.length - i;
  if (rest === 1) {
    const v = bytes[i] << 16;
    chunk.push(ALPHABET[v >> 18], ALPHABET[(v >> 12) & 63], '==');
  } else if (rest === 2) {
    const v = (bytes[i] << 16) | (bytes[i + 1] << 8);
    chunk.push(ALPHABET[v >> 18], ALPHABET[(v >> 12) & 63], ALPHABET[(v >> 6) & 63], '=');
  }
  parts.push(chunk.join(''));
  return parts.join('');
}

export function decodeBase64(text: string): Uint8Array {
  if (text.length % 4 !== 0) throw new InvalidInputError('base64 text length must be a multiple of 4');
  const pad = text.endsWith('==') ? 2 : text.endsWith('=') ? 1 : 0;
  const out = new Uint8Array((text.length / 4) * 3 - pad);
  let o = 0;
  for (let i = 0; i < text.length; i += 4) {
    const a = sextet(text, i);
    const b = sextet(text, i + 1);
    const c = text[i + 2] === '=' ? 0 : sextet(text, i + 2);
    const d = text[i + 3] === '=' ? 0 : sextet(text, i + 3);
    const v = (a << 18) | (b << 12) | (c << 6) | d;
    if (o < out.length) out[o++] = v >> 16;
    if (o < out.length) out[o++] = (v >> 8) & 255;
    if (o < out.length) out[o++] = v & 255;
  }
  return out;
}

function sextet(text: string, i: number): number {
  const code = text.charCodeAt(i);
  const v = code < 128 ? LOOKUP[code] : -1;
  if (v < 0) throw new InvalidInputError(`invalid base64 character at ${i}`);
  return v;
}

/** Little-endian bytes of a Float32Array (the platform order of every engine we target). */
export function float32ToBase64(values: Float32Array): string {
  return encodeBase64(new Uint8Array(values.buffer, values.byteOffset, values.byteLength));
}

export function base64ToFloat32(text: string): Float32Array {
  const bytes = decodeBase64(text);
  if (bytes.length % 4 !== 0) throw new InvalidInputError('float32 data must be a multiple of 4 bytes');
  return new Float32Array(bytes.buffer, bytes.byteOffset, bytes.length / 4);
}
