/**
 * What a section is: a run of a file's lines a person would recognise (a heading and its text, a
 * top-level declaration of code, or a window of lines), with a title to show.
 */

export interface Section {
  /** Zero-based first line. */
  readonly start: number;
  /** Zero-based line after the last one (exclusive). */
  readonly end: number;
  /** What a person would call it: the heading's text, the declaration's name, or "lines a–b". */
  readonly title: string;
}

/** How a file was cut. */
export type SectionKind = 'headings' | 'code' | 'window';

export interface SectionOptions {
  /** Lines per window for files without headings or declarations. @default 60 */
  readonly windowLines: number;
  /** Lines shared by consecutive windows. @default 15 */
  readonly windowOverlap: number;
  /** A section longer than this is cut into windows of its own (titles keep the name). @default 200 */
  readonly maxLines: number;
  /** A section shorter than this joins the one before it (unless it is the first). @default 3 */
  readonly minLines: number;
  /** Sections per file at most; the rest joins the last one (keeps a generated file small). @default 400 */
  readonly maxSections: number;
}

/**
 * Defaults: common practice for passage retrieval (windows of a few dozen lines overlapping by a
 * quarter, as in passage-level retrieval of long documents, Callan 1994, "Passage-level evidence in
 * document retrieval", SIGIR), not fitted to any collection.
 */
export const DEFAULT_SECTION_OPTIONS: SectionOptions = {
  windowLines: 60,
  windowOverlap: 15,
  maxLines: 200,
  minLines: 3,
  maxSections: 400,
};

/** A source of saved section rows. */
export interface SectionRowReader {
  /** Numbers per row. */
  readonly k: number;
  /** Rows in the source. */
  readonly rows: number;
  /**
   * Copies rows first … first + count − 1 into `into` from element `at` (k numbers a row).
   * @throws SectionRowsError when the rows cannot be read; SectionRowsClosedError after close() (sectionRows.ts).
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

/** The sections of one file: parallel arrays, f32 vectors (k per section). */
export interface FileSections {
  /** Zero-based first line of each section. */
  readonly starts: Int32Array;
  /** Zero-based line after each section's last. */
  readonly ends: Int32Array;
  readonly titles: readonly string[];
  /**
   * Unit concept vectors, k per section (zeros for a section without a model term). With `stored`,
   * a fresh copy read from there on each access.
   */
  readonly vectors: Float32Array;
  /**
   * Where the vectors stay when they are not held in memory (a reopened index, or a large build's
   * scratch file: sectionRows.ts).
   */
  readonly stored?: StoredRows;
}

/**
 * Bytes kept out of memory (a ranker's codes, a large build's section counts and rows): written at
 * positions, read back in runs (the node side is a
 * scratch file of its own: src/node/sectionCodeFile.ts). Only ever read where it was written.
 */
export interface ByteSpill {
  /** Writes all of `bytes` at byte `position`. @throws SectionRowsError when it cannot. */
  write(bytes: Uint8Array, position: number): void;
  /** Fills `into` from byte `position`. @throws SectionRowsError when it cannot (closed: SectionRowsClosedError). */
  read(into: Uint8Array, position: number): void;
  /** Gives the space back (idempotent). */
  close(): void;
}

/** Opens an empty spill, or returns null where none can be had (the caller then keeps the bytes in memory). */
export type OpenSpill = () => ByteSpill | null;
