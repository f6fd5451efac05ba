/**
 * Reads and counts files on the pool's threads for a build from scratch, and returns the counts
 * over a vocabulary that is already in IndexBuilder's canonical order (terms sorted by UTF-16
 * code units, every term used), so the builder does not have to renumber millions of terms.
 * No shared term map is grown while reading: each thread keeps its own terms, and its files'
 * counts (packed in one array, not sent per batch); at the end each sorts its own terms (in
 * parallel), the sorted lists are merged here, and each thread translates its files' counts to
 * the merged ids and sends them back in one pair of arrays, which the files' DocTerms view. The
 * result does not depend on which thread read which file.
 */
import { Vocabulary, type DocTerms } from '../../core/counting/termCounts.js';
import type { Language } from '../../core/text/languages.js';
import { runCountBatches, type CountJob, type CountOptions, type CountOutcome } from './parallelCount.js';
import type { FinalCounts, FromWorker, TermOrder, ToWorker } from './threadProtocol.js';
import type { ThreadSections } from './threadSections.js';
import type { WorkerPool } from './workerPool.js';

interface Pending {
  readonly worker: number;
  /** Positions [at, at + terms) of the worker's final counts. */
  readonly at: number;
  readonly terms: number;
  readonly length: number;
  readonly language?: Language;
  readonly sections?: ThreadSections;
}

export interface SortedCounts {
  /** Every term that occurs, in sorted order (ids are positions). */
  readonly vocab: Vocabulary;
  /** One outcome per job, in job order. */
  readonly outcomes: CountOutcome[];
}

export async function countFilesSorted(pool: WorkerPool, jobs: readonly CountJob[], options: CountOptions): Promise<SortedCounts> {
  const terms: string[][] = pool.workers.map(() => []);
  const raw: (Pending | Exclude<CountOutcome, { kind: 'text' }>)[] = new Array(jobs.length);
  await runCountBatches(pool, jobs, { ...options, keepCounts: true }, (w, msg) => {
    for (const t of msg.newTerms) terms[w].push(t);
    for (const f of msg.files) {
      if (f.kind === 'text') throw new Error('a tokenizing thread sent counts it was asked to keep');
      raw[f.index] =
        f.kind === 'kept'
          ? { worker: w, at: f.at, terms: f.terms, length: f.length, language: f.language, sections: f.sections }
          : { kind: f.kind };
    }
  });
  options.onStep?.('read');
  const orders = await Promise.all(pool.workers.map((_, w) => ask<TermOrder>(pool, w, { type: 'sort-terms' }, 'term-order')));
  const { sorted, translate } = mergeSorted(
    terms,
    orders.map((o) => o.order),
  );
  options.onStep?.('merged');
  // Each thread translates and sorts its own files' counts (in parallel), into one pair of arrays.
  const finals = await Promise.all(
    pool.workers.map((_, w) => ask<FinalCounts>(pool, w, { type: 'finish-counts', translate: translate[w] }, 'final-counts')),
  );
  if (options.endThreads) await pool.close();
  options.onStep?.('finished');
  const outcomes: CountOutcome[] = new Array(jobs.length);
  for (let i = 0; i < jobs.length; i++) {
    const r = raw[i];
    if ('worker' in r) {
      const f = finals[r.worker];
      const terms: DocTerms = {
        termIds: f.termIds.subarray(r.at, r.at + r.terms),
        counts: f.counts.subarray(r.at, r.at + r.terms),
        length: r.length,
      };
      // A file's sections view the thread's section arrays (one pair per thread, as its files' counts).
      const sections = r.sections && { ...r.sections, termIds: f.sectionTermIds, counts: f.sectionCounts };
      outcomes[i] = {
        kind: 'text',
        terms,
        ...(r.language === undefined ? {} : { language: r.language }),
        ...(sections ? { sections } : {}),
      };
    } else outcomes[i] = r;
  }
  // As bytes: the index keeps this vocabulary, and strings with a map cost several times more.
  return { vocab: Vocabulary.fromTerms(sorted), outcomes };
}

/** Sends msg to worker w and resolves with its reply of the given type. */
function ask<T extends FromWorker>(pool: WorkerPool, w: number, msg: ToWorker, replyType: T['type']): Promise<T> {
  const worker = pool.workers[w];
  return new Promise((resolve, reject) => {
    const done = (): void => {
      worker.off('message', onMessage);
      worker.off('error', onError);
    };
    const onMessage = (reply: FromWorker): void => {
      if (reply.type === replyType) {
        done();
        resolve(reply as T);
      } else if (reply.type === 'error') {
        done();
        reject(new Error(`a tokenizing thread failed: ${reply.message}`));
      }
    };
    const onError = (err: Error): void => {
      done();
      reject(err);
    };
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.postMessage(msg, msg.type === 'finish-counts' ? [msg.translate.buffer as ArrayBuffer] : []);
  });
}

/** Merges per-thread sorted term lists into one sorted list of distinct terms, with each thread's local → global ids. */
export function mergeSorted(
  terms: readonly (readonly string[])[],
  orders: readonly Int32Array[],
): { sorted: string[]; translate: Int32Array[] } {
  const k = terms.length;
  const pos = new Int32Array(k);
  const translate = terms.map((t) => new Int32Array(t.length));
  // The head term of each list (undefined when it is done).
  const head: (string | undefined)[] = terms.map((t, w) => (orders[w].length > 0 ? t[orders[w][0]] : undefined));
  const sorted: string[] = [];
  for (;;) {
    let best: string | undefined;
    for (let w = 0; w < k; w++) {
      const t = head[w];
      if (t !== undefined && (best === undefined || t < best)) best = t;
    }
    if (best === undefined) break;
    const id = sorted.length;
    sorted.push(best);
    for (let w = 0; w < k; w++) {
      if (head[w] !== best) continue;
      const order = orders[w];
      const p = pos[w];
      translate[w][order[p]] = id;
      pos[w] = p + 1;
      head[w] = p + 1 < order.length ? terms[w][order[p + 1]] : undefined;
    }
  }
  return { sorted, translate };
}
