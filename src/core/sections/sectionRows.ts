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
import type { FileSections } from './sectionVectors.js';

/** Reading saved section rows failed (the file went away, an I/O error, a short read). */
export class SectionRowsError extends UndertoneError {}

/** The rows were read after their source was closed (the index it belonged to was replaced). */
export class SectionRowsClosedError extends SectionRowsError {
  constructor() {
    super('the saved section vectors were closed (the index they belong to was replaced)');
  }
}

/** A source of saved section rows. */
export interface SectionRowReader {
  /** Numbers per row. */
  readonly k: number;
  /** Rows in the source. */
  readonly rows: number;
  /**
   * Copies rows first … first + count − 1 into `into` from element `at` (k numbers a row).
   * @throws SectionRowsError when the rows cannot be read; SectionRowsClosedError after close().
   * @throws InvalidInputError for rows outside the source or an `into` too short.
   */
  read(first: number, count: number, into: Float32Array, at?: number): void;
  /** Gives the source back (idempotent); later reads throw SectionRowsClosedError. */
  close(): void;
  readonly closed: boolean;
}

/** Where one file's rows are: its first row in the reader (its n rows follow). */
export interface StoredRows {
  readonly reader: SectionRowReader;
  readonly first: number;
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
 * A file's sections whose vectors stay in `stored`: `vectors` reads all of the file's rows on each
 * access (a fresh array; rankers read only the rows they need through `stored`).
 */
export function storedSections(starts: Int32Array, ends: Int32Array, titles: readonly string[], stored: StoredRows): FileSections {
  const { reader, first } = stored;
  const n = starts.length;
  if (ends.length !== n || titles.length !== n || first < 0 || first + n > reader.rows)
    throw new InvalidInputError(`stored sections disagree in size (${n} starts, rows ${first}… of ${reader.rows})`);
  return {
    starts,
    ends,
    titles,
    stored,
    get vectors(): Float32Array {
      const out = new Float32Array(n * reader.k);
      reader.read(first, n, out, 0);
      return out;
    },
  };
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
