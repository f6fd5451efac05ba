/**
 * The tokenizing threads' section counts, parked in a scratch file while the SVD runs: on the
 * Linux tree they are some 400 MB (term ids and counts of 1.33 M sections), not needed until the
 * sections fold, and the SVD's blocks come on top of them. The ids and counts of each distinct
 * array (one pair per thread: the files' sections view them) go to the spill; lines, titles and
 * offsets stay. unpark() reads them back into fresh arrays and gives every file its sections
 * again, the same numbers, and closes the spill (close() alone, on a failure or a cancel);
 * lines() gives the files their sections without the counts and a reader of each file's counts,
 * which the sections fold calls file by file (the pipeline: the 400 MB never come back whole).
 */
import type { CountedSections, SectionTerms } from '../core/sections/sectionVectors.js';
import type { ByteSpill, OpenSpill } from '../core/sections/types.js';

/** Park from this many bytes of ids and counts on (below it the file costs more than it saves; a round number, not tuned). */
export const PARK_FROM_BYTES = 64 * 1024 * 1024;

type Lines = Omit<CountedSections, 'termIds' | 'counts'>;

const NO_IDS = new Int32Array(0);
const NO_COUNTS = new Float32Array(0);

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

  /**
   * Gives every parked file its sections back in `into` without their counts (empty ids and
   * counts: the fold reads them from the spill a file at a time, through the returned reader, so
   * they are never all resident). The reader gives a file's ids and counts as views of one buffer
   * reused from call to call (valid until the next call); the spill stays open until close().
   */
  lines(into: Map<string, CountedSections>): (key: string) => SectionTerms | undefined {
    const byKey = new Map<string, { readonly offsets: Int32Array; readonly pack: number }>();
    for (const f of this.files) {
      into.set(f.key, { ...f.lines, termIds: NO_IDS, counts: NO_COUNTS });
      byKey.set(f.key, { offsets: f.lines.offsets, pack: f.pack });
    }
    let ids = new Int32Array(1024);
    let counts = new Float32Array(1024);
    return (key) => {
      const f = byKey.get(key);
      if (!f) return undefined;
      const first = f.offsets[0];
      const n = f.offsets[f.offsets.length - 1] - first;
      if (n > ids.length) {
        ids = new Int32Array(Math.max(n, 2 * ids.length));
        counts = new Float32Array(ids.length);
      }
      const p = this.packs[f.pack];
      if (n > 0) {
        this.spill.read(new Uint8Array(ids.buffer, 0, 4 * n), p.at + 4 * first);
        this.spill.read(new Uint8Array(counts.buffer, 0, 4 * n), p.at + 4 * (p.length + first));
      }
      return { termIds: ids.subarray(0, n), counts: counts.subarray(0, n), first };
    };
  }

  /** Gives the spill back without reading it (idempotent). */
  close(): void {
    this.spill.close();
  }
}
