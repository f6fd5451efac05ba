/**
 * `undertone links <folder> [<file>]`: suggested links (core/links): for one note, or for every
 * note of the folder, the notes nearest in meaning that are not linked with it either way, each
 * with its similarity (concept cosine), the words behind it and the link to write, in the collection's own style.
 * Notes are the indexed Markdown, HTML and plain-text files; their links are read again here.
 * --top N: suggestions per note (default 5); --min-similarity S: the least similarity (default
 * the calibrated one, core/links/suggestLinks.ts).
 */
import { join, relative, resolve } from 'node:path';
import { InvalidInputError, NotIndexedError } from '../../core/errors.js';
import type { TermShare } from '../../core/explain/explain.js';
import { LinkGraph, type NoteText } from '../../core/links/linkGraph.js';
import { detectLinkStyle, formatLink, type StyleVerdict } from '../../core/links/linkStyle.js';
import { NoteCatalogue } from '../../core/links/noteCatalogue.js';
import { DEFAULT_SUGGEST_OPTIONS, suggestAllLinks, suggestLinks, type CollectionSuggestion } from '../../core/links/suggestLinks.js';
import { SurfaceForms } from '../../core/text/surfaceForms.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { round } from './askCommand.js';

export async function linksCommand(folder: string, file: string | undefined, flags: Flags, io: Io): Promise<number> {
  const top = positiveInt(flags.top, 'top') ?? DEFAULT_SUGGEST_OPTIONS.top;
  const minSimilarity = parseMinSimilarity(flags['min-similarity']);
  const { index } = await ensureIndex(folder, flags, io);
  const root = resolve(folder);
  const maxBytes = positiveInt(flags['max-file-size'], 'max-file-size') ?? DEFAULT_MAX_FILE_BYTES;
  const catalogue = new NoteCatalogue();
  let key: string | undefined;
  if (file !== undefined) {
    const fromCwd = relative(root, resolve(file)).split('\\').join('/');
    key = index.has(file) ? file : index.has(fromCwd) ? fromCwd : undefined;
    if (key === undefined) throw new NotIndexedError(file);
    if (!catalogue.isNote(key))
      throw new InvalidInputError(`links suggests links between notes (Markdown, HTML or text files); "${key}" is not one`);
  }
  const notes: NoteText[] = [];
  for (const path of index.paths()) {
    if (!catalogue.isNote(path)) continue;
    const got = await readIndexableText(join(root, path), maxBytes).catch(() => null);
    if (got?.kind === 'text') notes.push({ key: path, text: got.text });
  }
  const graph = LinkGraph.fromNotes(notes);
  const style = detectLinkStyle(graph);
  const forms = new SurfaceForms({ stem: index.settings.tokenize.stem });
  const options = { top, minSimilarity };
  const found: CollectionSuggestion[] =
    key === undefined
      ? suggestAllLinks(index, graph, options)
      : suggestLinks(index, graph, key, options).map((s) => ({ ...s, from: key! }));
  const wanted = new Set(found.flatMap((s) => [s.from, s.path]));
  for (const n of notes) if (wanted.has(n.key)) forms.add(n.text);
  const words = (terms: readonly TermShare[]) => terms.map((t) => ({ word: forms.wordFor(t.term), share: t.share, inBoth: t.inBoth }));
  if (flags.json) {
    io.out(
      JSON.stringify({
        ...(key === undefined ? {} : { file: key }),
        style: style.style,
        styleCounts: { markdown: style.markdown, doubleBracket: style.doubleBracket },
        notes: graph.notes.size,
        linkedPairs: graph.pairCount,
        minSimilarity,
        suggestions: found.map((s) => ({
          file: s.from,
          path: s.path,
          title: graph.notes.titleOf(s.path),
          similarity: round(s.similarity),
          score: round(s.score),
          link: formatLink(style.style, s.from, s.path, graph),
          words: words(s.terms).map((w) => ({ ...w, share: round(w.share) })),
        })),
      }),
    );
    return 0;
  }
  io.out(header(style, graph, minSimilarity));
  if (found.length === 0) {
    io.out(
      key === undefined
        ? `No links worth suggesting: no unlinked pair of notes has a similarity of ${minSimilarity} or more.`
        : `No links worth suggesting for ${key}: no unlinked note has a similarity of ${minSimilarity} or more.`,
    );
    return 0;
  }
  const whyOf = (s: CollectionSuggestion): string =>
    words(s.terms)
      .map((w) => `${w.word}${w.inBoth ? '' : '~'}`)
      .join(', ');
  const rows = found.map((s) =>
    key === undefined
      ? [s.similarity.toFixed(3), s.from, formatLink(style.style, s.from, s.path, graph), whyOf(s)]
      : [s.similarity.toFixed(3), formatLink(style.style, s.from, s.path, graph), whyOf(s)],
  );
  const head =
    key === undefined ? ['similarity', 'note', 'link to add', 'words behind it'] : ['similarity', 'link to add', 'words behind it'];
  for (const line of formatTable(
    head,
    rows,
    head.map((h) => h === 'similarity'),
  ))
    io.out(line);
  io.out(
    'similarity: cosine of the two notes in concept space, discounted by how much of each the space holds (listed as Nearby ranks them); words: the largest shares of it; ~ marks a word found in only one of the two notes.',
  );
  return 0;
}

function header(style: StyleVerdict, graph: LinkGraph, minSimilarity: number): string {
  const how = style.style === 'markdown' ? 'relative Markdown links' : 'double-bracket links';
  return `${graph.notes.size} notes, ${graph.pairCount} linked pairs; links written as ${how} (${style.markdown} Markdown, ${style.doubleBracket} double-bracket); least similarity ${minSimilarity}.`;
}

function parseMinSimilarity(value: unknown): number {
  if (value === undefined) return DEFAULT_SUGGEST_OPTIONS.minSimilarity;
  const t = Number(value);
  if (!(t >= 0 && t <= 1)) throw new InvalidInputError(`--min-similarity needs a number from 0 to 1, got "${String(value)}"`);
  return t;
}
