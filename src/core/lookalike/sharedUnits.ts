/**
 * What two files share, in units that make sense for the pair: lines when both files have at
 * least MIN_LINES non-blank lines, words otherwise ("0 shared lines" says nothing about two
 * single-line files that share 14 of 15 words). Our choice of unit rule; no published source.
 */

/** Files with fewer non-blank lines than this are compared by words. */
export const MIN_LINES = 3;

export interface SharedAmount {
  readonly unit: 'lines' | 'words';
  /** Shared units (multiset intersection). */
  readonly shared: number;
  /** Units of the larger file. */
  readonly of: number;
}

export interface SharedCounts {
  readonly sharedLines: number;
  readonly lines: readonly [number, number];
  readonly sharedWords: number;
  readonly words: readonly [number, number];
}

export function sharedAmount(p: SharedCounts): SharedAmount {
  if (Math.min(p.lines[0], p.lines[1]) >= MIN_LINES) return { unit: 'lines', shared: p.sharedLines, of: Math.max(p.lines[0], p.lines[1]) };
  return { unit: 'words', shared: p.sharedWords, of: Math.max(p.words[0], p.words[1]) };
}

/** "11 of 12 lines shared", "14 of 15 words shared". */
export function describeShared(p: SharedCounts): string {
  const a = sharedAmount(p);
  const unit = a.of === 1 ? a.unit.slice(0, -1) : a.unit;
  return `${a.shared} of ${a.of} ${unit} shared`;
}
