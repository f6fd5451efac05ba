/**
 * `undertone import-factors <folder> --u U.mtx --s S.txt --v V.mtx [--terms terms.txt] [--files files.txt]`:
 * replaces the saved index's concept model by singular factors computed elsewhere from the
 * matrix that `undertone export` wrote (A = U Σ Vᵀ, terms × files):
 *   U  terms × k, Matrix Market (array or coordinate);
 *   S  k singular values: plain numbers separated by white space, or a Matrix Market vector;
 *   V  files × k, Matrix Market.
 * terms.txt and files.txt (default: beside U, when present) must match the saved index line for
 * line, so factors are never attached to the wrong rows. The factors themselves are checked too
 * (shapes, orthonormal U, fit to the matrix; see core/index/model/importedFactors.ts). Documents are
 * folded in with the new U, exactly as queries are; the saved index is rewritten atomically.
 */
import { createReadStream, existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { InvalidInputError } from '../../core/errors.js';
import { LsiIndex } from '../../core/index/lsiIndex.js';
import { MatrixMarketParser, parseMatrixMarket, toDense, type MatrixMarketData } from '../../core/matrix/matrixMarket.js';
import { modelFromFactors } from '../../core/index/model/importedFactors.js';
import { loadIndex, saveIndex } from '../../node/persist.js';
import { indexFileFrom, type Flags } from '../context.js';
import { fsErrorMessage, isFsError } from '../failure.js';
import type { Io } from '../output.js';
import { EXPORT_FILES, exportedMatrix } from './exportCommand.js';

export async function importFactorsCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const need = (name: 'u' | 's' | 'v'): string => {
    const v = flags[name];
    if (typeof v !== 'string' || v.length === 0)
      throw new InvalidInputError(`import-factors needs --u U.mtx --s S.txt --v V.mtx (missing --${name})`);
    return v;
  };
  const [uPath, sPath, vPath] = [need('u'), need('s'), need('v')];
  const indexFile = indexFileFrom(folder, flags);
  const loaded = await loadIndex(indexFile);
  if (loaded.status !== 'ok') {
    throw new InvalidInputError(
      `there is no usable saved index for ${folder}${loaded.status === 'damaged' ? ` (${loaded.reason})` : ''}; run "undertone export" first`,
    );
  }
  const index = loaded.index;
  const { slots, terms, matrix } = exportedMatrix(index);
  const termsFile = listFile(flags.terms, uPath, EXPORT_FILES.terms);
  const filesFile = listFile(flags.files, uPath, EXPORT_FILES.files);
  if (termsFile) await expectSameLines(termsFile, terms, 'terms');
  if (filesFile)
    await expectSameLines(
      filesFile,
      slots.map((s) => s.meta.path),
      'files',
    );

  const u = await readMatrixFile(uPath, 'U');
  const v = await readMatrixFile(vPath, 'V');
  const s = await readVector(sPath);
  if (u.cols !== v.cols) throw new InvalidInputError(`U has ${u.cols} columns but V has ${v.cols}`);
  if (u.rows !== terms.length)
    throw new InvalidInputError(`U has ${u.rows} rows but the index has ${terms.length} terms (rows of the exported matrix)`);
  if (v.rows !== slots.length)
    throw new InvalidInputError(`V has ${v.rows} rows but the index has ${slots.length} files (columns of the exported matrix)`);
  const { model, report } = modelFromFactors(
    index.model,
    matrix,
    { k: u.cols, u: toDense(u), s, v: toDense(v) },
    index.settings.conceptScaling,
  );
  const next = LsiIndex.assemble(
    index.settings,
    index.vocab,
    model,
    // Named fields, not a spread: a reopened index's slot gives its terms through a getter.
    slots.map((slot) => ({ meta: slot.meta, terms: slot.terms, folded: false, residual: 0 })),
  );
  await saveIndex(indexFile, next);
  const summary = {
    k: report.k,
    orthogonalityError: report.orthogonalityError,
    documentResidual: report.documentResidual,
    termResidual: report.termResidual,
    files: slots.length,
    terms: terms.length,
  };
  if (flags.json) io.out(JSON.stringify(summary));
  else if (!flags.quiet) {
    io.err(
      `imported k=${report.k} factors for ${slots.length} files × ${terms.length} terms ` +
        `(max |UᵀU − I| ${report.orthogonalityError.toExponential(1)}, residuals ${report.documentResidual.toExponential(1)} / ${report.termResidual.toExponential(1)}); saved index updated`,
    );
  }
  return 0;
}

function listFile(flag: unknown, uPath: string, name: string): string | undefined {
  if (typeof flag === 'string') return flag;
  const beside = join(dirname(uPath), name);
  return existsSync(beside) ? beside : undefined;
}

async function expectSameLines(file: string, expected: readonly string[], what: string): Promise<void> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (err) {
    throw new InvalidInputError(`the --${what} file: ${isFsError(err) ? fsErrorMessage(err) : (err as Error).message}`);
  }
  const got = text.split('\n');
  if (got.length > 0 && got[got.length - 1] === '') got.pop();
  const n = Math.max(got.length, expected.length);
  for (let i = 0; i < n; i++) {
    if (got[i] !== expected[i]) {
      throw new InvalidInputError(
        `${file} does not match the saved index's ${what} (line ${i + 1}: "${got[i] ?? '(end of file)'}" vs "${expected[i] ?? '(none)'}"); the folder changed since the export, so export again`,
      );
    }
  }
}

async function readMatrixFile(path: string, name: string): Promise<MatrixMarketData> {
  const parser = new MatrixMarketParser(`${name} (${path})`);
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 20 });
  try {
    for await (const chunk of stream) parser.push(chunk as string);
  } catch (err) {
    throw new InvalidInputError(`cannot read ${path}: ${(err as Error).message}`);
  }
  return parser.end();
}

async function readVector(path: string): Promise<Float64Array> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (err) {
    throw new InvalidInputError(`cannot read ${path}: ${(err as Error).message}`);
  }
  if (text.trimStart().startsWith('%%MatrixMarket')) {
    const m = parseMatrixMarket(text, `S (${path})`);
    if (m.rows !== 1 && m.cols !== 1) throw new InvalidInputError(`S (${path}) must be a vector, not ${m.rows}×${m.cols}`);
    return toDense(m);
  }
  const words = text.split(/\s+/).filter((w) => w.length > 0);
  const s = Float64Array.from(words, Number);
  if (s.some((x) => !Number.isFinite(x))) throw new InvalidInputError(`S (${path}) must hold numbers only`);
  return s;
}
