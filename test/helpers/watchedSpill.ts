/**
 * A scratch file beside a folder (src/node/sectionCodeFile.ts, openSpillBeside) whose reads and
 * closes are counted: the parked counts' and sections' tests check when a file is read and that
 * it is given back.
 */
import type { OpenSpill } from '../../src/core/sections/types.js';
import { openSpillBeside } from '../../src/node/sectionCodeFile.js';

export interface WatchedSpill {
  readonly open: OpenSpill;
  /** Reads and closes so far, over every file opened. */
  readonly seen: { reads: number; closes: number };
}

export function watchedSpill(folder: string, what?: string): WatchedSpill {
  const beside = openSpillBeside(folder, what);
  const seen = { reads: 0, closes: 0 };
  const open: OpenSpill = () => {
    const s = beside();
    if (!s) return null;
    return {
      write: (b, at) => s.write(b, at),
      read: (into, at) => (seen.reads++, s.read(into, at)),
      close: () => (seen.closes++, s.close()),
    };
  };
  return { open, seen };
}
