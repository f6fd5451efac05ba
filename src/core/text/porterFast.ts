/**
 * The Porter stemmer (Porter 1980) exactly as natural's PorterStemmer implements it
 * (natural/lib/natural/stemmers/porter_stemmer.js), quirks included, for lowercase tokens (ASCII
 * or not: a code unit outside [a-z] is a consonant to both, and no suffix has one),
 * with plain string and char-code operations instead of regular expressions built per call.
 * Tokenizing threads stem millions of distinct identifier parts in a large tree; this is several
 * times faster per new word. The control flow follows natural's step for step:
 *   - categorizeGroups: a 'y' after a non-[aeiouy] char counts as a vowel group of its own, runs
 *     of [aeiou] form one vowel group, runs of everything else one consonant group;
 *   - measure(s) = (groups without a leading C and a trailing V).length / 2, and -1 for '';
 *   - step 2/3 suffix lists are applied in order to the running result, each guarded by the
 *     measure of the original token without that suffix.
 * test/core/text/porterFast.test.ts holds it to natural's stemmer on real and generated words.
 */

const A = 97,
  E = 101,
  I = 105,
  O = 111,
  U = 117,
  Y = 121;

function isVowel(c: number): boolean {
  return c === A || c === E || c === I || c === O || c === U;
}

/** 1 = vowel group member ([aeiou], or 'y' after a non-[aeiouy] char), 0 = consonant. */
function charIsV(s: string, i: number): boolean {
  const c = s.charCodeAt(i);
  if (isVowel(c)) return true;
  if (c !== Y || i === 0) return false;
  const p = s.charCodeAt(i - 1);
  return !isVowel(p) && p !== Y;
}

/** True when some char of s[0, end) is in a vowel group (natural's categorizeGroups has a 'V'). */
function hasVowelGroup(s: string, end: number): boolean {
  for (let i = 0; i < end; i++) if (charIsV(s, i)) return true;
  return false;
}

export function measure(s: string | null): number {
  if (!s) return -1;
  // The groups of categorizeGroups counted on the fly (no string): 0 = C, 1 = V.
  let count = 0;
  let first = -1;
  let last = -1;
  let prevVowelRun = false;
  for (let i = 0; i < s.length; i++) {
    let g: number;
    if (isVowel(s.charCodeAt(i))) {
      g = prevVowelRun ? -1 : 1;
      prevVowelRun = true;
    } else {
      g = charIsV(s, i) ? 1 : last === 0 ? -1 : 0;
      prevVowelRun = false;
    }
    if (g >= 0) {
      if (count++ === 0) first = g;
      last = g;
    }
  }
  // Without a leading C group and then a trailing V group.
  if (first === 0) count--;
  if (count > 0 && last === 1) count--;
  return count / 2;
}

/**
 * substr(categorizeChars(s), from, 3) === 'CVC', natural's test on one 'C' or 'V' per char, with
 * a negative from counted from the end (clamped at 0) as substr does.
 */
function cvcAt(s: string, from: number): boolean {
  const i = from < 0 ? Math.max(s.length + from, 0) : from;
  return i + 3 <= s.length && !charIsV(s, i) && charIsV(s, i + 1) && !charIsV(s, i + 2);
}

/** JavaScript's String.prototype.substr(start, length), which strict TypeScript discourages. */
function substr(s: string, start: number, length?: number): string {
  const from = start < 0 ? Math.max(s.length + start, 0) : start;
  return s.slice(from, length === undefined ? undefined : from + Math.max(0, length));
}

/** s ends with a doubled char that is not [aeiou] (natural's endsWithDoublCons). */
function doubleConsonant(s: string): boolean {
  const n = s.length;
  return n >= 2 && s.charCodeAt(n - 1) === s.charCodeAt(n - 2) && !isVowel(s.charCodeAt(n - 1));
}

/** natural's attemptReplace for a plain suffix: null when s does not end with it. */
function replaceSuffix(s: string | null, suffix: string, replacement: string): string | null {
  if (s === null || !s.endsWith(suffix)) return null;
  return s.slice(0, s.length - suffix.length) + replacement;
}

type Rule = readonly [string, string];

function replacePatterns(token: string, rules: readonly Rule[], threshold: number | null): string {
  let result = token;
  for (const [suffix, to] of rules) {
    if (threshold === null || measure(replaceSuffix(token, suffix, '')) > threshold) {
      result = replaceSuffix(result, suffix, to) || result;
    }
  }
  return result || token;
}

const STEP1B: readonly Rule[] = [
  ['at', 'ate'],
  ['bl', 'ble'],
  ['iz', 'ize'],
];
const STEP2: readonly Rule[] = [
  ['ational', 'ate'],
  ['tional', 'tion'],
  ['enci', 'ence'],
  ['anci', 'ance'],
  ['izer', 'ize'],
  ['abli', 'able'],
  ['bli', 'ble'],
  ['alli', 'al'],
  ['entli', 'ent'],
  ['eli', 'e'],
  ['ousli', 'ous'],
  ['ization', 'ize'],
  ['ation', 'ate'],
  ['ator', 'ate'],
  ['alism', 'al'],
  ['iveness', 'ive'],
  ['fulness', 'ful'],
  ['ousness', 'ous'],
  ['aliti', 'al'],
  ['iviti', 'ive'],
  ['biliti', 'ble'],
  ['logi', 'log'],
];
const STEP3: readonly Rule[] = [
  ['icate', 'ic'],
  ['ative', ''],
  ['alize', 'al'],
  ['iciti', 'ic'],
  ['ical', 'ic'],
  ['ful', ''],
  ['ness', ''],
];
// Step 4 suffixes; the lazy prefix of natural's regular expression picks the longest that fits.
const STEP4 = [
  'al',
  'ance',
  'ence',
  'er',
  'ic',
  'able',
  'ible',
  'ant',
  'ement',
  'ment',
  'ent',
  'ou',
  'ism',
  'ate',
  'iti',
  'ous',
  'ive',
  'ize',
];

function step1a(t: string): string {
  if (t.endsWith('sses')) return t.slice(0, -2);
  if (t.endsWith('ies')) return t.slice(0, -2);
  if (t.endsWith('s') && substr(t, -2, 1) !== 's' && t.length > 2) return t.slice(0, -1);
  return t;
}

function step1bTail(t: string): string | null {
  if (!hasVowelGroup(t, t.length)) return null;
  const result = replacePatterns(t, STEP1B, null);
  if (result !== t) return result;
  const last = t.charCodeAt(t.length - 1);
  if (doubleConsonant(t) && last !== 108 && last !== 115 && last !== 122) return t.slice(0, -1);
  if (measure(t) === 1 && cvcAt(t, -3) && last !== 119 && last !== 120 && last !== Y) return `${t}e`;
  return t;
}

function step1b(t: string): string {
  if (substr(t, -3) === 'eed') {
    if (measure(substr(t, 0, t.length - 3)) > 0) return t.replace(/eed$/, 'ee');
    return t;
  }
  const stripped = t.endsWith('ed') ? t.slice(0, -2) : t.endsWith('ing') ? t.slice(0, -3) : null;
  if (stripped === null || stripped === '') return t;
  return step1bTail(stripped) || t;
}

function step1c(t: string): string {
  // natural: the token ends in 'y' and a group before the last is a vowel group; the last group
  // is the final 'y' alone (as a vowel) or a consonant run, so that is a vowel char before it.
  if (t.endsWith('y') && hasVowelGroup(t, t.length - 1)) return `${t.slice(0, -1)}i`;
  return t;
}

function step4(t: string): string {
  let best = '';
  for (const suffix of STEP4) if (suffix.length > best.length && t.length > suffix.length && t.endsWith(suffix)) best = suffix;
  if (best) {
    const stem = t.slice(0, t.length - best.length);
    if (measure(stem) > 1) return stem;
  }
  if (t.length > 4 && t.endsWith('ion')) {
    const st = t.charCodeAt(t.length - 4);
    if (st === 115 || st === 116) {
      const stem = t.slice(0, -3);
      if (measure(stem) > 1) return stem;
    }
  }
  return t;
}

function step5a(t: string): string {
  const m = measure(t.endsWith('e') ? t.slice(0, -1) : t);
  const n = t.length;
  const w = t.charCodeAt(n - 2);
  const cvc = cvcAt(t, -4) && n >= 2 && w !== 119 && w !== 120 && w !== Y;
  if (m > 1 || (m === 1 && !cvc)) return t.endsWith('e') ? t.slice(0, -1) : t;
  return t;
}

function step5b(t: string): string {
  return measure(t) > 1 && t.endsWith('ll') ? t.slice(0, -1) : t;
}

/** natural's PorterStemmer.stem(token) for a lowercase token. */
export function porterStem(token: string): string {
  if (token.length < 3) return token;
  let t = step1a(token);
  t = step1b(t);
  t = step1c(t);
  t = replacePatterns(t, STEP2, 0);
  t = replacePatterns(t, STEP3, 0);
  t = step4(t);
  t = step5a(t);
  return step5b(t);
}
