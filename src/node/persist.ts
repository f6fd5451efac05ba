/**
 * Saving and loading the index file: atomic writes (a temporary file in the same folder, flushed,
 * then renamed over the old one), and loads that report a missing or damaged file instead of
 * trusting it.
 */
import { randomBytes } from 'node:crypto';
import { mkdir, open, rename, rm } from 'node:fs/promises';
import { dirname } from 'node:path';
import { CorruptIndexError } from '../core/errors.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import { decodeIndex, encodeIndex } from '../core/index/persistence/serialize.js';

/** Writes bytes to path so that readers see either the old file or the new one, never a mix. */
export async function writeFileAtomic(path: string, bytes: Uint8Array): Promise<void> {
  await mkdir(dirname(path), { recursive: true });
  const tmp = `${path}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`;
  const handle = await open(tmp, 'w');
  try {
    await handle.writeFile(bytes);
    await handle.sync();
  } catch (err) {
    await handle.close();
    await rm(tmp, { force: true });
    throw err;
  }
  await handle.close();
  try {
    await rename(tmp, path);
  } catch (err) {
    await rm(tmp, { force: true });
    throw err;
  }
}

export async function saveIndex(path: string, index: LsiIndex): Promise<number> {
  const bytes = encodeIndex(index);
  await writeFileAtomic(path, bytes);
  return bytes.length;
}

export type LoadOutcome =
  | { readonly status: 'ok'; readonly index: LsiIndex; readonly bytes: number }
  | { readonly status: 'missing' }
  | { readonly status: 'damaged'; readonly reason: string };

export interface LoadOptions {
  /** Bytes per read call: few calls for a big file, without holding the thread pool for long. */
  readChunkBytes: number;
}

export const DEFAULT_LOAD_OPTIONS: LoadOptions = { readChunkBytes: 32 * 1024 * 1024 };

/**
 * Reads a whole file into a buffer of its own (byte offset 0, so decodeIndex can view its
 * sections in place), in large chunks: fs.readFile reads big files 512 KiB at a time.
 */
async function readWhole(path: string, chunk: number): Promise<Uint8Array> {
  const handle = await open(path, 'r');
  try {
    const size = (await handle.stat()).size;
    const buf = new Uint8Array(new ArrayBuffer(size));
    let done = 0;
    while (done < size) {
      const { bytesRead } = await handle.read(buf, done, Math.min(chunk, size - done), done);
      if (bytesRead === 0) break;
      done += bytesRead;
    }
    return done === size ? buf : buf.subarray(0, done);
  } finally {
    await handle.close();
  }
}

/** Loads a saved index; a missing, damaged, truncated or older file is reported, never trusted. */
export async function loadIndex(path: string, options: Partial<LoadOptions> = {}): Promise<LoadOutcome> {
  const chunk = Math.max(1, Math.floor(options.readChunkBytes ?? DEFAULT_LOAD_OPTIONS.readChunkBytes));
  let bytes: Uint8Array;
  try {
    bytes = await readWhole(path, chunk);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { status: 'missing' };
    return { status: 'damaged', reason: `cannot read ${path}: ${(err as Error).message}` };
  }
  try {
    return { status: 'ok', index: decodeIndex(bytes), bytes: bytes.length };
  } catch (err) {
    if (err instanceof CorruptIndexError) return { status: 'damaged', reason: err.message };
    throw err;
  }
}
