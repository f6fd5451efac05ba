/**
 * Reads and counts files on the pool's threads for a build from scratch, and returns the counts
 * over a vocabulary that is already in IndexBuilder's canonical order (terms sorted by UTF-16
 * code units, every term used), so the builder does not have to renumber millions of terms.
 * No shared term map is grown while reading: each thread keeps its own terms, and its files'
 * counts (packed in one array, not sent per batch); at the end each sorts its own terms (in
 * parallel) and sends them as code units, the sorted lists are merged here into the
 * vocabulary's bytes, and each thread translates its files' counts to the merged ids and sends
 * them back in one pair of arrays, which the files' DocTerms view. The result does not depend on
 * which thread read which file.
 */
import { InvalidInputError } from '../../core/errors.js';
import { Vocabulary, type DocTerms } from '../../core/counting/termCounts.js';
import type { Language } from '../../core/text/languages.js';
import { runCountBatches, type CountJob, type CountOptions, type CountOutcome } from './parallelCount.js';
import type { FinalCounts, FromWorker, TermOrder, ToWorker } from './threadProtocol.js';
import type { TermUnits } from './termOrder.js';
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
  const raw: (Pending | Exclude<CountOutcome, { kind: 'text' }>)[] = new Array(jobs.length);
  await runCountBatches(pool, jobs, { ...options, keepCounts: true }, (w, msg) => {
    for (const f of msg.files) {
      if (f.kind === 'text') throw new Error('a tokenizing thread sent counts it was asked to keep');
      raw[f.index] =
        f.kind === 'kept'
          ? { worker: w, at: f.at, terms: f.terms, length: f.length, language: f.language, sections: f.sections }
          : { kind: f.kind };
    }
  });
  options.onStep?.('read');
  // Each thread sorts its own terms (in parallel) and hands them over as code units, letting go of
  // its word tables; the merge writes the vocabulary's bytes with no string per term.
  const lists = await Promise.all(pool.workers.map((_, w) => ask<TermOrder>(pool, w, { type: 'sort-terms' }, 'term-order')));
  const merged = mergeSortedUnits(lists);
  lists.length = 0;
  const translate = merged.toMerged;
  options.onStep?.('merged');
  // Each thread translates its own files' counts into one pair of arrays (and its sections' into
  // another), one thread after the other: a thread's counts as floats are new arrays beside its
  // packs, and with every thread at it at once they all stood at the peak (Linux tree: about 150
  // MB more than one at a time, for a few seconds of wall time less). Each run's sort by term
  // was done by all threads at once while the merge above ran (parallelWorker.ts, rankRuns).
  const finals: FinalCounts[] = [];
  for (let w = 0; w < pool.workers.length; w++)
    finals.push(await ask<FinalCounts>(pool, w, { type: 'finish-counts', translate: translate[w] }, 'final-counts'));
  if (options.endThreads) await pool.close();
  options.onStep?.('finished');
  const outcomes: CountOutcome[] = new Array(jobs.length);
  for (let i = 0; i < jobs.length; i++) {
    const r = raw[i];
    if ('worker' in r) {
      const f = finals[r.worker];
      // A file without terms gets arrays of its own: an empty view would still hold the thread's
      // whole pair (on the Linux tree two such files kept 220 MB through the SVD, as nothing
      // parks an empty file's counts).
      const terms: DocTerms =
        r.terms > 0
          ? { termIds: f.termIds.subarray(r.at, r.at + r.terms), counts: f.counts.subarray(r.at, r.at + r.terms), length: r.length }
          : { termIds: new Int32Array(0), counts: new Float32Array(0), length: r.length };
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
  const vocab = Vocabulary.fromEncoded(merged.bytes, merged.starts);
  if (!vocab) throw new Error('the merged vocabulary has offsets that do not delimit its terms');
  return { vocab, outcomes };
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

/** The merged vocabulary as saved (UTF-8, '\0' between terms) and each list's sorted positions → merged ids. */
export interface MergedTerms {
  readonly bytes: Uint8Array;
  /** Start offset of each term, one more entry than terms (the last is bytes.length + 1). */
  readonly starts: Int32Array;
  /** toMerged[w][p]: the merged id of list w's p-th term. */
  readonly toMerged: Int32Array[];
}

/**
 * Merges per-thread sorted term lists (code units, each list ascending in UTF-16 code unit
 * order, its terms distinct) into one sorted list of distinct terms, written straight to UTF-8
 * bytes as TextEncoder writes the terms joined by '\0' (a lone surrogate becomes U+FFFD): no
 * string per term on this thread, where millions of them (the Linux tree has 3.6 million) and
 * their sorted copy held hundreds of MB.
 */
export function mergeSortedUnits(lists: readonly TermUnits[]): MergedTerms {
  const k = lists.length;
  const pos = new Int32Array(k);
  const toMerged = lists.map((l) => new Int32Array(l.starts.length - 1));
  let total = 0;
  for (const l of lists) total += l.units.length + l.starts.length;
  // Most terms are ASCII (one byte a unit); grown as needed.
  let out = new Uint8Array(Math.max(64, total));
  let used = 0;
  let starts = new Int32Array(1024);
  let count = 0;
  for (;;) {
    let best = -1;
    for (let w = 0; w < k; w++) {
      if (pos[w] >= toMerged[w].length) continue;
      if (best < 0 || compareTerms(lists[w], pos[w], lists[best], pos[best]) < 0) best = w;
    }
    if (best < 0) break;
    const b = lists[best];
    const p = pos[best];
    const from = b.starts[p];
    const to = b.starts[p + 1];
    if (count > 0) out[used++] = 0;
    if (count + 1 >= starts.length) {
      const grown = new Int32Array(starts.length * 2);
      grown.set(starts);
      starts = grown;
    }
    starts[count] = used;
    if (used + 3 * (to - from) + 1 > out.length) {
      const grown = new Uint8Array(Math.max(2 * out.length, used + 3 * (to - from) + 1));
      grown.set(out.subarray(0, used));
      out = grown;
    }
    used = encodeUtf8(b.units, from, to, out, used);
    const id = count++;
    for (let w = 0; w < k; w++) {
      if (w !== best && (pos[w] >= toMerged[w].length || compareTerms(lists[w], pos[w], b, p) !== 0)) continue;
      toMerged[w][pos[w]++] = id;
    }
  }
  starts[count] = used + 1;
  return { bytes: out.slice(0, used), starts: starts.slice(0, count + 1), toMerged };
}

/** Code unit order of term p of a and term q of b (shorter first on a common prefix), as strings compare. */
function compareTerms(a: TermUnits, p: number, b: TermUnits, q: number): number {
  const u = a.units;
  const v = b.units;
  let i = a.starts[p];
  const ie = a.starts[p + 1];
  let j = b.starts[q];
  const je = b.starts[q + 1];
  for (; i < ie && j < je; i++, j++) if (u[i] !== v[j]) return u[i] - v[j];
  return ie - i - (je - j);
}

/** Writes u[from, to) as UTF-8 at out[at] (room checked by the caller: 3 bytes a unit); returns the end. */
function encodeUtf8(u: Uint16Array, from: number, to: number, out: Uint8Array, at: number): number {
  for (let i = from; i < to; i++) {
    let c = u[i];
    if (c < 0x80) {
      if (c === 0) throw new InvalidInputError('a term holds U+0000, the separator of a vocabulary held as bytes');
      out[at++] = c;
    } else if (c < 0x800) {
      out[at++] = 0xc0 | (c >> 6);
      out[at++] = 0x80 | (c & 63);
    } else if (c >= 0xd800 && c <= 0xdfff) {
      const d = i + 1 < to ? u[i + 1] : 0;
      if (c <= 0xdbff && d >= 0xdc00 && d <= 0xdfff) {
        c = ((c - 0xd800) << 10) + (d - 0xdc00) + 0x10000;
        i++;
        out[at++] = 0xf0 | (c >> 18);
        out[at++] = 0x80 | ((c >> 12) & 63);
        out[at++] = 0x80 | ((c >> 6) & 63);
        out[at++] = 0x80 | (c & 63);
      } else {
        // A lone surrogate: U+FFFD, as TextEncoder writes it.
        out[at++] = 0xef;
        out[at++] = 0xbf;
        out[at++] = 0xbd;
      }
    } else {
      out[at++] = 0xe0 | (c >> 12);
      out[at++] = 0x80 | ((c >> 6) & 63);
      out[at++] = 0x80 | (c & 63);
    }
  }
  return at;
}
