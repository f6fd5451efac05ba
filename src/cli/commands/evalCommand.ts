/**
 * `undertone eval <folder> --queries q.jsonl --qrels qrels.tsv`: MAP, P@10 and nDCG@10 of the
 * current settings on a user's own judged queries. A judged document id matches a file whose
 * path, or path without its extension, equals the id.
 */
import { readFile } from 'node:fs/promises';
import { InvalidInputError, NoKnownTermsError } from '../../core/errors.js';
import { evaluateRuns } from '../../core/eval/retrievalMetrics.js';
import { ensureIndex, type Flags } from '../context.js';
import type { Io } from '../output.js';

export async function evalCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  if (typeof flags.queries !== 'string' || typeof flags.qrels !== 'string') {
    throw new InvalidInputError('eval needs --queries <file.jsonl> and --qrels <file.tsv>');
  }
  const queries = (await readFile(flags.queries, 'utf8'))
    .split('\n')
    .filter((l) => l.trim())
    .map((l) => JSON.parse(l) as { id: string | number; text: string });
  const qrels = new Map<string, Set<string>>();
  for (const line of (await readFile(flags.qrels, 'utf8')).split('\n')) {
    const [q, d, rel] = line.trim().split(/\s+/);
    if (!q || !d || (rel !== undefined && !(Number(rel) > 0))) continue;
    if (!qrels.has(q)) qrels.set(q, new Set());
    qrels.get(q)!.add(d);
  }
  const { index } = await ensureIndex(folder, flags, io);
  const idOf = (path: string): string => path.replace(/\.[^./]+$/, '');
  const runs = new Map<string, string[]>();
  for (const q of queries) {
    const qid = String(q.id);
    if (!qrels.has(qid)) continue;
    try {
      runs.set(qid, index.search(q.text, { top: index.size }).map((h) => (qrels.get(qid)!.has(h.path) ? h.path : idOf(h.path))));
    } catch (err) {
      if (!(err instanceof NoKnownTermsError)) throw err;
      runs.set(qid, []);
    }
  }
  const s = evaluateRuns(runs, qrels);
  if (flags.json) io.out(JSON.stringify(s));
  else io.out(`queries ${s.queries}  MAP ${s.map.toFixed(4)}  P@10 ${s.precisionAt10.toFixed(4)}  nDCG@10 ${s.ndcgAt10.toFixed(4)}`);
  return 0;
}
