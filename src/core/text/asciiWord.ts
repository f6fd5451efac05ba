/**
 * tokenize() of one ASCII word ([A-Za-z0-9_$]+), by char codes instead of regular expressions,
 * on a run of UTF-16 code units (no string per word): the same rules as
 * src/core/text/tokenize.ts step by step — skip hex literals and hex-looking runs (skipsWord);
 * split on '_' and '$', then at lower→Upper, Upper→Upper+lower and letter↔digit boundaries
 * (partBounds); emit each part (and, for a split word, the joined compound) lowercased, unless it
 * is a stop word, 1 or over MAX_TOKEN_LENGTH characters, a digit run over MAX_DIGIT_RUN, or
 * hex-looking (keepToken; the limits are tokenRules.ts's); stem
 * with porterFast.ts, which equals natural's stemmer that tokenize uses. Tokenizing threads meet
 * millions of distinct identifiers in a large source tree; this path makes a first sighting
 * several times cheaper. Non-ASCII words go to tokenize().
 * test/core/text/asciiWord.test.ts holds it to tokenize() on real and generated words.
 */
import { STOP_WORDS } from './stopWords.js';
import type { TokenizeOptions } from './tokenize.js';
import { MAX_DIGIT_RUN, MAX_TOKEN_LENGTH, MIN_HEXISH_LENGTH } from './tokenRules.js';
import { porterStem } from './porterFast.js';

export { MAX_TOKEN_LENGTH } from './tokenRules.js';

const LOWER = 1,
  UPPER = 2,
  DIGIT = 3,
  SEP = 4;
const KIND = new Uint8Array(128);
for (let c = 97; c <= 122; c++) KIND[c] = LOWER;
for (let c = 65; c <= 90; c++) KIND[c] = UPPER;
for (let c = 48; c <= 57; c++) KIND[c] = DIGIT;
KIND[95] = SEP; // _
KIND[36] = SEP; // $

/** True when every char is in [A-Za-z0-9_$] (the words this module handles). */
export function isAsciiWord(word: string): boolean {
  for (let i = 0; i < word.length; i++) {
    const c = word.charCodeAt(i);
    if (c >= 128 || KIND[c] === 0) return false;
  }
  return word.length > 0;
}

/** ^(?=.*\d)[0-9a-f]{8,}$ on the lowercase form of u[start, end) (ASCII word characters). */
function hexish(u: Uint16Array, start: number, end: number): boolean {
  if (end - start < MIN_HEXISH_LENGTH) return false;
  let digit = false;
  for (let i = start; i < end; i++) {
    const c = u[i] | 0x20; // ASCII lowercase (digits are unchanged by the bit)
    if (c >= 48 && c <= 57) digit = true;
    else if (!(c >= 97 && c <= 102)) return false;
  }
  return digit;
}

/** True when tokenize skips the whole word: ^0[xX][0-9a-fA-F]+$, or hex-looking. */
export function skipsWord(u: Uint16Array, start: number, end: number): boolean {
  if (hexish(u, start, end)) return true;
  if (end - start < 3 || u[start] !== 48 || (u[start + 1] | 0x20) !== 120) return false;
  for (let i = start + 2; i < end; i++) {
    const c = u[i] | 0x20;
    if (!((c >= 48 && c <= 57) || (c >= 97 && c <= 102))) return false;
  }
  return true;
}

/** True when u[start, end) is all ASCII digits. */
export function allDigits(u: Uint16Array, start: number, end: number): boolean {
  for (let i = start; i < end; i++) if (KIND[u[i]] !== DIGIT) return false;
  return end > start;
}

/**
 * The parts of an ASCII identifier, as splitIdentifier() gives them: part p is
 * u[out[2p], out[2p + 1]). Returns the number of parts; out needs room for end − start parts.
 */
export function partBounds(u: Uint16Array, start: number, end: number, out: Int32Array): number {
  let parts = 0;
  let from = -1;
  for (let i = start; i < end; i++) {
    const k = KIND[u[i]];
    if (k === SEP) {
      if (from >= 0) {
        out[2 * parts] = from;
        out[2 * parts++ + 1] = i;
      }
      from = -1;
      continue;
    }
    if (from < 0) {
      from = i;
      continue;
    }
    const prev = KIND[u[i - 1]];
    if (
      (prev === LOWER && k === UPPER) ||
      (prev === UPPER && k === UPPER && i + 1 < end && KIND[u[i + 1]] === LOWER) ||
      (prev !== DIGIT && k === DIGIT) ||
      (prev === DIGIT && k !== DIGIT)
    ) {
      out[2 * parts] = from;
      out[2 * parts++ + 1] = i;
      from = i;
    }
  }
  if (from >= 0) {
    out[2 * parts] = from;
    out[2 * parts++ + 1] = end;
  }
  return parts;
}

/** tokenize's keep() for a lowercase ASCII token. */
export function keepToken(t: string, u: Uint16Array, start: number, end: number): boolean {
  const n = end - start;
  if (n <= 1 || n > MAX_TOKEN_LENGTH || STOP_WORDS.has(t)) return false;
  if (n > MAX_DIGIT_RUN && allDigits(u, start, end)) return false;
  return !hexish(u, start, end);
}

/** Writes the lowercase of u[start, end) into out from position at; returns the new end. */
export function lowerInto(u: Uint16Array, start: number, end: number, out: Uint16Array, at: number): number {
  for (let i = start; i < end; i++) {
    const c = u[i];
    out[at++] = KIND[c] === UPPER ? c | 0x20 : c;
  }
  return at;
}

/** tokenize(word, options) for an ASCII word (see isAsciiWord), through the functions above. */
export function asciiWordTokens(word: string, options: Readonly<TokenizeOptions>): string[] {
  const u = Uint16Array.from(word, (ch) => ch.charCodeAt(0));
  const out: string[] = [];
  if (skipsWord(u, 0, u.length)) return out;
  const bounds = new Int32Array(2 * u.length);
  const parts = partBounds(u, 0, u.length, bounds);
  const low = new Uint16Array(u.length);
  const emit = (from: number, to: number): void => {
    const t = String.fromCharCode(...low.subarray(from, to));
    if (keepToken(t, low, from, to)) out.push(options.stem ? porterStem(t) : t);
  };
  let joined = 0;
  for (let p = 0; p < parts; p++) {
    const at = joined;
    joined = lowerInto(u, bounds[2 * p], bounds[2 * p + 1], low, joined);
    emit(at, joined);
  }
  if (options.keepCompounds && parts > 1 && joined <= MAX_TOKEN_LENGTH && !allDigits(low, 0, joined)) emit(0, joined);
  return out;
}

/** The parts of an ASCII identifier as strings (splitIdentifier's result). */
export function asciiParts(word: string): string[] {
  const u = Uint16Array.from(word, (ch) => ch.charCodeAt(0));
  const bounds = new Int32Array(2 * u.length);
  const n = partBounds(u, 0, u.length, bounds);
  return Array.from({ length: n }, (_, p) => word.slice(bounds[2 * p], bounds[2 * p + 1]));
}
