/**
 * Saving and loading the index file: atomic writes (a temporary file in the same folder, flushed,
 * then renamed over the old one), and loads that report a missing or damaged file instead of
 * trusting it.
 */
import { randomBytes } from 'node:crypto';
import { mkdir, open, readFile, rename, rm } from 'node:fs/promises';
import { dirname } from 'node:path';
import { CorruptIndexError } from '../core/errors.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import { decodeIndex, encodeIndex } from '../core/index/serialize.js';

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

/** Loads a saved index; a missing, damaged, truncated or older file is reported, never trusted. */
export async function loadIndex(path: string): Promise<LoadOutcome> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { status: 'missing' };
    return { status: 'damaged', reason: `cannot read ${path}: ${(err as Error).message}` };
  }
  try {
    const u8 = new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    return { status: 'ok', index: decodeIndex(u8), bytes: bytes.length };
  } catch (err) {
    if (err instanceof CorruptIndexError) return { status: 'damaged', reason: err.message };
    throw err;
  }
}
