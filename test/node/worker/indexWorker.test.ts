import { build } from 'esbuild';
import { mkdtempSync, mkdirSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { isCancelled, WorkerClient } from '../../../src/node/worker/client.js';
import type { WorkerConfig } from '../../../src/node/worker/workerProtocol.js';
import { loadCollection, REPO_ROOT } from '../../helpers/shared.js';
import { workerConfig } from './fixtures/workerConfig.js';

// A real worker thread running the bundled worker entry, over a folder made of the ADI
// collection (test/fixtures/corpora/adi: 82 abstracts, 35 queries with relevance judgements).
const adi = loadCollection('adi');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-worker-'));
const workerJs = join(tmp, 'indexWorker.js');
const spinJs = join(tmp, 'spinWorker.js');
const folder = join(tmp, 'ws');
const workers: Worker[] = [];

beforeAll(async () => {
  const common = { bundle: true, platform: 'node', format: 'cjs', absWorkingDir: REPO_ROOT, logLevel: 'error' } as const;
  await build({ ...common, entryPoints: ['src/node/worker/indexWorker.ts'], outfile: workerJs });
  await build({ ...common, entryPoints: ['test/node/worker/fixtures/spinWorker.ts'], outfile: spinJs });
});

afterAll(async () => {
  await Promise.all(workers.map((w) => w.terminate()));
  rmSync(tmp, { recursive: true, force: true });
});

function start(file = workerJs): WorkerClient {
  const w = new Worker(file);
  workers.push(w);
  return new WorkerClient(w);
}

describe('shared cancel flag in a real thread', () => {
  it('stops synchronous work that never reads its messages', async () => {
    const client = start(spinJs);
    const controller = new AbortController();
    const pending = client.request('build', {}, { signal: controller.signal });
    setTimeout(() => controller.abort(), 50);
    const err = await pending.catch((e: unknown) => e);
    // The spin lasts 5 s unless the flag is seen; a cancel seen via the message queue would come too late.
    expect(isCancelled(err)).toBe(true);
  });
});

describe('index worker round trip', () => {
  const docs = adi ? adi.docs : [];
  const config = (over: Partial<WorkerConfig> = {}): WorkerConfig =>
    workerConfig({ roots: [{ name: 'ws', fsPath: folder, exclude: [] }], indexFile: join(tmp, 'storage', 'index.undertone'), ...over });
  const text = (id: string) => docs.find((d) => d.id === id)!.text.replace(/\. /g, '.\n');

  beforeAll(() => {
    mkdirSync(join(folder, 'docs'), { recursive: true });
    for (const d of docs) writeFileSync(join(folder, 'docs', `${d.id}.txt`), text(d.id));
    // git's per-repository exclude file (gitignore(5)); it is not itself indexed, unlike a .gitignore.
    mkdirSync(join(folder, '.git', 'info'), { recursive: true });
    writeFileSync(join(folder, '.git', 'info', 'exclude'), 'scratch/\n');
  });

  it('builds, saves, and ranks search results exactly as the same index built in-process', async () => {
    const client = start();
    await client.request('configure', { config: config() });
    const stages = new Set<string>();
    const report = await client.request('build', {}, { onProgress: (p) => stages.add(p.stage) });
    expect(report.summary.files).toBe(docs.length);
    expect([...stages]).toEqual(['scan', 'read', 'matrix', 'svd', 'sections', 'save']);
    expect(existsSync(config().indexFile)).toBe(true);

    const local = new IndexBuilder();
    for (const d of docs) local.addText({ path: `docs/${d.id}.txt`, size: 0, mtimeMs: 0 }, text(d.id));
    const index = local.build();
    for (const q of adi.queries.slice(0, 5)) {
      const viaWorker = await client.request('search', { query: q.text, top: 5 });
      const direct = index.search(q.text, { top: 5 });
      expect(viaWorker.map((h) => h.key)).toEqual(direct.map((h) => h.path));
      viaWorker.forEach((h, i) => expect(h.score).toBeCloseTo(direct[i].score, 6));
      // The passage starts on a real line of that file (it may run on over the next lines of its paragraph).
      for (const h of viaWorker)
        expect(readFileSync(h.fsPath, 'utf8').split('\n')[h.line]).toContain(h.lineText.replace(/^…/, '').split(' ')[0]);
    }
  });

  it('loads the saved index in a new worker and folds in only the files changed meanwhile', async () => {
    writeFileSync(join(folder, 'docs', '7.txt'), `${text('7')}\nAn added closing sentence about indexing.`);
    const client = start();
    await client.request('configure', { config: config() });
    const loaded = await client.request('load', {});
    expect(loaded.outcome).toBe('loaded');
    const refreshed = await client.request('refresh', { maxFoldShare: 0.15 });
    expect(refreshed).toMatchObject({ added: 0, changed: 1, removed: 0, tooManyChanges: false });
    expect(refreshed.summary!.staleness.changedFiles).toBe(1);
  });

  it('folds in a new copy of a file, which then finds its twin first; a deleted file leaves every answer', async () => {
    const client = start();
    await client.request('configure', { config: config() });
    await client.request('load', {});
    const twin = join(folder, 'docs', 'copy-of-12.txt');
    writeFileSync(twin, text('12'));
    const update = await client.request('update', { changes: [{ kind: 'created', fsPath: twin }] });
    expect(update.folded).toEqual(['docs/copy-of-12.txt']);
    const near = await client.request('nearby', { fsPath: twin, top: 3 });
    // Identical text gives an identical concept vector: cosine 1 (up to float32 rounding).
    expect(near![0].key).toBe('docs/12.txt');
    expect(near![0].score).toBeCloseTo(1, 5);

    rmSync(join(folder, 'docs', '12.txt'));
    const gone = await client.request('update', { changes: [{ kind: 'deleted', fsPath: join(folder, 'docs', '12.txt') }] });
    expect(gone.removed).toEqual(['docs/12.txt']);
    const after = await client.request('nearby', { fsPath: twin, top: 100 });
    expect(after!.map((h) => h.key)).not.toContain('docs/12.txt');
    expect(await client.request('nearby', { fsPath: join(folder, 'docs', '12.txt'), top: 3 })).toBeNull();
    writeFileSync(join(folder, 'docs', '12.txt'), text('12'));
    rmSync(twin);
  });

  it('leaves out a new file that git is told to ignore', async () => {
    const client = start();
    await client.request('configure', { config: config() });
    await client.request('load', {});
    mkdirSync(join(folder, 'scratch'), { recursive: true });
    const ignored = join(folder, 'scratch', 'notes.txt');
    writeFileSync(ignored, text('3'));
    const update = await client.request('update', { changes: [{ kind: 'created', fsPath: ignored }] });
    expect(update.folded).toEqual([]);
    expect(await client.request('nearby', { fsPath: ignored, top: 3 })).toBeNull();
  });

  it('keeps the previous index in use and on disk when a build is cancelled', async () => {
    // Workers of earlier tests may still hold a delayed save of their folded edits: end them first,
    // so only this test's worker can touch the file.
    await Promise.all(workers.splice(0).map((w) => w.terminate()));
    const client = start();
    await client.request('configure', { config: config() });
    await client.request('load', {});
    const before = readFileSync(config().indexFile);
    const answerBefore = await client.request('search', { query: adi.queries[0].text, top: 3 });
    const controller = new AbortController();
    const pending = client.request('build', {}, { signal: controller.signal, onProgress: () => controller.abort() });
    expect(isCancelled(await pending.catch((e: unknown) => e))).toBe(true);
    expect(readFileSync(config().indexFile).equals(before)).toBe(true);
    expect(await client.request('search', { query: adi.queries[0].text, top: 3 })).toEqual(answerBefore);
  });

  it('indexes several folders as one, with keys prefixed by folder name', async () => {
    const second = join(tmp, 'second');
    mkdirSync(second, { recursive: true });
    writeFileSync(join(second, 'twin-of-20.txt'), text('20'));
    const client = start();
    await client.request('configure', {
      config: config({
        roots: [
          { name: 'ws', fsPath: folder, exclude: [] },
          { name: 'second', fsPath: second, exclude: [] },
        ],
        indexFile: join(tmp, 'multi.undertone'),
      }),
    });
    const report = await client.request('build', {});
    expect(report.summary.files).toBe(docs.length + 1);
    const near = await client.request('nearby', { fsPath: join(second, 'twin-of-20.txt'), top: 1 });
    expect(near![0]).toMatchObject({ key: 'ws/docs/20.txt', folder: 'ws', relPath: 'docs/20.txt', fsPath: join(folder, 'docs', '20.txt') });
  });

  it('deletes the saved index file on request', async () => {
    const client = start();
    await client.request('configure', { config: config() });
    expect(await client.request('deleteIndex', {})).toEqual({ deleted: true });
    expect(existsSync(config().indexFile)).toBe(false);
    await expect(client.request('search', { query: 'library', top: 3 })).rejects.toMatchObject({ name: 'NoIndexError' });
  });
});
