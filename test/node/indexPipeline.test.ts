import { mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { CancelledError, EmptyCorpusError } from '../../src/core/errors.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { resolveSettings } from '../../src/core/index/model/settings.js';
import { chooseCounting, PARALLEL_MIN_FILES, runIndexPipeline, type SourceFile } from '../../src/node/indexPipeline.js';
import { ThreadExecutor } from '../../src/node/parallel/threadExecutor.js';
import { WorkerPool } from '../../src/node/parallel/workerPool.js';
import { encodeIndex, type TermListSource } from '../../src/core/index/persistence/serialize.js';
import type { ByteSpill, OpenSpill } from '../../src/core/sections/types.js';
import { openSpillBeside } from '../../src/node/sectionCodeFile.js';
import { loadCollection } from '../helpers/shared.js';
import { useBundledParallelWorker } from '../helpers/parallelWorkerBundle.js';

// Real text: CRAN abstracts (test/fixtures/corpora/cran), written out as files: 300 to index and
// 300 others that make a previous index with a vocabulary of its own.
const cran = loadCollection('cran');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-pipeline-'));
const settings = resolveSettings({});
let restoreWorker: () => void = () => undefined;

function folderOf(name: string, docs: { id: string; text: string }[]): SourceFile[] {
  const dir = join(tmp, name);
  mkdirSync(dir, { recursive: true });
  return docs.map((d) => {
    const absPath = join(dir, `${d.id}.txt`);
    writeFileSync(absPath, d.text);
    const st = statSync(absPath);
    return { key: `${d.id}.txt`, absPath, size: st.size, mtimeMs: st.mtimeMs };
  });
}
let files: SourceFile[] = [];
let otherFiles: SourceFile[] = [];
const none = { binary: 0, tooLarge: 0, unreadable: 0, other: 0 };
const bytesOf = (v: Float32Array): Buffer => Buffer.from(v.buffer, v.byteOffset, v.byteLength);

beforeAll(async () => {
  restoreWorker = await useBundledParallelWorker(tmp);
  files = folderOf('a', cran.docs.slice(0, 300));
  otherFiles = folderOf('b', cran.docs.slice(300, 600));
});

afterAll(() => {
  restoreWorker();
  rmSync(tmp, { recursive: true, force: true });
});

describe('chooseCounting', () => {
  it('counts on this thread below the threshold or without threads, sorted from scratch, else against the vocabulary', () => {
    expect(chooseCounting(PARALLEL_MIN_FILES - 1, true, true)).toBe('serial');
    expect(chooseCounting(10_000, false, true)).toBe('serial');
    expect(chooseCounting(PARALLEL_MIN_FILES, true, true)).toBe('sorted');
    expect(chooseCounting(PARALLEL_MIN_FILES, true, false)).toBe('parallel');
  });
});

describe('runIndexPipeline', () => {
  const run = (opts: { threads: false | { threads: number }; previous?: LsiIndex; keepUnchanged?: boolean; list?: SourceFile[] }) =>
    runIndexPipeline({
      settings,
      scan: async () => ({ files: opts.list ?? files, skipped: { ...none } }),
      maxFileBytes: 1 << 20,
      previous: opts.previous,
      keepUnchanged: opts.keepUnchanged,
      emptyMessage: 'empty',
      threads: opts.threads,
    });

  it('gives the same index whichever way the files are counted (this thread, sorted threads, threads on a used vocabulary)', async () => {
    const probe = WorkerPool.start({ threads: 2 });
    expect(probe).toBeDefined(); // the bundled thread script was found, so the threaded runs below use threads
    await probe!.close();
    const serial = await run({ threads: false });
    const sorted = await run({ threads: { threads: 2 } });
    // A previous index over other files, same tokenizer: its vocabulary is reused, nothing else.
    const other = await run({ threads: false, list: otherFiles });
    const parallel = await run({ threads: { threads: 2 }, previous: other.index });
    for (const r of [serial, sorted, parallel]) expect(r).toMatchObject({ read: 300, reused: 0, files: 300, unchanged: false });
    expect(parallel).toMatchObject({ added: 300, changed: 0, removed: 300 });
    for (const r of [sorted, parallel]) {
      expect(r.index.paths()).toEqual(serial.index.paths());
      expect(bytesOf(r.index.vectors()).equals(bytesOf(serial.index.vectors()))).toBe(true);
    }
  });

  it('reuses unchanged files, keeps an unchanged index when asked, and saves only what it built', async () => {
    const savedIndexes: LsiIndex[] = [];
    const first = await runIndexPipeline({
      settings,
      scan: async () => ({ files, skipped: { ...none } }),
      maxFileBytes: 1 << 20,
      emptyMessage: 'empty',
      threads: false,
      save: async (index) => {
        savedIndexes.push(index);
      },
    });
    expect(savedIndexes).toEqual([first.index]);
    const again = await run({ threads: false, previous: first.index, keepUnchanged: true });
    expect(again).toMatchObject({ unchanged: true, read: 0, reused: 300 });
    expect(again.index).toBe(first.index);
    const rebuilt = await run({ threads: false, previous: first.index, list: files.slice(0, 250) });
    expect(rebuilt).toMatchObject({ unchanged: false, read: 0, reused: 250, removed: 50 });
  });

  it('stops with CancelledError before saving when cancelled, and with EmptyCorpusError when no file has text', async () => {
    let saves = 0;
    const cancelled = runIndexPipeline({
      settings,
      scan: async () => ({ files, skipped: { ...none } }),
      maxFileBytes: 1 << 20,
      emptyMessage: 'empty',
      threads: false,
      isCancelled: () => true,
      save: async () => {
        saves++;
      },
    });
    await expect(cancelled).rejects.toBeInstanceOf(CancelledError);
    expect(saves).toBe(0);
    await expect(run({ threads: false, list: [] })).rejects.toThrow(new EmptyCorpusError('empty'));
  });

  it("keeps a large build's section counts and rows in scratch files beside the index: the same saved bytes, nothing left behind on success, failure or cancel, memory where none can be made", async () => {
    const dir = join(tmp, 'scratch');
    mkdirSync(dir, { recursive: true });
    const made: ByteSpill[] = [];
    let closes = 0;
    // Real scratch files (sectionCodeFile.ts), counted as they are opened and closed.
    const beside = openSpillBeside(dir, "the build's scratch file");
    const scratch: OpenSpill = () => {
      const s = beside();
      if (!s) return null;
      const counted: ByteSpill = {
        write: (b, at) => s.write(b, at),
        read: (into, at) => s.read(into, at),
        close: () => {
          closes++;
          s.close();
        },
      };
      made.push(counted);
      return counted;
    };
    const build = (opts: {
      scratch?: OpenSpill;
      save?: (index: LsiIndex, termLists?: TermListSource) => Promise<void>;
      cancelAt?: string;
      countsOnUse?: boolean;
      fileOnThreadsFrom?: number;
    }) => {
      let stop = false;
      return runIndexPipeline({
        settings,
        scan: async () => ({ files, skipped: { ...none } }),
        maxFileBytes: 1 << 20,
        emptyMessage: 'empty',
        threads: { threads: 2 },
        scratch: opts.scratch,
        // Thresholds of 0: the fixture's few MB take the paths the Linux tree's 1.4 GB do.
        spillRowsFromBytes: 0,
        parkCountsFromBytes: 0,
        save: opts.save,
        countsOnUse: opts.countsOnUse,
        fileOnThreadsFrom: opts.fileOnThreadsFrom,
        isCancelled: () => stop,
        onProgress: (p) => {
          if (p.stage === opts.cancelAt) stop = true;
        },
      });
    };
    const when = new Date(0);
    const plain = await build({});
    const spilled = await build({ scratch });
    // One file for the parked section counts and one for the files' raw counts (parkedCounts.ts;
    // both closed once read back), one for the rows (still open: the index reads them).
    expect(made.length).toBe(3);
    expect(closes).toBe(2);
    expect(readdirSync(dir)).toEqual([]); // unlinked as soon as made
    const sample = spilled.index.paths()[0];
    expect(spilled.index.sections.get(sample)!.stored).toBeDefined();
    expect(plain.index.sections.get(sample)!.stored).toBeUndefined();
    expect(Buffer.from(encodeIndex(spilled.index, when)).equals(Buffer.from(encodeIndex(plain.index, when)))).toBe(true);
    spilled.index.sections.closeRows();
    expect(closes).toBe(3);
    // A save streams the parked raw counts from their file (the index's own arrays still empty
    // then): the same bytes as from memory, and the returned index has every file's counts back.
    let streamed: Uint8Array | undefined;
    let emptyWhileSaved = 0;
    const saving = await build({
      scratch,
      save: async (index, termLists) => {
        expect(termLists).toBeDefined();
        emptyWhileSaved = index.paths().filter((p) => index.termsOf(p).termIds.length === 0).length;
        streamed = encodeIndex(index, when, { termLists });
      },
    });
    expect(emptyWhileSaved).toBe(files.length);
    expect(Buffer.from(streamed!).equals(Buffer.from(encodeIndex(plain.index, when)))).toBe(true);
    for (const p of plain.index.paths())
      expect(Array.from(saving.index.termsOf(p).counts)).toEqual(Array.from(plain.index.termsOf(p).counts));
    expect(Buffer.from(encodeIndex(saving.index, when)).equals(Buffer.from(streamed!))).toBe(true);
    saving.index.sections.closeRows();
    expect(made.length).toBe(6);
    expect(closes).toBe(6);
    // Counts back on use: after the save they stay in their file (still open) until read, then all come back.
    const onUse = await build({
      scratch,
      countsOnUse: true,
      save: async (index, termLists) => void encodeIndex(index, when, { termLists }),
    });
    expect(made.length).toBe(9);
    expect(closes).toBe(7); // the section counts' file only
    const firstPath = plain.index.paths()[0];
    expect(Array.from(onUse.index.termsOf(firstPath).termIds)).toEqual(Array.from(plain.index.termsOf(firstPath).termIds));
    expect(closes).toBe(8); // read back whole on that first use
    expect(Buffer.from(encodeIndex(onUse.index, when)).equals(Buffer.from(streamed!))).toBe(true);
    onUse.index.sections.closeRows();
    expect(closes).toBe(9);
    // A save that fails: all three files given back before the error leaves.
    await expect(
      build({
        scratch,
        save: async () => {
          throw new Error('no room');
        },
      }),
    ).rejects.toThrow('no room');
    expect(made.length).toBe(12);
    expect(closes).toBe(12);
    // Cancelled during the SVD, both kinds of counts parked: their files given back (a cancelled fold closes
    // its own: test/core/sections/sectionVectors.test.ts).
    await expect(build({ scratch, cancelAt: 'svd' })).rejects.toBeInstanceOf(CancelledError);
    expect(made.length).toBe(14);
    expect(closes).toBe(14);
    expect(readdirSync(dir)).toEqual([]);
    // No scratch file to be had: everything in memory, the same bytes.
    const inMemory = await build({ scratch: () => null });
    expect(inMemory.index.sections.get(sample)!.stored).toBeUndefined();
    expect(Buffer.from(encodeIndex(inMemory.index, when)).equals(Buffer.from(encodeIndex(plain.index, when)))).toBe(true);
    // The save's filing on the build's threads (as from FILE_ON_THREADS_FROM on; every section
    // filed under a list, lists from one section on): the same saved bytes as filed on this thread.
    const filing = vi.spyOn(ThreadExecutor.prototype, 'fileRows');
    const listed = (index: LsiIndex, termLists?: TermListSource): Uint8Array => {
      index.sections.setListsFrom(1);
      return encodeIndex(index, when, { termLists });
    };
    let onThreads: Uint8Array | undefined;
    try {
      const threaded = await build({
        scratch,
        fileOnThreadsFrom: 0,
        save: async (index, termLists) => void (onThreads = listed(index, termLists)),
      });
      threaded.index.sections.closeRows();
      expect(filing).toHaveBeenCalled();
    } finally {
      filing.mockRestore();
    }
    expect(Buffer.from(onThreads!).equals(Buffer.from(listed(plain.index)))).toBe(true);
  });

  it("parks only the counts it read itself: a previous index's counts stay that index's own during a refresh, after it and after a cancel", async () => {
    const dir = join(tmp, 'scratch-refresh');
    mkdirSync(dir, { recursive: true });
    const scratch = openSpillBeside(dir, "the build's scratch file");
    const touched = files.map((f, i) => (i === 0 ? { ...f, mtimeMs: f.mtimeMs + 1 } : f));
    const refresh = (previous: LsiIndex, cancelAt?: string) => {
      let stop = false;
      return runIndexPipeline({
        settings,
        previous,
        // The previous index's 300 files, one of them touched (read again, its words the same, so
        // the vocabulary stays in order and the 299 reused files keep their very count objects).
        scan: async () => ({ files: touched, skipped: { ...none } }),
        maxFileBytes: 1 << 20,
        emptyMessage: 'empty',
        threads: { threads: 2 },
        scratch,
        parkCountsFromBytes: 0,
        isCancelled: () => stop,
        onProgress: (p) => {
          if (p.stage === cancelAt) stop = true;
        },
      });
    };
    const base = await runIndexPipeline({
      settings,
      scan: async () => ({ files, skipped: { ...none } }),
      maxFileBytes: 1 << 20,
      emptyMessage: 'empty',
      threads: { threads: 2 },
    });
    const before = new Map(base.index.paths().map((p) => [p, Array.from(base.index.termsOf(p).counts)]));
    const unchanged = (): void => {
      for (const [p, counts] of before) expect(Array.from(base.index.termsOf(p).counts)).toEqual(counts);
    };
    await expect(refresh(base.index, 'svd')).rejects.toBeInstanceOf(CancelledError);
    unchanged();
    const refreshed = await refresh(base.index);
    expect(refreshed.reused).toBe(files.length - 1);
    expect(refreshed.index.termsOf(files[1].key)).toBe(base.index.termsOf(files[1].key));
    unchanged();
    // The new files' counts were parked and came back: the refreshed index holds every file's.
    // The file read again had its counts parked and back: the same saved bytes as without scratch files.
    const inMemory = await runIndexPipeline({
      settings,
      previous: base.index,
      scan: async () => ({ files: touched, skipped: { ...none } }),
      maxFileBytes: 1 << 20,
      emptyMessage: 'empty',
      threads: { threads: 2 },
    });
    const when = new Date(0);
    expect(Buffer.from(encodeIndex(refreshed.index, when)).equals(Buffer.from(encodeIndex(inMemory.index, when)))).toBe(true);
    refreshed.index.sections.closeRows();
  });
});
