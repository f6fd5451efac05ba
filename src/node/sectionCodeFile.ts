/**
 * Scratch files for bytes kept out of memory (the node side of ByteSpill in
 * src/core/sections/types.ts: the section lists' 8-bit codes of a large reopened index whose lists
 * are filed anew — a format-4 file, or after many edits; a format-5 file's saved codes are read
 * from the index file itself — written once when the lists are filed and read back in runs per
 * request; and a large build's section counts during the SVD and its section vectors from the
 * fold on: parkedSections.ts, foldCountedSections's spill). Each is created beside the
 * index file (on the same disk, not in a temporary folder that may live in memory), opened, and
 * its name removed at once, so nothing is left behind even if the process dies; the space goes
 * when the descriptor is closed (by the owner, or once the spill is garbage collected). Where the
 * folder takes no new file, openSpillBeside gives null and the codes stay in memory.
 */
import { randomBytes } from 'node:crypto';
import { closeSync, openSync, readSync, unlinkSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { SectionRowsClosedError, SectionRowsError } from '../core/sections/sectionRows.js';
import type { ByteSpill, OpenSpill } from '../core/sections/types.js';
import { describeFsError } from './scanRead.js';

/**
 * ES2021's FinalizationRegistry, declared here as in sectionRowFile.ts (the project's type check
 * leaves the ES2021 declarations out). Node has it since 14.6.
 */
declare const FinalizationRegistry: new <T>(cleanup: (held: T) => void) => {
  register(target: object, held: T, token: object): void;
  unregister(token: object): boolean;
};

interface Held {
  fd: number;
  /** The name while it still exists (it could not be removed while open), else null. */
  path: string | null;
}

const release = (held: Held): void => {
  try {
    closeSync(held.fd);
  } catch {
    // already closed
  }
  if (held.path)
    try {
      unlinkSync(held.path);
    } catch {
      // gone already
    }
};

const orphans = new FinalizationRegistry<Held>(release);

export class FileSpill implements ByteSpill {
  private readonly _held: Held;
  private _closed = false;

  /**
   * Creates an empty scratch file in `folder`. @throws the file system's error when it cannot.
   * @param what the file in messages.
   */
  constructor(
    folder: string,
    private readonly what = "the section lists' scratch file",
  ) {
    const path = join(folder, `.undertone-scratch.${process.pid}.${randomBytes(4).toString('hex')}`);
    const fd = openSync(path, 'wx+', 0o600);
    let left: string | null = path;
    try {
      unlinkSync(path);
      left = null;
    } catch {
      // Some systems keep an open file's name: it is removed on close instead.
    }
    this._held = { fd, path: left };
    orphans.register(this, this._held, this);
  }

  write(bytes: Uint8Array, position: number): void {
    if (this._closed) throw new SectionRowsClosedError();
    for (let done = 0; done < bytes.length;) {
      try {
        done += writeSync(this._held.fd, bytes, done, bytes.length - done, position + done);
      } catch (err) {
        throw new SectionRowsError(`cannot write ${this.what}: ${describeFsError(err)}`);
      }
    }
  }

  read(into: Uint8Array, position: number): void {
    if (this._closed) throw new SectionRowsClosedError();
    for (let done = 0; done < into.length;) {
      let got: number;
      try {
        got = readSync(this._held.fd, into, done, into.length - done, position + done);
      } catch (err) {
        throw new SectionRowsError(`cannot read ${this.what}: ${describeFsError(err)}`);
      }
      if (got === 0) throw new SectionRowsError(`${this.what} ends early`);
      done += got;
    }
  }

  close(): void {
    if (this._closed) return;
    this._closed = true;
    orphans.unregister(this);
    release(this._held);
  }
}

/**
 * Opens spills in `folder` (null where it takes no new file: the caller keeps the bytes in memory).
 * @param what the files in messages.
 */
export function openSpillBeside(folder: string, what?: string): OpenSpill {
  return () => {
    try {
      return new FileSpill(folder, what);
    } catch {
      return null;
    }
  };
}
