/**
 * Reading and writing portable concept model files (src/core/model/conceptFile.ts) on disk: reads
 * check every byte (a damaged file is refused with its path in the message); writes are atomic
 * (a temporary name in the same folder, then rename), so a reader never sees half a model.
 */
import { randomBytes } from 'node:crypto';
import { readFile, rename, rm, writeFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { InvalidInputError } from '../core/errors.js';
import { CorruptModelError, decodeConceptFile, encodeConceptFile, type PortableModel } from '../core/index/persistence/conceptFile.js';

export async function readConceptFile(path: string): Promise<PortableModel> {
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (err) {
    throw new InvalidInputError(`cannot read the concept model ${path}: ${(err as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (err as Error).message}`);
  }
  try {
    return decodeConceptFile(bytes);
  } catch (err) {
    if (err instanceof CorruptModelError) throw new CorruptModelError(`${path}: ${err.message}`);
    throw err;
  }
}

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
