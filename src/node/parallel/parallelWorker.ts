/**
 * Entry point of a parallel worker thread (bundled to dist/parallelWorker.js): reads and
 * tokenizes batches of files for the folder indexer, and runs its share of the SVD's matrix
 * products on shared memory (kernelTasks.ts).
 */
import { collectGarbage } from '../collectGarbage.js';
import { parentPort } from 'node:worker_threads';
import { instantiateKernels, type KernelExports } from '../../core/matrix/wasm/wasmArena.js';
import { CTRL_FAILED, CTRL_FINISHED, drainTasks } from './kernelTasks.js';
import { mapRankedRun, rankSmallRun, translateSmallRun } from './parallelCount.js';
import { grow32, mappedInt32 } from './wordTable.js';
import type { FileOutcome, FinalCounts, FromWorker, ToWorker } from './threadProtocol.js';
import { decodeUtf8 } from '../scanRead.js';
import { DEFAULT_MAX_FILE_BYTES } from '../scanTypes.js';
import { FileReader } from './readTextSync.js';
import { WordCounter, type PackedFile } from './wordCounter.js';
import type { TermUnits } from './termOrder.js';
import { countThreadSections, type ThreadSections } from './threadSections.js';

if (!parentPort) throw new Error('parallelWorker.js must be started as a worker thread.');
const port = parentPort;
let counter: WordCounter | undefined;
let keepCounts = false;
/** Pack ranges [start, end) of the kept files, in pack order. */
let kept: number[] = [];
/** Count each file's sections too (with keepCounts). */
let withSections = false;
/**
 * Pack ranges [start, end) of the kept sections, in pack order, in pairs of one array (not each
 * file's offsets: an array each, with its buffer, for tens of thousands of files).
 */
let sectionRuns = new Int32Array(0);
let sectionRunsUsed = 0;
const reader = new FileReader();
let maxFileBytes = DEFAULT_MAX_FILE_BYTES;
let kernels: KernelExports | undefined;
/** Why rankRuns failed, reported by the finish-counts that follows. */
let rankFailure: string | undefined;
let memory: WebAssembly.Memory | undefined;

port.on('message', (msg: ToWorker) => {
  if (msg.type === 'wasm-init') {
    const replaced = memory !== undefined;
    kernels = instantiateKernels(msg.module, msg.memory);
    memory = msg.memory;
    // A new executor's memory: the old one is freed once no thread holds it (see collectGarbage).
    if (replaced) collectGarbage();
    return;
  }
  if (msg.type === 'kernel') {
    try {
      if (!kernels || !memory) throw new Error('kernel job before wasm-init');
      drainTasks(kernels, msg.job, msg.ctrl, memory);
    } catch {
      Atomics.store(msg.ctrl, CTRL_FAILED, 1);
    } finally {
      Atomics.add(msg.ctrl, CTRL_FINISHED, 1);
      Atomics.notify(msg.ctrl, CTRL_FINISHED);
    }
    return;
  }
  if (msg.type === 'sort-terms') {
    const { units, starts } = setAsideCounts();
    const reply: FromWorker = { type: 'term-order', units, starts };
    port.postMessage(reply, [units.buffer as ArrayBuffer, starts.buffer as ArrayBuffer]);
    // Once setAsideCounts has returned (its frame held the counter), while the main thread merges.
    collectGarbage();
    // Still while it merges (a finish-counts waits in the queue until this returns). A failure
    // here has no request to answer: the finish-counts that follows reports it.
    try {
      rankRuns();
    } catch (err) {
      rankFailure = err instanceof Error ? err.message : String(err);
    }
    return;
  }
  if (msg.type === 'setup') {
    counter = new WordCounter(msg.tokenize);
    maxFileBytes = msg.maxFileBytes;
    keepCounts = msg.keepCounts === true;
    withSections = keepCounts && msg.sections === true;
    counter.recordWords = withSections;
    kept = [];
    sectionRuns = new Int32Array(0);
    sectionRunsUsed = 0;
    finishing = undefined;
    rankFailure = undefined;
    return;
  }
  if (msg.type === 'finish-counts') {
    if (rankFailure !== undefined) {
      const failed: FromWorker = { type: 'error', message: rankFailure };
      port.postMessage(failed);
      return;
    }
    // The packs' ids are translated in place, their counts into floats, and the buffers
    // transferred. Arrays past MAPPED_FROM_BYTES lie in mappings of their own (mappedInt32), so
    // nothing of this thread's malloc arena stays in use once it ends.
    const reply = finishCounts(msg.translate);
    const buffers = new Set([reply.termIds.buffer, reply.counts.buffer, reply.sectionTermIds.buffer, reply.sectionCounts.buffer]);
    port.postMessage(reply, [...buffers] as ArrayBuffer[]);
    // The packs' byte counts go back to the system before the next thread finishes its own.
    collectGarbage();
    return;
  }
  try {
    const wc = counter ?? (counter = new WordCounter({}));
    const read: ({ readonly index: number; sections?: ThreadSections } & (
      PackedFile | { readonly kind: 'binary' | 'too-large' | 'unreadable' }
    ))[] = [];
    for (const f of msg.files) {
      const got = reader.read(f.absPath, maxFileBytes);
      if (got.kind !== 'bytes') {
        read.push({ index: f.index, kind: got.kind });
        continue;
      }
      const text = got.ascii ? undefined : decodeUtf8(got.bytes);
      const packed = text === undefined ? wc.packAscii(got.bytes, f.absPath) : wc.packText(text, f.absPath);
      // A file counted in another language keeps its sections for the sections stage (they are
      // counted in English there, which may bring words no file has into this thread's terms).
      const sections =
        withSections && f.key !== undefined && packed.language === undefined
          ? countThreadSections(wc, f.key, text ?? got.bytes.toString('latin1'))
          : undefined;
      if (sections) keepSectionRuns(sections.offsets);
      read.push({ index: f.index, ...packed, sections });
    }
    if (keepCounts) {
      // The counts stay in the pack until finish-counts; the reply says where.
      const files: FileOutcome[] = read.map((r) =>
        'kind' in r
          ? r
          : { index: r.index, kind: 'kept', at: r.at, terms: r.terms, length: r.length, language: r.language, sections: r.sections },
      );
      for (const r of read) if (!('kind' in r)) kept.push(r.at, r.at + r.terms);
      // The terms go once, sorted, at sort-terms (as code units: no string per term on the main thread).
      const reply: FromWorker = { type: 'batch', batch: msg.batch, newTerms: [], files };
      port.postMessage(reply);
      return;
    }
    // One pair of buffers for the whole batch; each file's arrays are views into them.
    const { ids, counts } = wc.takePack();
    const files: FileOutcome[] = read.map((r) =>
      'kind' in r
        ? r
        : {
            index: r.index,
            kind: 'text',
            ids: ids.subarray(r.at, r.at + r.terms),
            counts: counts.subarray(r.at, r.at + r.terms),
            length: r.length,
            language: r.language,
          },
    );
    const reply: FromWorker = { type: 'batch', batch: msg.batch, newTerms: wc.takeNewTerms(), files };
    port.postMessage(reply, [ids.buffer as ArrayBuffer, counts.buffer as ArrayBuffer]);
  } catch (err) {
    const reply: FromWorker = { type: 'error', message: err instanceof Error ? err.message : String(err) };
    port.postMessage(reply);
  }
});

/** What finish-counts needs once the last batch is counted: the packs and the sorted order of the terms. */
let finishing:
  | {
      readonly order: Int32Array;
      readonly files: ReturnType<WordCounter['drainSmallPack']>;
      readonly sections: ReturnType<WordCounter['drainSmallSectionPack']>;
      /** The runs hold ranks in ascending order (rankRuns), not the thread's own ids. */
      readonly ranked: boolean;
    }
  | undefined;

/**
 * The thread's terms in sorted order as code units (the term-order reply), and everything else
 * of the counter let go but its packs: its word tables, term map and term strings (on the Linux
 * tree a few hundred MB a thread) are not needed to translate the packs, which run at the end of
 * counting, the build's peak. The caller collects garbage once this has returned (measured on the
 * Linux tree: about 450 MB resident less a thread), rather than at some later point.
 */
function setAsideCounts(): TermUnits {
  const wc = counter ?? new WordCounter({});
  // The word caches go first, so that the sort's arrays take the place they held.
  wc.dropWordCaches();
  collectGarbage();
  const { order, terms: units } = wc.sortedTerms();
  // Views of the packs: valid as long as nothing more is packed, and the counter is dropped here.
  finishing = { order, files: wc.drainSmallPack(), sections: wc.drainSmallSectionPack(), ranked: false };
  counter = undefined;
  return units;
}

/**
 * Puts every kept run, files' and sections', in the order of the thread's sorted terms (ids become
 * ranks: rankSmallRun), so finish-counts only maps them: the sorting that made the threads' finish,
 * one thread after the other, last seconds on a large tree is done here, by all threads at once,
 * while the main thread merges their terms. In place: no memory beyond a rank per term.
 */
function rankRuns(): void {
  if (!finishing || finishing.ranked) return;
  const { order, files, sections: s } = finishing;
  const rank = new Int32Array(order.length);
  for (let p = 0; p < order.length; p++) rank[order[p]] = p;
  for (let r = 0; r < kept.length; r += 2) rankSmallRun(files.ids, files.counts, files.big, kept[r], kept[r + 1], rank);
  for (let r = 0; r < sectionRunsUsed; r += 2) rankSmallRun(s.ids, s.counts, s.big, sectionRuns[r], sectionRuns[r + 1], rank);
  finishing = { ...finishing, ranked: true };
}

/** Notes the pack range of each of a file's sections (section i: [offsets[i], offsets[i + 1])). */
function keepSectionRuns(offsets: Int32Array): void {
  const n = offsets.length - 1;
  if (n <= 0) return;
  if (sectionRunsUsed + 2 * n > sectionRuns.length) sectionRuns = grow32(sectionRuns, sectionRunsUsed + 2 * n);
  for (let i = 0; i < n; i++) {
    sectionRuns[sectionRunsUsed++] = offsets[i];
    sectionRuns[sectionRunsUsed++] = offsets[i + 1];
  }
}

/**
 * Every kept file's counts over final ids (each file's run sorted), in place in the packs, and a
 * fresh start. bySorted: the final id of each term in sorted order (setAsideCounts).
 */
function finishCounts(bySorted: Int32Array): FinalCounts {
  if (!finishing) setAsideCounts();
  const { order, files, sections: s, ranked } = finishing!;
  finishing = undefined;
  // Ranked runs map through bySorted itself; otherwise each run is translated and sorted here.
  let translate = bySorted;
  if (!ranked) {
    translate = new Int32Array(order.length);
    for (let p = 0; p < order.length; p++) translate[order[p]] = bySorted[p];
  }
  const finish = ranked ? mapRankedRun : translateSmallRun;
  // The counts were bytes: their floats get a buffer of their own (a mapping of its own past
  // MAPPED_FROM_BYTES, as the packs); the ids are translated in place.
  const { ids, counts, big } = files;
  const out = new Float32Array(mappedInt32(counts.length).buffer, 0, counts.length);
  for (let r = 0; r < kept.length; r += 2) finish(ids, counts, big, kept[r], kept[r + 1], translate, ids, out);
  kept = [];
  const sectionCounts = new Float32Array(mappedInt32(s.counts.length).buffer, 0, s.counts.length);
  for (let r = 0; r < sectionRunsUsed; r += 2)
    finish(s.ids, s.counts, s.big, sectionRuns[r], sectionRuns[r + 1], translate, s.ids, sectionCounts);
  sectionRuns = new Int32Array(0);
  sectionRunsUsed = 0;
  return { type: 'final-counts', termIds: ids, counts: out, sectionTermIds: s.ids, sectionCounts };
}
