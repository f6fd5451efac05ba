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
 */
import { ConceptCodes } from '../index/search/conceptCodes.js';
import type { SectionLists } from './sectionLists.js';
import type { FileSections } from './sectionVectors.js';

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

export class ListedSections {
  private _slotFile: Int32Array;
  private _slotIndex: Int32Array;
  private _used = 0;
  private _dead = 0;
  private readonly _paths: string[] = [];
  private readonly _files: (FileSections | null)[] = [];
  private readonly _fileSlots: (Int32Array | null)[] = [];
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

  /** Files the sections, in the order given, under the trained lists. */
  constructor(
    readonly lists: SectionLists,
    entries: Iterable<readonly [string, FileSections]>,
  ) {
    const k = lists.k;
    const listOf: Int32Array[] = [];
    this._starts = new Int32Array(lists.lists + 1);
    for (const [path, f] of entries) {
      const l = new Int32Array(f.starts.length);
      const v = f.vectors; // once: stored rows are read on each access
      for (let i = 0; i < l.length; i++) {
        l[i] = lists.file(v, i * k);
        this._starts[l[i] + 1]++;
      }
      this._fileNo.set(path, this._files.length);
      this._paths.push(path);
      this._files.push(f);
      listOf.push(l);
    }
    for (let j = 0; j < lists.lists; j++) this._starts[j + 1] += this._starts[j];
    const n = this._starts[lists.lists];
    this._slotFile = new Int32Array(n + 64);
    this._slotIndex = new Int32Array(n + 64);
    const next = this._starts.slice(0, lists.lists);
    listOf.forEach((l, f) => {
      const slots = new Int32Array(l.length);
      for (let i = 0; i < l.length; i++) {
        const s = next[l[i]]++;
        slots[i] = s;
        this._slotFile[s] = f;
        this._slotIndex[s] = i;
      }
      this._fileSlots.push(slots);
    });
    this._used = n;
    this._extra = Array.from({ length: lists.lists }, () => []);
    this._codes = ConceptCodes.empty(k, n + 64);
    if (this._codes && this._files.some((f) => f?.stored)) {
      // Stored rows: each file's rows read once, coded row by row into their slots (a row's code
      // depends on that row alone, so the codes equal the block-wise ones).
      this._files.forEach((f, no) => {
        const v = f!.vectors;
        const slots = this._fileSlots[no]!;
        for (let i = 0; i < slots.length; i++) this._codes!.setRowsAt(slots[i], v.subarray(i * k, (i + 1) * k), 1);
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

  private readonly _codes: ConceptCodes | null;

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
    for (const s of this._fileSlots[f]!) this._slotFile[s] = -1;
    this._dead += this._fileSlots[f]!.length;
    this._files[f] = null;
    this._fileSlots[f] = null;
    this._fileNo.delete(path);
  }

  /** Files a file's sections under the trained lists (replacing what it had). */
  add(path: string, f: FileSections): void {
    this.remove(path);
    const k = this.lists.k;
    const n = f.starts.length;
    const no = this._files.length;
    this._fileNo.set(path, no);
    this._paths.push(path);
    this._files.push(f);
    if (this._used + n > this._slotFile.length) {
      const size = Math.max(this._used + n, Math.ceil(this._slotFile.length * 1.25));
      const grow = (a: Int32Array): Int32Array => {
        const b = new Int32Array(size);
        b.set(a);
        return b;
      };
      this._slotFile = grow(this._slotFile);
      this._slotIndex = grow(this._slotIndex);
    }
    this._codes?.ensureCapacity(this._used + n);
    const slots = new Int32Array(n);
    const v = f.vectors; // once: stored rows are read on each access
    for (let i = 0; i < n; i++) {
      const s = this._used++;
      slots[i] = s;
      this._slotFile[s] = no;
      this._slotIndex[s] = i;
      this._extra[this.lists.file(v, i * k)].push(s);
      this._codes?.setRowsAt(s, v.subarray(i * k, (i + 1) * k), 1);
    }
    this._fileSlots.push(slots);
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
      if (f !== undefined) for (const s of this._fileSlots[f]!) push(s, s + 1);
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
    if (this._codes) {
      const { center, radius } = this._codes.boundsRuns(q, from, to, runs);
      if (this._bestLow.length < files) this._bestLow = new Float64Array(Math.ceil(files * 1.25)).fill(Number.NEGATIVE_INFINITY);
      const bestLow = this._bestLow;
      const touched: number[] = [];
      for (let r = 0; r < runs; r++)
        for (let s = from[r]; s < to[r]; s++) {
          const f = slotFile[s];
          if (f < 0 || ok[f] < 0) continue;
          const low = center[s] - radius[s];
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
        for (let s = from[r]; s < to[r]; s++) if (center[s] + radius[s] >= bar && slotFile[s] >= 0 && ok[slotFile[s]] > 0) take(s);
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
