import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { loadIndex } from '../../../src/node/persist.js';
import { IndexService } from '../../../src/node/worker/indexService.js';
import type { WorkerConfig } from '../../../src/node/worker/workerProtocol.js';
import type { HandlerContext } from '../../../src/node/worker/server.js';
import { loadCollection } from '../../helpers/shared.js';

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
  const config: WorkerConfig = {
    roots: [{ name: 'ws', path: folder, exclude: [] }],
    indexFile: join(tmp, 'index.undertone'),
    settings: { k: 40 },
    include: [],
    exclude: [],
    maxFileBytes: 1 << 20,
    honourGitignore: false,
  };

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
});
