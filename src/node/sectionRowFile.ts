/**
 * Saved section vectors read from the index file where they lie (the node side of
 * src/core/sections/sectionRows.ts): positioned synchronous reads (pread) of the rows a ranking
 * needs, through a descriptor kept open from the load on. The descriptor stays valid when a save
 * or a rebuild renames a new file over the path (the old file's bytes live on until it is closed),
 * so an index reads the rows of the file it was loaded from until its owner closes them (the
 * worker, when another index replaces it) or the reader is garbage collected.
 */
import { readSync } from 'node:fs';
import type { FileHandle } from 'node:fs/promises';
import { checkRowRange, SectionRowsClosedError, SectionRowsError, type SectionRowReader } from '../core/sections/sectionRows.js';
import type { ByteSpill } from '../core/sections/types.js';
import { describeFsError } from './scanRead.js';

/**
 * ES2021's FinalizationRegistry, declared here: the project's type check includes the web-worker
 * lib file (tsconfig.json), which leaves the ES2021 declarations out. Node has it since 14.6.
 */
declare const FinalizationRegistry: new <T>(cleanup: (held: T) => void) => {
  register(target: object, held: T, token: object): void;
  unregister(token: object): boolean;
};

/** Closes the descriptor of a reader nobody closed once it is unreachable. */
const orphans = new FinalizationRegistry<FileHandle>((handle) => void handle.close().catch(() => undefined));

export class FileSectionRows implements SectionRowReader {
  private _closed = false;

  /**
   * @param handle an open descriptor of the index file (owned from now on: close() closes it).
   * @param path the file's path, for messages.
   * @param offset byte offset of the first row in the file.
   * @param gate called before every read (the check of these bytes, persistCheck.ts: it finishes
   *   the check if it has not ended and throws when the bytes are damaged); close() calls its stop.
   */
  constructor(
    private readonly handle: FileHandle,
    private readonly path: string,
    private readonly offset: number,
    readonly rows: number,
    readonly k: number,
    private readonly gate?: { ensure(): void; stop(): void },
  ) {
    orphans.register(this, handle, this);
  }

  get closed(): boolean {
    return this._closed;
  }

  read(first: number, count: number, into: Float32Array, at = 0): void {
    if (this._closed) throw new SectionRowsClosedError();
    checkRowRange(this, first, count, into, at);
    this.gate?.ensure();
    const rowBytes = 4 * this.k;
    const bytes = new Uint8Array(into.buffer, into.byteOffset + 4 * at, count * rowBytes);
    const position = this.offset + first * rowBytes;
    for (let done = 0; done < bytes.length;) {
      let got: number;
      try {
        got = readSync(this.handle.fd, bytes, done, bytes.length - done, position + done);
      } catch (err) {
        throw new SectionRowsError(`cannot read the section vectors of ${this.path}: ${describeFsError(err)}`);
      }
      if (got === 0) throw new SectionRowsError(`the section vectors of ${this.path} end early (the file was cut short)`);
      done += got;
    }
  }

  /**
   * Other bytes of the same file (`bytes` from byte `offset`: the section lists' saved codes) as a
   * read-only spill; reads fail once this reader is closed. Its close() leaves the descriptor open.
   */
  region(offset: number, bytes: number): ByteSpill {
    return {
      write: () => {
        throw new SectionRowsError(`the saved section codes of ${this.path} are read-only`);
      },
      read: (into, position) => {
        if (this._closed) throw new SectionRowsClosedError();
        if (position < 0 || position + into.length > bytes) throw new SectionRowsError(`the saved section codes of ${this.path} end early`);
        this.gate?.ensure();
        for (let done = 0; done < into.length;) {
          let got: number;
          try {
            got = readSync(this.handle.fd, into, done, into.length - done, offset + position + done);
          } catch (err) {
            throw new SectionRowsError(`cannot read the section codes of ${this.path}: ${describeFsError(err)}`);
          }
          if (got === 0) throw new SectionRowsError(`the section codes of ${this.path} end early (the file was cut short)`);
          done += got;
        }
      },
      close: () => undefined,
    };
  }

  close(): void {
    if (this._closed) return;
    this._closed = true;
    this.gate?.stop();
    orphans.unregister(this);
    void this.handle.close().catch(() => undefined);
  }
}
