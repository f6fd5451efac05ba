import { build } from 'esbuild';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_UPDATE_POLICY } from '../../src/core/index/update/updatePolicy.js';
import { IndexController, type ControllerHost } from '../../src/extension/indexController.js';
import type { IndexState } from '../../src/extension/indexState.js';
import { startIndexWorker } from '../../src/extension/workerHost.js';
import { loadCollection, REPO_ROOT } from '../helpers/shared.js';

// The controller without the editor: a fake host, the real bundled worker, and a folder made of
// the ADI collection (test/fixtures/corpora/adi); CRAN abstracts (test/fixtures/corpora/cran) play files
// on a topic the index has never seen.
const adi = loadCollection('adi');
const cran = loadCollection('cran');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-controller-'));
const folder = join(tmp, 'ws');
const controllers: IndexController[] = [];

beforeAll(async () => {
  await build({
    entryPoints: ['src/node/worker/indexWorker.ts'],
    outfile: join(tmp, 'ext', 'dist', 'indexWorker.js'),
    bundle: true,
    platform: 'node',
    format: 'cjs',
    absWorkingDir: REPO_ROOT,
    logLevel: 'error',
  });
  mkdirSync(join(folder, 'docs'), { recursive: true });
  for (const d of adi?.docs ?? []) writeFileSync(join(folder, 'docs', `${d.id}.txt`), d.text);
});

afterAll(async () => {
  await Promise.all(controllers.map((c) => c.dispose()));
  rmSync(tmp, { recursive: true, force: true });
});

interface Fake extends ControllerHost {
  progressRuns: number;
  log: (line: string) => void;
  lines: string[];
  cancelAt?: number;
}

function fakeHost(over: Partial<Fake> = {}): Fake {
  const host: Fake = {
    startWorker: (onExit) => startIndexWorker(join(tmp, 'ext'), onExit),
    setting: () => undefined,
    folders: () => ({ local: [{ name: 'ws', fsPath: folder, filesExclude: {} }], elsewhere: [] }),
    indexFile: join(tmp, 'storage', 'index.undertone'),
    progressRuns: 0,
    lines: [],
    withProgress: async (_title, task) => {
      host.progressRuns++;
      const abort = new AbortController();
      return task((percent) => {
        if (host.cancelAt !== undefined && percent >= host.cancelAt) abort.abort();
      }, abort.signal);
    },
    showError: (m) => host.lines.push(`error: ${m}`),
    log: (line) => host.lines.push(line),
    ...over,
  };
  return host;
}

function make(host: ControllerHost, policy = DEFAULT_UPDATE_POLICY): IndexController {
  const c = new IndexController(host, policy);
  controllers.push(c);
  return c;
}

/** Resolves with the first state (current or later) that satisfies the test. */
function until(c: IndexController, test: (s: IndexState) => boolean): Promise<IndexState> {
  if (test(c.state)) return Promise.resolve(c.state);
  return new Promise((resolve) => {
    const sub = c.onDidChangeState((s) => {
      if (test(s)) {
        sub.dispose();
        resolve(s);
      }
    });
  });
}

describe('IndexController without local folders', () => {
  it('says which folders are not on the local disk instead of failing', async () => {
    const c = make(fakeHost({ folders: () => ({ local: [], elsewhere: ['remote-notes (vscode-vfs)'] }) }));
    await c.start();
    expect(c.state.kind).toBe('unavailable');
    expect(c.state.kind === 'unavailable' && c.state.reason).toContain('remote-notes (vscode-vfs) is not on this machine');
  });
});

describe('IndexController on a folder with nothing to index', () => {
  it('shows no error on start-up and says why there is no index', async () => {
    const empty = join(tmp, 'empty');
    mkdirSync(join(empty, 'pictures'), { recursive: true });
    writeFileSync(join(empty, 'pictures', 'harbour.png'), 'not really a picture');
    const host = fakeHost({
      folders: () => ({ local: [{ name: 'empty', fsPath: empty, filesExclude: {} }], elsewhere: [] }),
      indexFile: join(tmp, 'empty-storage', 'index.undertone'),
    });
    const c = make(host);
    await c.start();
    expect(c.state.kind).toBe('none');
    expect(c.state.kind === 'none' && c.state.reason).toMatch(/^Nothing to index/);
    expect(host.lines.filter((l) => l.startsWith('error:'))).toEqual([]);
  });
});

describe('IndexController with a hostile storage folder', () => {
  it('a folder at the index path: builds, uses the index, says it could not be saved, and ends the progress', async () => {
    const indexFile = join(tmp, 'occupied-storage', 'index.undertone');
    mkdirSync(indexFile, { recursive: true });
    const host = fakeHost({ indexFile });
    const c = make(host);
    await c.start();
    expect(c.state).toMatchObject({ kind: 'ready', summary: { files: adi.docs.length } });
    expect(host.progressRuns).toBe(1);
    expect(host.lines.find((l) => l.startsWith('No usable saved index'))).toContain(`${indexFile} is a folder`);
    expect(host.lines.find((l) => l.startsWith('The index could not be saved'))).toMatch(/a folder of that name is in the way \(EISDIR\)/);
    expect(host.lines.filter((l) => l.startsWith('error:'))).toEqual([expect.stringMatching(/built the index but could not save it/)]);
  });
});

describe('IndexController', () => {
  it('builds on first start with a progress notification, then loads the saved index on the next', async () => {
    const first = fakeHost();
    const c1 = make(first);
    const kinds: string[] = [];
    c1.onDidChangeState((s) => kinds.push(s.kind));
    await c1.start();
    expect(first.progressRuns).toBe(1);
    expect(kinds[0]).toBe('building');
    expect(c1.state).toMatchObject({ kind: 'ready', summary: { files: adi.docs.length } });
    await c1.dispose();

    const second = fakeHost();
    const c2 = make(second);
    await c2.start();
    expect(second.progressRuns).toBe(0);
    expect(c2.state).toMatchObject({ kind: 'ready', summary: { files: adi.docs.length } });
    expect(second.lines.some((l) => l.startsWith('Loaded the saved index'))).toBe(true);
  });

  it('keeps the previous index when the person cancels a rebuild', async () => {
    const host = fakeHost();
    const c = make(host);
    await c.start();
    const before = readFileSync(host.indexFile!);
    host.cancelAt = 10;
    await c.build('user');
    expect(c.state).toMatchObject({ kind: 'ready', summary: { files: adi.docs.length } });
    expect(readFileSync(host.indexFile!).equals(before)).toBe(true);
    expect(host.lines).toContain('Indexing cancelled; the previous index stays in use.');
  });

  it('builds again in the background when the section rows checked after a load are damaged', async () => {
    const saved = fakeHost();
    await make(saved).start(); // the saved index (built by an earlier test or now)
    const indexFile = join(tmp, 'damaged-storage', 'index.undertone');
    mkdirSync(join(tmp, 'damaged-storage'), { recursive: true });
    const bytes = readFileSync(saved.indexFile!);
    bytes[bytes.length - 3] ^= 0x55; // inside the rows and codes, which format 6 checks after the load
    writeFileSync(indexFile, bytes);
    const host = fakeHost({ indexFile });
    const c = make(host);
    const kinds: string[] = [];
    c.onDidChangeState((s) => kinds.push(s.kind));
    await c.start();
    expect(host.lines.some((l) => l.startsWith('Loaded the saved index'))).toBe(true);
    await until(c, (s) => s.kind === 'ready' && host.lines.some((l) => l.startsWith('Built the index')));
    expect(host.lines.find((l) => l.startsWith('The saved index is damaged'))).toMatch(/checksum.*: rebuilding\.$/);
    expect(kinds).toContain('building');
    expect(host.progressRuns).toBe(0); // in the background: no notification
    expect(c.state).toMatchObject({ kind: 'ready', summary: { files: adi.docs.length } });
    expect(readFileSync(indexFile).equals(bytes)).toBe(false); // the damaged file was replaced
    expect(host.lines.filter((l) => l.startsWith('error:'))).toEqual([]);
  });

  it('folds in saved edits, and rebuilds in the background once files on a new topic pile up', async () => {
    const c = make(fakeHost(), { ...DEFAULT_UPDATE_POLICY, settleMs: 0 });
    await c.start();
    const first = join(folder, 'docs', 'cran-1.txt');
    writeFileSync(first, cran.docs[0].text);
    const change = await c.applyChanges([{ kind: 'created', fsPath: first }]);
    expect(change).toEqual({ folded: ['docs/cran-1.txt'], removed: [], all: false });
    expect(c.state.kind).toBe('ready'); // one file: below every trigger
    const more = cran.docs.slice(1, 8).map((d, i) => {
      const p = join(folder, 'docs', `cran-${i + 2}.txt`);
      writeFileSync(p, d.text);
      return { kind: 'created' as const, fsPath: p };
    });
    await c.applyChanges(more);
    const rebuilding = await until(c, (s) => s.kind === 'building');
    expect(rebuilding).toMatchObject({ background: true, previous: { files: adi.docs.length + 8 } });
    const done = await until(c, (s) => s.kind === 'ready');
    expect(done).toMatchObject({ summary: { files: adi.docs.length + 8, staleness: { changedFiles: 0 } } });
    for (let i = 1; i <= 8; i++) rmSync(join(folder, 'docs', `cran-${i}.txt`));
  });

  it('reports a deleted file as removed, and the file is gone from nearby answers', async () => {
    const c = make(fakeHost());
    await c.start();
    const victim = join(folder, 'docs', '5.txt');
    const text = readFileSync(victim, 'utf8');
    rmSync(victim);
    expect(await c.applyChanges([{ kind: 'deleted', fsPath: victim }])).toEqual({ folded: [], removed: ['docs/5.txt'], all: false });
    expect(await c.nearby(victim, 5)).toBeNull();
    const near = await c.nearby(join(folder, 'docs', '6.txt'), 200);
    expect(near!.map((h) => h.key)).not.toContain('docs/5.txt');
    writeFileSync(victim, text);
  });

  it('deletes the saved index and says so in its state', async () => {
    const host = fakeHost();
    const c = make(host);
    await c.start();
    expect(await c.deleteIndex()).toBe(true);
    expect(existsSync(host.indexFile!)).toBe(false);
    expect(c.state).toEqual({ kind: 'none', reason: 'the saved index was deleted.' });
    expect(await c.nearby(join(folder, 'docs', '6.txt'), 5)).toBeNull();
  });

  it('does not build on start when told not to', async () => {
    const host = fakeHost({
      setting: (k) => (k === 'buildOnStartup' ? false : undefined),
      indexFile: join(tmp, 'other', 'index.undertone'),
    });
    const c = make(host);
    await c.start();
    expect(c.state).toEqual({ kind: 'none', reason: 'there is no index for this workspace yet.' });
    expect(host.progressRuns).toBe(0);
  });
});

describe('IndexController on a first build', () => {
  it('says word match is on offer once counting ends, then the index is ready; a rebuild never says so', async () => {
    const host = fakeHost({ indexFile: join(tmp, 'first-build', 'index.undertone') });
    const c = make(host);
    const states: IndexState[] = [];
    c.onDidChangeState((s) => states.push(s));
    await c.start();
    const offered = states.findIndex((s) => s.kind === 'building' && s.wordMatch !== undefined);
    expect(offered).toBeGreaterThanOrEqual(0);
    const s = states[offered];
    expect(s.kind === 'building' && s.wordMatch).toBe(adi.docs.length);
    expect(states.slice(0, offered).every((x) => x.kind !== 'ready')).toBe(true);
    expect(c.state.kind).toBe('ready');
    states.length = 0;
    await c.build('user');
    expect(states.some((x) => x.kind === 'building')).toBe(true);
    expect(states.every((x) => x.kind !== 'building' || x.wordMatch === undefined)).toBe(true);
  });
});
