/**
 * The section lists as the index file keeps them (format 5), so that a reopened index neither
 * trains nor files them again: the trained quantizer (centroids, group centres and group starts,
 * ./sectionLists.ts), each section's list in file order, and every section's 8-bit code in slot
 * order — list by list, within a list in file order, the order ListedSections gives its slots —
 * with each row's scale, error and norm (f64; ../index/search/conceptCodes.ts). A reader keeps the
 * codes where they lie and reads a probed list as one run, as it would from a spill
 * (./listedSections.ts). Where the store has a listing (a reopened index, or one ranked since its
 * lists were trained), each section's list and coded row are taken from it (runs of slots read at
 * once); otherwise the section is filed (lists.file) and its row coded (a row's code depends on
 * that row alone, so both ways give the same bytes).
 */
import { codeRows } from '../index/search/conceptCodes.js';
import type { SectionLists } from './sectionLists.js';
import { SectionRowsError, StoredFileSections } from './sectionRows.js';
import type { FileSections } from './sectionVectors.js';
import type { ByteSpill } from './types.js';

/** Numbers a coded row has beside its codes: scale, error and norm (f64 each). */
export const CODE_PARAMS = 3;
/** Rows coded at a time when saving (a bounded scratch block; common practice, not tuned). */
const SAVE_ROWS = 4096;

/** A listing read from a saved index: what ListedSections needs instead of filing and coding. */
export interface SavedListing {
  /** Each section's list, in the order of the store's files (sections in file order). */
  readonly listOf: Int32Array;
  /** n × k code bytes in slot order (read-only). */
  readonly codes: ByteSpill;
  /** n × CODE_PARAMS f64 in slot order (read-only). */
  readonly params: ByteSpill;
  /** The bytes lie in a file (kept there from SPILL_FROM_BYTES on) rather than in memory. */
  readonly inFile: boolean;
}

/** What a listing knows of a file's sections: their lists and their slots (ListedSections). */
export interface KnownSections {
  readonly lists: Int32Array;
  readonly slots: Int32Array;
}

/** Copies coded rows of a listing's slots (ListedSections.readCoded); false when it has none. */
export type ReadCoded = (from: number, count: number, codes: Int8Array, at: number, params: Float64Array, paramsAt: number) => boolean;

/** The saved lists of an index being written. */
export interface SavedListsPlan {
  readonly centroids: Float32Array;
  readonly groups: Float32Array;
  readonly groupStarts: Int32Array;
  /** Each section's list, in the order of the files given. */
  readonly listOf: Int32Array;
  /** Sections (slots). */
  readonly count: number;
  /** The codes in slot order, in pieces (each valid until the next is asked for). */
  codes(): Iterable<Uint8Array>;
  /** The scales, errors and norms in slot order, in pieces (after codes(): kept from it). */
  params(): Iterable<Uint8Array>;
}

/**
 * Lays out the saved lists of `files` (the index file's order, files without sections left out).
 * @param known a file's sections' lists and slots where a listing has them (null: filed here).
 * @param readCoded copies coded rows of those slots (undefined: every row is coded here).
 */
export function planSavedLists(
  lists: SectionLists,
  files: readonly FileSections[],
  known: (no: number) => KnownSections | null,
  readCoded?: ReadCoded,
): SavedListsPlan {
  const k = lists.k;
  const firsts = new Int32Array(files.length + 1);
  files.forEach((f, no) => (firsts[no + 1] = firsts[no] + sectionCount(f)));
  const n = firsts[files.length];
  const listOf = new Int32Array(n);
  // Each section's slot in the listing, or −1 (then coded here).
  const source = new Int32Array(readCoded ? n : 0).fill(-1);
  let scratch = new Float32Array(0);
  files.forEach((f, no) => {
    const m = firsts[no + 1] - firsts[no];
    const have = known(no);
    if (have && have.lists.length === m && have.slots.length === m) {
      listOf.set(have.lists, firsts[no]);
      if (readCoded) source.set(have.slots, firsts[no]);
      return;
    }
    let v: Float32Array;
    if (f.stored) {
      if (scratch.length < m * k) scratch = new Float32Array(Math.max(m * k, 2 * scratch.length));
      f.stored.reader.read(f.stored.first, m, scratch, 0);
      v = scratch;
    } else v = f.vectors;
    for (let i = 0; i < m; i++) listOf[firsts[no] + i] = lists.file(v, i * k);
  });
  // Slot order: by list, then file order (a stable counting sort).
  const starts = new Int32Array(lists.lists + 1);
  for (let g = 0; g < n; g++) starts[listOf[g] + 1]++;
  for (let l = 0; l < lists.lists; l++) starts[l + 1] += starts[l];
  const order = new Int32Array(n);
  const next = starts.slice(0, lists.lists);
  for (let g = 0; g < n; g++) order[next[listOf[g]]++] = g;
  let params: Float64Array | null = null;
  const coded = function* (): Iterable<Uint8Array> {
    const out = new Float64Array(n * CODE_PARAMS);
    const block = new Float32Array(SAVE_ROWS * k);
    const codes = new Int8Array(SAVE_ROWS * k);
    const [scales, errors, norms] = [new Float64Array(SAVE_ROWS), new Float64Array(SAVE_ROWS), new Float64Array(SAVE_ROWS)];
    const fresh = new Uint8Array(SAVE_ROWS);
    let no = 0;
    let copying = readCoded !== undefined;
    for (let s = 0; s < n; s += SAVE_ROWS) {
      const m = Math.min(SAVE_ROWS, n - s);
      fresh.fill(1);
      for (let r = 0; r < m;) {
        const g = order[s + r];
        if (copying && source[g] >= 0) {
          // A run of slots that follow each other in the listing too: one copy.
          let run = 1;
          while (r + run < m && source[order[s + r + run]] === source[g] + run) run++;
          if (readCoded!(source[g], run, codes, r, out, s + r)) {
            fresh.fill(0, r, r + run);
            r += run;
            continue;
          }
          copying = false; // the listing keeps no codes: code every row here
        }
        if (g < firsts[no] || g >= firsts[no + 1]) no = fileOf(firsts, g);
        const f = files[no];
        const i = g - firsts[no];
        if (f.stored) {
          // A run of slots holding consecutive rows of one file: one read.
          let run = 1;
          while (r + run < m && order[s + r + run] === g + run && g + run < firsts[no + 1]) run++;
          f.stored.reader.read(f.stored.first + i, run, block, r * k);
          r += run;
        } else {
          block.set(f.vectors.subarray(i * k, (i + 1) * k), r * k);
          r++;
        }
      }
      for (let r = 0; r < m;) {
        if (!fresh[r]) {
          r++;
          continue;
        }
        let to = r + 1;
        while (to < m && fresh[to]) to++;
        codeRows(block, k, r, to, codes, scales, errors, norms);
        for (let x = r; x < to; x++) {
          const at = (s + x) * CODE_PARAMS;
          [out[at], out[at + 1], out[at + 2]] = [scales[x], errors[x], norms[x]];
        }
        r = to;
      }
      yield new Uint8Array(codes.buffer, 0, m * k);
    }
    params = out;
  };
  return {
    centroids: lists.centroids,
    groups: lists.groups,
    groupStarts: lists.groupStarts,
    listOf,
    count: n,
    codes: coded,
    params: function* () {
      if (!params) {
        // Not streamed after codes(): code again.
        const again = coded()[Symbol.iterator]();
        while (!again.next().done);
      }
      yield new Uint8Array(params!.buffer, params!.byteOffset, params!.byteLength);
      params = null;
    },
  };
}

/** Sections of a file, without making its arrays (a stored file's are made on each access). */
export function sectionCount(f: FileSections): number {
  return f instanceof StoredFileSections ? f.count : f.starts.length;
}

/** The file holding flat section g (firsts ascending, length files + 1). */
function fileOf(firsts: Int32Array, g: number): number {
  let lo = 0;
  let hi = firsts.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (firsts[mid] <= g) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** Bytes held in memory (a decoded index's payload), read-only. */
export function bytesSpill(bytes: Uint8Array): ByteSpill {
  return {
    write: () => {
      throw new SectionRowsError('the saved section codes are read-only');
    },
    read: (into, position) => {
      if (position < 0 || position + into.length > bytes.length) throw new SectionRowsError('the saved section codes end early');
      into.set(bytes.subarray(position, position + into.length));
    },
    close: () => undefined,
  };
}

/**
 * Saved bytes (the first `savedBytes`, read-only) followed by bytes written later in memory (the
 * codes of sections added after the reopen: a few files folded in, so little; common practice).
 */
export class SavedTail implements ByteSpill {
  private _tail = new Uint8Array(0);
  private _tailBytes = 0;

  constructor(
    private readonly saved: ByteSpill,
    private readonly savedBytes: number,
  ) {}

  write(bytes: Uint8Array, position: number): void {
    if (position < this.savedBytes) throw new SectionRowsError('the saved section codes are read-only');
    const from = position - this.savedBytes;
    const end = from + bytes.length;
    if (end > this._tail.length) {
      const grown = new Uint8Array(Math.max(end, 2 * this._tail.length, 4096));
      grown.set(this._tail.subarray(0, this._tailBytes));
      this._tail = grown;
    }
    this._tail.set(bytes, from);
    this._tailBytes = Math.max(this._tailBytes, end);
  }

  read(into: Uint8Array, position: number): void {
    const inSaved = Math.max(0, Math.min(into.length, this.savedBytes - position));
    if (inSaved > 0) this.saved.read(into.subarray(0, inSaved), position);
    if (inSaved === into.length) return;
    const from = position + inSaved - this.savedBytes;
    const rest = into.length - inSaved;
    if (from + rest > this._tailBytes) throw new SectionRowsError('the section codes end early');
    into.set(this._tail.subarray(from, from + rest), inSaved);
  }

  close(): void {
    this.saved.close();
    this._tail = new Uint8Array(0);
    this._tailBytes = 0;
  }
}
