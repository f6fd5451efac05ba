/**
 * A file's sections counted on a tokenizing thread right after the file itself, from the code
 * units the thread has just counted: one read and one pass over the text per file instead of a
 * second read in a later stage. The file is cut as the sections stage cuts it (splitSections on
 * the same text and index key); each section is the run of units from its first line's start to
 * its last line's end, counted into the counter's section pack (WordCounter.packSection). Line
 * breaks are ASCII, which the units keep as they are (NFKD maps no other character to one), so
 * the units have the text's lines. The counts are over the thread's local ids until
 * translated with the file counts (parallelWorker.ts, finish-counts).
 */
import { splitSections } from '../../core/sections/splitSections.js';
import type { WordCounter } from './wordCounter.js';

/** A file's sections as a thread reports them. */
export interface ThreadSections {
  /** Zero-based first line of each section, and the line after its last. */
  readonly starts: Int32Array;
  readonly ends: Int32Array;
  readonly titles: string[];
  /** Section i's counts are positions [offsets[i], offsets[i + 1]) of the thread's section pack. */
  readonly offsets: Int32Array;
}

let lineStarts = new Int32Array(1 << 12);

/**
 * Cuts the file that wc has just counted in English (packText / packAscii without a language)
 * and counts each section into wc's section pack. `text` is the file's text as the sections
 * stage would read it; `key` its index key (its extension picks the cut).
 */
export function countThreadSections(wc: WordCounter, key: string, text: string): ThreadSections {
  const { sections } = splitSections(key, text);
  const { units, length } = wc.loaded;
  const lines = findLineStarts(units, length);
  const n = sections.length;
  // The three lists share one buffer: the copy the main thread receives is one array buffer per
  // file, not three (on the Linux tree, 1.33 M sections in 78,000 files).
  const all = new Int32Array(3 * n + 1);
  const starts = all.subarray(0, n);
  const ends = all.subarray(n, 2 * n);
  const offsets = all.subarray(2 * n);
  const titles: string[] = new Array(n);
  offsets[0] = wc.sectionPackUsed;
  for (let i = 0; i < n; i++) {
    const s = sections[i];
    starts[i] = s.start;
    ends[i] = s.end;
    titles[i] = s.title;
    if (s.end > lines) throw new Error(`the sections of "${key}" end past its last line`);
    // From the section's first line to the start of the line after its last (the break is no word).
    const p = wc.packSection(lineStarts[s.start], s.end < lines ? lineStarts[s.end] : length);
    offsets[i + 1] = p.at + p.terms;
  }
  return { starts, ends, titles, offsets };
}

/** Fills lineStarts with the start of each line of u[0, n) ("\n", "\r\n" or "\r" end one); returns the number of lines. */
function findLineStarts(u: Uint16Array, n: number): number {
  let lines = 0;
  const push = (at: number): void => {
    if (lines === lineStarts.length) {
      const grown = new Int32Array(lineStarts.length * 2);
      grown.set(lineStarts);
      lineStarts = grown;
    }
    lineStarts[lines++] = at;
  };
  push(0);
  for (let i = 0; i < n; i++) {
    const c = u[i];
    if (c === 10) push(i + 1);
    else if (c === 13) {
      if (i + 1 < n && u[i + 1] === 10) i++;
      push(i + 1);
    }
  }
  return lines;
}
