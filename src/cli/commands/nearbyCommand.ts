/** `undertone nearby <folder> <file>`: the files nearest in meaning to one file. */
import { join, relative, resolve } from 'node:path';
import { InvalidInputError, NotIndexedError } from '../../core/errors.js';
import { explainPair } from '../../core/explain/explain.js';
import { SurfaceForms } from '../../core/text/surfaceForms.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { explanationJson, explanationLine, round } from './askCommand.js';

export async function nearbyCommand(folder: string, file: string | undefined, flags: Flags, io: Io): Promise<number> {
  if (!file) throw new InvalidInputError('nearby needs a file: undertone nearby <folder> <file>');
  const top = positiveInt(flags.top, 'top') ?? 10;
  const { index } = await ensureIndex(folder, flags, io);
  // Accept a path relative to the folder, or relative to the current directory.
  const fromCwd = relative(resolve(folder), resolve(file)).split('\\').join('/');
  const key = index.has(file) ? file : index.has(fromCwd) ? fromCwd : undefined;
  if (key === undefined) throw new NotIndexedError(file);
  const hits = index.nearby(key, { top });
  const forms = new SurfaceForms({ stem: index.settings.tokenize.stem });
  if (flags.explain) {
    // Readable words for the stems: read the file and its neighbours (unreadable ones keep stems).
    for (const p of [key, ...hits.map((h) => h.path)]) {
      const got = await readIndexableText(join(resolve(folder), p), DEFAULT_MAX_FILE_BYTES).catch(() => null);
      if (got?.kind === 'text') forms.add(got.text);
    }
  }
  const why = (path: string) => (flags.explain ? explainPair(index, key, path) : null);
  if (flags.json) {
    const results = hits.map((h) => {
      const e = why(h.path);
      return { path: h.path, score: round(h.score), ...(e ? { explain: explanationJson(e, forms) } : {}) };
    });
    io.out(JSON.stringify({ file: key, results }));
    return 0;
  }
  const rows = hits.map((h, i) => [String(i + 1), h.score.toFixed(3), h.path]);
  const lines = formatTable(['rank', 'score', 'path'], rows, [true, true, false]);
  lines.slice(0, 2).forEach((l) => io.out(l));
  hits.forEach((h, i) => {
    io.out(lines[i + 2]);
    const e = why(h.path);
    if (e) io.out(explanationLine(e, forms));
  });
  if (flags.explain && hits.length > 0)
    io.out("why: each word's share of the similarity (the shares add up to the score); ~ marks a word found in only one of the two files.");
  return 0;
}
