/** `undertone ask <folder> "<text>"` and batch mode `--queries file.jsonl`. */
import { readFile } from 'node:fs/promises';
import { InvalidInputError, NoKnownTermsError } from '../../core/errors.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';

export async function askCommand(folder: string, text: string | undefined, flags: Flags, io: Io): Promise<number> {
  const top = positiveInt(flags.top, 'top') ?? 10;
  if (typeof flags.queries === 'string') {
    const lines = (await readFile(flags.queries, 'utf8')).split('\n').filter((l) => l.trim().length > 0);
    const queries = lines.map((line, i) => {
      let q: unknown;
      try {
        q = JSON.parse(line);
      } catch {
        throw new InvalidInputError(`${flags.queries}:${i + 1}: not a JSON line`);
      }
      const { id, text: t } = (q ?? {}) as { id?: unknown; text?: unknown };
      if ((typeof id !== 'string' && typeof id !== 'number') || typeof t !== 'string') {
        throw new InvalidInputError(`${flags.queries}:${i + 1}: expected {"id": …, "text": "…"}`);
      }
      return { id, text: t };
    });
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
  if (!text || text.trim().length === 0) throw new InvalidInputError('ask needs a question in plain language, or --queries <file.jsonl>');
  const { index } = await ensureIndex(folder, flags, io);
  printHits(index, text, top, flags, io);
  return 0;
}

function printHits(index: LsiIndex, text: string, top: number, flags: Flags, io: Io): void {
  const hits = index.search(text, { top });
  if (flags.json) {
    io.out(JSON.stringify({ query: text, results: hits.map((h) => ({ path: h.path, score: round(h.score), concept: round(h.conceptScore), lexical: round(h.lexicalScore) })) }));
    return;
  }
  const rows = hits.map((h, i) => [String(i + 1), h.score.toFixed(3), h.path]);
  for (const line of formatTable(['rank', 'score', 'path'], rows, [true, true, false])) io.out(line);
}

export function round(x: number): number {
  return Math.round(x * 10000) / 10000;
}
