/**
 * The ids of a thread's terms ordered by term (UTF-16 code unit order, as Array.prototype.sort
 * gives), for the term merge at the end of a fresh build (sortedCount.ts). A plain string sort
 * compares whole strings about n·log2(n) times; here each id first gets a numeric key — its
 * first two code units above the id — and one native Float64Array sort orders all keys, so only
 * ids that share their first two units are compared as strings, in short runs. This is a
 * two-character bucket sort (the most significant digits of an MSD radix sort; common practice)
 * finished by comparison sorts. Past 2^21 terms (the id would not fit beside the prefix in a
 * double's 53 bits) it falls back to one comparison sort.
 * test/node/parallel/termOrder.test.ts holds it to Array.prototype.sort.
 */

/** Ids that fit below the prefix in a key: 2^21 (2^32 prefixes × 2^21 = 2^53). */
const ID_SPAN = 1 << 21;

function compareBy(terms: readonly string[]): (a: number, b: number) => number {
  return (a, b) => {
    const x = terms[a],
      y = terms[b];
    return x < y ? -1 : x > y ? 1 : 0;
  };
}

/** Ids 0 … n − 1 of terms (distinct strings) in term order. */
export function sortedTermIds(terms: readonly string[]): Int32Array {
  const n = terms.length;
  const ids = new Int32Array(n);
  if (n >= ID_SPAN) {
    for (let i = 0; i < n; i++) ids[i] = i;
    return ids.sort(compareBy(terms));
  }
  // Key: first unit × 2^16 + (second unit + 1, or 0 for a one-unit term), then the id. A term
  // without a second unit sorts before every longer term with its first unit, as strings do;
  // 0xffff + 1 overflows the 16 bits only into the first unit's place for U+FFFF, which no
  // term holds (a noncharacter, not a letter or digit).
  const key = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = terms[i];
    const prefix = t.length === 0 ? 0 : t.charCodeAt(0) * 65536 + (t.length > 1 ? t.charCodeAt(1) + 1 : 0);
    key[i] = prefix * ID_SPAN + i;
  }
  key.sort();
  for (let i = 0; i < n; i++) ids[i] = key[i] % ID_SPAN;
  // Runs of equal prefix: order by the whole term.
  const compare = compareBy(terms);
  let from = 0;
  for (let i = 1; i <= n; i++) {
    if (i < n && Math.floor(key[i] / ID_SPAN) === Math.floor(key[from] / ID_SPAN)) continue;
    if (i - from > 1) ids.subarray(from, i).sort(compare);
    from = i;
  }
  return ids;
}

/** Terms as code units: term i is units[starts[i], starts[i + 1]) (no string per term). */
export interface TermUnits {
  readonly units: Uint16Array;
  /** One more entry than terms. */
  readonly starts: Int32Array;
}

/** terms[order[0]], terms[order[1]], … as code units, in one buffer (what a thread hands over). */
export function termUnitsInOrder(terms: readonly string[], order: Int32Array): TermUnits {
  const starts = new Int32Array(order.length + 1);
  for (let i = 0; i < order.length; i++) starts[i + 1] = starts[i] + terms[order[i]].length;
  const units = new Uint16Array(starts[order.length]);
  for (let i = 0; i < order.length; i++) {
    const t = terms[order[i]];
    const at = starts[i];
    for (let j = 0; j < t.length; j++) units[at + j] = t.charCodeAt(j);
  }
  return { units, starts };
}
