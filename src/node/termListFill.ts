/**
 * The files' term lists of a reopened index, filled into their place in the loaded head after the
 * load (the node side of serialize.ts' TermListGate). The load streams them through the payload
 * checksum and TermListCheck in a small scratch buffer, so their 173 MB (on the Linux tree) of
 * fresh pages are not touched before the index answers; this then reads them again, from the same
 * open descriptor, in the background (reads on the thread pool), and a slot asked for its terms
 * before that has ended finishes the fill at once with positioned synchronous reads (pread). The
 * descriptor keeps the bytes of the file that was checked even when a save renames a new file over
 * the path (as for the section rows, sectionRowFile.ts).
 */
import { readSync } from 'node:fs';
import type { FileHandle } from 'node:fs/promises';
import { UndertoneError } from '../core/errors.js';
import type { TermListGate } from '../core/index/persistence/serialize.js';
import { describeFsError } from './scanRead.js';

/** The term lists could not be read back after the load (the index file's descriptor was closed or failed). */
export class TermListsError extends UndertoneError {}

export class TermListFill implements TermListGate {
  /** Bytes filled from the start of `into` by the background reads (none past it are trusted filled). */
  private filled = 0;
  private _done = false;
  private failure: TermListsError | undefined;

  /**
   * @param handle the index file's open descriptor (owned by the section rows' reader; `closed` says when it is closed).
   * @param into where the lists go: their place in the loaded head.
   * @param position their byte offset in the file.
   */
  constructor(
    private readonly handle: FileHandle,
    private readonly path: string,
    private readonly into: Uint8Array,
    private readonly position: number,
    private readonly closed: () => boolean,
  ) {
    if (into.length === 0) this._done = true;
  }

  get done(): boolean {
    return this._done;
  }

  /**
   * Fills the lists in the background, `chunk` bytes a read; resolves when they are in (or ensure()
   * has filled them, or a read failed: ensure() then reports it).
   */
  async start(chunk: number): Promise<void> {
    const { into, position } = this;
    while (!this._done && this.filled < into.length) {
      if (this.closed()) return;
      const length = Math.min(chunk, into.length - this.filled);
      let got: number;
      try {
        ({ bytesRead: got } = await this.handle.read(into, this.filled, length, position + this.filled));
      } catch (err) {
        this.failure ??= new TermListsError(`cannot read the term lists of ${this.path}: ${describeFsError(err)}`);
        return;
      }
      if (this._done) return;
      if (got === 0) {
        this.failure ??= new TermListsError(`the term lists of ${this.path} end early (the file was cut short)`);
        return;
      }
      this.filled += got;
    }
    this._done = true;
  }

  /**
   * Returns once the lists are in, reading what the background has not (a read it has under way is
   * read again: the same bytes).
   * @throws TermListsError when they cannot be read (the descriptor closed, the file cut short).
   */
  ensure(): void {
    if (this._done) return;
    if (this.failure) throw this.failure;
    if (this.closed()) throw new TermListsError(`the term lists of ${this.path} were closed (the index they belong to was replaced)`);
    const { into, position } = this;
    for (let at = this.filled; at < into.length;) {
      let got: number;
      try {
        got = readSync(this.handle.fd, into, at, into.length - at, position + at);
      } catch (err) {
        throw (this.failure = new TermListsError(`cannot read the term lists of ${this.path}: ${describeFsError(err)}`));
      }
      if (got === 0) throw (this.failure = new TermListsError(`the term lists of ${this.path} end early (the file was cut short)`));
      at += got;
    }
    this.filled = into.length;
    this._done = true;
  }
}
