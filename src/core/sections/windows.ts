/**
 * Sliding windows of lines with overlap, for text without headings or declarations (Callan 1994,
 * "Passage-level evidence in document retrieval": fixed-size overlapping windows). The last
 * window is moved back so it is full when the text allows; a text shorter than one window is one
 * section.
 */
import type { Section } from './types.js';

/** Windows over lines [from, to) of `size` lines, each starting `size − overlap` after the one before. */
export function lineWindows(
  from: number,
  to: number,
  size: number,
  overlap: number,
  title: (start: number, end: number) => string,
): Section[] {
  const out: Section[] = [];
  if (to <= from) return out;
  const step = Math.max(1, size - Math.min(overlap, size - 1));
  if (to - from <= size) return [{ start: from, end: to, title: title(from, to) }];
  for (let s = from; ; s += step) {
    const start = Math.min(s, Math.max(from, to - size));
    const end = Math.min(to, start + size);
    out.push({ start, end, title: title(start, end) });
    if (end >= to) break;
  }
  return out;
}

/** "lines 12–40" (one-based, as an editor shows them). */
export const linesTitle = (start: number, end: number): string => `lines ${start + 1}–${end}`;
