/**
 * Shared line count of two files: how many non-blank lines, compared after trimming, the two
 * texts have in common, counting repeats (multiset intersection: a line twice in each counts 2).
 * This is the figure a person checks first when told two files look alike.
 */

/** Count of each trimmed non-blank line of a text. */
export function lineCounts(text: string): Map<string, number> {
  const counts = new Map<string, number>();
  for (const raw of text.split(/\r\n|\r|\n/)) {
    const line = raw.trim();
    if (line.length > 0) counts.set(line, (counts.get(line) ?? 0) + 1);
  }
  return counts;
}

/** Σ over lines of min(count in a, count in b). */
export function sharedLineCount(a: ReadonlyMap<string, number>, b: ReadonlyMap<string, number>): number {
  const [small, large] = a.size <= b.size ? [a, b] : [b, a];
  let shared = 0;
  for (const [line, n] of small) {
    const m = large.get(line);
    if (m !== undefined) shared += n < m ? n : m;
  }
  return shared;
}

/** Total non-blank lines (the shared count of a file with an exact copy of itself). */
export function nonBlankLineCount(counts: ReadonlyMap<string, number>): number {
  let total = 0;
  for (const n of counts.values()) total += n;
  return total;
}
