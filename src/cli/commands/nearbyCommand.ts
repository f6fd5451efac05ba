/** `undertone nearby <folder> <file>`: the files nearest in meaning to one file. */
import { join, relative, resolve } from 'node:path';
import { InvalidInputError, NotIndexedError } from '../../core/errors.js';
import { explainPair, explainSides, type Explanation } from '../../core/explain/explain.js';
import type { SectionHit } from '../../core/sections/sectionStore.js';
import { SurfaceForms } from '../../core/text/surfaceForms.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { explanationJson, explanationLine, round, sectionLabel, sectionSides } from './askCommand.js';
import { nearbySections } from '../../core/sections/sectionSearch.js';

export async function nearbyCommand(folder: string, file: string | undefined, flags: Flags, io: Io): Promise<number> {
  if (!file) throw new InvalidInputError('nearby needs a file: undertone nearby <folder> <file>');
  const top = positiveInt(flags.top, 'top') ?? 10;
  const { index } = await ensureIndex(folder, flags, io);
  // Accept a path relative to the folder, or relative to the current directory.
  const fromCwd = relative(resolve(folder), resolve(file)).split('\\').join('/');
  const key = index.has(file) ? file : index.has(fromCwd) ? fromCwd : undefined;
  if (key === undefined) throw new NotIndexedError(file);
  if (flags.sections || flags.line !== undefined) {
    const line = positiveInt(flags.line ?? '1', 'line')!;
    const near = nearbySections(index, key, line - 1, { top });
    if (!near) throw new InvalidInputError(`"${key}" has no sections in this index (built with --skip-sections?)`);
    const forms = new SurfaceForms({ stem: index.settings.tokenize.stem });
    let why: (h: SectionHit) => Explanation | null = () => null;
    if (flags.explain) {
      const { sides, texts } = await sectionSides(index, folder, [near.from, ...near.hits]);
      const from = sides.get(near.from);
      for (const t of texts) forms.add(t);
      why = (h) => {
        const to = sides.get(h);
        return from && to ? explainSides(index, from, to) : null;
      };
    }
    if (flags.json) {
      const place = (h: typeof near.from) => ({ path: h.path, title: h.title, startLine: h.start + 1, endLine: h.end });
      const results = near.hits.map((h) => {
        const e = why(h);
        return { ...place(h), score: round(h.score), ...(e ? { explain: explanationJson(e, forms) } : {}) };
      });
      io.out(JSON.stringify({ section: place(near.from), results }));
      return 0;
    }
    io.out(`near ${key}: ${sectionLabel(near.from)}`);
    const rows = near.hits.map((h, i) => [String(i + 1), h.score.toFixed(3), `${h.path}:${h.start + 1}`, sectionLabel(h)]);
    const lines = formatTable(['rank', 'score', 'place', 'section'], rows, [true, true, false, false]);
    lines.slice(0, 2).forEach((l) => io.out(l));
    near.hits.forEach((h, i) => {
      io.out(lines[i + 2]);
      const e = why(h);
      if (e) io.out(explanationLine(e, forms));
      else if (flags.explain) io.out('        why: (a file changed since it was indexed; run index again)');
    });
    if (flags.explain && near.hits.length > 0)
      io.out(
        "why: each word's share of the similarity of the two sections (the shares add up to the score); ~ marks a word found in only one of them.",
      );
    return 0;
  }
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
