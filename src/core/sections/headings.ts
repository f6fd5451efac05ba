/**
 * Sections of a marked-up document at its headings: Markdown (ATX "# Title" and setext titles
 * underlined with = or -, CommonMark 0.30 §4.2–4.3; fenced code and a leading front-matter
 * block are skipped), reStructuredText (a title underlined, and optionally overlined, by one
 * repeated punctuation character at least as long as the title, Docutils reStructuredText
 * Markup Specification, "Sections") and AsciiDoc ("= Title" to "====== Title", listing and
 * literal blocks skipped; AsciiDoc Language Documentation, "Sections"). Every heading, whatever
 * its level, starts a section that runs to the next heading; text before the first heading is a
 * section of its own. Returns null when the text has no heading.
 */
import type { Section } from './types.js';
import { linesTitle } from './windows.js';

export type MarkupKind = 'markdown' | 'rst' | 'asciidoc';

interface Heading {
  /** First line of the heading (an overline, for reStructuredText). */
  readonly line: number;
  readonly title: string;
}

const ATX = /^ {0,3}(#{1,6})[ \t]+(.*?)(?:[ \t]+#+)?[ \t]*$/;
const SETEXT = /^ {0,3}(=+|-+)[ \t]*$/;
const FENCE = /^ {0,3}(`{3,}|~{3,})/;
const RST_ADORN = /^([!-/:-@[-`{-~])\1+\s*$/;
const ADOC_HEADING = /^(={1,6})[ \t]+(\S.*?)[ \t]*$/;
const ADOC_DELIM = /^(-{4,}|\.{4,}|\/{4,}|\+{4,}|_{4,}|`{3,})\s*$/;

function markdownHeadings(lines: readonly string[]): Heading[] {
  const out: Heading[] = [];
  let fence: string | null = null;
  let i = 0;
  if (lines[0]?.trim() === '---') {
    const close = lines.findIndex((l, j) => j > 0 && /^(---|\.\.\.)\s*$/.test(l));
    if (close > 0) i = close + 1;
  }
  for (; i < lines.length; i++) {
    const line = lines[i];
    const f = FENCE.exec(line);
    if (fence) {
      if (f && f[1][0] === fence[0] && f[1].length >= fence.length && line.trim() === f[1]) fence = null;
      continue;
    }
    if (f) {
      fence = f[1];
      continue;
    }
    const atx = ATX.exec(line);
    if (atx && atx[2].trim()) {
      out.push({ line: i, title: atx[2].trim() });
      continue;
    }
    const next = lines[i + 1];
    if (next !== undefined && SETEXT.test(next) && line.trim() && !/^ {4}/.test(line) && !/^\s*([-*+>]|\d+[.)])\s/.test(line)) {
      // "Text\n---" is a heading only after a blank line or at the start (else a paragraph ends in it).
      if (i === 0 || !lines[i - 1].trim() || out.at(-1)?.line === i - 2) {
        out.push({ line: i, title: line.trim() });
        i++;
      }
    }
  }
  return out;
}

function rstHeadings(lines: readonly string[]): Heading[] {
  const out: Heading[] = [];
  for (let i = 0; i + 1 < lines.length; i++) {
    const title = lines[i].trimEnd();
    const under = RST_ADORN.exec(lines[i + 1]);
    if (!under || !title.trim() || RST_ADORN.test(title)) continue;
    if (lines[i + 1].trimEnd().length < title.trim().length) continue;
    const over = i > 0 && lines[i - 1].trimEnd() === lines[i + 1].trimEnd();
    // Without an overline the title may not be indented (an indented line is a block quote).
    if (!over && /^\s/.test(title)) continue;
    out.push({ line: over ? i - 1 : i, title: title.trim() });
    i++;
  }
  return out;
}

function asciidocHeadings(lines: readonly string[]): Heading[] {
  const out: Heading[] = [];
  let delim: string | null = null;
  for (let i = 0; i < lines.length; i++) {
    const d = ADOC_DELIM.exec(lines[i]);
    if (delim) {
      if (d && d[1] === delim) delim = null;
      continue;
    }
    if (d) {
      delim = d[1];
      continue;
    }
    const h = ADOC_HEADING.exec(lines[i]);
    if (h) out.push({ line: i, title: h[2] });
  }
  return out;
}

/** Sections at the headings of a document, or null when it has none. */
export function headingSections(lines: readonly string[], kind: MarkupKind): Section[] | null {
  const found = kind === 'markdown' ? markdownHeadings(lines) : kind === 'rst' ? rstHeadings(lines) : asciidocHeadings(lines);
  if (found.length === 0) return null;
  const out: Section[] = [];
  if (found[0].line > 0 && lines.slice(0, found[0].line).some((l) => l.trim())) {
    out.push({ start: 0, end: found[0].line, title: linesTitle(0, found[0].line) });
  }
  found.forEach((h, i) => out.push({ start: h.line, end: found[i + 1]?.line ?? lines.length, title: h.title }));
  return out;
}
