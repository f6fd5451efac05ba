/**
 * Reads the links a note writes, before they are resolved to files (linkResolver.ts):
 * - Markdown inline links `[text](destination "title")`, destinations in `<…>` too (CommonMark 0.31
 *   §6.3, https://spec.commonmark.org/0.31.2/#links); images (`![…](…)`) are not links;
 * - reference-style links `[text][label]`, `[label][]` and `[label]`, with their definitions
 *   `[label]: destination` (CommonMark §4.7; labels match case-insensitively, runs of white space
 *   as one); a use without a definition is plain text;
 * - double-bracket links `[[target]]`, `[[target|alias]]`, `[[target#heading]]`, and the same
 *   with a leading `!` (an embedded note, still a link between the two notes);
 * - HTML anchors `<a href="…">` (quoted or not).
 * Fenced code blocks and inline code spans are skipped: a link shown as code is not a link.
 * Every link keeps its place in the text ([start, end) offsets), so a caller can cut it out.
 */

export type LinkKind = 'inline' | 'reference' | 'double-bracket' | 'html';

export interface RawLink {
  readonly kind: LinkKind;
  /** The destination as written, without its fragment (percent-escapes left as they are). */
  readonly target: string;
  /** The fragment after '#' (heading anchor), '' when none. */
  readonly fragment: string;
  /** The visible words: link text, alias, or the target itself for a bare double-bracket link. */
  readonly text: string;
  /** [start, end) of the whole link in the text (for reference links, the use, not the definition). */
  readonly start: number;
  readonly end: number;
}

/** Code spans and fenced blocks as [start, end) ranges, in order. */
function codeRanges(text: string): [number, number][] {
  const ranges: [number, number][] = [];
  const fence = /^ {0,3}(`{3,}|~{3,})[^\n]*$/gm;
  let m: RegExpExecArray | null;
  while ((m = fence.exec(text)) !== null) {
    const marker = m[1];
    const close = new RegExp(`^ {0,3}${marker[0] === '`' ? '`' : '~'}{${marker.length},}[ \\t]*$`, 'gm');
    close.lastIndex = m.index + m[0].length;
    const c = close.exec(text);
    const end = c ? c.index + c[0].length : text.length;
    ranges.push([m.index, end]);
    fence.lastIndex = end;
  }
  const spans: [number, number][] = [];
  const tick = /`+/g;
  let from = 0;
  for (const [s, e] of [...ranges, [text.length, text.length] as [number, number]]) {
    tick.lastIndex = from;
    while ((m = tick.exec(text)) !== null && m.index < s) {
      const run = m[0];
      const closeAt = findRun(text, run, m.index + run.length, s);
      if (closeAt < 0) continue;
      spans.push([m.index, closeAt + run.length]);
      tick.lastIndex = closeAt + run.length;
    }
    from = e;
  }
  return [...ranges, ...spans].sort((a, b) => a[0] - b[0]);
}

/** Index of the next backtick run of exactly `run`'s length in [from, limit), or −1. */
function findRun(text: string, run: string, from: number, limit: number): number {
  const re = /`+/g;
  re.lastIndex = from;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text)) !== null && m.index < limit) if (m[0] === run) return m.index;
  return -1;
}

/** Normalises a reference label: case-folded, white space collapsed (CommonMark §4.7). */
export function normaliseLabel(label: string): string {
  return label.trim().replace(/\s+/g, ' ').toLowerCase();
}

function splitFragment(destination: string): { target: string; fragment: string } {
  const hash = destination.indexOf('#');
  const target = hash < 0 ? destination : destination.slice(0, hash);
  return { target: target.split('?')[0], fragment: hash < 0 ? '' : destination.slice(hash + 1) };
}

/** The destination of `(…)` starting at `open` (the '('): [destination, index after ')'], or null. */
function inlineDestination(text: string, open: number): [string, number] | null {
  let i = open + 1;
  while (i < text.length && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n')) i++;
  let dest: string;
  if (text[i] === '<') {
    const close = text.indexOf('>', i + 1);
    if (close < 0 || text.slice(i + 1, close).includes('\n')) return null;
    dest = text.slice(i + 1, close);
    i = close + 1;
  } else {
    let depth = 0;
    const start = i;
    for (; i < text.length; i++) {
      const c = text[i];
      if (c === '\\') {
        i++;
        continue;
      }
      if (c === '(') depth++;
      else if (c === ')') {
        if (depth === 0) break;
        depth--;
      } else if (c === ' ' || c === '\t' || c === '\n') break;
    }
    dest = text.slice(start, i);
  }
  // An optional title, then ')'.
  const rest = /^[ \t\n]*(?:"[^"]*"|'[^']*'|\([^)]*\))?[ \t\n]*\)/.exec(text.slice(i, i + 1000));
  if (!rest) return null;
  return [dest, i + rest[0].length];
}

/** The index of the ']' closing the '[' at `open` (brackets nest; escapes honoured), or −1. */
function closingBracket(text: string, open: number): number {
  let depth = 0;
  for (let i = open; i < text.length; i++) {
    const c = text[i];
    if (c === '\\') i++;
    else if (c === '[') depth++;
    else if (c === ']' && --depth === 0) return i;
    else if (c === '\n' && text[i + 1] === '\n') return -1; // links do not cross paragraphs
  }
  return -1;
}

const DEFINITION = /^ {0,3}\[([^\]\n]+)\]:[ \t]*(?:<([^>\n]*)>|(\S+))[^\n]*$/gm;
const ANCHOR = /<a\s[^>]*?\bhref\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s>]+))[^>]*>([\s\S]*?)<\/a\s*>/gi;

/** Every link in a note's text, in order of appearance. */
export function readLinks(text: string): RawLink[] {
  const code = codeRanges(text);
  let ci = 0;
  const inCode = (at: number): boolean => {
    while (ci < code.length && code[ci][1] <= at) ci++;
    return ci < code.length && code[ci][0] <= at;
  };
  const definitions = new Map<string, string>();
  const definitionSpans: [number, number][] = [];
  let m: RegExpExecArray | null;
  DEFINITION.lastIndex = 0;
  while ((m = DEFINITION.exec(text)) !== null) {
    if (inCodeAt(code, m.index)) continue;
    const label = normaliseLabel(m[1]);
    if (!definitions.has(label)) definitions.set(label, m[2] ?? m[3]);
    definitionSpans.push([m.index, m.index + m[0].length]);
  }
  const links: RawLink[] = [];
  const push = (kind: LinkKind, destination: string, linkText: string, start: number, end: number): void => {
    const { target, fragment } = splitFragment(destination.trim());
    links.push({ kind, target, fragment, text: linkText.trim(), start, end });
  };
  let defAt = 0;
  for (let i = 0; i < text.length; i++) {
    if (text[i] !== '[' || (i > 0 && text[i - 1] === '\\')) continue;
    while (defAt < definitionSpans.length && definitionSpans[defAt][1] <= i) defAt++;
    if (defAt < definitionSpans.length && definitionSpans[defAt][0] <= i) {
      i = definitionSpans[defAt][1];
      continue;
    }
    if (inCode(i)) continue;
    if (text[i + 1] === '[') {
      const close = text.indexOf(']]', i + 2);
      const inner = close < 0 ? '' : text.slice(i + 2, close);
      if (close > 0 && inner.length > 0 && !/[[\]\n]/.test(inner)) {
        const start = i > 0 && text[i - 1] === '!' ? i - 1 : i;
        const bar = inner.indexOf('|');
        const dest = bar < 0 ? inner : inner.slice(0, bar);
        const shown = bar < 0 ? dest.split('#')[0] || dest : inner.slice(bar + 1);
        push('double-bracket', dest, shown, start, close + 2);
        i = close + 1;
      }
      continue;
    }
    if (i > 0 && text[i - 1] === '!') continue; // an image
    const close = closingBracket(text, i);
    if (close < 0) continue;
    const linkText = text.slice(i + 1, close);
    if (text[close + 1] === '(') {
      const got = inlineDestination(text, close + 1);
      if (got) {
        push('inline', got[0], linkText, i, got[1]);
        i = got[1] - 1;
        continue;
      }
    }
    if (text[close + 1] === '[') {
      const labelEnd = text.indexOf(']', close + 2);
      if (labelEnd > 0) {
        const label = normaliseLabel(text.slice(close + 2, labelEnd) || linkText);
        const dest = definitions.get(label);
        if (dest !== undefined) {
          push('reference', dest, linkText, i, labelEnd + 1);
          i = labelEnd;
          continue;
        }
      }
    }
    const dest = definitions.get(normaliseLabel(linkText));
    if (dest !== undefined && text[close + 1] !== '(' && text[close + 1] !== ':') {
      push('reference', dest, linkText, i, close + 1);
      i = close;
    }
  }
  ANCHOR.lastIndex = 0;
  while ((m = ANCHOR.exec(text)) !== null) {
    if (inCodeAt(code, m.index)) continue;
    push('html', decodeEntities(m[1] ?? m[2] ?? m[3]), m[4].replace(/<[^>]*>/g, ''), m.index, m.index + m[0].length);
  }
  return links.sort((a, b) => a.start - b.start);
}

function inCodeAt(code: readonly [number, number][], at: number): boolean {
  return code.some(([s, e]) => s <= at && at < e);
}

function decodeEntities(s: string): string {
  return s
    .replace(/&amp;/g, '&')
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>');
}

/**
 * The text with the given links cut out (their words too): what a note would say had it never
 * written them. Definitions of reference links are left (they hold no words of the sentence).
 */
export function withoutLinks(text: string, links: readonly Pick<RawLink, 'start' | 'end'>[]): string {
  const sorted = [...links].sort((a, b) => a.start - b.start);
  let out = '';
  let at = 0;
  for (const l of sorted) {
    if (l.start < at) continue;
    out += text.slice(at, l.start);
    at = l.end;
  }
  return out + text.slice(at);
}
