/**
 * Reads one file for indexing: size cap, binary sniff, lenient UTF-8 decoding.
 *
 * - Binary test: a NUL byte in the first 8 KiB. This is the heuristic git uses
 *   (xdiff-interface.c `buffer_is_binary`, which looks at the first 8000 bytes); UTF-16 text,
 *   which is full of NUL bytes, is therefore treated as binary too.
 * - Decoding: WHATWG TextDecoder for UTF-8 with fatal: false, so each invalid byte sequence
 *   becomes U+FFFD instead of an error, and with ignoreBOM: false, so a leading BOM is dropped.
 * - The file is opened with O_NONBLOCK so that a FIFO named like a source file can't block the
 *   thread; anything that is not a regular file is reported as unreadable.
 */

import { constants } from 'node:fs';
import { open, type FileHandle } from 'node:fs/promises';
import { InvalidInputError } from '../core/errors.js';

/** Bytes inspected for a NUL byte (common practice; git inspects 8000). */
export const BINARY_SNIFF_BYTES = 8192;

/** Outcome of reading one file for the index. */
export type IndexableText =
  | { readonly kind: 'text'; readonly text: string }
  | { readonly kind: 'binary' }
  | { readonly kind: 'too-large' }
  | { readonly kind: 'unreadable'; readonly message: string };

const OPEN_FLAGS = constants.O_RDONLY | (constants.O_NONBLOCK ?? 0);

/**
 * Reads `absPath` and returns its text, or why it has none. Never throws for file-system
 * trouble (missing file, permissions, a folder, a device): that comes back as `unreadable`.
 * @param maxFileBytes files larger than this are `too-large` without being read.
 */
export async function readIndexableText(absPath: string, maxFileBytes: number): Promise<IndexableText> {
  checkByteCap(maxFileBytes);
  let handle: FileHandle | undefined;
  try {
    handle = await open(absPath, OPEN_FLAGS);
    const st = await handle.stat();
    if (!st.isFile()) return { kind: 'unreadable', message: 'Not a regular file.' };
    if (st.size > maxFileBytes) return { kind: 'too-large' };
    const bytes = await readUpTo(handle, st.size, maxFileBytes);
    if (bytes === undefined) return { kind: 'too-large' }; // grew past the cap since stat
    if (looksBinary(bytes)) return { kind: 'binary' };
    return { kind: 'text', text: decodeUtf8(bytes) };
  } catch (err) {
    return { kind: 'unreadable', message: describeFsError(err) };
  } finally {
    await handle?.close().catch(() => undefined);
  }
}

/** True when the first BINARY_SNIFF_BYTES bytes hold a NUL byte. */
export function looksBinary(bytes: Uint8Array): boolean {
  const n = Math.min(bytes.length, BINARY_SNIFF_BYTES);
  for (let i = 0; i < n; i++) if (bytes[i] === 0) return true;
  return false;
}

/** UTF-8 to string: invalid sequences become U+FFFD, a leading BOM is removed. */
export function decodeUtf8(bytes: Uint8Array): string {
  return new TextDecoder('utf-8', { fatal: false, ignoreBOM: false }).decode(bytes);
}

/** Throws InvalidInputError unless `n` is a positive safe integer. */
export function checkByteCap(n: number): void {
  if (!Number.isSafeInteger(n) || n <= 0) {
    throw new InvalidInputError(`maxFileBytes must be a positive whole number of bytes, got ${String(n)}.`);
  }
}

/** A short human message for a Node file-system error. */
export function describeFsError(err: unknown): string {
  const e = err as NodeJS.ErrnoException;
  if (e && typeof e.code === 'string' && !e.message.startsWith(e.code)) return `${e.code}: ${e.message}`;
  return err instanceof Error ? err.message : String(err);
}

/** Reads to end of file; undefined if the file turns out to hold more than `cap` bytes. */
async function readUpTo(handle: FileHandle, expected: number, cap: number): Promise<Uint8Array | undefined> {
  // One byte more than expected, so growth since the stat shows up as a full buffer.
  let buf = Buffer.allocUnsafe(Math.min(expected, cap) + 1);
  let filled = 0;
  for (;;) {
    const { bytesRead } = await handle.read(buf, filled, buf.length - filled, filled);
    if (bytesRead === 0) return buf.subarray(0, filled);
    filled += bytesRead;
    if (filled > cap) return undefined;
    if (filled === buf.length) {
      const bigger = Buffer.allocUnsafe(Math.min(buf.length * 2, cap + 1));
      buf.copy(bigger, 0, 0, filled);
      buf = bigger;
    }
  }
}
