/**
 * Token shingles (Broder 1997, "On the resemblance and containment of documents"): the set of
 * all runs of w consecutive tokens, each run hashed to 32 bits. Resemblance = Jaccard of sets.
 *
 * Tokens: the text is lowercased, then every maximal run of letters, combining marks, digits and
 * '_' is one token (a word, an identifier such as `parse_header` or `parseHeader`, or a number;
 * "3.14" gives "3" and "14"). No stemming, no stop-word removal, no identifier splitting: a
 * near-copy check wants the words as written.
 *
 * Hashing: each token → MurmurHash3_x86_32 of its UTF-8 bytes; each window of w token hashes →
 * MurmurHash3_x86_32 of those w words (seed = w). Two different shingles of a 300-token file
 * collide with probability ≈ 300²/2³³ ≈ 10⁻⁵ (birthday bound), so set sizes are exact in practice.
 *
 * Default w = 5 (token 5-grams, as in the Stack's and C4's deduplication: Kocetkov et al. 2022; Lee et al. 2022).
 */
import { hashString32, murmur3Words32 } from './murmur3.js';

const TOKEN = /[\p{L}\p{M}\p{N}_]+/gu;

/** The shingle tokenizer's tokens, in order (lowercased; nothing dropped). */
export function shingleTokens(text: string): string[] {
  return text.toLowerCase().match(TOKEN) ?? [];
}

/** A file's shingle set: sorted, duplicate-free 32-bit hashes, and its token count. */
export interface ShingleSet {
  readonly hashes: Uint32Array;
  readonly tokens: number;
}

/** Shingle set of a text; empty hashes when the text has fewer than `size` tokens. */
export function shingleSet(text: string, size: number): ShingleSet {
  const tokens = shingleTokens(text);
  const n = tokens.length;
  if (n < size) return { hashes: new Uint32Array(0), tokens: n };
  const tokenHashes = new Uint32Array(n);
  for (let i = 0; i < n; i++) tokenHashes[i] = hashString32(tokens[i]);
  const count = n - size + 1;
  const all = new Uint32Array(count);
  for (let i = 0; i < count; i++) all[i] = murmur3Words32(tokenHashes, i, size, size);
  all.sort();
  let u = 0;
  for (let i = 0; i < count; i++) if (i === 0 || all[i] !== all[u - 1]) all[u++] = all[i];
  return { hashes: all.slice(0, u), tokens: n };
}

/** |a ∩ b| for two sorted duplicate-free arrays (one merge pass). */
export function intersectionSize(a: Uint32Array, b: Uint32Array): number {
  let i = 0;
  let j = 0;
  let common = 0;
  while (i < a.length && j < b.length) {
    const x = a[i];
    const y = b[j];
    if (x === y) {
      common++;
      i++;
      j++;
    } else if (x < y) i++;
    else j++;
  }
  return common;
}

/** Exact Jaccard |a ∩ b| / |a ∪ b| of two sorted duplicate-free sets; 0 when both are empty. */
export function jaccardSorted(a: Uint32Array, b: Uint32Array): number {
  const common = intersectionSize(a, b);
  const union = a.length + b.length - common;
  return union === 0 ? 0 : common / union;
}
