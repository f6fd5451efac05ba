/**
 * The sections of every indexed file with their concept vectors, kept beside the file vectors:
 * set when a file is built or folded in, dropped when it is removed. Ranks sections by cosine
 * with a unit concept vector and finds a file's best section for a query. Ranking screens first:
 * an 8-bit copy of all section vectors (../index/search/conceptCodes.ts, built lazily, dropped on
 * any change) bounds every cosine; T is the top-th best lower bound over sections that could be
 * listed together (at most perFile of a file, accepted files), and only sections whose upper bound
 * reaches T get an exact product (branch and bound, common practice; as screenedTop.ts does for
 * files). The exact products are the same f32 sums as a full pass, so the list equals the full
 * pass's (checked in test/core/sections/sectionStore.test.ts).
 * From listsFrom sections on (a large tree, where even the screen reads every section) ranking is
 * no longer exhaustive: an inverted file (./sectionLists.ts) is trained once on a seeded sample,
 * every section filed under a list, and a query multiplies only the sections of its probe nearest
 * lists plus those of files the caller names (a search's best word matches). Edits file the new
 * sections under the trained centroids; the centroids are trained again when the count has doubled
 * or halved since.
 * Files reopened from a saved index keep their f32 rows in the file (FileSections.stored,
 * ./sectionRows.ts): the exact products read just the rows they multiply (runs of nearby rows in
 * one read), the same numbers, so the same rankings. Given a spill (spillListsTo; the node side
 * gives a scratch file beside a loaded index), the lists' 8-bit codes stay out of memory too
 * (listedSections.ts).
 * The index file keeps the lists (format 5, savedLists.ts: written by savedLists, trained then if
 * they were not), and restoreLists takes them back: a reopened index ranks through the saved
 * centroids and filing at once, reading the saved codes where they lie in the file from
 * SPILL_FROM_BYTES on (no scratch copy) or from memory below it. Only lists filed again (after the
 * count doubled or halved, or from a format-4 file) are trained, filed and spilled as above.
 */
import { InvalidInputError } from '../errors.js';
import { ConceptCodes } from '../index/search/conceptCodes.js';
import type { MatrixExecutor } from '../matrix/executor.js';
import { insertDescending, ListedSections } from './listedSections.js';
import { planSavedLists, sectionCount, type SavedListing, type SavedListsPlan } from './savedLists.js';
import { SectionLists, type SectionListsOptions } from './sectionLists.js';
import { RowScratch, StoredFileSections, type SectionRowReader } from './sectionRows.js';
import type { FileSections } from './sectionVectors.js';
import type { OpenSpill } from './types.js';

/** A section found by a search or a nearby question. */
export interface SectionHit {
  /** The file's key. */
  readonly path: string;
  /** Position of the section in its file's list. */
  readonly index: number;
  /** Zero-based first line and the line after the last. */
  readonly start: number;
  readonly end: number;
  readonly title: string;
  /** Cosine of the section's vector with the query's. */
  readonly score: number;
}

/** Below this many sections a full pass is as quick as screening (common practice, not tuned). */
export const SCREEN_MIN_SECTIONS = 4096;
/**
 * From this many sections on ranking visits the probed lists only (sectionLists.ts). Below it the
 * exact screen stays: its CPU cost grows with the count, about 0.4 µs a section on a loaded machine
 * (bench/sectionLists.ts: 469–553 ms a request for 1.33 M sections), so some 25 ms at this count. A
 * round number from that cost, not from any ranking.
 */
export const SECTION_LISTS_FROM = 65536;
/**
 * The lists' codes go to a spill (spillListsTo) from this many bytes on: below it they cost little
 * memory, and reading them back costs a request some milliseconds (about 5 ms for the 8 MB a request
 * reads on the Linux tree, bench/sectionLatency.ts). A round number, not tuned.
 */
export const SPILL_FROM_BYTES = 64 * 1024 * 1024;
/** Slack on the threshold for the rounding of the exact sums (scores are O(1)). */
const SCREEN_SLACK = 1e-9;
/**
 * Stored rows up to this many apart are read in one run (the rows between are read and skipped:
 * a few KiB more per read against one call less; common practice, not tuned).
 */
const ROW_GAP = 8;

interface Screen {
  readonly codes: ConceptCodes;
  readonly paths: string[];
  readonly files: FileSections[];
  /** Flat position of each file's first section (length files + 1). */
  readonly firsts: Int32Array;
}

/** How many sections a file has (a saved table's without making its arrays). */
function sectionsIn(f: FileSections): number {
  return f instanceof StoredFileSections ? f.count : f.starts.length;
}

export class SectionStore {
  private readonly _files = new Map<string, FileSections>();
  private _count = 0;
  /** The screening codes (undefined: not built since the last change; null: not available). */
  private _screen: Screen | null | undefined;
  private _lastExact = 0;
  /** The trained lists (null: none) and the count they were trained at. */
  private _lists: SectionLists | null = null;
  private _trainedAt = 0;
  /** The sections filed under the lists (undefined: not built since the lists were trained or rebuilt). */
  private _listed: ListedSections | undefined;
  private readonly _scratch: RowScratch;
  /** The sources of stored rows of the files set so far (closed by closeRows). */
  private readonly _readers = new Set<SectionRowReader>();
  /** Where the lists' codes go (undefined: memory), and from how many bytes of codes on. */
  private _openSpill: OpenSpill | undefined;
  private _spillFrom = SPILL_FROM_BYTES;
  private _filer: MatrixExecutor | undefined;
  /** Lists and their filing read from a saved index, not yet turned into _listed (restoreLists). */
  private _saved: SavedListing | undefined;

  /**
   * @param screenFrom sections from which ranking screens (default SCREEN_MIN_SECTIONS).
   * @param listsFrom sections from which ranking visits the probed lists only (default SECTION_LISTS_FROM).
   * @param listOptions options of the lists (sectionLists.ts defaults).
   */
  constructor(
    readonly k: number,
    private readonly screenFrom = SCREEN_MIN_SECTIONS,
    private listsFrom = SECTION_LISTS_FROM,
    private listOptions: Partial<SectionListsOptions> = {},
  ) {
    this._scratch = new RowScratch(k);
  }

  /**
   * Closes the sources of stored rows (the saved index file): for the owner of an index that is
   * being replaced. Later reads of those rows throw SectionRowsClosedError.
   */
  closeRows(): void {
    for (const r of this._readers) r.close();
    this._readers.clear();
    this._saved = undefined;
    this.forgetListed();
    this._openSpill = undefined;
  }

  /**
   * Keeps the lists' 8-bit codes in spills opened by `open` (undefined: in memory) when they would
   * take at least `fromBytes` (k + 24 bytes a section), from the next filing on (listedSections.ts).
   */
  spillListsTo(open: OpenSpill | undefined, fromBytes = SPILL_FROM_BYTES): void {
    this._openSpill = open;
    this._spillFrom = fromBytes;
    this.forgetListed();
  }

  /**
   * Ranking visits the probed lists only from `count` sections on (tests and benchmarks: small
   * collections with lists; the saved index keeps its lists from the same count on).
   */
  setListsFrom(count: number): void {
    this.listsFrom = count;
  }

  /**
   * Takes the lists and their filing from a saved index (savedLists.ts), once all files are set:
   * the next ranking neither trains nor files. The parts are checked against the files set.
   * @throws InvalidInputError when they disagree in size or order.
   */
  restoreLists(centroids: Float32Array, groups: Float32Array, groupStarts: Int32Array, listing: SavedListing): void {
    if (listing.listOf.length !== this._count)
      throw new InvalidInputError(`the saved section lists hold ${listing.listOf.length} sections, not ${this._count}`);
    this._lists = SectionLists.restore(this.k, centroids, groups, groupStarts, this.listOptions);
    for (const l of listing.listOf)
      if (!(l >= 0 && l < this._lists.lists)) {
        this._lists = null;
        throw new InvalidInputError('a saved section list number is out of range');
      }
    this._trainedAt = this._count;
    this.forgetListed();
    this._saved = listing;
  }

  /**
   * The lists as the index file keeps them, for `paths` in the file's order (files without sections
   * skipped), or null below listsFrom sections (training them now if they are not trained).
   * @param spill where the rows filed now may wait, coded, until the save writes them (from
   *   spillListsTo's byte count on; default the spill given there): without one they are read again.
   */
  savedLists(paths: readonly string[], spill?: OpenSpill): SavedListsPlan | null {
    if (this._count < this.listsFrom || this._count === 0) return null;
    const lists = this.lists();
    if (!lists) return null;
    const listed = this._saved || this._listed ? this.listed() : null;
    const named = paths.filter((p) => {
      const f = this._files.get(p);
      return f !== undefined && sectionCount(f) > 0;
    });
    const files = named.map((p) => this._files.get(p)!);
    const known = (no: number): { lists: Int32Array; slots: Int32Array } | null => {
      const [lists, slots] = [listed?.listsOf(named[no]), listed?.slotsOf(named[no])];
      return lists && slots ? { lists, slots } : null;
    };
    const readCoded = listed ? listed.readCoded.bind(listed) : undefined;
    const open = spill ?? this._openSpill;
    return planSavedLists(lists, files, known, readCoded, open ? { open, fromBytes: this._spillFrom } : undefined, this._filer);
  }

  /**
   * The executor whose threads file the sections under their lists when savedLists plans a save
   * (the same lists as without one); undefined: filed on this thread. The caller keeps it alive
   * until the save ends, then clears it.
   */
  fileOn(ex: MatrixExecutor | undefined): void {
    // What the lists placed in the executor's memory is let go with it.
    if (ex !== this._filer) this._lists?.forgetPlacement();
    this._filer = ex;
  }

  /** Other options for the lists (trained again at the next ranking that uses them). */
  configureLists(options: Partial<SectionListsOptions>): void {
    this.listOptions = options;
    this.dropLists();
  }

  /** Files that have sections. */
  get files(): number {
    return this._files.size;
  }

  /** Sections over all files. */
  get count(): number {
    return this._count;
  }

  get(path: string): FileSections | undefined {
    return this._files.get(path);
  }

  /** Entries in insertion order (the index file keeps its own order; see serialize.ts). */
  entries(): IterableIterator<[string, FileSections]> {
    return this._files.entries();
  }

  set(path: string, sections: FileSections): void {
    const n = sectionsIn(sections);
    const stored = sections.stored;
    // Stored rows are checked without reading them (vectors would read them all); a saved table's
    // files (StoredFileSections) have as many lines and titles as rows by construction, and are
    // not made into arrays here (on the Linux tree that decoded 1.33 M titles on every reopen).
    const sized = stored ? stored.reader.k === this.k && stored.first + n <= stored.reader.rows : sections.vectors.length === n * this.k;
    const table = sections instanceof StoredFileSections;
    if ((!table && (sections.ends.length !== n || sections.titles.length !== n)) || !sized)
      throw new InvalidInputError(`the sections of "${path}" disagree in size (k = ${this.k})`);
    if (stored) this._readers.add(stored.reader);
    if (this._saved) this.listed(); // the saved filing holds for the files as they were
    this.delete(path);
    this._files.set(path, sections);
    this._count += n;
    this._screen = undefined;
    if (this._lists && this._count > 2 * this._trainedAt) this.dropLists();
    this._listed?.add(path, sections);
  }

  delete(path: string): void {
    const old = this._files.get(path);
    if (!old) return;
    if (this._saved) this.listed();
    this._count -= sectionsIn(old);
    this._files.delete(path);
    this._screen = undefined;
    this._listed?.remove(path);
    if (this._lists && 2 * this._count < this._trainedAt) this.dropLists();
    else if (this._listed && 2 * this._listed.dead > this._listed.used) this.forgetListed();
  }

  /** The section of a file holding a zero-based line (the last one that starts at or before it), or null. */
  at(path: string, line: number): { index: number; vector: Float32Array } | null {
    const f = this._files.get(path);
    if (!f) return null;
    const [starts, ends] = [f.starts, f.ends]; // once: a reopened file's are made on each access
    if (starts.length === 0) return null;
    let best = 0;
    for (let i = 0; i < starts.length; i++) if (starts[i] <= line && line < ends[i]) best = i;
    if (line >= ends[starts.length - 1]) best = starts.length - 1;
    const { block, at } = this._scratch.rows(f, best, 1);
    return { index: best, vector: block.slice(at, at + this.k) };
  }

  /** A file's section with the highest cosine with q, or null when the file has none. */
  best(path: string, q: Float32Array): SectionHit | null {
    const f = this._files.get(path);
    if (!f || f.starts.length === 0) return null;
    let at = 0;
    let top = Number.NEGATIVE_INFINITY;
    const { block, at: base } = this._scratch.rows(f, 0, f.starts.length);
    for (let i = 0; i < f.starts.length; i++) {
      const s = dot(block, base + i * this.k, q, this.k);
      if (s > top) [top, at] = [s, i];
    }
    return this.hit(path, f, at, top);
  }

  /**
   * The `top` sections with the highest cosine with q over files that `accept` lets in (all when
   * it is undefined, which spares a call per file), best first
   * (ties: file order, then position). At most `perFile` sections of one file. Exact scores; with
   * many sections only those that can still place are multiplied (see the header); from listsFrom
   * sections only those of the probed lists and of the files in `also` (then not exact).
   */
  rank(
    q: Float32Array,
    top: number,
    accept?: (path: string) => boolean,
    perFile = Number.POSITIVE_INFINITY,
    also: readonly string[] = [],
  ): SectionHit[] {
    if (q.length !== this.k) throw new InvalidInputError(`query vector has ${q.length} numbers, the sections have ${this.k}`);
    if (top > 0 && perFile >= 1 && this._count >= this.listsFrom) return this.rankLists(q, top, accept, perFile, also);
    return this.rankScreened(q, top, accept, perFile);
  }

  /** rank() by the exact 8-bit screen over all sections, whatever their count (the reference of the lists). */
  rankScreened(q: Float32Array, top: number, accept?: (path: string) => boolean, perFile = Number.POSITIVE_INFINITY): SectionHit[] {
    if (q.length !== this.k) throw new InvalidInputError(`query vector has ${q.length} numbers, the sections have ${this.k}`);
    const screen = top > 0 && perFile >= 1 ? this.screen() : null;
    if (!screen) return this.rankExact(q, top, accept, perFile);
    const { codes, paths, files, firsts } = screen;
    const { center, radius } = codes.bounds(q, firsts[files.length]);
    const ok = new Uint8Array(files.length);
    // The top-th best lower bound over sections that can be listed together.
    const best = new Float64Array(top).fill(Number.NEGATIVE_INFINITY);
    const lows: number[] = [];
    for (let f = 0; f < files.length; f++) {
      if (accept && !accept(paths[f])) continue;
      ok[f] = 1;
      lows.length = 0;
      for (let j = firsts[f]; j < firsts[f + 1]; j++) lows.push(center[j] - radius[j]);
      if (lows.length > perFile) {
        lows.sort((a, b) => b - a);
        lows.length = perFile;
      }
      for (const low of lows) if (low > best[top - 1]) insertDescending(best, low);
    }
    const bar = best[top - 1] - SCREEN_SLACK;
    const picked: { path: string; f: FileSections; at: number[] }[] = [];
    for (let f = 0; f < files.length; f++) {
      if (!ok[f]) continue;
      let at: number[] | null = null;
      for (let j = firsts[f]; j < firsts[f + 1]; j++) {
        if (center[j] + radius[j] < bar) continue;
        (at ??= []).push(j - firsts[f]);
      }
      if (at) picked.push({ path: paths[f], f: files[f], at });
    }
    return this.rankOver(picked, q, top, perFile);
  }

  /** rank() as a full pass over every section (the reference of the screened rank). */
  rankExact(q: Float32Array, top: number, accept?: (path: string) => boolean, perFile = Number.POSITIVE_INFINITY): SectionHit[] {
    if (q.length !== this.k) throw new InvalidInputError(`query vector has ${q.length} numbers, the sections have ${this.k}`);
    const all: { path: string; f: FileSections; at: null }[] = [];
    for (const [path, f] of this._files) if (!accept || accept(path)) all.push({ path, f, at: null });
    return this.rankOver(all, q, top, perFile);
  }

  /**
   * rank() over the sections of the probe lists nearest to q (and all sections of the files in
   * `also`): the same exact products as the full pass, over part of the sections.
   */
  rankLists(
    q: Float32Array,
    top: number,
    accept?: (path: string) => boolean,
    perFile = Number.POSITIVE_INFINITY,
    also: readonly string[] = [],
    probe?: number,
  ): SectionHit[] {
    if (q.length !== this.k) throw new InvalidInputError(`query vector has ${q.length} numbers, the sections have ${this.k}`);
    const listed = this.listed();
    if (!listed || top <= 0 || perFile < 1) return this.rankExact(q, top, accept, perFile);
    return this.rankOver(listed.candidates(q, top, accept, also, probe ?? listed.lists.probe), q, top, perFile);
  }

  /** The trained lists, training them when there are none yet (null without sections). */
  lists(): SectionLists | null {
    if (this._count === 0) return null;
    if (this._lists) return this._lists;
    const blocks: FileSections[] = [];
    const firsts = new Int32Array(this._files.size + 1);
    for (const f of this._files.values()) {
      blocks.push(f);
      firsts[blocks.length] = firsts[blocks.length - 1] + f.starts.length;
    }
    const row = (j: number): { block: Float32Array; at: number } => {
      let lo = 0;
      let hi = blocks.length - 1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (firsts[mid] <= j) lo = mid;
        else hi = mid - 1;
      }
      return this._scratch.rows(blocks[lo], j - firsts[lo], 1);
    };
    this._lists = SectionLists.train(this.k, { n: this._count, row }, this.listOptions);
    this._trainedAt = this._count;
    this.forgetListed();
    return this._lists;
  }

  /** True while a reopened index's saved listing waits to be set up (fileSaved). */
  get savedListingPending(): boolean {
    return this._saved !== undefined;
  }

  /**
   * Sets up a reopened index's saved listing now (nothing is trained or filed: the lists and
   * slots as saved), so neither the first section search nor the first edit waits for it: about
   * 0.15 s on the Linux tree's 1.33 M sections, in one step. Nothing to do without one.
   */
  fileSaved(): void {
    if (this._saved) this.listed();
  }

  /** The sections filed under the trained lists (training and filing them when needed). */
  private listed(): ListedSections | null {
    if (this._listed) return this._listed;
    const lists = this.lists();
    if (!lists) return null;
    const big = this._count * (this.k + 24) >= this._spillFrom;
    const saved = this._saved;
    this._saved = undefined;
    if (saved) {
      // Saved codes stay in their file from the spill's size on (a spill of their own otherwise).
      this._listed = new ListedSections(lists, this._files.entries(), undefined, saved, big && saved.inFile);
      return this._listed;
    }
    const spill = big ? this._openSpill : undefined;
    this._listed = new ListedSections(lists, this._files.entries(), spill);
    return this._listed;
  }

  private dropLists(): void {
    this._lists = null;
    this._saved = undefined;
    this.forgetListed();
  }

  /** Drops the filed sections, giving their spills back. */
  private forgetListed(): void {
    this._listed?.close();
    this._listed = undefined;
  }

  /** Exact products the last rank() computed (for tests and the benchmark). */
  get lastExact(): number {
    return this._lastExact;
  }

  /** Sections screened so far (for the benchmark): the screen's size, or 0 when ranking is a full pass. */
  get screened(): number {
    const s = this.screen();
    return s ? s.firsts[s.files.length] : 0;
  }

  private rankOver(
    list: readonly { path: string; f: FileSections; at: readonly number[] | null }[],
    q: Float32Array,
    top: number,
    perFile: number,
  ): SectionHit[] {
    const heap: { path: string; f: FileSections; i: number; score: number }[] = [];
    let floor = Number.NEGATIVE_INFINITY;
    this._lastExact = 0;
    if (top <= 0) return [];
    const k = this.k;
    for (const { path, f, at } of list) {
      let taken = 0;
      const scores: { i: number; score: number }[] = [];
      const n = at ? at.length : f.starts.length;
      this._lastExact += n;
      if (!f.stored) {
        const v = f.vectors;
        for (let x = 0; x < n; x++) {
          const i = at ? at[x] : x;
          const s = dot(v, i * k, q, k);
          if (s > floor || heap.length < top) scores.push({ i, score: s });
        }
      } else {
        // Runs of picked rows no more than ROW_GAP apart, each read once.
        for (let x = 0; x < n;) {
          let y = x + 1;
          if (at) while (y < n && at[y] - at[y - 1] <= ROW_GAP) y++;
          else y = n;
          const from = at ? at[x] : x;
          const to = (at ? at[y - 1] : y - 1) + 1;
          const { block, at: base } = this._scratch.rows(f, from, to - from);
          for (let z = x; z < y; z++) {
            const i = at ? at[z] : z;
            const s = dot(block, base + (i - from) * k, q, k);
            if (s > floor || heap.length < top) scores.push({ i, score: s });
          }
          x = y;
        }
      }
      scores.sort((a, b) => b.score - a.score || a.i - b.i);
      for (const { i, score } of scores) {
        if (taken++ >= perFile) break;
        heap.push({ path, f, i, score });
      }
      if (heap.length > 4 * top + 64) {
        heap.sort((a, b) => b.score - a.score);
        heap.length = top;
        floor = heap[top - 1].score;
      }
    }
    heap.sort((a, b) => b.score - a.score);
    return heap.slice(0, top).map((h) => this.hit(h.path, h.f, h.i, h.score));
  }

  private screen(): Screen | null {
    if (this._screen !== undefined) return this._screen;
    if (this._count < this.screenFrom || this._count === 0) return null; // not cached: sections may still be added
    const paths: string[] = [];
    const files: FileSections[] = [];
    const firsts = new Int32Array(this._files.size + 1);
    const rows = new Float32Array(this._count * this.k);
    let n = 0;
    for (const [path, f] of this._files) {
      firsts[files.length] = n;
      paths.push(path);
      files.push(f);
      // Stored rows straight into place (no array a file).
      if (f.stored) f.stored.reader.read(f.stored.first, f.starts.length, rows, n * this.k);
      else rows.set(f.vectors, n * this.k);
      n += f.starts.length;
    }
    firsts[files.length] = n;
    const codes = ConceptCodes.create(this.k, Math.max(n, 1), rows, n);
    this._screen = codes ? { codes, paths, files, firsts } : null;
    return this._screen;
  }

  private hit(path: string, f: FileSections, i: number, score: number): SectionHit {
    if (f instanceof StoredFileSections) return { path, index: i, ...f.section(i), score };
    return { path, index: i, start: f.starts[i], end: f.ends[i], title: f.titles[i], score };
  }
}

function dot(block: Float32Array, at: number, q: Float32Array, k: number): number {
  let s = 0;
  for (let c = 0; c < k; c++) s += block[at + c] * q[c];
  return s;
}
