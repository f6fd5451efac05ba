/**
 * An inverted file over section vectors, so a query visits only part of them: a coarse quantizer
 * of `lists` centroids, every vector filed under its nearest centroid, and a query that scores
 * the centroids and looks only into the `probe` best lists (Jégou, Douze & Schmid 2011, "Product
 * quantization for nearest neighbor search", IEEE TPAMI 33(1), §IV.A, the "IVF" non-exhaustive
 * search with w = probe lists visited; the exact products of the visited vectors are left to the
 * caller). Vectors are unit concept vectors and closeness is cosine, so the centroids come from
 * spherical k-means (Dhillon & Modha 2001, Machine Learning 42, ../topics/sphericalKMeans.ts) on a
 * seeded sample of samplePerList vectors per list.
 * Two levels, so that training and filing cost O(n·(g + lists/g)·k) rather than O(n·lists·k): the
 * sample is first cut into g = ⌈√lists⌉ groups, then each group into a share of the lists in
 * proportion to its size (a two-level vocabulary tree, Nistér & Stewénius 2006, "Scalable
 * recognition with a vocabulary tree", CVPR). A vector is filed under the best centroid of its
 * fileGroups best groups (an approximate nearest centroid; the query side scores every centroid);
 * fileRows files a block of rows in one call of a SIMD kernel (../matrix/wasm/assembly/fileRows.ts)
 * with the same scores and ties as file().
 * Defaults: lists = ⌈√n⌉ (the rule of thumb of the IVF literature, common practice); probe 24, the
 * smallest of 16/24/48 with recall@10 ≥ 0.98 of the exhaustive top 10 for both search and Nearby on
 * public collections pooled (numba, CMake, Django and Sphinx manuals, rxjs and lodash sources in
 * test/fixtures: 0.982 and 0.996 at 90 lists; bench/sectionLists.ts); fileGroups 1 (2 gave the same
 * recall there, 0.984 and 0.995, for a third more filing work); samplePerList 32, iterations 8 and
 * start 'sample' common practice (k-means on a sample, few Lloyd passes for a coarse quantizer;
 * 'sample' gave the same recall there as k-means++ seeding in 70 % of the time), not fitted to any
 * held-out collection.
 */
import { InvalidInputError } from '../errors.js';
import type { CoarseQuantizer, MatrixExecutor } from '../matrix/executor.js';
import { dotModule, type DotKernelExports } from '../matrix/wasm/dotKernel.js';
import { instantiateKernelModule, type KernelModuleExports } from '../matrix/wasm/kernelModule.js';
import { createRandom, DEFAULT_SEED, type RandomSource } from '../random.js';
import { sphericalKMeans, type Clustering } from '../topics/sphericalKMeans.js';

export interface SectionListsOptions {
  /** Lists (centroids); 0 means ⌈√n⌉. @default 0 */
  readonly lists: number;
  /** Lists a query visits. @default 24 */
  readonly probe: number;
  /** Training vectors per list (a seeded sample). @default 32 */
  readonly samplePerList: number;
  /** Lloyd passes of each k-means. @default 8 */
  readonly iterations: number;
  /** Best groups whose centroids a filed vector is compared with. @default 1 */
  readonly fileGroups: number;
  /**
   * Start centres: 'sample' takes distinct vectors of the seeded sample (Forgy's start, common
   * practice for a coarse quantizer); 'kmeans++' seeds as ../topics/sphericalKMeans.ts does (better
   * spread, about twice the training time). @default 'sample'
   */
  readonly start: 'sample' | 'kmeans++';
  /** @default DEFAULT_SEED */
  readonly seed: number;
}

export const DEFAULT_SECTION_LISTS_OPTIONS: Readonly<SectionListsOptions> = Object.freeze({
  lists: 0,
  probe: 24,
  samplePerList: 32,
  iterations: 8,
  fileGroups: 1,
  start: 'sample',
  seed: DEFAULT_SEED,
});

/** Row j of a set of vectors: its numbers are block[at … at + k). */
export interface RowSource {
  readonly n: number;
  row(j: number): { readonly block: Float32Array; readonly at: number };
}

/** The centroids in a WebAssembly memory for the SIMD dot kernel (../matrix/wasm/dotKernel.ts). */
interface Kernel {
  readonly dots: DotKernelExports['dots'];
  readonly fileRows: KernelModuleExports['file_rows'];
  /** The query (f64) and the scores (f64: groups, then lists), as views and byte offsets. */
  readonly q: Float64Array;
  readonly groupScores: Float64Array;
  readonly listScores: Float64Array;
  readonly groupsAt: number;
  readonly centroidsAt: number;
  readonly startsAt: number;
  /** Rows filed at once (FILE_BLOCK_ROWS) and their lists, as views and byte offsets. */
  readonly rows: Float32Array;
  readonly rowLists: Int32Array;
}

/** Rows filed by one call of the kernel (a staging block of FILE_BLOCK_ROWS × k f32; our choice). */
const FILE_BLOCK_ROWS = 256;
/**
 * Rows filed by one call on an executor (fileRowsOn): enough that sharing them out between
 * threads costs little beside the products (4,096 rows at k = 289: about 80 M multiply-adds
 * against one posted job), a staging block of 4.7 MB there. Our choice, not tuned.
 */
const EXECUTOR_FILE_ROWS = 4096;

/** The quantizer and staging blocks as placed in an executor's memory (fileRowsOn). */
interface Placed {
  readonly ex: MatrixExecutor;
  readonly quantizer: CoarseQuantizer;
  readonly rows: Float32Array;
  readonly out: Int32Array;
}

/**
 * The trained quantizer: centroids in groups. Filing and probing; the lists themselves are the
 * caller's. Products with the centroids run on the SIMD dot kernel where there is one, else in
 * plain loops (the same products up to rounding; ties may then go another way).
 */
export class SectionLists {
  private readonly _kernel: Kernel | null;
  private _placed: Placed | undefined;

  private constructor(
    readonly k: number,
    /** lists × k unit centroids, row-major, group by group. */
    readonly centroids: Float32Array,
    /** g × k unit group centres. */
    readonly groups: Float32Array,
    /** First centroid of each group (length g + 1). */
    readonly groupStarts: Int32Array,
    readonly probe: number,
    private readonly _fileGroups: number,
  ) {
    this._kernel = kernelFor(k, groups, centroids, groupStarts);
  }

  get lists(): number {
    return this.centroids.length / this.k;
  }

  /**
   * Lists trained before (a saved index: centroids, groups and groupStarts as trained), probing
   * and filing with the given options (the training options are not used).
   * @throws InvalidInputError when the parts disagree in size or order.
   */
  static restore(
    k: number,
    centroids: Float32Array,
    groups: Float32Array,
    groupStarts: Int32Array,
    options: Partial<SectionListsOptions> = {},
  ): SectionLists {
    const o = { ...DEFAULT_SECTION_LISTS_OPTIONS, ...options };
    const g = groupStarts.length - 1;
    const lists = centroids.length / k;
    const sized = k > 0 && Number.isInteger(lists) && lists >= 1 && g >= 1 && groups.length === g * k;
    let ordered = sized && groupStarts[0] === 0 && groupStarts[g] === lists;
    for (let c = 0; ordered && c < g; c++) ordered = groupStarts[c + 1] >= groupStarts[c];
    if (!ordered) throw new InvalidInputError('saved section lists disagree in size');
    return new SectionLists(k, centroids, groups, groupStarts, Math.max(1, Math.floor(o.probe)), Math.max(1, o.fileGroups));
  }

  /** Trains the centroids on a seeded sample of the rows (same rows, options and seed: same centroids). */
  static train(k: number, rows: RowSource, options: Partial<SectionListsOptions> = {}): SectionLists {
    const o = { ...DEFAULT_SECTION_LISTS_OPTIONS, ...options };
    if (rows.n < 1) throw new InvalidInputError('section lists need at least one vector');
    const lists = Math.max(1, Math.min(rows.n, o.lists > 0 ? Math.floor(o.lists) : Math.ceil(Math.sqrt(rows.n))));
    const random = createRandom(o.seed);
    // A seeded sample without repeats (partial Fisher–Yates over the row numbers).
    const m = Math.min(rows.n, Math.max(lists, Math.ceil(lists * o.samplePerList)));
    const ids = Int32Array.from({ length: rows.n }, (_, i) => i);
    for (let i = 0; i < m; i++) {
      const j = i + Math.floor(random.next() * (rows.n - i));
      [ids[i], ids[j]] = [ids[j], ids[i]];
    }
    const sample = ids.subarray(0, m).sort();
    const points = new Float64Array(m * k);
    sample.forEach((id, i) => {
      const { block, at } = rows.row(id);
      for (let c = 0; c < k; c++) points[i * k + c] = block[at + c];
    });
    const g = Math.max(1, Math.min(lists, Math.ceil(Math.sqrt(lists))));
    const kmeans = { restarts: 1, maxIterations: o.iterations };
    const cluster = (x: Float64Array, n: number, count: number): Clustering => {
      const seed = random.nextUint32();
      if (o.start === 'kmeans++') return sphericalKMeans(x, n, k, count, { ...kmeans, seed });
      return sphericalKMeans(x, n, k, count, { ...kmeans, initial: pickRows(x, n, k, count, createRandom(seed)) });
    };
    const top = cluster(points, m, g);
    const groups = top.clusters;
    // Members of each group, and each group's share of the lists (at least one each).
    const members: number[][] = Array.from({ length: groups }, () => []);
    top.assignment.forEach((c, i) => members[c].push(i));
    const shares = members.map((x) => Math.max(1, Math.round((lists * x.length) / m)));
    const centroids: number[] = [];
    const groupStarts = new Int32Array(groups + 1);
    for (let c = 0; c < groups; c++) {
      const size = members[c].length;
      const sub = new Float64Array(size * k);
      members[c].forEach((i, r) => sub.set(points.subarray(i * k, (i + 1) * k), r * k));
      const inner = size > 0 ? cluster(sub, size, Math.min(shares[c], size)).centres : top.centres.subarray(c * k, (c + 1) * k);
      for (const x of inner) centroids.push(x);
      groupStarts[c + 1] = centroids.length / k;
    }
    return new SectionLists(
      k,
      Float32Array.from(centroids),
      Float32Array.from(top.centres),
      groupStarts,
      Math.max(1, Math.floor(o.probe)),
      Math.max(1, o.fileGroups),
    );
  }

  /** The list a vector belongs to: the best centroid of its fileGroups best groups (ties: lower number). */
  file(block: Float32Array, at: number): number {
    const k = this.k;
    const g = this.groupStarts.length - 1;
    const want = Math.min(this._fileGroups, g);
    const bestGroups = new Int32Array(want).fill(-1);
    const bestScores = new Float64Array(want).fill(Number.NEGATIVE_INFINITY);
    const w = this._kernel;
    if (w) {
      for (let c = 0; c < k; c++) w.q[c] = block[at + c];
      w.dots(w.groupsAt, w.q.byteOffset, k, 0, g, w.groupScores.byteOffset);
    }
    for (let c = 0; c < g; c++) {
      const s = w ? w.groupScores[c] : dot(this.groups, c * k, block, at, k);
      if (s > bestScores[want - 1]) insertTop(bestScores, bestGroups, s, c);
    }
    let list = 0;
    let top = Number.NEGATIVE_INFINITY;
    for (const c of bestGroups) {
      if (c < 0) continue;
      const [from, to] = [this.groupStarts[c], this.groupStarts[c + 1]];
      if (w) w.dots(w.centroidsAt, w.q.byteOffset, k, from, to, w.listScores.byteOffset);
      for (let j = from; j < to; j++) {
        const s = w ? w.listScores[j] : dot(this.centroids, j * k, block, at, k);
        if (s > top || (s === top && j < list)) [top, list] = [s, j];
      }
    }
    return list;
  }

  /**
   * The lists of `count` rows, block[at …] row after row (k numbers each), into out[outAt …]: what
   * file() gives each of them, in one kernel call per block of rows where there is a kernel and a
   * row is filed under one group (the default).
   */
  fileRows(block: Float32Array, at: number, count: number, out: Int32Array, outAt: number): void {
    const k = this.k;
    const w = this._kernel;
    if (!w || this._fileGroups !== 1) {
      for (let i = 0; i < count; i++) out[outAt + i] = this.file(block, at + i * k);
      return;
    }
    const g = this.groupStarts.length - 1;
    for (let from = 0; from < count; from += FILE_BLOCK_ROWS) {
      const m = Math.min(FILE_BLOCK_ROWS, count - from);
      w.rows.set(block.subarray(at + from * k, at + (from + m) * k));
      w.fileRows(w.rows.byteOffset, k, 0, m, w.groupsAt, g, w.centroidsAt, w.startsAt, w.q.byteOffset, w.rowLists.byteOffset);
      out.set(w.rowLists.subarray(0, m), outAt + from);
    }
  }

  /**
   * fileRows on an executor's threads where it can run file_rows (the same kernel, so the same
   * lists; the default fileGroups only): the quantizer is copied into its memory once, and the
   * rows go through a staging block of EXECUTOR_FILE_ROWS. Elsewhere, fileRows.
   */
  fileRowsOn(ex: MatrixExecutor | undefined, block: Float32Array, at: number, count: number, out: Int32Array, outAt: number): void {
    const placed = ex?.fileRows && this._fileGroups === 1 ? this.placedIn(ex) : null;
    if (!placed) return this.fileRows(block, at, count, out, outAt);
    const k = this.k;
    for (let from = 0; from < count; from += EXECUTOR_FILE_ROWS) {
      const m = Math.min(EXECUTOR_FILE_ROWS, count - from);
      placed.rows.set(block.subarray(at + from * k, at + (from + m) * k));
      if (!ex!.fileRows!(placed.rows, m, k, placed.quantizer, placed.out))
        return this.fileRows(block, at + from * k, count - from, out, outAt + from);
      out.set(placed.out.subarray(0, m), outAt + from);
    }
  }

  /** Lets go of what fileRowsOn placed in an executor's memory (the executor may go then). */
  forgetPlacement(): void {
    this._placed = undefined;
  }

  /** The quantizer and staging blocks in ex's memory (made on first use with that executor). */
  private placedIn(ex: MatrixExecutor): Placed {
    if (this._placed?.ex === ex) return this._placed;
    const copy = <T extends Float32Array | Int32Array>(to: T, from: T): T => {
      to.set(from);
      return to;
    };
    const quantizer = {
      groups: copy(ex.float32(this.groups.length), this.groups),
      centroids: copy(ex.float32(this.centroids.length), this.centroids),
      starts: copy(ex.int32(this.groupStarts.length), this.groupStarts),
    };
    this._placed = { ex, quantizer, rows: ex.float32(EXECUTOR_FILE_ROWS * this.k), out: ex.int32(EXECUTOR_FILE_ROWS) };
    return this._placed;
  }

  /** The `probe` lists (or `count`) whose centroids have the highest cosine with q, best first. */
  nearest(q: ArrayLike<number>, count = this.probe): Int32Array {
    const k = this.k;
    const n = this.lists;
    const want = Math.min(count, n);
    const ids = new Int32Array(want).fill(-1);
    const scores = new Float64Array(want).fill(Number.NEGATIVE_INFINITY);
    const c = this.centroids;
    const w = this._kernel;
    if (w) {
      for (let d = 0; d < k; d++) w.q[d] = q[d];
      w.dots(w.centroidsAt, w.q.byteOffset, k, 0, n, w.listScores.byteOffset);
    }
    for (let j = 0; j < n; j++) {
      let s = 0;
      if (w) s = w.listScores[j];
      else for (let d = 0, o = j * k; d < k; d++) s += c[o + d] * q[d];
      if (s > scores[want - 1]) insertTop(scores, ids, s, j);
    }
    return ids;
  }
}

/** `count` distinct rows of x (n × k), drawn without repeats (partial Fisher–Yates). */
function pickRows(x: Float64Array, n: number, k: number, count: number, random: RandomSource): Float64Array {
  const ids = Int32Array.from({ length: n }, (_, i) => i);
  const out = new Float64Array(count * k);
  for (let i = 0; i < count; i++) {
    const j = i + Math.floor(random.next() * (n - i));
    [ids[i], ids[j]] = [ids[j], ids[i]];
    out.set(x.subarray(ids[i] * k, (ids[i] + 1) * k), i * k);
  }
  return out;
}

/** The centroids copied into a memory of their own for the dot kernel, or null without WebAssembly SIMD. */
function kernelFor(k: number, groups: Float32Array, centroids: Float32Array, groupStarts: Int32Array): Kernel | null {
  const module = dotModule();
  if (!module) return null;
  const g = groups.length / k;
  const lists = centroids.length / k;
  const align = (x: number): number => Math.ceil(x / 16) * 16;
  const qAt = 16;
  const groupScoresAt = align(qAt + 8 * k);
  const listScoresAt = align(groupScoresAt + 8 * g);
  const groupsAt = align(listScoresAt + 8 * lists);
  const centroidsAt = align(groupsAt + 4 * groups.length);
  const startsAt = align(centroidsAt + 4 * centroids.length);
  const rowsAt = align(startsAt + 4 * groupStarts.length);
  const rowListsAt = align(rowsAt + 4 * FILE_BLOCK_ROWS * k);
  const bytes = rowListsAt + 4 * FILE_BLOCK_ROWS;
  try {
    const pages = Math.ceil(bytes / 65536);
    const memory = new WebAssembly.Memory({ initial: pages, maximum: pages, shared: true });
    const buffer = memory.buffer;
    new Float32Array(buffer, groupsAt, groups.length).set(groups);
    new Float32Array(buffer, centroidsAt, centroids.length).set(centroids);
    new Int32Array(buffer, startsAt, groupStarts.length).set(groupStarts);
    const exports = instantiateKernelModule(module, memory);
    return {
      dots: exports.dots,
      fileRows: exports.file_rows,
      q: new Float64Array(buffer, qAt, k),
      groupScores: new Float64Array(buffer, groupScoresAt, g),
      listScores: new Float64Array(buffer, listScoresAt, lists),
      groupsAt,
      centroidsAt,
      startsAt,
      rows: new Float32Array(buffer, rowsAt, FILE_BLOCK_ROWS * k),
      rowLists: new Int32Array(buffer, rowListsAt, FILE_BLOCK_ROWS),
    };
  } catch {
    return null;
  }
}

function dot(a: Float32Array, ao: number, b: Float32Array, bo: number, k: number): number {
  let s = 0;
  for (let d = 0; d < k; d++) s += a[ao + d] * b[bo + d];
  return s;
}

/** Inserts (s, id) into descending parallel arrays of fixed length, dropping the last entry. */
function insertTop(scores: Float64Array, ids: Int32Array, s: number, id: number): void {
  let i = scores.length - 1;
  while (i > 0 && scores[i - 1] < s) {
    scores[i] = scores[i - 1];
    ids[i] = ids[i - 1];
    i--;
  }
  scores[i] = s;
  ids[i] = id;
}
