/**
 * The sections filed under the lists of a trained inverted file (sectionLists.ts), with an 8-bit
 * copy of their vectors kept list by list, so a query reads the codes of its probed lists as a few
 * long runs (Jégou, Douze & Schmid 2011, IEEE TPAMI 33(1), §IV.A: the inverted lists hold each
 * vector's code; here the codes only screen, the ranking stays on exact products). Within the
 * visited sections the ranking is exact: the 8-bit codes bound every cosine
 * (../index/search/conceptCodes.ts), T is the top-th best lower bound over sections that can be
 * listed together (one a file: at most perFile ≥ 1 of a file may be listed, so this T is never
 * above the list's last score), and only sections whose upper bound reaches T are multiplied
 * (branch and bound, common practice, as sectionStore.ts does over all sections).
 * Slots: at build time sections take slots list by list; a section added later (a file folded in
 * on save) takes the next free slot at the end and joins its list's extra slots; a removed file's
 * slots are marked dead and skipped. The owner rebuilds when dead slots pile up (deadShare).
 * Spilled codes: given a way to open a spill (OpenSpill; the node side is a scratch file), the
 * coded rows are written out in slot order, so a probed list is one run of the file, and a query
 * reads the runs it bounds into a scratch block, packed (two positioned reads a run: the codes, then
 * each row's scale, error and norm). The bounds are the same numbers as from codes held in memory
 * (a row's bound depends on that row and the query alone), so the same sections are multiplied.
 * On the Linux tree this keeps 1.33 M × (289 + 24) bytes (0.42 GB) out of the editor's worker.
 * Saved listing (savedLists.ts): a reopened index gives each section's list and the coded rows in
 * this slot order as the index file holds them; nothing is filed or coded, and the codes are read
 * from the file as from a spill (or copied into memory when small). Sections added later take
 * slots after the saved ones, their codes kept in memory (SavedTail).
 */
import { InvalidInputError } from '../errors.js';
import { ConceptCodes } from '../index/search/conceptCodes.js';
import { CODE_PARAMS, SavedTail, type SavedListing } from './savedLists.js';
import type { SectionLists } from './sectionLists.js';
import { StoredFileSections } from './sectionRows.js';
import type { FileSections } from './sectionVectors.js';
import type { ByteSpill, OpenSpill } from './types.js';

/** Sections of one file to multiply exactly: positions in the file, ascending. */
export interface PickedSections {
  readonly path: string;
  readonly f: FileSections;
  readonly at: number[];
}

/** Slack on the threshold for the rounding of the exact sums (scores are O(1)). */
const SLACK = 1e-9;
/** Rows coded at a time when building (a bounded scratch block). */
const CODE_ROWS = 4096;
/** Coded rows a list gathers before they are written to the spill (a bounded buffer, not tuned). */
const SPILL_BATCH = 32;
/** Spilled runs at most this many rows apart are read in one call (about 5 KiB of codes; common practice, not tuned). */
const SPILL_GAP = 16;
/**
 * Room left for sections and files added later (folded in on save): 1/64 more, at least 64 (our
 * choice). Without it the first save on the Linux tree copied the 1.33 M-slot arrays into fresh
 * memory (about 45 ms); 1/64 is about 250 KB there and lasts some 20,000 new sections.
 */
const slackFor = (n: number): number => Math.max(64, n >> 6);
/** Numbers a row has beside its codes in the spill: scale, error and norm (f64 each). */
const PARAMS = CODE_PARAMS;

/** Codes kept in spills, and the scratch a query loads the rows it bounds into. */
interface Spilled {
  /** k bytes a slot, in slot order. */
  readonly codes: ByteSpill;
  /** PARAMS f64 a slot, in slot order. */
  readonly params: ByteSpill;
  /** Codes one file's rows before they are written out. */
  readonly coder: ConceptCodes;
  /** The rows of one request, packed. */
  readonly scratch: ConceptCodes;
  staging: Float64Array;
}

export class ListedSections {
  private _slotFile: Int32Array;
  private _slotIndex: Int32Array;
  private _used = 0;
  private _dead = 0;
  private readonly _paths: string[] = [];
  private readonly _files: (FileSections | null)[] = [];
  /**
   * Each file's slots, flat: file no's are _fileSlots[_fileFirst[no] … _fileFirst[no + 1]) (a
   * removed file's entries are left, its _files entry is null).
   */
  private _fileSlots: Int32Array;
  private _fileFirst: Int32Array;
  private _rows = new Float32Array(0);
  private readonly _fileNo = new Map<string, number>();
  /** First build-time slot of each list (length lists + 1), and each list's later slots. */
  private readonly _starts: Int32Array;
  private readonly _extra: number[][];
  private _from = new Int32Array(64);
  private _to = new Int32Array(64);
  private _bestLow = new Float64Array(0);
  private _ok = new Int8Array(0);
  private _picked = new Int32Array(256);
  private _lastScreened = 0;
  private _lastRuns = 0;

  /**
   * Files the sections, in the order given, under the trained lists.
   * @param openSpill where the coded rows go instead of memory (see the header); without it, or
   * when it gives no spill, they stay in memory.
   */
  constructor(
    readonly lists: SectionLists,
    entries: Iterable<readonly [string, FileSections]>,
    openSpill?: OpenSpill,
    saved?: SavedListing,
    inPlace = false,
  ) {
    const k = lists.k;
    this._starts = new Int32Array(lists.lists + 1);
    let total = 0;
    const counts: number[] = [];
    for (const [path, f] of entries) {
      this._fileNo.set(path, this._files.length);
      this._paths.push(path);
      this._files.push(f);
      counts.push(countOf(f));
      total += counts[counts.length - 1];
    }
    const files = this._files.length;
    this._fileFirst = new Int32Array(files + 1 + slackFor(files));
    for (let f = 0; f < files; f++) this._fileFirst[f + 1] = this._fileFirst[f] + counts[f];
    // Each section's list, in file order (one flat array: no array a file): saved, or filed here.
    const listOf = saved ? saved.listOf : new Int32Array(total);
    if (saved) {
      if (listOf.length !== total) throw new InvalidInputError(`the saved section lists hold ${listOf.length} sections, not ${total}`);
      for (let g = 0; g < total; g++) {
        const l = listOf[g];
        if (!(l >= 0 && l < lists.lists)) throw new InvalidInputError('a saved section list number is out of range');
        this._starts[l + 1]++;
      }
    } else
      this._files.forEach((f, no) => {
        const first = this._fileFirst[no];
        const v = this.rowsOf(f!, counts[no]);
        lists.fileRows(v, 0, counts[no], listOf, first);
        for (let i = 0; i < counts[no]; i++) this._starts[listOf[first + i] + 1]++;
      });
    for (let j = 0; j < lists.lists; j++) this._starts[j + 1] += this._starts[j];
    const n = this._starts[lists.lists];
    this._slotFile = new Int32Array(n + slackFor(n));
    this._slotIndex = new Int32Array(n + slackFor(n));
    this._fileSlots = new Int32Array(n + slackFor(n));
    const next = this._starts.slice(0, lists.lists);
    for (let f = 0; f < files; f++)
      for (let i = 0, g = this._fileFirst[f]; i < counts[f]; i++, g++) {
        const s = next[listOf[g]]++;
        this._fileSlots[g] = s;
        this._slotFile[s] = f;
        this._slotIndex[s] = i;
      }
    this._used = n;
    this._extra = Array.from({ length: lists.lists }, () => []);
    if (saved) {
      // Saved codes: kept where they lie (what is added later goes after them, in memory), or read in.
      this._spilled = inPlace ? spillsOver(k, saved, n) : null;
      this._codes = this._spilled ? null : ConceptCodes.empty(k, n + 64);
      if (this._codes) this.readSaved(saved, n);
      return;
    }
    this._spilled = openSpill ? spillsFor(k, openSpill) : null;
    this._codes = this._spilled ? null : ConceptCodes.empty(k, n + 64);
    if (this._spilled) this.spillAll(listOf);
    else if (this._codes && this._files.some((f) => f?.stored)) {
      // Stored rows: each file's rows read once, coded row by row into their slots (a row's code
      // depends on that row alone, so the codes equal the block-wise ones).
      this._files.forEach((f, no) => {
        const v = this.rowsOf(f!, counts[no]);
        const first = this._fileFirst[no];
        for (let i = 0; i < counts[no]; i++) this._codes!.setRowsAt(this._fileSlots[first + i], v.subarray(i * k, (i + 1) * k), 1);
      });
    } else if (this._codes) {
      const block = new Float32Array(CODE_ROWS * k);
      for (let s = 0; s < n; s += CODE_ROWS) {
        const m = Math.min(CODE_ROWS, n - s);
        for (let r = 0; r < m; r++) {
          const f = this._files[this._slotFile[s + r]]!;
          const i = this._slotIndex[s + r];
          block.set(f.vectors.subarray(i * k, (i + 1) * k), r * k);
        }
        this._codes.setRowsAt(s, block, m);
      }
    }
  }

  /** Reads n saved coded rows into the codes held in memory (params a block at a time). */
  private readSaved(saved: SavedListing, n: number): void {
    const rows = this._codes!.rowsAt(0, n);
    saved.codes.read(bytesOf(rows.codes), 0);
    const block = new Float64Array(Math.min(n, CODE_ROWS) * PARAMS);
    for (let s = 0; s < n; s += CODE_ROWS) {
      const m = Math.min(CODE_ROWS, n - s);
      saved.params.read(bytesOf(block.subarray(0, m * PARAMS)), s * PARAMS * 8);
      for (let i = 0; i < m; i++)
        [rows.scales[s + i], rows.errors[s + i], rows.norms[s + i]] = [block[i * PARAMS], block[i * PARAMS + 1], block[i * PARAMS + 2]];
    }
  }

  /**
   * Each of a file's sections' list (null when the file is not listed): for a writer of the
   * saved lists (savedLists.ts), so that a save files nothing again.
   */
  listsOf(path: string): Int32Array | null {
    const no = this._fileNo.get(path);
    if (no === undefined) return null;
    if (!this._slotList || this._slotList.length < this._used) {
      const slotList = new Int32Array(this._used);
      for (let l = 0; l < this.lists.lists; l++) {
        slotList.fill(l, this._starts[l], this._starts[l + 1]);
        for (const x of this._extra[l]) slotList[x] = l;
      }
      this._slotList = slotList;
    }
    const [from, to] = [this._fileFirst[no], this._fileFirst[no + 1]];
    const out = new Int32Array(to - from);
    for (let g = from; g < to; g++) out[g - from] = this._slotList[this._fileSlots[g]];
    return out;
  }

  /** The slot of each of a file's sections (null when the file is not listed). */
  slotsOf(path: string): Int32Array | null {
    const no = this._fileNo.get(path);
    if (no === undefined) return null;
    return this._fileSlots.slice(this._fileFirst[no], this._fileFirst[no + 1]);
  }

  /**
   * Copies the coded rows of slots from … from + count − 1: their codes to codes[at·k …] and their
   * scale, error and norm to params[3·paramsAt …]. False when this listing keeps no codes.
   */
  readCoded(from: number, count: number, codes: Int8Array, at: number, params: Float64Array, paramsAt: number): boolean {
    const k = this.lists.k;
    if (this._spilled) {
      this._spilled.codes.read(bytesOf(codes.subarray(at * k, (at + count) * k)), from * k);
      this._spilled.params.read(bytesOf(params.subarray(paramsAt * PARAMS, (paramsAt + count) * PARAMS)), from * PARAMS * 8);
      return true;
    }
    if (!this._codes) return false;
    const rows = this._codes.rowsAt(from, count);
    codes.set(rows.codes, at * k);
    for (let i = 0; i < count; i++) {
      const o = (paramsAt + i) * PARAMS;
      [params[o], params[o + 1], params[o + 2]] = [rows.scales[i], rows.errors[i], rows.norms[i]];
    }
    return true;
  }

  /** Each slot's list (made by listsOf; undefined after a change). */
  private _slotList: Int32Array | undefined;

  /** A file's rows: its vectors, or its stored rows read into a scratch block (valid until the next call). */
  private rowsOf(f: FileSections, n: number): Float32Array {
    if (!f.stored) return f.vectors;
    const k = this.lists.k;
    if (this._rows.length < n * k) this._rows = new Float32Array(Math.max(n * k, 2 * this._rows.length));
    f.stored.reader.read(f.stored.first, n, this._rows, 0);
    return this._rows;
  }

  private readonly _codes: ConceptCodes | null;
  private readonly _spilled: Spilled | null;
  private _at = new Int32Array(64);
  private _order = new Int32Array(64);

  /** Codes every file's rows and writes them out in slot order (each list through a small buffer). */
  private spillAll(listOf: Int32Array): void {
    const sp = this._spilled!;
    const k = this.lists.k;
    const lists = this.lists.lists;
    const codes = new Int8Array(lists * SPILL_BATCH * k);
    const params = new Float64Array(lists * SPILL_BATCH * PARAMS);
    const held = new Int32Array(lists);
    const written = new Int32Array(lists);
    const flush = (l: number): void => {
      const m = held[l];
      if (m === 0) return;
      const slot = this._starts[l] + written[l];
      const c = codes.subarray(l * SPILL_BATCH * k, (l * SPILL_BATCH + m) * k);
      const p = params.subarray(l * SPILL_BATCH * PARAMS, (l * SPILL_BATCH + m) * PARAMS);
      sp.codes.write(bytesOf(c), slot * k);
      sp.params.write(bytesOf(p), slot * PARAMS * 8);
      written[l] += m;
      held[l] = 0;
    };
    this._files.forEach((f, no) => {
      const [first, n] = [this._fileFirst[no], this._fileFirst[no + 1] - this._fileFirst[no]];
      const rows = this.code(this.rowsOf(f!, n), n);
      for (let i = 0; i < n; i++) {
        const j = listOf[first + i];
        const to = j * SPILL_BATCH + held[j];
        codes.set(rows.codes.subarray(i * k, (i + 1) * k), to * k);
        params[to * PARAMS] = rows.scales[i];
        params[to * PARAMS + 1] = rows.errors[i];
        params[to * PARAMS + 2] = rows.norms[i];
        if (++held[j] === SPILL_BATCH) flush(j);
      }
    });
    for (let l = 0; l < lists; l++) flush(l);
  }

  /** Codes n rows of a block with the spill's coder; views of them (valid until the next call). */
  private code(v: Float32Array, n: number): ReturnType<ConceptCodes['rowsAt']> {
    const coder = this._spilled!.coder;
    coder.ensureCapacity(Math.max(1, n));
    coder.setRowsAt(0, v, n);
    return coder.rowsAt(0, n);
  }

  /** Writes n coded rows (code() views) to the spill from slot on. */
  private spillRows(rows: ReturnType<ConceptCodes['rowsAt']>, slot: number, n: number): void {
    const sp = this._spilled!;
    const p = new Float64Array(n * PARAMS);
    for (let i = 0; i < n; i++) [p[i * PARAMS], p[i * PARAMS + 1], p[i * PARAMS + 2]] = [rows.scales[i], rows.errors[i], rows.norms[i]];
    sp.codes.write(bytesOf(rows.codes), slot * this.lists.k);
    sp.params.write(bytesOf(p), slot * PARAMS * 8);
  }

  /**
   * Loads the coded rows of the runs into the scratch and bounds them. Runs are taken in slot
   * order and those at most SPILL_GAP rows apart are read as one block (the rows between are
   * bounded and never looked at): a query's also-files scatter single slots over the whole file,
   * and a read call costs more than a few KiB more to copy. Run r's rows start at _at[r].
   * @returns the bounds, row-indexed by packed position.
   */
  private boundsSpilled(q: Float32Array, runs: number): { center: Float64Array; radius: Float64Array } {
    const sp = this._spilled!;
    const k = this.lists.k;
    const [from, to] = [this._from, this._to];
    if (this._at.length < runs) this._at = new Int32Array(from.length);
    if (this._order.length < runs) this._order = new Int32Array(from.length);
    const order = this._order.subarray(0, runs);
    for (let r = 0; r < runs; r++) order[r] = r;
    order.sort((a, b) => from[a] - from[b] || a - b);
    // Blocks [blockFrom, blockTo) in slot order: first their total, then their reads.
    let total = 0;
    for (let x = 0; x < runs;) {
      const blockFrom = from[order[x]];
      let blockTo = to[order[x]];
      for (x++; x < runs && from[order[x]] <= blockTo + SPILL_GAP; x++) blockTo = Math.max(blockTo, to[order[x]]);
      total += blockTo - blockFrom;
    }
    sp.scratch.ensureCapacity(Math.max(1, total));
    if (sp.staging.length < total * PARAMS) sp.staging = new Float64Array(Math.max(total * PARAMS, 2 * sp.staging.length));
    let p = 0;
    for (let x = 0; x < runs;) {
      const first = x;
      const blockFrom = from[order[x]];
      let blockTo = to[order[x]];
      for (x++; x < runs && from[order[x]] <= blockTo + SPILL_GAP; x++) blockTo = Math.max(blockTo, to[order[x]]);
      const m = blockTo - blockFrom;
      for (let y = first; y < x; y++) this._at[order[y]] = p + from[order[y]] - blockFrom;
      const rows = sp.scratch.rowsAt(p, m);
      sp.codes.read(bytesOf(rows.codes), blockFrom * k);
      const staged = sp.staging;
      sp.params.read(bytesOf(staged.subarray(0, m * PARAMS)), blockFrom * PARAMS * 8);
      for (let i = 0; i < m; i++) {
        rows.scales[i] = staged[i * PARAMS];
        rows.errors[i] = staged[i * PARAMS + 1];
        rows.norms[i] = staged[i * PARAMS + 2];
      }
      p += m;
    }
    return sp.scratch.bounds(q, total);
  }

  /** Gives the spills back (a spilled instance answers no more queries after it). */
  close(): void {
    this._spilled?.codes.close();
    this._spilled?.params.close();
  }

  /** Whether the coded rows are kept in spills rather than in memory. */
  get spilled(): boolean {
    return this._spilled !== null;
  }

  /** Sections the last candidates() bounded, and the runs of slots they lay in (for the benchmark). */
  get lastScreened(): number {
    return this._lastScreened;
  }

  get lastRuns(): number {
    return this._lastRuns;
  }

  /** Slots in use and dead ones among them. */
  get used(): number {
    return this._used;
  }

  get dead(): number {
    return this._dead;
  }

  /** Drops a file's sections (their slots die). */
  remove(path: string): void {
    const f = this._fileNo.get(path);
    if (f === undefined) return;
    const [from, to] = [this._fileFirst[f], this._fileFirst[f + 1]];
    for (let g = from; g < to; g++) this._slotFile[this._fileSlots[g]] = -1;
    this._dead += to - from;
    this._files[f] = null;
    this._fileNo.delete(path);
  }

  /** Files a file's sections under the trained lists (replacing what it had). */
  add(path: string, f: FileSections): void {
    this.remove(path);
    this._slotList = undefined;
    const k = this.lists.k;
    const n = countOf(f);
    const no = this._files.length;
    this._fileNo.set(path, no);
    this._paths.push(path);
    this._files.push(f);
    const grow = (a: Int32Array, size: number): Int32Array => {
      if (size <= a.length) return a;
      const b = new Int32Array(Math.max(size, Math.ceil(a.length * 1.25)));
      b.set(a);
      return b;
    };
    this._slotFile = grow(this._slotFile, this._used + n);
    this._slotIndex = grow(this._slotIndex, this._used + n);
    this._fileFirst = grow(this._fileFirst, no + 2);
    const first = this._fileFirst[no];
    this._fileFirst[no + 1] = first + n;
    this._fileSlots = grow(this._fileSlots, first + n);
    this._codes?.ensureCapacity(this._used + n);
    const v = f.vectors; // once: stored rows are read on each access
    if (this._spilled && n > 0) this.spillRows(this.code(v, n), this._used, n);
    for (let i = 0; i < n; i++) {
      const s = this._used++;
      this._fileSlots[first + i] = s;
      this._slotFile[s] = no;
      this._slotIndex[s] = i;
      this._extra[this.lists.file(v, i * k)].push(s);
      this._codes?.setRowsAt(s, v.subarray(i * k, (i + 1) * k), 1);
    }
  }

  /**
   * The sections to multiply for a top-`top` list: those of the `probe` lists nearest to q and all
   * of the files in `also`, that `accept` lets in (every file when it is undefined: no call per
   * file), less those whose 8-bit bound cannot place (see the header). Files in file-number order,
   * positions ascending.
   */
  candidates(
    q: Float32Array,
    top: number,
    accept: ((path: string) => boolean) | undefined,
    also: readonly string[],
    probe: number,
  ): PickedSections[] {
    let runs = 0;
    const push = (from: number, to: number): void => {
      if (runs > 0 && this._to[runs - 1] === from) {
        this._to[runs - 1] = to;
        return;
      }
      if (runs === this._from.length) {
        const from2 = new Int32Array(2 * runs);
        from2.set(this._from);
        this._from = from2;
        const to2 = new Int32Array(2 * runs);
        to2.set(this._to);
        this._to = to2;
      }
      this._from[runs] = from;
      this._to[runs++] = to;
    };
    for (const l of this.lists.nearest(q, probe)) {
      if (this._starts[l + 1] > this._starts[l]) push(this._starts[l], this._starts[l + 1]);
      for (const s of this._extra[l]) push(s, s + 1);
    }
    for (const path of also) {
      const f = this._fileNo.get(path);
      if (f !== undefined)
        for (let g = this._fileFirst[f]; g < this._fileFirst[f + 1]; g++) push(this._fileSlots[g], this._fileSlots[g] + 1);
    }
    this._lastRuns = runs;
    this._lastScreened = 0;
    for (let r = 0; r < runs; r++) this._lastScreened += this._to[r] - this._from[r];
    const files = this._files.length;
    const slotFile = this._slotFile;
    const from = this._from;
    const to = this._to;
    // 1 accepted, −1 not, 0 not asked yet (every file accepted without `accept`).
    if (this._ok.length < files) this._ok = new Int8Array(Math.ceil(files * 1.25));
    const ok = this._ok;
    ok.fill(accept ? 0 : 1, 0, files);
    if (accept)
      for (let r = 0; r < runs; r++)
        for (let s = from[r]; s < to[r]; s++) {
          const f = slotFile[s];
          if (f >= 0 && ok[f] === 0) ok[f] = accept(this._paths[f]) ? 1 : -1;
        }
    let picked = 0;
    const take = (s: number): void => {
      if (picked === this._picked.length) {
        const grown = new Int32Array(2 * picked);
        grown.set(this._picked);
        this._picked = grown;
      }
      this._picked[picked++] = s;
    };
    if (this._codes || this._spilled) {
      // Bounds row-indexed by slot (codes in memory) or by packed position (spilled: run r from at[r]).
      const { center, radius } = this._codes ? this._codes.boundsRuns(q, from, to, runs) : this.boundsSpilled(q, runs);
      if (this._codes) {
        if (this._at.length < runs) this._at = new Int32Array(this._from.length);
        this._at.set(from.subarray(0, runs));
      }
      const at = this._at;
      if (this._bestLow.length < files) this._bestLow = new Float64Array(Math.ceil(files * 1.25)).fill(Number.NEGATIVE_INFINITY);
      const bestLow = this._bestLow;
      const touched: number[] = [];
      for (let r = 0; r < runs; r++)
        for (let s = from[r], j = at[r]; s < to[r]; s++, j++) {
          const f = slotFile[s];
          if (f < 0 || ok[f] < 0) continue;
          const low = center[j] - radius[j];
          if (low > bestLow[f]) {
            if (bestLow[f] === Number.NEGATIVE_INFINITY) touched.push(f);
            bestLow[f] = low;
          }
        }
      const best = new Float64Array(Math.max(1, top)).fill(Number.NEGATIVE_INFINITY);
      for (const f of touched) {
        if (bestLow[f] > best[best.length - 1]) insertDescending(best, bestLow[f]);
        bestLow[f] = Number.NEGATIVE_INFINITY;
      }
      const bar = best[best.length - 1] - SLACK;
      for (let r = 0; r < runs; r++)
        for (let s = from[r], j = at[r]; s < to[r]; s++, j++)
          if (center[j] + radius[j] >= bar && slotFile[s] >= 0 && ok[slotFile[s]] > 0) take(s);
    } else {
      for (let r = 0; r < runs; r++) for (let s = from[r]; s < to[r]; s++) if (slotFile[s] >= 0 && ok[slotFile[s]] > 0) take(s);
    }
    return this.group(picked);
  }

  /** The first `count` picked slots as files in file-number order, positions ascending, without repeats. */
  private group(count: number): PickedSections[] {
    const [file, index] = [this._slotFile, this._slotIndex];
    const slots = Array.from(this._picked.subarray(0, count)).sort((a, b) => file[a] - file[b] || index[a] - index[b]);
    const out: PickedSections[] = [];
    let last = -1;
    for (let x = 0; x < slots.length; x++) {
      const [f, at] = [file[slots[x]], index[slots[x]]];
      if (f !== last) out.push({ path: this._paths[f], f: this._files[f]!, at: [at] });
      else if (at !== index[slots[x - 1]]) out[out.length - 1].at.push(at);
      last = f;
    }
    return out;
  }
}

/** Inserts x into a descending array of fixed length, dropping its last entry. */
export function insertDescending(a: Float64Array, x: number): void {
  let i = a.length - 1;
  while (i > 0 && a[i - 1] < x) {
    a[i] = a[i - 1];
    i--;
  }
  a[i] = x;
}

/** Sections of a file, without making its arrays (a stored file's are made on each access). */
function countOf(f: FileSections): number {
  return f instanceof StoredFileSections ? f.count : f.starts.length;
}

/** The bytes of a typed array (a view of the same memory). */
function bytesOf(a: Int8Array | Float64Array): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}

/** Spills over saved codes (n rows, read-only) and the coders, or null without WebAssembly SIMD. */
function spillsOver(k: number, saved: SavedListing, n: number): Spilled | null {
  const coder = ConceptCodes.empty(k, 64);
  const scratch = coder && ConceptCodes.empty(k, 4096);
  if (!coder || !scratch) return null;
  const codes = new SavedTail(saved.codes, n * k);
  const params = new SavedTail(saved.params, n * PARAMS * 8);
  return { codes, params, coder, scratch, staging: new Float64Array(0) };
}

/** Two spills and the coders, or null when WebAssembly SIMD or a spill is not to be had. */
function spillsFor(k: number, openSpill: OpenSpill): Spilled | null {
  const coder = ConceptCodes.empty(k, 64);
  const scratch = coder && ConceptCodes.empty(k, 4096);
  if (!coder || !scratch) return null;
  const codes = openSpill();
  const params = codes && openSpill();
  if (!codes || !params) {
    codes?.close();
    return null;
  }
  return { codes, params, coder, scratch, staging: new Float64Array(0) };
}
