/**
 * A readable passage of a file for a search result: a short run of prose (one line or a few
 * consecutive lines of one paragraph) that matches the query, with the query's words marked.
 *
 * The file is cut into paragraphs (blank lines, markup-only lines such as underlines and code
 * fences, and headings end one). Each line is scored by the caller's scorer on its own cleaned
 * text (markup stripped; for search: the share of the query's idf mass present plus the concept
 * cosine, see node/worker/bestLine.ts), times a readability factor min(1, words / minWords) of
 * its window: the line and the lines after it in its paragraph, up to `maxChars`. So a lone token
 * such as "``suspend``" with nothing after it loses to a sentence that says something about it,
 * while a term followed by its description reads as one passage. The best line wins (ties: the
 * earliest); its window is shortened around the first marked word.
 * The readability factor and the defaults are common practice for result snippets, not from a
 * paper; highlighting the query's words follows the usual keyword-in-context display.
 */

export interface PassageScorer {
  /** How well a piece of text matches the query (higher is better; 0 = not at all). */
  score(text: string): number;
  /** True when the word (as written in the text) stands for one of the query's terms. */
  isQueryWord(word: string): boolean;
}

export interface PassageOptions {
  /** Longest passage shown, in characters. @default 160 */
  readonly maxChars: number;
  /** Words a passage needs to count as fully readable. @default 6 */
  readonly minWords: number;
  /** Lines looked at (keeps a huge file from stalling a search). @default 20000 */
  readonly maxLines: number;
}

export const DEFAULT_PASSAGE_OPTIONS: PassageOptions = { maxChars: 160, minWords: 6, maxLines: 20_000 };

export interface Passage {
  /** Zero-based line where the passage starts. */
  readonly line: number;
  /** The passage, cleaned and shortened (an ellipsis marks a cut). */
  readonly text: string;
  /** [start, end) character ranges of `text` holding the query's words. */
  readonly highlights: readonly (readonly [number, number])[];
}

const WORD = /[\p{L}\p{N}_]+(?:['’][\p{L}\p{N}_]+)*/gu;
const LETTER_WORD = /\p{L}{2,}/gu;
/** A line of markup only: RST underlines, horizontal rules, code fences, table borders. */
const MARKUP_ONLY = /^[\s=\-~^*#`_+.:|<>/\\'"]*$/;
const FENCE = /^\s*(```|~~~)/;
const HEADING = /^\s*#{1,6}\s/;

/** A line as prose: XML/HTML tags, inline-markup characters and list or heading markers removed. */
export function cleanLine(line: string): string {
  return line
    .replace(/<[^>]*>/g, ' ')
    .replace(
      /&(?:nbsp|amp|lt|gt|quot|apos|#\d+);/g,
      (e) => ({ '&nbsp;': ' ', '&amp;': '&', '&lt;': '<', '&gt;': '>', '&quot;': '"', '&apos;': "'" })[e] ?? ' ',
    )
    .replace(/^\s*(?:[-*+]|\d+[.)]|#{1,6}|\.\.|>)\s+/, '')
    .replace(/:[a-z]+:`([^`]*)`/g, '$1')
    .replace(/`+|\*\*|__/g, '')
    .replace(/\s+/g, ' ')
    .trim();
}

function letterWords(text: string): number {
  return text.match(LETTER_WORD)?.length ?? 0;
}

/** Character ranges of the words of `text` that the scorer calls query words. */
export function highlightRanges(text: string, isQueryWord: (word: string) => boolean): [number, number][] {
  const out: [number, number][] = [];
  for (const m of text.matchAll(WORD)) if (isQueryWord(m[0])) out.push([m.index, m.index + m[0].length]);
  return out;
}

/** Shortens text to maxChars, keeping the character at `focus` in view; ellipses mark the cuts. */
export function shortenAround(text: string, focus: number, maxChars: number): string {
  if (text.length <= maxChars) return text;
  let start = Math.max(0, Math.min(focus - Math.floor(maxChars / 3), text.length - maxChars));
  if (start > 0) {
    const space = text.indexOf(' ', start);
    if (space >= 0 && space < start + 20) start = space + 1;
  }
  const budget = maxChars - (start > 0 ? 1 : 0);
  let end = start + budget;
  if (end < text.length) {
    end -= 1;
    const space = text.lastIndexOf(' ', end);
    if (space > start + budget / 2) end = space;
  }
  return `${start > 0 ? '…' : ''}${text.slice(start, end).trimEnd()}${end < text.length ? '…' : ''}`;
}

interface Para {
  readonly lines: { readonly at: number; readonly text: string }[];
}

function paragraphs(lines: readonly string[]): Para[] {
  const out: Para[] = [];
  let cur: Para['lines'] = [];
  let inFence = false;
  const flush = () => {
    if (cur.length) out.push({ lines: cur });
    cur = [];
  };
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i];
    if (FENCE.test(raw)) {
      flush();
      inFence = !inFence;
      continue;
    }
    if (raw.trim() === '' || MARKUP_ONLY.test(raw)) {
      flush();
      continue;
    }
    if (HEADING.test(raw)) flush();
    const text = cleanLine(raw);
    if (text) cur.push({ at: i, text });
    // Code keeps one line per window: its lines seldom read as one sentence.
    if (HEADING.test(raw) || inFence) flush();
  }
  flush();
  return out;
}

export function choosePassage(fileText: string, scorer: PassageScorer, options: Partial<PassageOptions> = {}): Passage {
  const o = { ...DEFAULT_PASSAGE_OPTIONS, ...options };
  const lines = fileText.split(/\r?\n/, o.maxLines);
  let best: { line: number; text: string; score: number } | undefined;
  let first: { line: number; text: string } | undefined;
  for (const p of paragraphs(lines)) {
    for (let i = 0; i < p.lines.length; i++) {
      let text = p.lines[i].text;
      for (let j = i + 1; j < p.lines.length && text.length < o.maxChars; j++) text = `${text} ${p.lines[j].text}`;
      first ??= { line: p.lines[i].at, text };
      const raw = scorer.score(p.lines[i].text);
      if (!(raw > 0)) continue;
      const score = raw * Math.min(1, letterWords(text) / o.minWords);
      if (!best || score > best.score) best = { line: p.lines[i].at, text, score };
    }
  }
  const chosen = best ?? first;
  if (!chosen) return { line: 0, text: '', highlights: [] };
  const marks = highlightRanges(chosen.text, scorer.isQueryWord);
  const text = shortenAround(chosen.text, marks.length ? marks[0][0] : 0, o.maxChars);
  return { line: chosen.line, text, highlights: highlightRanges(text, scorer.isQueryWord) };
}
