/**
 * Cuts a file into sections by its kind (its name's extension): headings for Markdown,
 * reStructuredText and AsciiDoc (headings.ts), top-level declarations for code (codeUnits.ts),
 * overlapping windows of lines for everything else and for files where neither finds anything
 * (windows.ts). Then evens the cut out: a section shorter than minLines non-blank lines joins the
 * one before it, one longer than maxLines is cut into windows that keep its title ("name (2/3)"),
 * and past maxSections the rest joins the last. The sections cover every non-blank line, in
 * order, without gaps (windows overlap).
 */
import { InvalidInputError } from '../errors.js';
import { codeSections, type CodeLanguage } from './codeUnits.js';
import { headingSections, type MarkupKind } from './headings.js';
import { DEFAULT_SECTION_OPTIONS, type Section, type SectionKind, type SectionOptions } from './types.js';
import { lineWindows, linesTitle } from './windows.js';

export { DEFAULT_SECTION_OPTIONS, type Section, type SectionKind, type SectionOptions } from './types.js';

const MARKUP: Record<string, MarkupKind> = {
  md: 'markdown',
  markdown: 'markdown',
  mdx: 'markdown',
  rst: 'rst',
  rest: 'rst',
  txt: 'rst',
  adoc: 'asciidoc',
  asciidoc: 'asciidoc',
  asc: 'asciidoc',
};
const CODE: Record<string, CodeLanguage> = {
  ts: 'ts',
  tsx: 'ts',
  mts: 'ts',
  cts: 'ts',
  js: 'ts',
  jsx: 'ts',
  mjs: 'ts',
  cjs: 'ts',
  go: 'go',
  java: 'java',
  cs: 'csharp',
  c: 'c',
  h: 'c',
  cc: 'c',
  cpp: 'c',
  cxx: 'c',
  hpp: 'c',
  hh: 'c',
  hxx: 'c',
  rs: 'rust',
  py: 'python',
  pyi: 'python',
};

export interface SplitResult {
  readonly kind: SectionKind;
  readonly sections: Section[];
}

/** The file's extension, lower case ("" when none). */
function extensionOf(path: string): string {
  const name = path.slice(path.lastIndexOf('/') + 1);
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
}

/** The programming language a path's extension names (undefined for anything else). */
export function codeLanguageOf(path: string): CodeLanguage | undefined {
  const ext = extensionOf(path);
  return Object.prototype.hasOwnProperty.call(CODE, ext) ? CODE[ext] : undefined;
}

/** Splits text into lines ("\n", "\r\n" or "\r"). */
export function splitLines(text: string): string[] {
  // Without a carriage return the pattern only ever matches "\n", and splitting on the one
  // character is the engine's plain string split (several times cheaper than the pattern's).
  return text.includes('\r') ? text.split(/\r\n|\r|\n/) : text.split('\n');
}

/** The sections of a file, from its path (for its kind) and its text. */
export function splitSections(path: string, text: string, options: Partial<SectionOptions> = {}): SplitResult {
  const o = { ...DEFAULT_SECTION_OPTIONS, ...options };
  if (!(
    o.windowLines >= 1 &&
    o.windowOverlap >= 0 &&
    o.windowOverlap < o.windowLines &&
    o.maxLines >= 1 &&
    o.minLines >= 0 &&
    o.maxSections >= 1
  ))
    throw new InvalidInputError(
      'section options: windowLines ≥ 1, 0 ≤ windowOverlap < windowLines, maxLines ≥ 1, minLines ≥ 0, maxSections ≥ 1',
    );
  const lines = splitLines(text);
  while (lines.length > 0 && isBlank(lines.at(-1)!)) lines.pop();
  if (lines.length === 0) return { kind: 'window', sections: [] };
  const ext = extensionOf(path);
  let kind: SectionKind = 'window';
  let found: Section[] | null = null;
  if (MARKUP[ext]) {
    found = headingSections(lines, MARKUP[ext]);
    // Plain .txt without reStructuredText titles may still use Markdown headings.
    if (!found && ext === 'txt') found = headingSections(lines, 'markdown');
    if (found) kind = 'headings';
  } else if (CODE[ext]) {
    found = codeSections(lines, CODE[ext]);
    if (found) kind = 'code';
  }
  if (!found) return { kind: 'window', sections: lineWindows(0, lines.length, o.windowLines, o.windowOverlap, linesTitle) };
  return { kind, sections: even(found, lines, o) };
}

/** The code units String.prototype.trim removes past ASCII (ECMAScript WhiteSpace and LineTerminator). */
const WIDE_SPACES = new Set([
  0xa0, 0x1680, 0x2000, 0x2001, 0x2002, 0x2003, 0x2004, 0x2005, 0x2006, 0x2007, 0x2008, 0x2009, 0x200a, 0x2028, 0x2029, 0x202f, 0x205f,
  0x3000, 0xfeff,
]);

/** True when line.trim() is empty, without making the trimmed string. */
export function isBlank(line: string): boolean {
  for (let i = 0; i < line.length; i++) {
    const c = line.charCodeAt(i);
    if (c === 32 || (c >= 9 && c <= 13)) continue;
    if (c < 128 || !WIDE_SPACES.has(c)) return false;
  }
  return true;
}

function even(found: readonly Section[], lines: readonly string[], o: SectionOptions): Section[] {
  // Non-blank lines before each line, counted once (a section's count is asked for again as
  // short sections join it).
  const before = new Int32Array(lines.length + 1);
  for (let i = 0; i < lines.length; i++) before[i + 1] = before[i] + (isBlank(lines[i]) ? 0 : 1);
  const filled = (s: Section): number => before[s.end] - before[s.start];
  const joined: Section[] = [];
  found.forEach((s, i) => {
    const prev = joined.at(-1);
    const short = filled(s) < o.minLines;
    // A short class line stays to gather its fields (or joins its first member, below).
    const header = found[i + 1]?.title.startsWith(`${s.title}.`) === true;
    if (prev && (joined.length >= o.maxSections || (short && !header))) joined[joined.length - 1] = { ...prev, end: s.end };
    else if (prev && filled(prev) < o.minLines && s.title.startsWith(`${prev.title}.`))
      joined[joined.length - 1] = { ...s, start: prev.start };
    else joined.push(s);
  });
  // A short first section (a licence line, a lone import) joins the one after it.
  if (joined.length > 1 && filled(joined[0]) < o.minLines) joined.splice(0, 2, { ...joined[1], start: joined[0].start });
  const out: Section[] = [];
  for (const s of joined) {
    if (s.end - s.start <= o.maxLines) {
      out.push(s);
      continue;
    }
    const parts = lineWindows(s.start, s.end, o.maxLines, o.windowOverlap, () => s.title);
    parts.forEach((p, i) => out.push({ ...p, title: `${s.title} (${i + 1}/${parts.length})` }));
  }
  return out;
}
