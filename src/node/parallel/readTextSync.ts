/**
 * The synchronous twin of readIndexableText (scanRead.ts) for tokenizing threads, which have
 * nothing else to do while a file is read: same size cap, same NUL-byte sniff, same O_NONBLOCK
 * open, and the same outcomes. One open, fstat, read and close per file, without a trip through
 * the event loop, into one buffer reused from file to file (FileReader). The bytes are handed
 * back undecoded: an all-ASCII file (most of them) is counted from its bytes, anything else is
 * decoded as readIndexableText decodes it (decodeUtf8: lenient UTF-8, a leading BOM dropped).
 */
import { isAscii } from 'node:buffer';
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import { describeFsError, looksBinary, type IndexableText } from '../scanRead.js';

const OPEN_FLAGS = constants.O_RDONLY | (constants.O_NONBLOCK ?? 0);

/** A file's bytes (valid until the reader's next read), or why it has none. */
export type IndexableBytes =
  { readonly kind: 'bytes'; readonly bytes: Buffer; readonly ascii: boolean } | Exclude<IndexableText, { kind: 'text' }>;

export class FileReader {
  private buf = Buffer.allocUnsafe(1 << 16);

  read(absPath: string, maxFileBytes: number): IndexableBytes {
    let fd: number | undefined;
    try {
      fd = openSync(absPath, OPEN_FLAGS);
      const st = fstatSync(fd);
      if (!st.isFile()) return { kind: 'unreadable', message: 'Not a regular file.' };
      if (st.size > maxFileBytes) return { kind: 'too-large' };
      // One byte more than expected, so growth since the stat shows up as a full buffer.
      this.reserve(Math.min(st.size, maxFileBytes) + 1, 0);
      let filled = 0;
      let want = Math.min(st.size, maxFileBytes) + 1;
      for (;;) {
        const n = readSync(fd, this.buf, filled, want - filled, filled);
        if (n === 0) break;
        filled += n;
        if (filled > maxFileBytes) return { kind: 'too-large' };
        if (filled === want) {
          want = Math.min(want * 2, maxFileBytes + 1);
          this.reserve(want, filled);
        }
      }
      const bytes = this.buf.subarray(0, filled);
      if (looksBinary(bytes)) return { kind: 'binary' };
      return { kind: 'bytes', bytes, ascii: isAscii(bytes) };
    } catch (err) {
      return { kind: 'unreadable', message: describeFsError(err) };
    } finally {
      if (fd !== undefined) {
        try {
          closeSync(fd);
        } catch {
          // already closed or never usable: nothing to do
        }
      }
    }
  }

  private reserve(n: number, keep: number): void {
    if (n <= this.buf.length) return;
    const bigger = Buffer.allocUnsafe(Math.max(n, this.buf.length * 2));
    this.buf.copy(bigger, 0, 0, keep);
    this.buf = bigger;
  }
}
