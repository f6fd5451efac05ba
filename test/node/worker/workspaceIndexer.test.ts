import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { WorkerPool } from '../../../src/node/parallel/workerPool.js';
import { RootMap } from '../../../src/node/worker/rootMap.js';
import { buildWorkspaceIndex } from '../../../src/node/worker/workspaceIndexer.js';
import { loadCollection } from '../../helpers/shared.js';
import { useBundledParallelWorker } from '../../helpers/parallelWorkerBundle.js';
import { workerConfig } from './fixtures/workerConfig.js';

// Real text: 300 CRAN abstracts (test/fixtures/corpora/cran) split over two workspace folders.
const cran = loadCollection('cran');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-wsindex-'));
const docs = cran ? cran.docs.slice(0, 300) : [];
const folders = [join(tmp, 'alpha'), join(tmp, 'beta')];
let restoreWorker: () => void = () => undefined;

beforeAll(async () => {
  restoreWorker = await useBundledParallelWorker(tmp);
  for (const f of folders) mkdirSync(f, { recursive: true });
  docs.forEach((d, i) => writeFileSync(join(folders[i % 2], `${d.id}.txt`), d.text));
});

afterAll(() => {
  restoreWorker();
  rmSync(tmp, { recursive: true, force: true });
});

describe('buildWorkspaceIndex', () => {
  const roots = new RootMap(folders.map((p, i) => ({ name: ['alpha', 'beta'][i], fsPath: p, exclude: [] })));
  const config = workerConfig({ roots: roots.roots, indexFile: join(tmp, 'unused') });

  it('indexes two folders as the same documents built in one process, with folder-prefixed keys', async () => {
    const built = await buildWorkspaceIndex(roots, config, { threads: false });
    const direct = new IndexBuilder();
    docs.forEach((d, i) => direct.addText({ path: `${['alpha', 'beta'][i % 2]}/${d.id}.txt`, size: 0, mtimeMs: 0 }, d.text));
    const reference = direct.build();
    expect(built.index.paths()).toEqual(reference.paths());
    // The vectors are views into a larger (shared WebAssembly) memory: compare their own bytes.
    const bytesOf = (v: Float32Array): Buffer => Buffer.from(v.buffer, v.byteOffset, v.byteLength);
    expect(bytesOf(built.index.vectors()).equals(bytesOf(reference.vectors()))).toBe(true);
    expect(built).toMatchObject({ read: 300, reused: 0, skipped: 0 });
  });

  it('makes a missing scratch folder (the storage folder before the first save) rather than keeping the scratch in memory', async () => {
    const storage = join(tmp, 'storage-not-yet', 'nested');
    expect(existsSync(storage)).toBe(false);
    const built = await buildWorkspaceIndex(roots, config, { threads: false, scratchFolder: storage });
    expect(existsSync(storage)).toBe(true);
    expect(built.index.size).toBe(300);
  });

  it('gives the same index on a thread pool as on one thread', async () => {
    const probe = WorkerPool.start({ threads: 2 });
    expect(probe).toBeDefined(); // the bundled pool script was found, so the pooled build below really uses threads
    await probe!.close();
    const serial = await buildWorkspaceIndex(roots, config, { threads: false });
    const pooled = await buildWorkspaceIndex(roots, config, { threads: 2 });
    expect(pooled.index.paths()).toEqual(serial.index.paths());
    const a = pooled.index.vectors();
    const b = serial.index.vectors();
    let worst = 0;
    for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
    expect(worst).toBeLessThan(1e-5);
  });

  it('reuses the counts of unchanged files from the index in use', async () => {
    const first = await buildWorkspaceIndex(roots, config, { threads: false });
    writeFileSync(join(folders[0], `${docs[0].id}.txt`), `${docs[0].text} changed`);
    const second = await buildWorkspaceIndex(roots, config, { previous: first.index, threads: false });
    expect(second).toMatchObject({ read: 1, reused: 299 });
  });

  it('names the setting when .gitignore files left every file out', async () => {
    // A workspace folder in a git working tree whose .gitignore hides its files (`/*`, as the
    // top-level one of Debian's linux-source-6.1 tarball has it).
    const repo = join(tmp, 'ignored');
    mkdirSync(join(repo, '.git'), { recursive: true });
    writeFileSync(join(repo, '.gitignore'), '/*\n');
    writeFileSync(join(repo, 'a.txt'), docs[0]?.text ?? 'flow');
    const only = new RootMap([{ name: 'ignored', fsPath: repo, exclude: [] }]);
    const cfg = workerConfig({ roots: only.roots, indexFile: join(tmp, 'unused'), honourGitignore: true });
    await expect(buildWorkspaceIndex(only, cfg, { threads: false })).rejects.toThrow(
      /^Nothing to index: .*\.gitignore files left out 2 files and folders; turning off the setting undertone\.useGitignore indexes them\.$/,
    );
    const off = workerConfig({ roots: only.roots, indexFile: join(tmp, 'unused'), honourGitignore: false });
    await expect(buildWorkspaceIndex(only, off, { threads: false })).resolves.toMatchObject({ read: 2 });
  });
});
