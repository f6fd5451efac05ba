/**
 * The ids of a thread's terms ordered by term (UTF-16 code unit order, as Array.prototype.sort
 * gives), for the term merge at the end of a fresh build (sortedCount.ts). The terms are code
 * units in one buffer (a thread keeps no string per term). A plain sort would compare whole
 * terms about n·log2(n) times; here the ids are first ordered by their first two code units
 * (two stable counting-sort passes, least significant unit first: an LSD radix sort over those
 * two digits), so only ids that share their first two units are compared as whole terms, in
 * short runs. This is a two-character bucket sort (the most significant digits of an MSD radix
 * sort; common practice) finished by comparison sorts, for any number of terms.
 * test/node/parallel/termOrder.test.ts holds it to Array.prototype.sort.
 */

/** Terms as code units: term i is units[starts[i], starts[i + 1]) (no string per term). */
export interface TermUnits {
  readonly units: Uint16Array;
  /** One more entry than terms. */
  readonly starts: Int32Array;
}

/**
 * The ids 0 … n − 1 of the terms held as code units (TermUnits, distinct) in term order: the same
 * order as sortedTermIds of their strings, with no string made. Ids are first ordered by their
 * first two code units (two stable counting-sort passes of 16 bits: any number of ids), then
 * runs of equal prefix by the whole terms.
 */
export function sortedUnitIds(t: TermUnits): Int32Array {
  const { units, starts } = t;
  const n = starts.length - 1;
  // Prefix halves: the first unit, and the second (0 for a one-unit term; a term holds no U+0000,
  // and if one did, the comparison of the run would still order it).
  const high = new Uint16Array(n);
  const low = new Uint16Array(n);
  for (let i = 0; i < n; i++) {
    const a = starts[i];
    const len = starts[i + 1] - a;
    high[i] = len > 0 ? units[a] : 0;
    low[i] = len > 1 ? units[a + 1] : 0;
  }
  const byLow = countingOrder(low, null);
  const ids = countingOrder(high, byLow);
  const compare = (x: number, y: number): number => {
    let i = starts[x];
    const ie = starts[x + 1];
    let j = starts[y];
    const je = starts[y + 1];
    for (; i < ie && j < je; i++, j++) if (units[i] !== units[j]) return units[i] - units[j];
    return ie - i - (je - j);
  };
  let from = 0;
  for (let i = 1; i <= n; i++) {
    if (i < n && high[ids[i]] === high[ids[from]] && low[ids[i]] === low[ids[from]]) continue;
    if (i - from > 1) ids.subarray(from, i).sort(compare);
    from = i;
  }
  return ids;
}

/** The ids (`order`, or 0 … n − 1) stably ordered by key (a counting sort over 16-bit keys). */
function countingOrder(key: Uint16Array, order: Int32Array | null): Int32Array {
  const n = key.length;
  const at = new Int32Array(65537);
  for (let i = 0; i < n; i++) at[key[i] + 1]++;
  for (let k = 1; k <= 65536; k++) at[k] += at[k - 1];
  const out = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const id = order ? order[i] : i;
    out[at[key[id]]++] = id;
  }
  return out;
}

/** Terms src[order[0]], src[order[1]], … in one buffer. */
export function unitsInOrder(src: TermUnits, order: Int32Array): TermUnits {
  const starts = new Int32Array(order.length + 1);
  for (let i = 0; i < order.length; i++) starts[i + 1] = starts[i] + src.starts[order[i] + 1] - src.starts[order[i]];
  const units = new Uint16Array(starts[order.length]);
  for (let i = 0; i < order.length; i++) units.set(src.units.subarray(src.starts[order[i]], src.starts[order[i] + 1]), starts[i]);
  return { units, starts };
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
