/**
 * `undertone ask <folder> "<text>"` (with `--like FILE` / `--unlike FILE` to steer it by files,
 * repeatable) and batch mode `--queries file.jsonl`.
 */
import { join, relative, resolve } from 'node:path';
import { InvalidInputError, NoKnownTermsError, NotIndexedError } from '../../core/errors.js';
import { QueryExplainer, topShares, type Explanation } from '../../core/explain/explain.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { SurfaceForms } from '../../core/text/surfaceForms.js';
import { bestSections, searchSections } from '../../core/sections/sectionSearch.js';
import type { SectionHit } from '../../core/sections/sectionStore.js';
import { sectionSide, type SectionSide } from '../../core/sections/sectionTerms.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { readQueries } from '../queryFiles.js';

export async function askCommand(folder: string, text: string | undefined, flags: Flags, io: Io): Promise<number> {
  const top = positiveInt(flags.top, 'top') ?? 10;
  if (typeof flags.queries === 'string') {
    if (text !== undefined) throw new InvalidInputError(`ask takes either a question or --queries, not both (got "${text}" too)`);
    const { queries, duplicates } = await readQueries(flags.queries);
    if (!flags.quiet) for (const d of duplicates) io.err(`warning: ${d}`);
    const { index } = await ensureIndex(folder, flags, io);
    for (const q of queries) {
      try {
        const hits = index.search(q.text, { top });
        io.out(JSON.stringify({ id: q.id, results: hits.map((h) => ({ path: h.path, score: round(h.score) })) }));
      } catch (err) {
        if (!(err instanceof NoKnownTermsError)) throw err;
        io.out(JSON.stringify({ id: q.id, results: [], note: 'no known words' }));
      }
    }
    return 0;
  }
  const likes = fileList(flags.like);
  const unlikes = fileList(flags.unlike);
  if ((!text || text.trim().length === 0) && likes.length === 0)
    throw new InvalidInputError(
      'ask needs a question in plain language, a file to find more like (--like FILE), or --queries <file.jsonl>',
    );
  const { index } = await ensureIndex(folder, flags, io);
  const feedback = { like: likes.map((f) => indexedKey(index, folder, f)), unlike: unlikes.map((f) => indexedKey(index, folder, f)) };
  if (flags.sections) await printSections(index, folder, text ?? '', top, flags, io, feedback);
  else printHits(index, text ?? '', top, flags, io, feedback);
  return 0;
}

function fileList(v: Flags[string]): string[] {
  return Array.isArray(v) ? v : typeof v === 'string' ? [v] : [];
}

/** An indexed path for a file named relative to the folder or to the current directory. */
function indexedKey(index: LsiIndex, folder: string, file: string): string {
  const fromCwd = relative(resolve(folder), resolve(file)).split('\\').join('/');
  const key = index.has(file) ? file : index.has(fromCwd) ? fromCwd : undefined;
  if (key === undefined) throw new NotIndexedError(file);
  return key;
}

function printHits(index: LsiIndex, text: string, top: number, flags: Flags, io: Io, feedback: { like: string[]; unlike: string[] }): void {
  const hits = index.search(text, { top, ...feedback });
  const explainer = flags.explain ? new QueryExplainer(index, text, true, feedback) : null;
  const forms = new SurfaceForms({ stem: index.settings.tokenize.stem });
  forms.add(text);
  const why = (path: string): Explanation | null => explainer?.explain(path) ?? null;
  const places = bestSections(
    index,
    text,
    hits.map((h) => h.path),
  );
  if (flags.json) {
    const results = hits.map((h) => {
      const e = why(h.path);
      const s = places.get(h.path);
      return {
        path: h.path,
        score: round(h.score),
        concept: round(h.conceptScore),
        lexical: round(h.lexicalScore),
        ...(s ? { section: sectionJson(s) } : {}),
        ...(e ? { explain: explanationJson(e, forms) } : {}),
      };
    });
    io.out(JSON.stringify({ query: text, results }));
    return;
  }
  const rows = hits.map((h, i) => [String(i + 1), h.score.toFixed(3), h.path]);
  const lines = formatTable(['rank', 'score', 'path'], rows, [true, true, false]);
  lines.slice(0, 2).forEach((l) => io.out(l));
  hits.forEach((h, i) => {
    io.out(lines[i + 2]);
    const s = places.get(h.path);
    if (s) io.out(`        in: ${sectionLabel(s)}`);
    const e = why(h.path);
    if (e) io.out(explanationLine(e, forms));
  });
  if (explainer && hits.length > 0)
    io.out(
      "why: each word's share of the score (meaning and word-match parts together); ~ marks a word not in the file, counted through related words.",
    );
}

/** One indented line: the largest shares, and the rest summed, adding up to the score. */
export function explanationLine(e: Explanation, forms: SurfaceForms, count = 5): string {
  const { top, rest, restTerms } = topShares(e, count);
  const parts = top.map((t) => `${forms.wordFor(t.term)}${t.inBoth ? '' : '~'} ${t.share.toFixed(3)}`);
  if (restTerms > 0) parts.push(`${restTerms} more ${rest.toFixed(3)}`);
  if (e.feedback !== 0) parts.push(`feedback ${e.feedback.toFixed(3)}`);
  return `        why: ${parts.join(', ') || 'no shared meaning'}  (= ${e.score.toFixed(3)})`;
}

export function explanationJson(e: Explanation, forms: SurfaceForms, count = 10): unknown {
  const { top, rest, restTerms } = topShares(e, count);
  return {
    score: round(e.score),
    terms: top.map((t) => ({
      word: forms.wordFor(t.term),
      term: t.term,
      share: round(t.share),
      concept: round(t.concept),
      lexical: round(t.lexical),
      inBoth: t.inBoth,
    })),
    rest: { terms: restTerms, share: round(rest) },
    feedback: round(e.feedback),
  };
}

export function round(x: number): number {
  return Math.round(x * 10000) / 10000;
}

/**
 * `--sections`: sections ranked instead of files (src/core/sections/sectionSearch.ts); with
 * `--explain`, each section's why from its own vector and terms (the file is read again).
 */
async function printSections(
  index: LsiIndex,
  folder: string,
  text: string,
  top: number,
  flags: Flags,
  io: Io,
  feedback: { like: string[]; unlike: string[] },
): Promise<void> {
  if (index.sections.count === 0) io.err('note: this index has no sections (built with --skip-sections); rebuild it to rank sections.');
  const hits = searchSections(index, text, { top, ...feedback });
  const forms = new SurfaceForms({ stem: index.settings.tokenize.stem });
  forms.add(text);
  let why: (h: SectionHit) => Explanation | null = () => null;
  if (flags.explain) {
    const explainer = new QueryExplainer(index, text, true, feedback);
    const { sides } = await sectionSides(index, folder, hits);
    why = (h) => {
      const side = sides.get(h);
      return side ? explainer.explainSection(h.path, side) : null;
    };
  }
  if (flags.json) {
    const sections = hits.map((h) => {
      const e = why(h);
      return { path: h.path, score: round(h.score), ...sectionJson(h), ...(e ? { explain: explanationJson(e, forms) } : {}) };
    });
    io.out(JSON.stringify({ query: text, sections }));
    return;
  }
  const rows = hits.map((h, i) => [String(i + 1), h.score.toFixed(3), `${h.path}:${h.start + 1}`, sectionLabel(h)]);
  const lines = formatTable(['rank', 'score', 'place', 'section'], rows, [true, true, false, false]);
  lines.slice(0, 2).forEach((l) => io.out(l));
  hits.forEach((h, i) => {
    io.out(lines[i + 2]);
    const e = why(h);
    if (e) io.out(explanationLine(e, forms));
    else if (flags.explain) io.out('        why: (the file changed since it was indexed; run index again)');
  });
  if (flags.explain && hits.length > 0)
    io.out(
      "why: each word's share of the section's score, from the section's own words (the word-match part is the whole file's); ~ marks a word not in the section.",
    );
}

/**
 * Each hit's section side (its terms counted again from the file on disk); a hit whose file cannot
 * be read or changed since the index was built has none.
 */
export async function sectionSides(
  index: LsiIndex,
  folder: string,
  hits: readonly SectionHit[],
): Promise<{ sides: Map<SectionHit, SectionSide>; texts: string[] }> {
  const texts = new Map<string, string | null>();
  const out = new Map<SectionHit, SectionSide>();
  for (const h of hits) {
    if (!texts.has(h.path)) {
      const got = await readIndexableText(join(resolve(folder), h.path), DEFAULT_MAX_FILE_BYTES).catch(() => null);
      texts.set(h.path, got?.kind === 'text' ? got.text : null);
    }
    const text = texts.get(h.path);
    const side = text == null ? null : sectionSide(index, h.path, h.index, text);
    if (side) out.set(h, side);
  }
  return { sides: out, texts: [...texts.values()].filter((t) => t !== null) };
}

/** "Title (lines 12–40)", one-based as an editor shows lines. */
export function sectionLabel(s: Pick<SectionHit, 'title' | 'start' | 'end'>): string {
  const range = `lines ${s.start + 1}–${s.end}`;
  // A window of lines is titled by its range already: say it once.
  return s.title === range ? range : `${s.title} (${range})`;
}

function sectionJson(s: SectionHit): { title: string; startLine: number; endLine: number } {
  return { title: s.title, startLine: s.start + 1, endLine: s.end };
}
