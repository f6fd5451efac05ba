/**
 * tokenize() of one ASCII word ([A-Za-z0-9_$]+), by char codes instead of regular expressions:
 * the same rules as src/core/text/tokenize.ts step by step — skip hex literals and hex-looking
 * runs; split on '_' and '$', then at lower→Upper, Upper→Upper+lower and letter↔digit
 * boundaries; emit each part (and, for a split word, the joined compound) lowercased, unless it is
 * a stop word, 1 or over 40 characters, a digit run over 4, or hex-looking; stem with
 * porterFast.ts, which equals natural's stemmer that tokenize uses. Tokenizing threads meet
 * millions of distinct identifiers in a large source tree; this path makes a first sighting
 * several times cheaper. Non-ASCII words go to tokenize().
 * test/node/parallel/asciiWord.test.ts holds it to tokenize() on real and generated words.
 */
import { STOP_WORDS } from '../../core/text/stopWords.js';
import type { TokenizeOptions } from '../../core/text/tokenize.js';
import { porterStem } from './porterFast.js';

const MAX_TOKEN_LENGTH = 40;
/** Stems remembered before the memo is cleared (as tokenize's stemWord does, with its own limit). */
const STEM_MEMO_LIMIT = 1_000_000;
let stems = new Map<string, string>();

/** porterStem (equal to natural's stemmer, which stemWord uses), memoised. */
function stemOf(t: string): string {
  let s = stems.get(t);
  if (s === undefined) {
    s = porterStem(t);
    if (stems.size >= STEM_MEMO_LIMIT) stems = new Map();
    stems.set(t, s);
  }
  return s;
}
const enum K {
  Lower = 1,
  Upper = 2,
  Digit = 3,
  Sep = 4,
}
const KIND = new Uint8Array(128);
for (let c = 97; c <= 122; c++) KIND[c] = K.Lower;
for (let c = 65; c <= 90; c++) KIND[c] = K.Upper;
for (let c = 48; c <= 57; c++) KIND[c] = K.Digit;
KIND[95] = K.Sep; // _
KIND[36] = K.Sep; // $

/** True when every char is in [A-Za-z0-9_$] (the words this module handles). */
export function isAsciiWord(word: string): boolean {
  for (let i = 0; i < word.length; i++) {
    const c = word.charCodeAt(i);
    if (c >= 128 || KIND[c] === 0) return false;
  }
  return word.length > 0;
}

/** ^(?=.*\d)[0-9a-f]{8,}$ on the lowercase form of s (s is ASCII word characters). */
function hexish(s: string): boolean {
  if (s.length < 8) return false;
  let digit = false;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i) | 0x20; // ASCII lowercase (digits are unchanged by the bit)
    if (c >= 48 && c <= 57) digit = true;
    else if (!(c >= 97 && c <= 102)) return false;
  }
  return digit;
}

/** ^0[xX][0-9a-fA-F]+$ */
function hexLiteral(s: string): boolean {
  if (s.length < 3 || s.charCodeAt(0) !== 48 || (s.charCodeAt(1) | 0x20) !== 120) return false;
  for (let i = 2; i < s.length; i++) {
    const c = s.charCodeAt(i) | 0x20;
    if (!((c >= 48 && c <= 57) || (c >= 97 && c <= 102))) return false;
  }
  return true;
}

function allDigits(s: string): boolean {
  for (let i = 0; i < s.length; i++) if (KIND[s.charCodeAt(i)] !== K.Digit) return false;
  return s.length > 0;
}

/** The parts of an ASCII identifier, as splitIdentifier() gives them. */
export function asciiParts(word: string): string[] {
  const parts: string[] = [];
  const n = word.length;
  let start = -1;
  for (let i = 0; i < n; i++) {
    const k = KIND[word.charCodeAt(i)];
    if (k === K.Sep) {
      if (start >= 0) parts.push(word.slice(start, i));
      start = -1;
      continue;
    }
    if (start < 0) {
      start = i;
      continue;
    }
    const prev = KIND[word.charCodeAt(i - 1)];
    const next = i + 1 < n ? KIND[word.charCodeAt(i + 1)] : 0;
    const boundary =
      (prev === K.Lower && k === K.Upper) ||
      (prev === K.Upper && k === K.Upper && next === K.Lower) ||
      (prev !== K.Digit && k === K.Digit) ||
      (prev === K.Digit && k !== K.Digit);
    if (boundary) {
      parts.push(word.slice(start, i));
      start = i;
    }
  }
  if (start >= 0) parts.push(word.slice(start));
  return parts;
}

/** Lowercases a part and keeps it unless tokenize's keep() would drop it. */
function emit(raw: string, out: string[]): void {
  const t = raw.toLowerCase();
  if (t.length <= 1 || t.length > MAX_TOKEN_LENGTH || STOP_WORDS.has(t)) return;
  if (t.length >= 5 && allDigits(t)) return;
  if (hexish(t)) return;
  out.push(t);
}

/** The kept lowercase tokens of an ASCII word before stemming (tokenize's steps 1–4). */
export function asciiWordLowerTokens(word: string, keepCompounds: boolean): string[] {
  const out: string[] = [];
  if (hexLiteral(word) || hexish(word)) return out;
  const parts = asciiParts(word);
  if (parts.length === 1 && parts[0] === word) {
    emit(word, out);
    return out;
  }
  for (const p of parts) emit(p, out);
  if (keepCompounds && parts.length > 1) {
    const compound = parts.join('');
    if (compound.length <= MAX_TOKEN_LENGTH && !allDigits(compound)) emit(compound, out);
  }
  return out;
}

/** tokenize(word, options) for an ASCII word (see isAsciiWord). */
export function asciiWordTokens(word: string, options: Readonly<TokenizeOptions>): string[] {
  const tokens = asciiWordLowerTokens(word, options.keepCompounds);
  return options.stem ? tokens.map(stemOf) : tokens;
}
