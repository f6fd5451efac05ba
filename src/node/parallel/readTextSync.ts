/**
 * The synchronous twin of readIndexableText (scanRead.ts) for tokenizing threads, which have
 * nothing else to do while a file is read: same size cap, same NUL-byte sniff, same lenient
 * UTF-8 decoding, same O_NONBLOCK open, and the same outcomes. One open, fstat, read and close
 * per file, without a trip through the event loop.
 */
import { closeSync, constants, fstatSync, openSync, readSync } from 'node:fs';
import { decodeUtf8, describeFsError, looksBinary, type IndexableText } from '../scanRead.js';

const OPEN_FLAGS = constants.O_RDONLY | (constants.O_NONBLOCK ?? 0);

export function readIndexableTextSync(absPath: string, maxFileBytes: number): IndexableText {
  let fd: number | undefined;
  try {
    fd = openSync(absPath, OPEN_FLAGS);
    const st = fstatSync(fd);
    if (!st.isFile()) return { kind: 'unreadable', message: 'Not a regular file.' };
    if (st.size > maxFileBytes) return { kind: 'too-large' };
    // One byte more than expected, so growth since the stat shows up as a full buffer.
    let buf = Buffer.allocUnsafe(Math.min(st.size, maxFileBytes) + 1);
    let filled = 0;
    for (;;) {
      const n = readSync(fd, buf, filled, buf.length - filled, filled);
      if (n === 0) break;
      filled += n;
      if (filled > maxFileBytes) return { kind: 'too-large' };
      if (filled === buf.length) {
        const bigger = Buffer.allocUnsafe(Math.min(buf.length * 2, maxFileBytes + 1));
        buf.copy(bigger, 0, 0, filled);
        buf = bigger;
      }
    }
    const bytes = buf.subarray(0, filled);
    if (looksBinary(bytes)) return { kind: 'binary' };
    return { kind: 'text', text: decodeUtf8(bytes) };
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
