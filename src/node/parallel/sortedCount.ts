/**
 * Reads and counts files on the pool's threads for a build from scratch, and returns the counts
 * over a vocabulary that is already in IndexBuilder's canonical order (terms sorted by UTF-16
 * code units, every term used), so the builder does not have to renumber millions of terms.
 * No shared term map is grown while reading: each thread keeps its own terms; at the end each
 * sorts its own (in parallel), the sorted lists are merged here, and each file's local ids are
 * translated once. The result does not depend on which thread read which file.
 */
import { Vocabulary, type DocTerms } from '../../core/index/termCounts.js';
import { runCountBatches, toDocTerms, type CountJob, type CountOptions, type CountOutcome } from './parallelCount.js';
import type { FromWorker, ToWorker } from './protocol.js';
import type { WorkerPool } from './workerPool.js';

interface Pending {
  readonly worker: number;
  readonly ids: Int32Array;
  readonly counts: Int32Array;
  readonly length: number;
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
  await runCountBatches(pool, jobs, options, (w, msg) => {
    for (const t of msg.newTerms) terms[w].push(t);
    for (const f of msg.files) raw[f.index] = f.kind === 'text' ? { worker: w, ids: f.ids, counts: f.counts, length: f.length } : { kind: f.kind };
  });
  const orders = await Promise.all(pool.workers.map((_, w) => termOrder(pool, w)));
  const { sorted, translate } = mergeSorted(terms, orders);
  const outcomes: CountOutcome[] = new Array(jobs.length);
  for (let i = 0; i < jobs.length; i++) {
    const r = raw[i];
    if ('worker' in r) {
      const terms: DocTerms = toDocTerms(r.ids, r.counts, r.length, translate[r.worker]);
      outcomes[i] = { kind: 'text', terms };
    } else outcomes[i] = r;
    raw[i] = undefined as never; // hand the local arrays back as we go
  }
  return { vocab: new Vocabulary(sorted), outcomes };
}

function termOrder(pool: WorkerPool, w: number): Promise<Int32Array> {
  const worker = pool.workers[w];
  return new Promise((resolve, reject) => {
    const onMessage = (msg: FromWorker): void => {
      if (msg.type === 'term-order') {
        worker.off('message', onMessage);
        worker.off('error', onError);
        resolve(msg.order);
      } else if (msg.type === 'error') {
        worker.off('message', onMessage);
        worker.off('error', onError);
        reject(new Error(`a tokenizing thread failed: ${msg.message}`));
      }
    };
    const onError = (err: Error): void => {
      worker.off('message', onMessage);
      reject(err);
    };
    worker.on('message', onMessage);
    worker.on('error', onError);
    const msg: ToWorker = { type: 'sort-terms' };
    worker.postMessage(msg);
  });
}

/** Merges per-thread sorted term lists into one sorted list of distinct terms, with each thread's local → global ids. */
export function mergeSorted(terms: readonly (readonly string[])[], orders: readonly Int32Array[]): { sorted: string[]; translate: Int32Array[] } {
  const k = terms.length;
  const pos = new Int32Array(k);
  const translate = terms.map((t) => new Int32Array(t.length));
  const sorted: string[] = [];
  for (;;) {
    let best = -1;
    let bestTerm = '';
    for (let w = 0; w < k; w++) {
      if (pos[w] >= orders[w].length) continue;
      const t = terms[w][orders[w][pos[w]]];
      if (best < 0 || t < bestTerm) {
        best = w;
        bestTerm = t;
      }
    }
    if (best < 0) break;
    const id = sorted.length;
    sorted.push(bestTerm);
    for (let w = 0; w < k; w++) {
      if (pos[w] < orders[w].length && terms[w][orders[w][pos[w]]] === bestTerm) {
        translate[w][orders[w][pos[w]]] = id;
        pos[w]++;
      }
    }
  }
  return { sorted, translate };
}
