/**
 * The section lists as the index file keeps them (format 5), so that a reopened index neither
 * trains nor files them again: the trained quantizer (centroids, group centres and group starts,
 * ./sectionLists.ts), each section's list in file order, and every section's 8-bit code in slot
 * order — list by list, within a list in file order, the order ListedSections gives its slots —
 * with each row's scale, error and norm (f64; ../index/search/conceptCodes.ts). A reader keeps the
 * codes where they lie and reads a probed list as one run, as it would from a spill
 * (./listedSections.ts). Where the store has a listing (a reopened index, or one ranked since its
 * lists were trained), each section's list and coded row are taken from it (runs of slots read at
 * once); otherwise the section is filed (lists.fileRows) and its row coded (a row's code depends on
 * that row alone, so both ways give the same bytes). Given a CodeSpill, a row is coded as it is
 * filed and waits in its list's chain (ListChains), so the codes go out in slot order without the
 * rows being read a second time.
 */
import { codeRows } from '../index/search/conceptCodes.js';
import type { MatrixExecutor } from '../matrix/executor.js';
import type { SectionLists } from './sectionLists.js';
import { SectionRowsError, StoredFileSections } from './sectionRows.js';
import type { FileSections } from './sectionVectors.js';
import type { ByteSpill, OpenSpill } from './types.js';

/** Numbers a coded row has beside its codes: scale, error and norm (f64 each). */
export const CODE_PARAMS = 3;
/** Rows coded at a time when saving (a bounded scratch block; common practice, not tuned). */
const SAVE_ROWS = 4096;
/** Rows filed and coded at a time by planSavedLists (a file with more goes whole; our choice, not tuned). */
const BATCH_ROWS = 4096;

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
 * @param ex files the rows on its threads where it can (SectionLists.fileRowsOn; the same lists).
 */
export function planSavedLists(
  lists: SectionLists,
  files: readonly FileSections[],
  known: (no: number) => KnownSections | null,
  readCoded?: ReadCoded,
  spill?: CodeSpill,
  ex?: MatrixExecutor,
): SavedListsPlan {
  const k = lists.k;
  const firsts = new Int32Array(files.length + 1);
  files.forEach((f, no) => (firsts[no + 1] = firsts[no] + sectionCount(f)));
  const n = firsts[files.length];
  const listOf = new Int32Array(n);
  // Each section's slot in the listing, or −1 (then coded here).
  const source = new Int32Array(readCoded ? n : 0).fill(-1);
  // With a CodeSpill, rows filed here are coded as they are filed, into their list's chain (in
  // memory below spill.fromBytes, else in a spill); without one, or where no spill opens, they
  // are read again at their slots below.
  const chainBytes = n * (k + 8 * CODE_PARAMS);
  const chainSpill = spill && chainBytes >= spill.fromBytes ? spill.open() : null;
  const chains = spill && (chainSpill || chainBytes < spill.fromBytes) ? new ListChains(lists.lists, k, chainSpill) : null;
  const filedCodes = chains ? new CodedBlock(k) : null;
  // Sections whose codes wait in a chain (the others are copied from the listing, or coded below).
  const inChain = new Uint8Array(chains ? n : 0);
  // The rows filed here, gathered over consecutive files (sections batchFirst … + batchRows), so
  // that one call files and codes many: worth it on an executor's threads. Each row is filed and
  // coded on its own and goes into its chain in file order, as file by file: the same bytes.
  let batch = new Float32Array(0);
  let batchFirst = 0;
  let batchRows = 0;
  const fileBatch = (): void => {
    if (batchRows === 0) return;
    lists.fileRowsOn(ex, batch, 0, batchRows, listOf, batchFirst);
    if (chains && filedCodes) {
      filedCodes.code(batch, batchRows);
      for (let i = 0; i < batchRows; i++) chains.add(listOf[batchFirst + i], filedCodes, i);
      inChain.fill(1, batchFirst, batchFirst + batchRows);
    }
    batchRows = 0;
  };
  files.forEach((f, no) => {
    const m = firsts[no + 1] - firsts[no];
    const have = known(no);
    if (have && have.lists.length === m && have.slots.length === m) {
      fileBatch();
      listOf.set(have.lists, firsts[no]);
      if (readCoded) source.set(have.slots, firsts[no]);
      return;
    }
    if (batchRows === 0) batchFirst = firsts[no];
    if (batch.length < (batchRows + m) * k) {
      const grown = new Float32Array(Math.max((batchRows + m) * k, 2 * batch.length));
      grown.set(batch.subarray(0, batchRows * k));
      batch = grown;
    }
    if (f.stored) f.stored.reader.read(f.stored.first, m, batch, batchRows * k);
    else batch.set(f.vectors.subarray(0, m * k), batchRows * k);
    batchRows += m;
    if (batchRows >= BATCH_ROWS) fileBatch();
  });
  fileBatch();
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
    chains?.rewind();
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
        if (chains && inChain[g]) {
          // Coded when it was filed: the next row of its list's chain (slots of a list follow file order).
          chains.take(listOf[g], codes, r * k, out, (s + r) * CODE_PARAMS);
          fresh[r] = 0;
          r++;
          continue;
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
      chains?.close();
    },
  };
}

/** Where planSavedLists may keep the codes of the rows it files (node: a scratch file beside the index). */
export interface CodeSpill {
  readonly open: OpenSpill;
  /** Bytes of codes and their numbers (k + 24 a row) from which they go to the spill. */
  readonly fromBytes: number;
}

/** A batch of rows coded at once (codeRows), read row by row by ListChains.add. */
class CodedBlock {
  codes = new Int8Array(0);
  scales = new Float64Array(0);
  errors = new Float64Array(0);
  norms = new Float64Array(0);

  constructor(readonly k: number) {}

  code(rows: Float32Array, m: number): void {
    if (this.scales.length < m) {
      const size = Math.max(m, 2 * this.scales.length);
      this.codes = new Int8Array(size * this.k);
      [this.scales, this.errors, this.norms] = [new Float64Array(size), new Float64Array(size), new Float64Array(size)];
    }
    codeRows(rows, this.k, 0, m, this.codes, this.scales, this.errors, this.norms);
  }
}

/** Bytes of the chains' unfinished blocks, all lists together (our choice: small beside the save). */
const CHAIN_BUFFER_BYTES = 16 * 1024 * 1024;

/**
 * Coded rows kept list by list in the order they are filed (file order), to be read back list by
 * list in that order, which is slot order: the save then writes the codes without reading any row
 * again (before, each section's row was read again at its slot: 1.33 M small reads on the Linux
 * tree). Each list fills a block of `per` rows (its rows' three numbers, then their codes); a
 * full block is appended to the spill, or kept in memory without one.
 */
class ListChains {
  private readonly per: number;
  /** Each list's unfinished block (made on its first row) and its rows. */
  private readonly open: (ChainBlock | undefined)[];
  private readonly fill: Int32Array;
  /** Each list's full blocks: spill positions, or the blocks themselves without a spill. */
  private readonly full: (number | ChainBlock)[][];
  private end = 0;
  /** The block being read: its list, its number in the chain, the next row in it. */
  private readList = -1;
  private readBlock = 0;
  private readRow = 0;
  private reading: ChainBlock | undefined;
  /** Where a block read back from the spill lands. */
  private readonly spillBlock: ChainBlock | undefined;

  constructor(
    lists: number,
    private readonly k: number,
    private readonly spill: ByteSpill | null,
  ) {
    // Rows a block: as many as the buffer budget gives every list, at least 8, at most 1024.
    this.per = Math.min(1024, Math.max(8, Math.floor(CHAIN_BUFFER_BYTES / Math.max(1, lists) / (8 * CODE_PARAMS + k) / 8) * 8));
    this.open = new Array<ChainBlock | undefined>(lists);
    this.fill = new Int32Array(lists);
    this.full = Array.from({ length: lists }, () => []);
    this.spillBlock = spill ? new ChainBlock(this.per, k) : undefined;
  }

  /** Appends row i of `coded` to list l's chain. */
  add(l: number, coded: CodedBlock, i: number): void {
    let block = this.open[l];
    if (!block) block = this.open[l] = new ChainBlock(this.per, this.k);
    const r = this.fill[l]++;
    block.params[CODE_PARAMS * r] = coded.scales[i];
    block.params[CODE_PARAMS * r + 1] = coded.errors[i];
    block.params[CODE_PARAMS * r + 2] = coded.norms[i];
    block.codes.set(coded.codes.subarray(i * this.k, (i + 1) * this.k), r * this.k);
    if (this.fill[l] < this.per) return;
    if (this.spill) {
      this.spill.write(block.bytes, this.end);
      this.full[l].push(this.end);
      this.end += block.bytes.length;
    } else {
      this.full[l].push(block);
      this.open[l] = undefined;
    }
    this.fill[l] = 0;
  }

  /** Reading starts again from each list's first row. */
  rewind(): void {
    this.readList = -1;
  }

  /** Copies the next row of list l (lists taken in ascending order) into codes at `at` and its numbers into params at `pAt`. */
  take(l: number, codes: Int8Array, at: number, params: Float64Array, pAt: number): void {
    if (l !== this.readList) {
      [this.readList, this.readBlock, this.readRow] = [l, 0, 0];
      this.reading = this.block(l, 0);
    } else if (this.readRow === this.per) {
      [this.readBlock, this.readRow] = [this.readBlock + 1, 0];
      this.reading = this.block(l, this.readBlock);
    }
    const b = this.reading!;
    const r = this.readRow++;
    for (let c = 0; c < CODE_PARAMS; c++) params[pAt + c] = b.params[CODE_PARAMS * r + c];
    codes.set(b.codes.subarray(r * this.k, (r + 1) * this.k), at);
  }

  /** Block b of list l's chain (its full blocks, then its unfinished one). */
  private block(l: number, b: number): ChainBlock {
    const full = this.full[l];
    if (b >= full.length) {
      const open = this.open[l];
      if (!open || b > full.length) throw new Error('a section list chain ran out of rows (a bug)');
      return open;
    }
    const at = full[b];
    if (typeof at !== 'number') return at;
    this.spill!.read(this.spillBlock!.bytes, at);
    return this.spillBlock!;
  }

  close(): void {
    this.spill?.close();
  }
}

/** A block of `per` coded rows: their numbers (CODE_PARAMS f64 a row), then their codes, in one buffer. */
class ChainBlock {
  readonly bytes: Uint8Array;
  readonly params: Float64Array;
  readonly codes: Int8Array;

  constructor(per: number, k: number) {
    this.bytes = new Uint8Array(per * (8 * CODE_PARAMS + k));
    this.params = new Float64Array(this.bytes.buffer, 0, CODE_PARAMS * per);
    this.codes = new Int8Array(this.bytes.buffer, 8 * CODE_PARAMS * per, k * per);
  }
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
