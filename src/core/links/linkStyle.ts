/**
 * The collection's own way of writing links, and a new link written that way. The style is the
 * one most of its resolved links use: double-bracket links when they outnumber Markdown links
 * (inline and reference-style), else relative Markdown links (also for a collection without
 * links: CommonMark's form, which every Markdown reader follows). HTML anchors do not vote.
 * A Markdown link is `[Title](relative/path.md)` (the path relative to the note's folder, with
 * spaces and brackets percent-escaped, RFC 3986 §2.1); a double-bracket link is `[[name]]`, or
 * `[[name|Title]]` when the title is not the file name, with the path from the top in place of
 * the name when another note has the same file name.
 */
import type { LinkGraph } from './linkGraph.js';
import { baseName } from './noteCatalogue.js';

export type LinkStyle = 'markdown' | 'double-bracket';

export interface StyleVerdict {
  readonly style: LinkStyle;
  /** Resolved links written as Markdown (inline or reference) and as double-bracket links. */
  readonly markdown: number;
  readonly doubleBracket: number;
}

export function detectLinkStyle(graph: LinkGraph): StyleVerdict {
  const markdown = graph.styleCounts.inline + graph.styleCounts.reference;
  const doubleBracket = graph.styleCounts['double-bracket'];
  return { style: doubleBracket > markdown ? 'double-bracket' : 'markdown', markdown, doubleBracket };
}

/** The path from the folder of `from` to `to` ('/'-separated keys). */
export function relativePath(from: string, to: string): string {
  const a = from.split('/').slice(0, -1);
  const b = to.split('/');
  let common = 0;
  while (common < a.length && common < b.length - 1 && a[common] === b[common]) common++;
  return [...a.slice(common).map(() => '..'), ...b.slice(common)].join('/');
}

function escapeDestination(path: string): string {
  return path.replace(/[ ()<>%]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase().padStart(2, '0')}`);
}

function escapeLinkText(text: string): string {
  return text.replace(/([[\]\\])/g, '\\$1');
}

/** The link to insert in `from` reaching `to`, in the given style, with `to`'s title as its text. */
export function formatLink(style: LinkStyle, from: string, to: string, graph: LinkGraph): string {
  const title = graph.notes.titleOf(to).replace(/\s+/g, ' ').trim() || baseName(to);
  if (style === 'markdown') return `[${escapeLinkText(title)}](${escapeDestination(relativePath(from, to))})`;
  const name = baseName(to);
  const shared = graph.notes.byName(name).length > 1;
  const target = (shared ? to.replace(/\.(md|markdown)$/i, '') : name).replace(/[[\]|#]/g, ' ');
  const shown = title.replace(/[[\]|]/g, ' ');
  return shown.toLowerCase() === target.toLowerCase() ? `[[${target}]]` : `[[${target}|${shown}]]`;
}
