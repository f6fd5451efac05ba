/** Terminal output for the command line: tables, a progress bar on stderr, and number formats. */
import type { IndexProgress, IndexStage } from '../node/folderIndexer.js';

export interface Io {
  out(line: string): void;
  err(line: string): void;
  /** True when stderr is a terminal (progress bars are drawn only then). */
  readonly interactive: boolean;
  /** Writes without a newline to stderr (progress redraws). */
  errRaw(text: string): void;
}

export const processIo: Io = {
  out: (line) => process.stdout.write(`${line}\n`),
  err: (line) => process.stderr.write(`${line}\n`),
  errRaw: (text) => process.stderr.write(text),
  interactive: Boolean(process.stderr.isTTY),
};

const STAGE_LABEL: Record<IndexStage, string> = {
  load: 'loading saved index',
  scan: 'scanning files',
  read: 'reading and tokenizing',
  matrix: 'weighting the matrix',
  svd: 'computing the SVD',
  sections: 'folding in sections',
  save: 'saving',
};

/** Returns a progress callback drawing a one-line bar on stderr, and a function to clear it. */
export function progressBar(io: Io): { update: (p: IndexProgress) => void; done: () => void } {
  let last = '';
  let lastDraw = 0;
  const update = (p: IndexProgress): void => {
    if (!io.interactive) return;
    const now = Date.now();
    const frac = p.total > 0 ? Math.min(1, p.done / p.total) : 0;
    const width = 24;
    const filled = Math.round(frac * width);
    const line = `${STAGE_LABEL[p.stage].padEnd(24)} [${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${p.done}/${p.total}`;
    if (line === last || (now - lastDraw < 80 && p.done !== p.total)) return;
    last = line;
    lastDraw = now;
    io.errRaw(`\r${line}\x1b[K`);
  };
  const done = (): void => {
    if (io.interactive && last) io.errRaw('\r\x1b[K');
  };
  return { update, done };
}

/**
 * Text safe to print on a terminal: control characters (C0, DEL, C1, and the line and paragraph
 * separators) written as escapes, so a file name cannot move the cursor, colour the screen or
 * split a table row.
 */
export function printable(text: string): string {
  // eslint-disable-next-line no-control-regex -- finding control characters is the point
  return text.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, (c) => {
    if (c === '\n') return '\\n';
    if (c === '\r') return '\\r';
    if (c === '\t') return '\\t';
    const code = c.charCodeAt(0);
    return code < 0x100 ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16)}`;
  });
}

/** A plain-text table with a header row and right-aligned numeric columns (cells made printable). */
export function formatTable(header: string[], rawRows: string[][], numeric: boolean[]): string[] {
  const rows = rawRows.map((r) => r.map(printable));
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const cell = (s: string, i: number): string => (numeric[i] ? s.padStart(widths[i]) : s.padEnd(widths[i]));
  const lines = [header.map(cell).join('  ').trimEnd(), widths.map((w) => '-'.repeat(w)).join('  ')];
  for (const r of rows) lines.push(r.map(cell).join('  ').trimEnd());
  return lines;
}

export function formatCount(n: number): string {
  return n.toLocaleString('en-US');
}

export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KiB`;
  return `${(n / 1024 / 1024).toFixed(1)} MiB`;
}
