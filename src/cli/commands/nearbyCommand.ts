/** `undertone nearby <folder> <file>`: the files nearest in meaning to one file. */
import { relative, resolve } from 'node:path';
import { InvalidInputError, NotIndexedError } from '../../core/errors.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { round } from './askCommand.js';

export async function nearbyCommand(folder: string, file: string | undefined, flags: Flags, io: Io): Promise<number> {
  if (!file) throw new InvalidInputError('nearby needs a file: undertone nearby <folder> <file>');
  const top = positiveInt(flags.top, 'top') ?? 10;
  const { index } = await ensureIndex(folder, flags, io);
  // Accept a path relative to the folder, or relative to the current directory.
  const fromCwd = relative(resolve(folder), resolve(file)).split('\\').join('/');
  const key = index.has(file) ? file : index.has(fromCwd) ? fromCwd : undefined;
  if (key === undefined) throw new NotIndexedError(file);
  const hits = index.nearby(key, { top });
  if (flags.json) {
    io.out(JSON.stringify({ file: key, results: hits.map((h) => ({ path: h.path, score: round(h.score) })) }));
    return 0;
  }
  const rows = hits.map((h, i) => [String(i + 1), h.score.toFixed(3), h.path]);
  for (const line of formatTable(['rank', 'score', 'path'], rows, [true, true, false])) io.out(line);
  return 0;
}
