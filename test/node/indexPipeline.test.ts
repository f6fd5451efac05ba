import { mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CancelledError, EmptyCorpusError } from '../../src/core/errors.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { resolveSettings } from '../../src/core/index/model/settings.js';
import { chooseCounting, PARALLEL_MIN_FILES, runIndexPipeline, type SourceFile } from '../../src/node/indexPipeline.js';
import { WorkerPool } from '../../src/node/parallel/workerPool.js';
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
});
