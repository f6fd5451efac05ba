/**
 * `undertone export <folder> --format model --out FILE` writes the index's concept model as one
 * portable file (src/core/model/conceptFile.ts) that other machines can import-model.
 * `undertone export <folder> --format mtx --out <dir>`: the folder's weighted term-document
 * matrix in Matrix Market coordinate format (NIST IR 5935), for decomposing a very large corpus
 * elsewhere (a cluster engine, scipy, …) and loading the factors back with `import-factors`.
 * Files written in <dir>:
 *   matrix.mtx        A, terms × files, the index's weighting (frozen global weights, unit columns);
 *   terms.txt         one term per line: row i of A is line i;
 *   files.txt         one path per line: column j of A is line j;
 *   singular-values.txt  the index's own leading singular values, one per line (for comparison).
 */
import { createWriteStream } from 'node:fs';
import { join, resolve } from 'node:path';
import { once } from 'node:events';
import { InvalidInputError } from '../../core/errors.js';
import { modelMatrix } from '../../core/index/model/conceptModel.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import type { DocSlot } from '../../core/index/lsiIndex.js';
import { coordinateChunks } from '../../core/matrix/matrixMarket.js';
import { portableFromIndex } from '../../core/index/model/portableFromIndex.js';
import { writeConceptFile } from '../../node/conceptModelFile.js';
import type { CsrMatrix } from '../../core/matrix/sparse.js';
import { checkWritableFile, ensureFolder } from '../../node/persist.js';
import { ensureIndex, type Flags } from '../context.js';
import { formatCount, type Io } from '../output.js';

export const EXPORT_FILES = {
  matrix: 'matrix.mtx',
  terms: 'terms.txt',
  files: 'files.txt',
  singularValues: 'singular-values.txt',
} as const;

export async function exportCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const format = typeof flags.format === 'string' ? flags.format : 'mtx';
  if (format !== 'mtx' && format !== 'model')
    throw new InvalidInputError(`--format must be mtx (Matrix Market) or model (a concept model file), got "${format}"`);
  if (typeof flags.out !== 'string' || flags.out.length === 0)
    throw new InvalidInputError(
      `export needs --out ${format === 'model' ? '<file>, the concept model file' : '<dir>, the folder'} to write`,
    );
  const out = resolve(flags.out);
  await ensureFolder(out); // before the build, not after it
  await checkWritableFile(join(out, EXPORT_FILES.matrix));
  const { index } = await ensureIndex(folder, flags, io);
  if (format === 'model') {
    const bytes = await writeConceptFile(out, portableFromIndex(index, { withFiles: true }));
    if (flags.json) io.out(JSON.stringify({ out, bytes, k: index.k, terms: index.model.keptIds.length, files: index.size }));
    else if (!flags.quiet)
      io.err(
        `wrote the concept model (k=${index.k}, ${formatCount(index.model.keptIds.length)} terms, ${formatCount(index.size)} files) to ${out}`,
      );
    return 0;
  }
  const written = await writeExport(index, out);
  if (flags.json) io.out(JSON.stringify({ out, ...written }));
  else if (!flags.quiet) {
    io.err(
      `exported ${formatCount(written.terms)} terms × ${formatCount(written.files)} files, ${formatCount(written.nonZeros)} non-zeros to ${out}`,
    );
  }
  return 0;
}

/** The index's live documents (slot order) and their weighted matrix under the frozen model. */
export function exportedMatrix(index: LsiIndex): { slots: DocSlot[]; terms: string[]; matrix: CsrMatrix } {
  const slots = index.slots().filter((s): s is DocSlot => s !== null);
  const matrix = modelMatrix(
    index.model,
    slots.map((s) => s.terms),
  );
  const terms = Array.from(index.model.keptIds, (id) => index.vocab.termOf(id));
  return { slots, terms, matrix };
}

export async function writeExport(index: LsiIndex, out: string): Promise<{ terms: number; files: number; nonZeros: number }> {
  await ensureFolder(out);
  const { slots, terms, matrix } = exportedMatrix(index);
  for (const t of terms)
    if (/[\r\n]/.test(t)) throw new InvalidInputError('a term contains a line break and cannot be exported one per line');
  for (const s of slots)
    if (/[\r\n]/.test(s.meta.path))
      throw new InvalidInputError(`the path "${s.meta.path}" contains a line break and cannot be exported one per line`);
  const comments = [
    'Undertone weighted term-document matrix: rows are terms (terms.txt), columns are files (files.txt)',
    `weighting ${index.model.scheme}, each file's column scaled to unit length`,
  ];
  await writeChunks(join(out, EXPORT_FILES.matrix), coordinateChunks(matrix, { transpose: true, comments }));
  await writeChunks(join(out, EXPORT_FILES.terms), lines(terms));
  await writeChunks(join(out, EXPORT_FILES.files), lines(slots.map((s) => s.meta.path)));
  await writeChunks(join(out, EXPORT_FILES.singularValues), lines(Array.from(index.model.singularValues, String)));
  return { terms: matrix.cols, files: matrix.rows, nonZeros: matrix.indptr[matrix.rows] };
}

function* lines(items: readonly string[]): Generator<string> {
  for (let i = 0; i < items.length; i += 4096) yield `${items.slice(i, i + 4096).join('\n')}\n`;
}

/** Streams text chunks to a file, waiting when the stream's buffer is full. */
export async function writeChunks(path: string, chunks: Iterable<string>): Promise<void> {
  const stream = createWriteStream(path, { encoding: 'utf8' });
  const failed = once(stream, 'error').then(([err]) => Promise.reject(err as Error));
  failed.catch(() => undefined);
  for (const chunk of chunks) {
    if (!stream.write(chunk)) await Promise.race([once(stream, 'drain'), failed]);
  }
  stream.end();
  await Promise.race([once(stream, 'finish'), failed]);
}
