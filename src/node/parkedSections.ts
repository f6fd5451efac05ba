/**
 * The tokenizing threads' section counts, parked in a scratch file while the SVD runs: on the
 * Linux tree they are some 400 MB (term ids and counts of 1.33 M sections), not needed until the
 * sections fold, and the SVD's blocks come on top of them. The ids and counts of each distinct
 * array (one pair per thread: the files' sections view them) go to the spill; lines, titles and
 * offsets stay. unpark() reads them back into fresh arrays and gives every file its sections
 * again, the same numbers, and closes the spill (close() alone, on a failure or a cancel).
 */
import type { CountedSections } from '../core/sections/sectionVectors.js';
import type { ByteSpill, OpenSpill } from '../core/sections/types.js';

/** Park from this many bytes of ids and counts on (below it the file costs more than it saves; a round number, not tuned). */
export const PARK_FROM_BYTES = 64 * 1024 * 1024;

type Lines = Omit<CountedSections, 'termIds' | 'counts'>;

export class ParkedSections {
  private constructor(
    private readonly spill: ByteSpill,
    /** Each distinct array's length and byte position (ids, then counts). */
    private readonly packs: readonly { readonly length: number; readonly at: number }[],
    private readonly files: readonly { readonly key: string; readonly lines: Lines; readonly pack: number }[],
  ) {}

  /**
   * Writes the ids and counts of `sections` to a spill and empties the map; null (the map left as
   * it is) below fromBytes or when no spill can be had. A failed write closes the spill and throws.
   */
  static park(sections: Map<string, CountedSections>, open: OpenSpill | undefined, fromBytes = PARK_FROM_BYTES): ParkedSections | null {
    if (!open) return null;
    const packOf = new Map<Int32Array, number>();
    const arrays: { termIds: Int32Array; counts: Float32Array }[] = [];
    let bytes = 0;
    for (const c of sections.values())
      if (!packOf.has(c.termIds)) {
        if (c.counts.length !== c.termIds.length) throw new Error('section ids and counts differ in length (a bug)');
        packOf.set(c.termIds, arrays.length);
        arrays.push({ termIds: c.termIds, counts: c.counts });
        bytes += 8 * c.termIds.length;
      }
    if (bytes < fromBytes) return null;
    const spill = open();
    if (!spill) return null;
    const packs: { length: number; at: number }[] = [];
    try {
      let at = 0;
      for (const a of arrays) {
        packs.push({ length: a.termIds.length, at });
        spill.write(new Uint8Array(a.termIds.buffer, a.termIds.byteOffset, 4 * a.termIds.length), at);
        spill.write(new Uint8Array(a.counts.buffer, a.counts.byteOffset, 4 * a.counts.length), at + 4 * a.termIds.length);
        at += 8 * a.termIds.length;
      }
    } catch (err) {
      spill.close();
      throw err;
    }
    const files: { key: string; lines: Lines; pack: number }[] = [];
    for (const [key, c] of sections) {
      files.push({ key, lines: { starts: c.starts, ends: c.ends, titles: c.titles, offsets: c.offsets }, pack: packOf.get(c.termIds)! });
    }
    sections.clear();
    return new ParkedSections(spill, packs, files);
  }

  /** Reads the counts back into `into` (every parked file, as it was) and closes the spill. */
  unpark(into: Map<string, CountedSections>): void {
    try {
      const arrays = this.packs.map((p) => {
        const termIds = new Int32Array(p.length);
        const counts = new Float32Array(p.length);
        this.spill.read(new Uint8Array(termIds.buffer), p.at);
        this.spill.read(new Uint8Array(counts.buffer), p.at + 4 * p.length);
        return { termIds, counts };
      });
      for (const f of this.files) into.set(f.key, { ...f.lines, ...arrays[f.pack] });
    } finally {
      this.spill.close();
    }
  }

  /** Gives the spill back without reading it (idempotent). */
  close(): void {
    this.spill.close();
  }
}
