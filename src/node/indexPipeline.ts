/**
 * The indexing pipeline, once for every tool: scan → reuse → read and count → build → save.
 * The command line (folderIndexer.ts: one folder, loads and saves its index file) and the editor's
 * worker (worker/workspaceIndexer.ts: every workspace folder under one key space, swaps the index
 * in itself) are thin adapters over runIndexPipeline.
 *
 *   scan    the adapter's scan function lists the files with their index keys
 *   reuse   a file whose size and modification time match the previous index keeps its counts
 *   read    the others are read and tokenized into term counts (chooseCounting picks how)
 *   build   IndexBuilder weights, prunes and runs the SVD (src/core/index/model)
 *   save    the adapter's save function, when it has one (atomic write, src/node/persist.ts)
 *
 * Counting is chosen in one place (chooseCounting): below PARALLEL_MIN_FILES files on this thread;
 * from scratch on threads with sorted vocabularies (parallel/sortedCount.ts: the counts come back
 * already in the builder's term order); otherwise on threads against the existing vocabulary
 * (parallel/parallelCount.ts). The tokenizing threads are ended before the SVD, which starts its
 * own (their word tables are freed before the build needs the memory); those threads get fresh
 * executor memory twice, once the SVD's passes are done and before the sections fold
 * (WebAssembly memory never shrinks, and what follows needs far less of it: collectGarbage.ts).
 * Nothing is swapped or saved before the build has finished, so a cancelled or failed run leaves
 * the previous index as it was.
 */
import { performance } from 'node:perf_hooks';
import { CancelledError, EmptyCorpusError } from '../core/errors.js';
import type { DocMeta, LsiIndex } from '../core/index/lsiIndex.js';
import { IndexBuilder } from '../core/index/model/indexBuilder.js';
import { modelSettingsKey, type IndexSettings } from '../core/index/model/settings.js';
import { countTerms, Vocabulary, type DocTerms } from '../core/counting/termCounts.js';
import { tokenizeIn } from '../core/text/tokenizeLanguage.js';
import { fileLanguage, withLanguage } from '../core/text/detectLanguage.js';
import { countFilesInParallel, type CountOutcome } from './parallel/parallelCount.js';
import { countFilesSorted } from './parallel/sortedCount.js';
import { WorkerPool, type PoolOptions } from './parallel/workerPool.js';
import type { MatrixExecutor } from '../core/matrix/executor.js';
import { collectGarbage } from './collectGarbage.js';
import { readIndexableText } from './scanRead.js';
import type { SkippedPath } from './scanTypes.js';
import { readSharedModel } from './conceptModelFile.js';
import { foldFileSections } from './sectionPass.js';
import type { CountedSections } from '../core/sections/sectionVectors.js';
import type { OpenSpill } from '../core/sections/types.js';
import { ParkedSections } from './parkedSections.js';
import { ParkedCounts } from './parkedCounts.js';
import type { TermListSource } from '../core/index/persistence/serialize.js';

/** Below this many files, starting worker threads costs more than it saves (our measurement). */
export const PARALLEL_MIN_FILES = 200;
/**
 * Sections × k from which the save files the sections on the build's threads (kept alive for
 * it): 2²⁶, about 0.8 s of filing on one thread (the whole Linux tree's 1.33 M sections at k = 289
 * are 384 M and took 4.4 s). Below, the threads go before the save, as their memory would be
 * kept for little (the Documentation folder's save was not faster with them). Our choice.
 */
export const FILE_ON_THREADS_FROM = 1 << 26;

/** The pipeline's stages, in order; the adapters report these (the command line adds 'load'). */
export type PipelineStage = 'scan' | 'read' | 'matrix' | 'svd' | 'sections' | 'save';

export interface PipelineProgress {
  readonly stage: PipelineStage;
  readonly done: number;
  readonly total: number;
}

/** What the counting stage hands to onCounted: the settings, the vocabulary and each file's raw counts. */
export interface CountedCorpus {
  readonly settings: IndexSettings;
  readonly vocab: Vocabulary;
  readonly docs: readonly { readonly meta: DocMeta; readonly terms: DocTerms }[];
}

/** A file to index: its key in the index and where it is on disk. */
export interface SourceFile {
  /** Index key (see ARCHITECTURE.md, glossary): '/'-separated, relative to its folder. */
  readonly key: string;
  readonly absPath: string;
  readonly size: number;
  readonly mtimeMs: number;
}

/** Files left out, by why. The scan's reasons and the reader's share these counters. */
export interface SkipCounts {
  binary: number;
  tooLarge: number;
  unreadable: number;
  /** Link loops, duplicate links and broken links (reported by the scan). */
  other: number;
}

export interface SourceScan {
  readonly files: readonly SourceFile[];
  readonly skipped: SkipCounts;
}

/** Tallies a scan's skipped paths into SkipCounts. */
export function tallySkipped(skipped: readonly Pick<SkippedPath, 'reason'>[]): SkipCounts {
  const counts: SkipCounts = { binary: 0, tooLarge: 0, unreadable: 0, other: 0 };
  for (const s of skipped) {
    if (s.reason === 'too-large') counts.tooLarge++;
    else if (s.reason === 'unreadable') counts.unreadable++;
    else counts.other++;
  }
  return counts;
}

export interface PipelineOptions {
  readonly settings: IndexSettings;
  /** Lists the files to index (after excludes), with their keys. */
  readonly scan: () => Promise<SourceScan>;
  /** Files above this many bytes are skipped when read (they may have grown since the scan). */
  readonly maxFileBytes: number;
  /** The index whose unchanged files need not be read again. */
  readonly previous?: LsiIndex;
  /**
   * Return the previous index as it is when nothing changed (no file read, none removed, same
   * model settings, no edits folded in since its build). @default false: always build.
   */
  readonly keepUnchanged?: boolean;
  /**
   * Saves the built index (not called for an unchanged one). termLists, when given, holds the
   * files' raw counts while they are parked (their own arrays are empty until the save returns):
   * pass it on to the save (persist.ts, saveIndex).
   */
  readonly save?: (index: LsiIndex, termLists?: TermListSource) => Promise<void>;
  /** Message of the EmptyCorpusError when no file has text (a function: asked after the scan). */
  readonly emptyMessage: string | (() => string);
  readonly signal?: AbortSignal;
  /** Polled as well as signal, including during the synchronous SVD. */
  readonly isCancelled?: () => boolean;
  readonly onProgress?: (p: PipelineProgress) => void;
  /** Fold each file's sections into the built model (src/core/sections). @default true */
  readonly sections?: boolean;
  /** Threads for tokenizing and the SVD (false: this thread only). @default {} (all cores) */
  readonly threads?: PoolOptions | false;
  /**
   * Called once counting has ended, before weighting and the SVD, with every file's raw counts
   * (the builder's own objects: not to be changed), so a caller can offer word-match answers
   * while the concept model is built (worker/wordMatchIndex.ts).
   */
  readonly onCounted?: (counted: CountedCorpus) => void;
  /**
   * Called wherever cancellation is checked, including inside the synchronous SVD (about every
   * column block of a product), so a caller can read and answer waiting messages there.
   */
  readonly poll?: () => void;
  /**
   * Opens scratch files (beside the index: sectionCodeFile.ts, openSpillBeside) for what a large
   * build keeps out of memory: the threads' section counts during the SVD (parkedSections.ts) and
   * the section vectors from the fold on (foldCountedSections, spill). Without one, or where it
   * gives null, both stay in memory.
   */
  readonly scratch?: OpenSpill;
  /**
   * With save: the files' raw counts parked during the build stay in their scratch file after the
   * save until something reads them (ParkedCounts.unparkOnUse; the first read brings all back), for
   * a caller that often asks nothing more of the index (the command line). The scratch file then
   * stays open as long as they are not read. @default false: back in memory before the index is returned
   */
  readonly countsOnUse?: boolean;
  /** Bytes of section rows from which they go to a scratch file. @default SPILL_ROWS_FROM_BYTES */
  readonly spillRowsFromBytes?: number;
  /** Bytes of section counts from which they are parked during the SVD. @default PARK_FROM_BYTES */
  readonly parkCountsFromBytes?: number;
  /** Sections × k from which the save files them on the build's threads. @default FILE_ON_THREADS_FROM */
  readonly fileOnThreadsFrom?: number;
}

export interface PipelineResult {
  readonly index: LsiIndex;
  /** True when the previous index was kept as it was (keepUnchanged). */
  readonly unchanged: boolean;
  readonly files: number;
  readonly reused: number;
  readonly read: number;
  readonly added: number;
  readonly changed: number;
  readonly removed: number;
  readonly bytesRead: number;
  readonly skipped: SkipCounts;
  /** Files the sections stage read again (their sections were not counted while they were read). */
  readonly sectionsReadAgain: number;
  /** Seconds per stage. */
  readonly seconds: Record<PipelineStage, number>;
  /** CPU seconds (user + system, every thread of the process) per stage. */
  readonly cpuSeconds: Record<PipelineStage, number>;
}

/** How the files to read are counted. */
export type Counting = 'serial' | 'parallel' | 'sorted';

/** The counting path for `toRead` files, given whether threads are allowed and the vocabulary starts empty. */
export function chooseCounting(toRead: number, threadsAllowed: boolean, fromScratch: boolean): Counting {
  if (!threadsAllowed || toRead < PARALLEL_MIN_FILES) return 'serial';
  return fromScratch ? 'sorted' : 'parallel';
}

export async function runIndexPipeline(options: PipelineOptions): Promise<PipelineResult> {
  const { settings, previous, signal } = options;
  const progress = options.onProgress ?? (() => undefined);
  const cancelled = (): boolean => {
    options.poll?.();
    return signal?.aborted === true || options.isCancelled?.() === true;
  };
  const check = (): void => {
    if (cancelled()) throw new CancelledError();
  };
  const seconds: Record<PipelineStage, number> = { scan: 0, read: 0, matrix: 0, svd: 0, sections: 0, save: 0 };
  const cpuSeconds: Record<PipelineStage, number> = { scan: 0, read: 0, matrix: 0, svd: 0, sections: 0, save: 0 };
  let mark = performance.now();
  let cpuMark = process.cpuUsage();
  const lap = (stage: PipelineStage): void => {
    const now = performance.now();
    seconds[stage] += (now - mark) / 1000;
    mark = now;
    const cpu = process.cpuUsage(cpuMark);
    cpuSeconds[stage] += (cpu.user + cpu.system) / 1e6;
    cpuMark = process.cpuUsage();
  };

  let pool: WorkerPool | undefined;
  const threads = options.threads ?? {};
  // forProducts: the build's pool runs only the SVD's and the sections' products (no idle worker).
  const getPool = (forProducts = false): WorkerPool | undefined =>
    (pool ??= threads === false ? undefined : WorkerPool.start(threads, forProducts));
  // Ending the threads hands their word tables (and the SVD's shared memory) back.
  const releasePool = async (): Promise<void> => {
    const p = pool;
    pool = undefined;
    await p?.close();
  };

  // The threads' section counts while they are parked in a scratch file (the SVD and the sections
  // fold, which reads them back a file at a time), and the built
  // index until it is returned: both give their scratch files back when the run fails.
  let parked: ParkedSections | null = null;
  // The files' raw counts, parked from the end of the weighting until the index is saved.
  let parkedCounts: ParkedCounts | null = null;
  let built: LsiIndex | undefined;
  try {
    // ---- scan
    progress({ stage: 'scan', done: 0, total: 1 });
    const scan = await options.scan();
    lap('scan');
    check();

    // ---- reuse
    const sameTokens = previous !== undefined && JSON.stringify(previous.settings.tokenize) === JSON.stringify(settings.tokenize);
    let vocab = sameTokens ? previous.vocab : new Vocabulary();
    let builder = new IndexBuilder(settings, vocab);
    const skipped: SkipCounts = { ...scan.skipped };
    let reused = 0,
      read = 0,
      added = 0,
      changed = 0,
      bytesRead = 0;
    const toRead: SourceFile[] = [];
    // Every file's counts in one list, for onCounted (references to the builder's objects).
    const countedDocs: { meta: DocMeta; terms: DocTerms }[] | undefined = options.onCounted ? [] : undefined;
    // Counts taken over from the previous index: still that index's own (it may answer during this
    // build and is kept when the build fails or is cancelled), so they are never parked.
    const reusedTerms = new Set<DocTerms>();
    for (const f of scan.files) {
      const old = sameTokens ? previous.meta(f.key) : undefined;
      if (old && old.size === f.size && old.mtimeMs === f.mtimeMs) {
        const meta = withLanguage<DocMeta>({ path: f.key, size: f.size, mtimeMs: f.mtimeMs }, old.language);
        const terms = previous!.termsOf(f.key);
        builder.addCounted(meta, terms);
        countedDocs?.push({ meta, terms });
        reusedTerms.add(terms);
        reused++;
      } else toRead.push(f);
    }

    // ---- read and count
    const record = (f: SourceFile, got: CountOutcome): void => {
      if (got.kind === 'text') {
        const meta: DocMeta = withLanguage<DocMeta>({ path: f.key, size: f.size, mtimeMs: f.mtimeMs }, got.language);
        builder.addCounted(meta, got.terms);
        countedDocs?.push({ meta, terms: got.terms });
        if (got.sections) countedSections.set(f.key, got.sections);
        bytesRead += f.size;
        read++;
        if (previous?.has(f.key)) changed++;
        else added++;
      } else if (got.kind === 'binary') skipped.binary++;
      else if (got.kind === 'too-large') skipped.tooLarge++;
      else skipped.unreadable++;
    };
    const total = scan.files.length;
    const counting = chooseCounting(toRead.length, threads !== false, reused === 0 && vocab.size === 0);
    const countPool = counting === 'serial' ? undefined : getPool();
    const jobs = () => toRead.map((f) => ({ absPath: f.absPath, size: f.size, key: f.key }));
    // Sections counted by the threads while they read the files (from scratch only; see sections below).
    const countedSections = new Map<string, CountedSections>();
    const countOptions = {
      sections: options.sections !== false,
      tokenize: settings.tokenize,
      maxFileBytes: options.maxFileBytes,
      signal,
      onProgress: (done: number) => progress({ stage: 'read', done: reused + done, total }),
    };
    if (countPool && counting === 'sorted') {
      // From scratch: counts come back over a vocabulary already in the builder's order.
      const counted = await countFilesSorted(countPool, jobs(), { ...countOptions, endThreads: true });
      vocab = counted.vocab;
      builder = new IndexBuilder(settings, vocab);
      counted.outcomes.forEach((got, i) => record(toRead[i], got));
      // Emptied: an async function's frame may keep the list alive past this block, and with it
      // the threads' section counts that are parked during the SVD (ParkedSections).
      counted.outcomes.length = 0;
    } else if (countPool) {
      await countFilesInParallel(countPool, jobs(), vocab, countOptions, (i, got) => record(toRead[i], got));
    } else {
      // No threads (none allowed, too few files, or no bundled thread script).
      for (let i = 0; i < toRead.length; i++) {
        const f = toRead[i];
        const got = await readIndexableText(f.absPath, options.maxFileBytes);
        if (got.kind !== 'text') record(f, got);
        else {
          const language = fileLanguage(f.key, got.text, settings.tokenize.languages);
          const terms = countTerms(tokenizeIn(got.text, settings.tokenize, language), vocab, true);
          record(f, { kind: 'text', terms, language: language === 'en' ? undefined : language });
        }
        if (i % 64 === 0) {
          check();
          progress({ stage: 'read', done: reused + i, total });
        }
      }
    }
    check();
    progress({ stage: 'read', done: total, total });
    lap('read');
    const present = new Set(scan.files.map((f) => f.key));
    const removed = previous ? previous.paths().filter((p) => !present.has(p)).length : 0;
    if (builder.size === 0) {
      const m = options.emptyMessage;
      throw new EmptyCorpusError(typeof m === 'function' ? m() : m);
    }
    const counts = { files: builder.size, reused, read, added, changed, removed, bytesRead, skipped };

    const unchanged =
      options.keepUnchanged === true &&
      previous !== undefined &&
      modelSettingsKey(previous.settings) === modelSettingsKey(settings) &&
      read === 0 &&
      removed === 0 &&
      previous.size === builder.size &&
      previous.staleness().changedFiles === 0;
    if (unchanged) return { ...counts, sectionsReadAgain: 0, index: previous, unchanged: true, seconds, cpuSeconds };
    if (countedDocs) options.onCounted?.({ settings, vocab, docs: countedDocs });

    // ---- build
    await releasePool();
    // The section counts wait in a scratch file while the SVD's blocks are resident.
    if (options.sections !== false && countedSections.size > 0) {
      parked = ParkedSections.park(countedSections, options.scratch, options.parkCountsFromBytes);
      // Their arrays go now, before the weighting builds the matrix beside the files' counts (no
      // collection would come by itself before the end of the weighting).
      if (parked) collectGarbage();
    }
    const buildPool = builder.size >= PARALLEL_MIN_FILES ? getPool(true) : undefined;
    // A shared concept model (import-model, undertone.conceptModel): fold into it, no local SVD.
    const sharedModel = settings.sharedModel ? await readSharedModel(settings.sharedModel) : undefined;
    // Runs the SVD and the files' projection; the sections fold gets a fresh one (below).
    let executor = buildPool?.executor();
    const aborted = {
      get aborted() {
        return cancelled();
      },
    };
    // Once the SVD's passes are done, its working blocks go: the same threads get fresh executor
    // memory for the term vectors, again for the files' projection and for the sections fold
    // (WebAssembly memory never shrinks, and the old one is freed only when no thread holds it
    // any more: collected here and in the workers, parallelWorker.ts).
    const freshExecutor = (): MatrixExecutor | undefined => {
      executor = undefined;
      executor = pool?.executor();
      collectGarbage();
      return executor;
    };
    const index = builder.build({
      sharedModel,
      signal: aborted,
      get executor() {
        return executor;
      },
      freshExecutor: buildPool ? freshExecutor : undefined,
      // The weighted matrix's entries wait in a scratch file during the SVD's passes; their arrays
      // go once they are there, before the passes' blocks (no collection would come by itself).
      spill: options.scratch,
      onParked: collectGarbage,
      // Not while a caller may read the counts during the build (onCounted).
      onWeighted: options.onCounted
        ? undefined
        : (docs) => {
            const own = reusedTerms.size === 0 ? docs : docs.filter((d) => !reusedTerms.has(d));
            parkedCounts = ParkedCounts.park(own, options.scratch, options.parkCountsFromBytes);
          },
      onProgress: (stage, done, all) => {
        if (stage === 'weighting' && done === 1) {
          lap('matrix');
          // What the weighting left behind (the pruning's and the global weights' working arrays) goes
          // before the SVD's blocks come on top.
          collectGarbage();
        }
        progress({ stage: stage === 'weighting' ? 'matrix' : 'svd', done, total: all });
      },
    });
    built = index;
    lap('svd');
    check();
    let sectionsReadAgain = 0;
    if (options.sections !== false && executor) {
      // The sections fold needs less executor memory than the projection left resident
      // (WebAssembly memory only grows): fresh executor memory on the same threads, before the
      // parked section counts come back (not on top of the projection's memory).
      freshExecutor();
    }
    // The parked section counts stay in their scratch file: the fold reads them a file at a time
    // (they never come back whole), and the file goes once the fold is done.
    const countedTerms = parked?.lines(countedSections);
    // ---- sections: each file cut into sections, each folded into the new model on the build's
    // threads. Counts the reading threads made are over the builder's vocabulary: usable as they
    // are when the index kept it (a build from scratch without a shared model); other files are
    // read again.
    if (options.sections !== false) {
      const keyed = scan.files.filter((f) => index.has(f.key));
      sectionsReadAgain = await foldFileSections(index, keyed, options.maxFileBytes, {
        check,
        signal: aborted,
        executor,
        counted: index.vocab === vocab ? countedSections : undefined,
        countedTerms,
        onProgress: (done) => progress({ stage: 'sections', done, total: keyed.length }),
        spill: options.scratch,
        spillFromBytes: options.spillRowsFromBytes,
      });
      countedSections.clear();
      lap('sections');
    }
    (parked as ParkedSections | null)?.close();
    parked = null;
    // The save files every section under its list (savedLists.ts): for many sections on the
    // build's threads, with fresh executor memory (the fold's goes; the quantizer and a staging
    // block come in). Else the
    // threads (and the shared memory of the SVD) are not needed to save: they go, and their
    // memory is collected, before the save (and the raw counts it streams) comes on top.
    const filer =
      options.save &&
      options.sections !== false &&
      executor &&
      index.sections.count * index.model.k >= (options.fileOnThreadsFrom ?? FILE_ON_THREADS_FROM)
        ? freshExecutor()
        : undefined;
    if (!filer) {
      executor = undefined;
      await releasePool();
      collectGarbage();
    }

    // ---- save: the parked raw counts are streamed from their scratch file, and come back into
    // the files only once the index is written (the returned index holds them as before).
    if (options.save) {
      progress({ stage: 'save', done: 0, total: 1 });
      index.sections.fileOn(filer);
      try {
        await options.save(index, (parkedCounts as ParkedCounts | null)?.source());
      } finally {
        index.sections.fileOn(undefined);
      }
      lap('save');
    }
    executor = undefined;
    await releasePool();
    if (parkedCounts) {
      const p: ParkedCounts = parkedCounts;
      parkedCounts = null;
      if (options.save && options.countsOnUse) p.unparkOnUse();
      else p.unpark();
    }
    built = undefined;
    return { ...counts, sectionsReadAgain, index, unchanged: false, seconds, cpuSeconds };
  } catch (err) {
    // A failed or cancelled run: its scratch files (parked counts, spilled section rows) go now.
    parked?.close();
    (parkedCounts as ParkedCounts | null)?.close();
    built?.sections.closeRows();
    throw err;
  } finally {
    await releasePool();
  }
}
