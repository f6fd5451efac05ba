/**
 * Every file's raw term counts, parked in a scratch file from the end of the weighting through
 * the save: the build needs them to weight the matrix and the index needs them again (they are saved,
 * and an index answers from them), but not the SVD, the files' projection or the sections fold in
 * between. On the Linux tree they are the largest thing resident then (78 M ids and counts of
 * 78,300 files, some 620 MB: measured with bench/buildStages.ts), and the SVD's blocks come on top.
 *
 * park() writes each file's ids and counts to the spill and gives its DocTerms empty arrays in
 * their place (the same objects: the builder, the index's slots and whoever else holds them see
 * the counts come back); unpark() reads them back into two arrays shared by all files (views of
 * them, the same numbers as before) and closes the spill; close() alone, on a failure or a cancel.
 * In between, source() gives the save each file's lists from the spill (it never needs them all
 * in memory), and unparkOnUse() may stand in for unpark(): the counts come back on their first read.
 * Nothing may read the files' counts between the two (the pipeline does not park them when a
 * caller asked for them during the build, onCounted, nor the counts a file takes over from the
 * previous index, which remain that index's own while it answers and when the build fails).
 */
import type { DocTerms } from '../core/counting/termCounts.js';
import type { ByteSpill, OpenSpill } from '../core/sections/types.js';
import type { TermListSource } from '../core/index/persistence/serialize.js';
import { readInRuns } from '../core/matrix/parkedMatrix.js';

/** Park from this many bytes of ids and counts on (below it the file costs more than it saves; a round number, not tuned). */
export const PARK_COUNTS_FROM_BYTES = 64 * 1024 * 1024;

/** Bytes gathered before each write to the spill (few calls, a small buffer; not tuned). */
const WRITE_BUFFER_BYTES = 4 * 1024 * 1024;

/** A DocTerms whose arrays park() may swap (its fields are read-only to everyone else). */
type Swappable = { termIds: Int32Array; counts: Float32Array };

const NO_IDS = new Int32Array(0);
const NO_COUNTS = new Float32Array(0);

export class ParkedCounts {
  /** True once the counts are back in their files (unpark) or given up (close). */
  private back = false;
  /** True once the parked files read their counts through accessors (unparkOnUse). */
  private onUse = false;

  private constructor(
    private readonly spill: ByteSpill,
    private readonly docs: readonly Swappable[],
    /** Each parked file's first entry (ids and counts of all files follow each other). */
    private readonly starts: Float64Array,
    private readonly total: number,
  ) {}

  /**
   * Writes the counts of `docs` to a spill and empties their arrays; null (nothing changed) below
   * fromBytes or when no spill can be had. A failed write restores nothing yet taken (arrays are
   * emptied only once everything is written), closes the spill and throws.
   */
  static park(docs: readonly DocTerms[], open: OpenSpill | undefined, fromBytes = PARK_COUNTS_FROM_BYTES): ParkedCounts | null {
    if (!open) return null;
    const parked: Swappable[] = [];
    let total = 0;
    for (const d of docs) {
      if (d.termIds.length === 0 || Object.isFrozen(d)) continue;
      if (d.counts.length !== d.termIds.length) throw new Error('term ids and counts differ in length (a bug)');
      parked.push(d as Swappable);
      total += d.termIds.length;
    }
    if (8 * total < fromBytes) return null;
    const spill = open();
    if (!spill) return null;
    const starts = new Float64Array(parked.length + 1);
    try {
      // Ids of every file, then counts of every file, each gathered in a buffer before it is written.
      const buffer = new Uint8Array(WRITE_BUFFER_BYTES);
      let filled = 0;
      let at = 0;
      const put = (bytes: Uint8Array): void => {
        for (let from = 0; from < bytes.length;) {
          const n = Math.min(bytes.length - from, buffer.length - filled);
          buffer.set(bytes.subarray(from, from + n), filled);
          filled += n;
          from += n;
          if (filled === buffer.length) {
            spill.write(buffer, at);
            at += filled;
            filled = 0;
          }
        }
      };
      for (let i = 0; i < parked.length; i++) {
        const ids = parked[i].termIds;
        starts[i + 1] = starts[i] + ids.length;
        put(new Uint8Array(ids.buffer, ids.byteOffset, ids.byteLength));
      }
      for (const d of parked) put(new Uint8Array(d.counts.buffer, d.counts.byteOffset, d.counts.byteLength));
      if (filled > 0) spill.write(buffer.subarray(0, filled), at);
    } catch (err) {
      spill.close();
      throw err;
    }
    for (const d of parked) {
      d.termIds = NO_IDS;
      d.counts = NO_COUNTS;
    }
    return new ParkedCounts(spill, parked, starts, total);
  }

  /** Gives every parked file its counts back (views of two shared arrays) and closes the spill. */
  unpark(): void {
    if (this.back) return;
    this.back = true;
    try {
      const termIds = new Int32Array(this.total);
      const counts = new Float32Array(this.total);
      readInRuns(this.spill, termIds, 0);
      readInRuns(this.spill, counts, 4 * this.total);
      this.docs.forEach((d, i) => {
        if (this.onUse) {
          // Plain fields again in place of the accessors of unparkOnUse.
          Object.defineProperty(d, 'termIds', {
            value: termIds.subarray(this.starts[i], this.starts[i + 1]),
            writable: true,
            enumerable: true,
            configurable: true,
          });
          Object.defineProperty(d, 'counts', {
            value: counts.subarray(this.starts[i], this.starts[i + 1]),
            writable: true,
            enumerable: true,
            configurable: true,
          });
        } else {
          d.termIds = termIds.subarray(this.starts[i], this.starts[i + 1]);
          d.counts = counts.subarray(this.starts[i], this.starts[i + 1]);
        }
      });
    } finally {
      this.spill.close();
    }
  }

  /**
   * Leaves the counts in the spill until they are used: the first read of any parked file's ids
   * or counts reads them all back (unpark) and the reader gets them. For a caller that may never
   * read them again (the command line: the index saved, often nothing asked of it after), so the
   * counts never come back into memory; the spill stays open until then, or until close().
   */
  unparkOnUse(): void {
    if (this.back) return;
    this.onUse = true;
    for (const d of this.docs)
      for (const field of ['termIds', 'counts'] as const)
        Object.defineProperty(d, field, {
          enumerable: true,
          configurable: true,
          get: () => {
            this.unpark();
            const now = Object.getOwnPropertyDescriptor(d, field);
            // Still an accessor: the spill could not be read (or was closed first).
            if (now?.get) throw new Error('the parked term counts could not be read back');
            return now?.value as Int32Array | Float32Array;
          },
        });
  }

  /**
   * The parked counts as a save reads them (serialize.ts, TermListSource): each file's ids, then
   * each file's counts, read from the spill through one buffer of READ_AHEAD_BYTES (the save asks
   * in slot order, which is the order they were parked in, so each read serves many files). A
   * file's lists are views of that buffer, valid until the next call. Gives undefined for a file
   * not parked here, and for all once the counts are back (unpark) or the spill is closed.
   */
  source(): TermListSource {
    const slot = new Map<object, number>();
    this.docs.forEach((d, i) => slot.set(d, i));
    const end = 8 * this.total;
    let buffer = new Uint8Array(Math.min(READ_AHEAD_BYTES, end));
    let from = 0;
    let held = 0;
    // Bytes [at, at + bytes) of the spill, as a view of the buffer (refilled from `at` when they are not in it).
    const window = (at: number, bytes: number): Uint8Array => {
      if (at < from || at + bytes > from + held) {
        if (bytes > buffer.length) buffer = new Uint8Array(bytes);
        held = Math.min(buffer.length, end - at);
        from = at;
        this.spill.read(buffer.subarray(0, held), at);
      }
      return buffer.subarray(at - from, at - from + bytes);
    };
    const entry = (d: DocTerms): number | undefined => (this.back ? undefined : slot.get(d));
    return {
      length: (d) => {
        const i = entry(d);
        return i === undefined ? undefined : this.starts[i + 1] - this.starts[i];
      },
      ids: (d) => {
        const i = entry(d);
        if (i === undefined) return undefined;
        const w = window(4 * this.starts[i], 4 * (this.starts[i + 1] - this.starts[i]));
        return new Int32Array(w.buffer, w.byteOffset, w.length / 4);
      },
      counts: (d) => {
        const i = entry(d);
        if (i === undefined) return undefined;
        const w = window(4 * (this.total + this.starts[i]), 4 * (this.starts[i + 1] - this.starts[i]));
        return new Float32Array(w.buffer, w.byteOffset, w.length / 4);
      },
    };
  }

  /** Gives the spill back without reading it (idempotent). */
  close(): void {
    this.back = true;
    this.spill.close();
  }
}

/** Bytes the save's source reads at once (a few calls for the whole tree's 620 MB; not tuned). */
const READ_AHEAD_BYTES = 4 * 1024 * 1024;
