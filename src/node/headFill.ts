/**
 * A part of a reopened index's loaded head filled into its place after the load (the node side of
 * serialize.ts' FillGate): the files' term lists (173 MB on the Linux tree) and the model's term
 * vectors (115 MB). The load streams each through the payload checksum and its checks
 * (TermListCheck, the finite-value check) in a small scratch buffer, so its fresh pages are not
 * touched before the index answers; this then reads it again, from the same open descriptor, in
 * the background (reads on the thread pool), and a user that needs it before that has ended
 * finishes the fill at once with positioned synchronous reads (pread). The descriptor keeps the
 * bytes of the file that was checked even when a save renames a new file over the path (as for
 * the section rows, sectionRowFile.ts).
 */
import { readSync } from 'node:fs';
import type { FileHandle } from 'node:fs/promises';
import { UndertoneError } from '../core/errors.js';
import type { FillGate } from '../core/index/persistence/serialize.js';
import { describeFsError } from './scanRead.js';

/** A part filled after the load could not be read back (the index file's descriptor was closed or failed). */
export class HeadFillError extends UndertoneError {}

export class HeadFill implements FillGate {
  /** Bytes filled from the start of `into` by the background reads (none past it are trusted filled). */
  private filled = 0;
  private _done = false;
  private failure: HeadFillError | undefined;

  /**
   * @param handle the index file's open descriptor (owned by the section rows' reader; `closed` says when it is closed).
   * @param into where the part goes: its place in the loaded head.
   * @param position its byte offset in the file.
   * @param what what it is, for messages ("term lists", "term vectors").
   */
  constructor(
    private readonly handle: FileHandle,
    private readonly path: string,
    private readonly into: Uint8Array,
    private readonly position: number,
    private readonly closed: () => boolean,
    private readonly what = 'term lists',
  ) {
    if (into.length === 0) this._done = true;
  }

  get done(): boolean {
    return this._done;
  }

  /**
   * Fills the part in the background, `chunk` bytes a read; resolves when it is in (or ensure()
   * has filled it, or a read failed: ensure() then reports it).
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
        this.failure ??= new HeadFillError(`cannot read the ${this.what} of ${this.path}: ${describeFsError(err)}`);
        return;
      }
      if (this._done) return;
      if (got === 0) {
        this.failure ??= new HeadFillError(`the ${this.what} of ${this.path} end early (the file was cut short)`);
        return;
      }
      this.filled += got;
    }
    this._done = true;
  }

  /**
   * Returns once the part is in, reading what the background has not (a read it has under way is
   * read again: the same bytes).
   * @throws HeadFillError when it cannot be read (the descriptor closed, the file cut short).
   */
  ensure(): void {
    if (this._done) return;
    if (this.failure) throw this.failure;
    if (this.closed()) throw new HeadFillError(`the ${this.what} of ${this.path} were closed (the index they belong to was replaced)`);
    const { into, position } = this;
    for (let at = this.filled; at < into.length;) {
      let got: number;
      try {
        got = readSync(this.handle.fd, into, at, into.length - at, position + at);
      } catch (err) {
        throw (this.failure = new HeadFillError(`cannot read the ${this.what} of ${this.path}: ${describeFsError(err)}`));
      }
      if (got === 0) throw (this.failure = new HeadFillError(`the ${this.what} of ${this.path} end early (the file was cut short)`));
      at += got;
    }
    this.filled = into.length;
    this._done = true;
  }
}
