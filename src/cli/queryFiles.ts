/**
 * Reading the query and judgment files of `ask --queries` and `eval`.
 * Queries: one JSON object per line, {"id": string | number, "text": "…"}; a leading byte-order
 * mark is dropped. Judgments (relevance files): whitespace-separated lines in either of two forms,
 *   query document [relevance]          (three or two columns), or
 *   query iteration document relevance  (four columns, the form TREC's evaluation tool reads;
 *                                        the iteration column is ignored),
 * where a relevance above 0 marks a relevant document. Lines that fit neither form are reported,
 * never skipped silently.
 */
import { readFile } from 'node:fs/promises';
import { InvalidInputError } from '../core/errors.js';

export interface QueryLine {
  readonly id: string | number;
  readonly text: string;
}

async function readText(path: string): Promise<string> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (err) {
    // readFile on a folder fails with EISDIR but without the path: add it for the message.
    if (err instanceof Error && !(err as NodeJS.ErrnoException).path) Object.assign(err, { path });
    throw err;
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/**
 * The queries of a JSON-lines file, in order. Throws InvalidInputError naming the file and line
 * for a line that is not JSON, lacks an id or a text, or has an empty text. Duplicate ids are
 * kept once (the first) and reported in `duplicates`.
 */
export async function readQueries(path: string): Promise<{ queries: QueryLine[]; duplicates: string[] }> {
  const queries: QueryLine[] = [];
  const seen = new Set<string>();
  const duplicates: string[] = [];
  (await readText(path)).split('\n').forEach((line, i) => {
    if (line.trim().length === 0) return;
    let q: unknown;
    try {
      q = JSON.parse(line);
    } catch {
      throw new InvalidInputError(`${path}:${i + 1}: not a JSON line`);
    }
    const { id, text } = (typeof q === 'object' && q !== null ? q : {}) as { id?: unknown; text?: unknown };
    if ((typeof id !== 'string' && typeof id !== 'number') || typeof text !== 'string') {
      throw new InvalidInputError(`${path}:${i + 1}: expected {"id": …, "text": "…"}`);
    }
    if (text.trim().length === 0) throw new InvalidInputError(`${path}:${i + 1}: query ${JSON.stringify(id)} has no text`);
    const key = String(id);
    if (seen.has(key)) {
      duplicates.push(`${path}:${i + 1}: query id ${JSON.stringify(id)} appears again; the first one is used`);
      return;
    }
    seen.add(key);
    queries.push({ id, text });
  });
  return { queries, duplicates };
}

export interface Judgments {
  /** Query id → relevant document ids. */
  readonly relevant: Map<string, Set<string>>;
  /** Query ids with at least one judgment line (relevant or not). */
  readonly judged: Set<string>;
  /** One entry per line that fits neither form. */
  readonly unparsed: string[];
}

/** Reads a relevance file in either form (see the header). */
export async function readJudgments(path: string): Promise<Judgments> {
  const relevant = new Map<string, Set<string>>();
  const judged = new Set<string>();
  const unparsed: string[] = [];
  (await readText(path)).split('\n').forEach((raw, i) => {
    const line = raw.trim();
    if (line.length === 0 || line.startsWith('#')) return;
    const f = line.split(/\s+/);
    let q: string, d: string, rel: string | undefined;
    if (f.length === 4) [q, , d, rel] = f;
    else if (f.length === 3) [q, d, rel] = f;
    else if (f.length === 2) [q, d] = f;
    else {
      unparsed.push(`${path}:${i + 1}: ${f.length} columns; expected "query document relevance" or "query iteration document relevance"`);
      return;
    }
    if (rel !== undefined && !Number.isFinite(Number(rel))) {
      unparsed.push(`${path}:${i + 1}: relevance "${rel}" is not a number`);
      return;
    }
    judged.add(q);
    if (rel !== undefined && !(Number(rel) > 0)) return;
    if (!relevant.has(q)) relevant.set(q, new Set());
    relevant.get(q)!.add(d);
  });
  return { relevant, judged, unparsed };
}
