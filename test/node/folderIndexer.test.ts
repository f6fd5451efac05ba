import { mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CancelledError } from '../../src/core/errors.js';
import { indexFolder } from '../../src/node/folderIndexer.js';
import { FolderNotFoundError } from '../../src/node/scan.js';
import { loadCollection } from '../helpers/shared.js';

// Real text: 40 CRAN abstracts (test/fixtures/corpora/cran) written out as files.
const cran = loadCollection('cran');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-folder-'));
const folder = join(tmp, 'notes');
const indexFile = join(tmp, 'cache', 'index.undertone');
const opts = { indexFile, parallel: false as const, settings: { k: 8 } };

beforeAll(() => {
  mkdirSync(folder, { recursive: true });
  for (const d of cran.docs.slice(0, 40)) writeFileSync(join(folder, `${d.id}.txt`), d.text);
});

afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe('indexFolder', () => {
  it('builds, then finds the saved index unchanged, then sees a file changed and one added since', async () => {
    const fresh = await indexFolder(folder, opts);
    expect(fresh.outcome).toBe('fresh');
    expect(fresh.files).toBe(40);

    const again = await indexFolder(folder, opts);
    expect(again.outcome).toBe('unchanged');
    expect(again.reused).toBe(40);

    const first = cran.docs[0];
    writeFileSync(join(folder, `${first.id}.txt`), `${first.text}\nboundary layer transition`);
    utimesSync(join(folder, `${first.id}.txt`), new Date(), new Date(Date.now() + 5_000));
    writeFileSync(join(folder, 'extra.txt'), cran.docs[40].text);
    const refreshed = await indexFolder(folder, opts);
    expect(refreshed.outcome).toBe('refreshed');
    expect(refreshed).toMatchObject({ files: 41, changed: 1, added: 1, reused: 39 });
    expect(refreshed.index.has('extra.txt')).toBe(true);
  });

  it('reports a missing folder, with or without a saved index to load', async () => {
    await expect(indexFolder(join(tmp, 'nowhere'), opts)).rejects.toBeInstanceOf(FolderNotFoundError);
    await expect(indexFolder(join(tmp, 'nowhere'), { ...opts, force: true })).rejects.toBeInstanceOf(FolderNotFoundError);
  });

  it('stops when cancelled, leaving the saved index as it was', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(indexFolder(folder, { ...opts, signal: controller.signal })).rejects.toBeInstanceOf(CancelledError);
    const after = await indexFolder(folder, opts);
    expect(after.outcome).toBe('unchanged');
    expect(after.files).toBe(41);
  });
});
