/**
 * Text → the UTF-16 code units that tokenize() (src/core/text/tokenize.ts) splits into words,
 * written into one reusable Uint16Array, plus the word-character test by code unit:
 *   - steps 1–2 of tokenize: NFKD normalisation, combining marks (\p{M}) removed; words are
 *     maximal runs of letters, digits, '_' and '$' (\p{L}, \p{N}, _, $), astral ones included;
 *   - NFKD is applied to each maximal run of non-ASCII characters on its own. That equals
 *     normalising the whole text: an ASCII character is a starter that no decomposition or
 *     canonical reordering moves across, and NFKD never composes. One-character runs (a dash, a
 *     quote, an accented letter) come from a per-code-unit memo;
 *   - ASCII bytes (most source and prose files) are copied as they are: nothing to normalise.
 * test/node/parallel/wordCounter.test.ts holds the counts built on this to tokenize's.
 */

const WORD_CHAR = /^[\p{L}\p{N}_$]$/u;
const MARK = /^\p{M}$/u;

/** Classes of a code unit (CLASS) or an astral code point. */
export const UNKNOWN = 0,
  WORD = 1,
  OTHER = 2,
  MARK_CHAR = 3,
  HIGH_SURROGATE = 4;

/** Class per code unit of the basic plane, filled in on first sight (classify). */
export const CLASS = new Uint8Array(65536);
const astral = new Map<number, number>();
/** NFKD of each single basic-plane non-ASCII code unit, on first sight. */
const single: (string | undefined)[] = new Array(65536);

function ofChar(s: string): number {
  return WORD_CHAR.test(s) ? WORD : MARK.test(s) ? MARK_CHAR : OTHER;
}

/** The class of code unit c (and remembers it). */
export function classify(c: number): number {
  let k = CLASS[c];
  if (k === UNKNOWN) {
    k = c >= 0xd800 && c <= 0xdbff ? HIGH_SURROGATE : c >= 0xdc00 && c <= 0xdfff ? OTHER : ofChar(String.fromCharCode(c));
    CLASS[c] = k;
  }
  return k;
}

function astralClass(cp: number): number {
  let k = astral.get(cp);
  if (k === undefined) {
    k = ofChar(String.fromCodePoint(cp));
    astral.set(cp, k);
  }
  return k;
}

/** True when u[i] (a high surrogate) and u[i + 1] form an astral letter or digit. */
export function astralWordAt(u: Uint16Array, i: number, n: number): boolean {
  if (i + 1 >= n) return false;
  const d = u[i + 1];
  if (d < 0xdc00 || d > 0xdfff) return false;
  return astralClass(((u[i] - 0xd800) << 10) + (d - 0xdc00) + 0x10000) === WORD;
}

/** A growable buffer of code units. */
export class UnitBuffer {
  units = new Uint16Array(1 << 16);
  length = 0;

  /** Loads ASCII bytes as they are. */
  loadAscii(bytes: Uint8Array): void {
    this.length = 0;
    this.reserve(bytes.length);
    this.units.set(bytes);
    this.length = bytes.length;
  }

  /** Loads text normalised as tokenize does (NFKD, combining marks removed). */
  loadText(text: string): void {
    this.length = 0;
    this.reserve(text.length);
    const n = text.length;
    let i = 0;
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c < 128) {
        if (this.length === this.units.length) this.reserve(this.length + 1);
        this.units[this.length++] = c;
        i++;
        continue;
      }
      let j = i + 1;
      while (j < n && text.charCodeAt(j) >= 128) j++;
      if (j === i + 1) this.append(single[c] ?? (single[c] = String.fromCharCode(c).normalize('NFKD')));
      else this.append(text.slice(i, j).normalize('NFKD'));
      i = j;
    }
  }

  /** Appends normalised non-ASCII text without its combining marks. */
  private append(s: string): void {
    this.reserve(this.length + s.length);
    const u = this.units;
    let n = this.length;
    for (let j = 0; j < s.length; j++) {
      const c = s.charCodeAt(j);
      if (c >= 0xd800 && c <= 0xdbff && j + 1 < s.length) {
        const d = s.charCodeAt(j + 1);
        if (d >= 0xdc00 && d <= 0xdfff) {
          if (astralClass(((c - 0xd800) << 10) + (d - 0xdc00) + 0x10000) !== MARK_CHAR) {
            u[n++] = c;
            u[n++] = d;
          }
          j++;
          continue;
        }
      }
      if (classify(c) !== MARK_CHAR) u[n++] = c;
    }
    this.length = n;
  }

  private reserve(n: number): void {
    if (n <= this.units.length) return;
    const grown = new Uint16Array(Math.max(n, this.units.length * 2));
    grown.set(this.units.subarray(0, this.length));
    this.units = grown;
  }
}

const CASELESS_LETTER = /^[\p{Lo}\p{Lm}]$/u;
/** Per code unit: 0 not yet known, 1 a letter without case (\p{Lo}, \p{Lm}, unchanged by toLowerCase), 2 not. */
const CASELESS = new Uint8Array(65536);

/**
 * True when u[start, end) holds only basic-plane letters without case (CJK, kana, Hangul, …).
 * tokenize() leaves such a word whole: no identifier boundary (those need \p{Lu}, \p{Ll}, \p{N},
 * '_' or '$'), no change by toLowerCase, not a digit or hex run, and no suffix the Porter stemmer
 * knows (all are ASCII), so its one term is the word itself when it has 2 to 40 units.
 */
export function caselessLetters(u: Uint16Array, start: number, end: number): boolean {
  for (let i = start; i < end; i++) {
    const c = u[i];
    let k = CASELESS[c];
    if (k === 0) {
      const ch = String.fromCharCode(c);
      k = CASELESS_LETTER.test(ch) && ch.toLowerCase() === ch ? 1 : 2;
      CASELESS[c] = k;
    }
    if (k !== 1) return false;
  }
  return true;
}

/** The string of u[start, end). */
export function unitsToString(u: Uint16Array, start: number, end: number): string {
  let s = '';
  for (let a = start; a < end; a += 4096)
    s += String.fromCharCode.apply(null, u.subarray(a, Math.min(end, a + 4096)) as unknown as number[]);
  return s;
}
