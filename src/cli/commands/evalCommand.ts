/**
 * `undertone eval <folder> --queries q.jsonl --qrels qrels.tsv`: MAP, P@10 and nDCG@10 of the
 * current settings on a user's own judged queries. A judged document id matches a file whose
 * path, or path without its extension, equals the id. The relevance file may be in our three-
 * column form or in the four-column form of TREC's evaluation tool (queryFiles.ts); every line
 * that cannot be read, every query without judgments, every judged document that is not in the
 * index and every repeated query id is reported.
 */
import { InvalidInputError, NoKnownTermsError } from '../../core/errors.js';
import { evaluateRuns } from '../../core/eval/retrievalMetrics.js';
import { ensureIndex, type Flags } from '../context.js';
import { printable, type Io } from '../output.js';
import { readJudgments, readQueries } from '../queryFiles.js';

/** Warnings of one kind beyond this many are summed up in one line. */
const MAX_LISTED = 10;

export async function evalCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  if (typeof flags.queries !== 'string' || typeof flags.qrels !== 'string') {
    throw new InvalidInputError('eval needs --queries <file.jsonl> and --qrels <file.tsv>');
  }
  const { queries, duplicates } = await readQueries(flags.queries);
  const judgments = await readJudgments(flags.qrels);
  const qrels = judgments.relevant;
  const warnings: string[] = [];
  const list = (items: string[], what: (n: number) => string): void => {
    if (items.length === 0) return;
    warnings.push(...items.slice(0, MAX_LISTED));
    if (items.length > MAX_LISTED) warnings.push(`… and ${items.length - MAX_LISTED} more ${what(items.length - MAX_LISTED)}`);
  };
  list(judgments.unparsed, () => 'lines that could not be read');
  list(duplicates, () => 'repeated query ids');
  const { index } = await ensureIndex(folder, flags, io);
  const idOf = (path: string): string => path.replace(/\.[^./]+$/, '');
  const known = new Set<string>();
  for (const p of index.paths()) {
    known.add(p);
    known.add(idOf(p));
  }
  const unjudged = queries.filter((q) => !qrels.has(String(q.id))).map((q) => String(q.id));
  if (unjudged.length > 0)
    warnings.push(
      `${unjudged.length} ${unjudged.length === 1 ? 'query has' : 'queries have'} no relevant document in ${flags.qrels} and ${unjudged.length === 1 ? 'is' : 'are'} not scored: ${unjudged.slice(0, MAX_LISTED).join(', ')}${unjudged.length > MAX_LISTED ? ', …' : ''}`,
    );
  const unknown: string[] = [];
  for (const [q, docs] of qrels) for (const d of docs) if (!known.has(d)) unknown.push(`${q}/${d}`);
  if (unknown.length > 0)
    warnings.push(
      `${unknown.length} judged ${unknown.length === 1 ? 'document is' : 'documents are'} not in the index (query/document): ${unknown.slice(0, MAX_LISTED).join(', ')}${unknown.length > MAX_LISTED ? ', …' : ''}`,
    );
  const asked = new Set(queries.map((q) => String(q.id)));
  const noQuery = [...qrels.keys()].filter((q) => !asked.has(q));
  if (noQuery.length > 0)
    warnings.push(
      `${noQuery.length} judged ${noQuery.length === 1 ? 'query is' : 'queries are'} not in ${flags.queries}: ${noQuery.slice(0, MAX_LISTED).join(', ')}${noQuery.length > MAX_LISTED ? ', …' : ''}`,
    );
  for (const w of warnings) io.err(`warning: ${printable(w)}`);

  const runs = new Map<string, string[]>();
  for (const q of queries) {
    const qid = String(q.id);
    if (!qrels.has(qid)) continue;
    try {
      runs.set(
        qid,
        index.search(q.text, { top: index.size }).map((h) => (qrels.get(qid)!.has(h.path) ? h.path : idOf(h.path))),
      );
    } catch (err) {
      if (!(err instanceof NoKnownTermsError)) throw err;
      runs.set(qid, []);
    }
  }
  if (runs.size === 0)
    throw new InvalidInputError(`nothing to evaluate: no query of ${flags.queries} has a relevant document in ${flags.qrels}`);
  const s = evaluateRuns(runs, qrels);
  if (flags.json) io.out(JSON.stringify(s));
  else io.out(`queries ${s.queries}  MAP ${s.map.toFixed(4)}  P@10 ${s.precisionAt10.toFixed(4)}  nDCG@10 ${s.ndcgAt10.toFixed(4)}`);
  return 0;
}
