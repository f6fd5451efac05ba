/**
 * Reading and writing portable concept model files (src/core/model/conceptFile.ts) on disk: reads
 * check every byte (a damaged file is refused with its path in the message); writes are atomic
 * (a temporary name in the same folder, then rename), so a reader never sees half a model.
 */
import { randomBytes } from 'node:crypto';
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { readFile, rename, rm, writeFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { InvalidInputError } from '../core/errors.js';
import { CorruptModelError, decodeConceptFile, encodeConceptFile, type PortableModel } from '../core/index/persistence/conceptFile.js';

export async function readConceptFile(path: string): Promise<PortableModel> {
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (err) {
    throw new InvalidInputError(
      `cannot read the concept model ${path}: ${(err as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (err as Error).message}`,
    );
  }
  try {
    return decodeConceptFile(bytes);
  } catch (err) {
    if (err instanceof CorruptModelError) throw new CorruptModelError(`${path}: ${err.message}`);
    throw err;
  }
}

/**
 * The settings entry of a shared model file, from its last four bytes (its CRC-32, which
 * sharedModelKey uses) without reading the rest; 'unreadable' when the file cannot be read (the
 * build then fails with the reason).
 */
export function sharedModelSetting(path: string): { path: string; key: string } {
  const abs = resolve(path);
  try {
    const fd = openSync(abs, 'r');
    try {
      const size = fstatSync(fd).size;
      const tail = Buffer.alloc(4);
      if (size < 24 || readSync(fd, tail, 0, 4, size - 4) !== 4) return { path: abs, key: 'unreadable' };
      return { path: abs, key: tail.readUInt32LE(0).toString(16).padStart(8, '0') };
    } finally {
      closeSync(fd);
    }
  } catch {
    return { path: abs, key: 'unreadable' };
  }
}

/** Reads a shared model for a build, checking that it is the model the settings name. */
export async function readSharedModel(setting: { path: string; key: string }): Promise<PortableModel> {
  const model = await readConceptFile(setting.path);
  if (sharedModelKeyOf(model) !== setting.key)
    throw new InvalidInputError(`the concept model ${setting.path} changed while it was being read; try again`);
  return model;
}

const sharedModelKeyOf = (m: PortableModel): string => m.checksum.toString(16).padStart(8, '0');

export async function writeConceptFile(path: string, model: Omit<PortableModel, 'checksum'>): Promise<number> {
  const target = resolve(path);
  const bytes = encodeConceptFile(model);
  const tmp = `${target}.${randomBytes(4).toString('hex')}.tmp`;
  try {
    await writeFile(tmp, bytes);
    await rename(tmp, target);
  } catch (err) {
    await rm(tmp, { force: true });
    throw new InvalidInputError(`cannot write ${target}: ${(err as Error).message}`);
  }
  return bytes.length;
}
