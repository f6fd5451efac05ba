/**
 * Section vectors that stay where they were saved: rows of k f32 numbers, numbered over the
 * index's sections in file order, read on demand through a SectionRowReader (the node adapter
 * reads them from the saved index file with positioned reads: src/node/sectionRowFile.ts). The
 * f32 rows of a large tree are most of its index (1.33 M sections × 289 × 4 B ≈ 1.5 GB on the
 * Linux tree), while a request multiplies only the few thousand rows its 8-bit screen lets
 * through, so the editor's worker keeps the 8-bit codes and reads the exact rows it needs (the
 * same f32 numbers, so the same products and rankings). Core declares the interface; it never
 * touches a file.
 */
import { InvalidInputError, UndertoneError } from '../errors.js';
import type { ByteSpill, FileSections, SectionRowReader, StoredRows } from './types.js';

export type { SectionRowReader, StoredRows } from './types.js';

/** Reading saved section rows failed (the file went away, an I/O error, a short read). */
export class SectionRowsError extends UndertoneError {}

/** The rows were read after their source was closed (the index it belonged to was replaced). */
export class SectionRowsClosedError extends SectionRowsError {
  constructor() {
    super('the saved section vectors were closed (the index they belong to was replaced)');
  }
}

/** Checks a read's arguments against the source and the destination (shared by the readers). */
export function checkRowRange(source: SectionRowReader, first: number, count: number, into: Float32Array, at: number): void {
  if (!(Number.isInteger(first) && Number.isInteger(count) && first >= 0 && count >= 0 && first + count <= source.rows))
    throw new InvalidInputError(`section rows ${first}…${first + count - 1} are outside the ${source.rows} saved rows`);
  if (!(Number.isInteger(at) && at >= 0 && at + count * source.k <= into.length))
    throw new InvalidInputError(`${count} rows of ${source.k} numbers do not fit the destination from ${at}`);
}

/** Rows held in one array (tests, and an index decoded from bytes in memory). */
export class MemoryRows implements SectionRowReader {
  readonly rows: number;
  private _closed = false;

  constructor(
    private readonly vectors: Float32Array,
    readonly k: number,
  ) {
    if (!(k > 0) || vectors.length % k !== 0) throw new InvalidInputError(`${vectors.length} numbers are not rows of ${k}`);
    this.rows = vectors.length / k;
  }

  get closed(): boolean {
    return this._closed;
  }

  read(first: number, count: number, into: Float32Array, at = 0): void {
    if (this._closed) throw new SectionRowsClosedError();
    checkRowRange(this, first, count, into, at);
    into.set(this.vectors.subarray(first * this.k, (first + count) * this.k), at);
  }

  close(): void {
    this._closed = true;
  }
}

/**
 * Rows written to a spill (a large build's scratch file, src/node/sectionCodeFile.ts: the fold
 * writes each chunk's rows in row order, foldCountedSections) and read back from it as a reopened
 * index reads its saved rows. close() gives the spill back (its space goes with it).
 */
export class SpillRows implements SectionRowReader {
  private _closed = false;

  constructor(
    private readonly spill: ByteSpill,
    readonly rows: number,
    readonly k: number,
  ) {}

  get closed(): boolean {
    return this._closed;
  }

  read(first: number, count: number, into: Float32Array, at = 0): void {
    if (this._closed) throw new SectionRowsClosedError();
    checkRowRange(this, first, count, into, at);
    if (count === 0) return;
    this.spill.read(new Uint8Array(into.buffer, into.byteOffset + 4 * at, 4 * count * this.k), 4 * first * this.k);
  }

  close(): void {
    if (this._closed) return;
    this._closed = true;
    this.spill.close();
  }
}

/** One file's sections whose rows are in `reader` from row `first` on (vectors read on each access). */
export function sectionsWithRows(
  file: Pick<FileSections, 'starts' | 'ends' | 'titles'>,
  reader: SectionRowReader,
  first: number,
): FileSections {
  const n = file.starts.length;
  return {
    starts: file.starts,
    ends: file.ends,
    titles: file.titles,
    stored: { reader, first },
    get vectors(): Float32Array {
      return rowsOf(reader, first, n);
    },
  };
}

/** A fresh array of the `n` rows of `reader` from row `first` on (a file's vectors, read on each access). */
function rowsOf(reader: SectionRowReader, first: number, n: number): Float32Array {
  const out = new Float32Array(n * reader.k);
  reader.read(first, n, out, 0);
  return out;
}

/**
 * The saved sections of all files, as the index file holds them: line pairs, titles as UTF-8
 * bytes (each title ends where the next starts, less its separator), and the vectors' rows.
 */
export interface SavedSectionTable {
  /** Start and end line of each section, interleaved (2 × count). */
  readonly lines: Int32Array;
  /** The titles' UTF-8 bytes; title i is titleBytes[titleStarts[i], titleStarts[i + 1] − 1). */
  readonly titleBytes: Uint8Array;
  /** count + 1 offsets (the last one past a separator after the last title). */
  readonly titleStarts: Int32Array;
  readonly rows: SectionRowReader;
}

const utf8 = new TextDecoder('utf-8');

/**
 * A file's saved sections, held as a position in the table: starts, ends, titles and vectors are
 * made afresh from it on each access (a few objects a file instead of arrays and strings for
 * every section: on the Linux tree, 1.33 M titles took 95 MB of heap and the line arrays 32 MB).
 * Rankers read only the rows they need through `stored`; take each field once per use.
 */
export class StoredFileSections implements FileSections {
  readonly stored: StoredRows;

  constructor(
    private readonly table: SavedSectionTable,
    first: number,
    private readonly n: number,
  ) {
    if (!(
      first >= 0 &&
      n >= 0 &&
      first + n <= table.rows.rows &&
      2 * (first + n) <= table.lines.length &&
      first + n < table.titleStarts.length
    ))
      throw new InvalidInputError(`stored sections ${first}…${first + n - 1} lie outside the saved table`);
    this.stored = { reader: table.rows, first };
  }

  /** Sections of the file. */
  get count(): number {
    return this.n;
  }

  get starts(): Int32Array {
    return this.line(0);
  }

  get ends(): Int32Array {
    return this.line(1);
  }

  get titles(): string[] {
    const { titleBytes, titleStarts } = this.table;
    const a = this.stored.first;
    return Array.from({ length: this.n }, (_, i) => utf8.decode(titleBytes.subarray(titleStarts[a + i], titleStarts[a + i + 1] - 1)));
  }

  /** Section i's lines and title alone (what a hit shows), without making the file's arrays. */
  section(i: number): { start: number; end: number; title: string } {
    if (!(i >= 0 && i < this.n)) throw new InvalidInputError(`section ${i} of ${this.n}`);
    const { lines, titleBytes, titleStarts } = this.table;
    const j = this.stored.first + i;
    return { start: lines[2 * j], end: lines[2 * j + 1], title: utf8.decode(titleBytes.subarray(titleStarts[j], titleStarts[j + 1] - 1)) };
  }

  get vectors(): Float32Array {
    return rowsOf(this.table.rows, this.stored.first, this.n);
  }

  private line(side: 0 | 1): Int32Array {
    const out = new Int32Array(this.n);
    const lines = this.table.lines;
    const a = this.stored.first;
    for (let i = 0; i < this.n; i++) out[i] = lines[2 * (a + i) + side];
    return out;
  }
}

/** Reads rows of one file's sections through a reusable scratch array. */
export class RowScratch {
  private _buf: Float32Array;

  constructor(readonly k: number) {
    this._buf = new Float32Array(k * 64);
  }

  /** A scratch array of at least `rows` rows (reused: valid until the next call). */
  room(rows: number): Float32Array {
    if (this._buf.length < rows * this.k) this._buf = new Float32Array(Math.max(rows * this.k, 2 * this._buf.length));
    return this._buf;
  }

  /** Rows i … i + count − 1 of a file's sections, from its vectors or its stored rows, and where they start. */
  rows(f: FileSections, i: number, count: number): { block: Float32Array; at: number } {
    if (!f.stored) return { block: f.vectors, at: i * this.k };
    const block = this.room(count);
    f.stored.reader.read(f.stored.first + i, count, block, 0);
    return { block, at: 0 };
  }
}
