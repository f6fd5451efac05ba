import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { SectionRowsClosedError } from '../../../src/core/sections/sectionRows.js';
import { loadIndex } from '../../../src/node/persist.js';
import { DEFAULT_INDEX_SERVICE_OPTIONS, IndexService } from '../../../src/node/worker/indexService.js';
import type { WorkerConfig } from '../../../src/node/worker/workerProtocol.js';
import type { HandlerContext } from '../../../src/node/worker/server.js';
import { loadCollection } from '../../helpers/shared.js';
import { workerConfig } from './fixtures/workerConfig.js';

// A folder made of the CISI collection (test/fixtures/corpora/cisi: 1460 abstracts, 112 queries).
const cisi = loadCollection('cisi');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-service-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

const ctx: HandlerContext = { signal: new AbortController().signal, isCancelled: () => false, progress: () => undefined };

/** A pause the test releases by hand, so the slices of background preparation run only when told. */
function gate() {
  const waiting: (() => void)[] = [];
  return {
    pause: () => new Promise<void>((resolve) => waiting.push(resolve)),
    get waiting() {
      return waiting.length;
    },
    release: () => waiting.splice(0).forEach((go) => go()),
  };
}

describe('IndexService background preparation', () => {
  const folder = join(tmp, 'ws');
  const config = workerConfig({
    roots: [{ name: 'ws', fsPath: folder, exclude: [] }],
    indexFile: join(tmp, 'index.undertone'),
    settings: { k: 40 },
    honourGitignore: false,
  });

  it('answers a search at once while preparing, the same as an index never prepared, and prepares between requests', async () => {
    mkdirSync(folder, { recursive: true });
    for (const d of cisi.docs) writeFileSync(join(folder, `${d.id}.txt`), d.text);
    const builder = new IndexService({ preparePause: gate().pause }); // its preparation never runs
    builder.configure(config);
    await builder.build(ctx);

    const slices = gate();
    const service = new IndexService({ prepareSliceMs: 0, preparePause: slices.pause });
    service.configure(config);
    expect((await service.load()).outcome).toBe('loaded');
    const preparing = service.preparing!;
    let prepared = false;
    void preparing.then(() => (prepared = true));
    const reference = await loadIndex(config.indexFile);
    if (reference.status !== 'ok') throw new Error('the saved index did not load');
    const queries = cisi.queries.slice(0, 6).map((q) => q.text);

    // Searches while no slice may run: answered, not held back behind the preparation.
    for (const q of queries.slice(0, 3)) {
      const hits = await service.search(q, 5);
      expect(hits.map((h) => h.key)).toEqual(reference.index.search(q, { top: 5 }).map((h) => h.path));
    }
    expect(prepared).toBe(false);
    // Slices of one chunk each: many, each awaiting the gate.
    let released = 0;
    for (; !prepared && released < 10_000; released++) {
      slices.release();
      await new Promise((resolve) => setImmediate(resolve));
      if (released === 5) {
        const hits = await service.search(queries[3], 5); // one more in the middle
        expect(hits.map((h) => h.key)).toEqual(reference.index.search(queries[3], { top: 5 }).map((h) => h.path));
      }
    }
    expect(released).toBeGreaterThan(20); // 1460 documents in 32-document chunks
    expect(await preparing).toBe(true);
    expect(service.preparing).toBeUndefined();
    expect(service.index!.bm25().prepared).toBe(true);
    for (const q of queries) {
      const hits = await service.search(q, 5);
      const ref = reference.index.search(q, { top: 5 });
      expect(hits.map((h) => [h.key, h.score])).toEqual(ref.map((h) => [h.path, h.score]));
    }
  });

  it('stops preparing an index it no longer uses', async () => {
    const slices = gate();
    const service = new IndexService({ prepareSliceMs: 0, preparePause: slices.pause });
    service.configure(config);
    await service.load();
    const first = service.preparing!;
    slices.release();
    await service.load(); // a second load puts a new index in use
    slices.release();
    expect(await first).toBe(false);
    expect(service.preparing).toBeDefined();
  });

  it('closes the section rows of a reopened index it replaces, and reads those of the new one', async () => {
    const service = new IndexService({ preparePause: gate().pause });
    service.configure(config);
    await service.load();
    const old = service.index!;
    const path = old.paths().find((p) => old.sections.get(p)?.stored)!;
    expect(path).toBeDefined(); // the reopened sections read their rows from the saved file
    const q = old.projectText(cisi.queries[0].text);
    const rankedBefore = old.sections.rankExact(q, 5);
    expect(rankedBefore.length).toBe(5);
    await service.load(); // a second load puts a new index in use
    expect(() => old.sections.rankExact(q, 5)).toThrow(SectionRowsClosedError);
    expect(service.index).not.toBe(old);
    expect(service.index!.sections.rankExact(q, 5).map((h) => h.score)).toEqual(rankedBefore.map((h) => h.score));
    expect(service.index!.sections.best(path, q)?.path).toBe(path);
  });

  it('answers from the saved file once a build is saved, as a reopen does, with the same rankings', async () => {
    // Below reopenFromSections (the default: where section search uses lists) the built index answers.
    const small = new IndexService({ preparePause: gate().pause });
    small.configure(config);
    await small.build(ctx);
    expect(small.index!.sections.count).toBeLessThan(DEFAULT_INDEX_SERVICE_OPTIONS.reopenFromSections);
    expect(small.index!.paths().some((p) => small.index!.sections.get(p)?.stored)).toBe(false);

    const service = new IndexService({ preparePause: gate().pause, reopenFromSections: 1 });
    service.configure(config);
    await service.build(ctx);
    const index = service.index!;
    // The sections read their rows from the saved file (the built index held them in memory).
    expect(index.paths().some((p) => index.sections.get(p)?.stored)).toBe(true);
    const reference = await loadIndex(config.indexFile);
    if (reference.status !== 'ok') throw new Error('the saved index did not load');
    for (const q of cisi.queries.slice(0, 5).map((x) => x.text)) {
      const hits = await service.search(q, 5);
      expect(hits.map((h) => [h.key, h.score])).toEqual(reference.index.search(q, { top: 5 }).map((h) => [h.path, h.score]));
      const v = index.projectText(q);
      expect(index.sections.rankExact(v, 5).map((h) => h.score)).toEqual(reference.index.sections.rankExact(v, 5).map((h) => h.score));
    }
    expect(await service.checkSaved()).toEqual({ damaged: false });
  });

  it('says when the section rows checked after a load were damaged, and asks only about the index in use', async () => {
    const good = new IndexService({ preparePause: gate().pause });
    good.configure(config);
    expect((await good.load()).outcome).toBe('loaded');
    expect(await good.checkSaved()).toEqual({ damaged: false });

    // A byte flipped near the end of the file: inside the rows and codes (format 6 checks the
    // part before them at load, the rest afterwards), so the load itself still succeeds.
    const damagedFile = join(tmp, 'damaged.undertone');
    const bytes = readFileSync(config.indexFile);
    bytes[bytes.length - 3] ^= 0x55;
    writeFileSync(damagedFile, bytes);
    const service = new IndexService({ preparePause: gate().pause });
    service.configure({ ...config, indexFile: damagedFile });
    expect((await service.load()).outcome).toBe('loaded');
    const verdict = await service.checkSaved();
    expect(verdict.damaged).toBe(true);
    expect(verdict.reason).toMatch(/checksum/);

    // Once another index is in use, the damaged file no longer counts.
    service.configure(config);
    expect((await service.load()).outcome).toBe('loaded');
    expect(await service.checkSaved()).toEqual({ damaged: false });
  });
});

// The editor's worker on the hostile cases of the command line (issue: never silently wrong).
describe('IndexService on a hostile storage folder and workspace', () => {
  const base = join(tmp, 'hostile');
  const folder = join(base, 'ws');
  mkdirSync(folder, { recursive: true });
  for (const d of cisi.docs.slice(0, 40)) writeFileSync(join(folder, `${d.id}.txt`), d.text);
  const config = (indexFile: string, extra: Partial<WorkerConfig> = {}): WorkerConfig =>
    workerConfig({
      roots: [{ name: 'ws', fsPath: folder, exclude: [] }],
      indexFile,
      settings: { k: 10 },
      honourGitignore: false,
      ...extra,
    });

  it('uses a built index it cannot save (a folder at the index path) and says why, instead of failing the build', async () => {
    const file = join(base, 'occupied', 'index.undertone');
    mkdirSync(file, { recursive: true });
    const service = new IndexService();
    service.configure(config(file));
    const loaded = await service.load();
    expect(loaded).toMatchObject({ outcome: 'damaged', reason: expect.stringContaining(`${file} is a folder`) });
    const built = await service.build(ctx);
    expect(built.summary.files).toBe(40);
    expect(built.saveProblem).toMatch(/cannot save \S+index\.undertone: a folder of that name is in the way \(EISDIR\)/);
    expect((await service.search(cisi.queries[0].text, 3)).length).toBe(3);
  });

  it('reports a FIFO or damaged bytes at the index path as damaged without blocking, then rebuilds and saves', async () => {
    const fifo = join(base, 'fifo.undertone');
    execFileSync('mkfifo', [fifo]);
    const service = new IndexService();
    service.configure(config(fifo));
    expect(await service.load()).toMatchObject({ outcome: 'damaged', reason: expect.stringContaining('not a regular file') });
    const junk = join(base, 'junk.undertone');
    writeFileSync(junk, 'UNDTNIDX and then nothing that makes sense');
    service.configure(config(junk));
    expect(await service.load()).toMatchObject({ outcome: 'damaged', reason: expect.stringContaining(junk) });
    const built = await service.build(ctx);
    expect(built.saveProblem).toBeUndefined();
    expect((await loadIndex(junk)).status).toBe('ok');
  });

  it('leaves out files that links reach outside the workspace folders unless the setting allows them', async () => {
    const secret = join(base, 'secret.txt');
    writeFileSync(secret, 'zebracrossing quartermaster vault');
    symlinkSync(secret, join(folder, 'linked.txt'));
    try {
      const service = new IndexService();
      service.configure(config(join(base, 'links.undertone')));
      await service.build(ctx);
      expect(service.index!.paths()).toHaveLength(40);
      expect(service.index!.has('linked.txt')).toBe(false);
      const allowed = new IndexService();
      allowed.configure(config(join(base, 'links-allowed.undertone'), { followLinksOutside: true }));
      await allowed.build(ctx);
      expect(allowed.index!.has('linked.txt')).toBe(true);
    } finally {
      rmSync(join(folder, 'linked.txt'));
    }
  });
});
