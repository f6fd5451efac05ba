import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { INDEX_FORMAT_VERSION } from '../../src/core/index/persistence/serialize.js';
import { loadIndex, saveIndex } from '../../src/node/persist.js';
import { loadCollection } from '../helpers/shared.js';

// Real text: the ADI collection (test/fixtures/corpora/adi); the reference is the index that was saved.
const adi = loadCollection('adi');
const dir = mkdtempSync(join(tmpdir(), 'undertone-persist-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function buildAdi(): LsiIndex {
  const b = new IndexBuilder();
  for (const d of adi.docs) b.addText({ path: `adi/${d.id}.txt`, size: d.text.length, mtimeMs: 1000 + Number(d.id) }, d.text);
  return b.build();
}

function answers(index: LsiIndex) {
  return {
    search: adi.queries.slice(0, 20).map((q) => index.search(q.text, { top: 10 })),
    nearby: index.paths().map((p) => index.nearby(p, { top: 5 })),
    ids: index.vocab.terms.map((t) => index.vocab.idOf(t)),
  };
}

async function reopen(path: string, readChunkBytes?: number): Promise<LsiIndex> {
  const got = await loadIndex(path, { readChunkBytes });
  if (got.status !== 'ok') throw new Error(`expected a loadable index, got ${got.status}`);
  return got.index;
}

describe('persist', () => {
  it('reopens a saved index with the same answers, also after a fold-in and a second save', async () => {
    const index = buildAdi();
    const file = join(dir, 'a.undertone');
    const written = await saveIndex(file, index);
    expect(written).toBe(readFileSync(file).length);
    const copy = await reopen(file);
    expect(answers(copy)).toEqual(answers(index));
    const text = 'a thesaurus for qqnewterm retrieval';
    index.foldIn({ path: 'extra/t.md', size: text.length, mtimeMs: 3 }, text);
    copy.foldIn({ path: 'extra/t.md', size: text.length, mtimeMs: 3 }, text);
    expect(answers(copy)).toEqual(answers(index));
    await saveIndex(file, copy);
    expect(answers(await reopen(file))).toEqual(answers(index));
  });

  it('reads the same index whatever the read size, and still finds damage near the end', async () => {
    const index = buildAdi();
    const file = join(dir, 'c.undertone');
    await saveIndex(file, index);
    const whole = answers(index);
    for (const chunk of [7, 4096, 65_536]) expect(answers(await reopen(file, chunk))).toEqual(whole);
    const flipped = readFileSync(file);
    flipped[flipped.length - 3] ^= 0x02;
    writeFileSync(file, flipped);
    expect(await loadIndex(file, { readChunkBytes: 4096 })).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
  });

  it('reports a missing file as missing and a damaged, truncated or older file as damaged', async () => {
    expect(await loadIndex(join(dir, 'none.undertone'))).toEqual({ status: 'missing' });
    const file = join(dir, 'b.undertone');
    await saveIndex(file, buildAdi());
    const good = readFileSync(file);
    const flipped = Buffer.from(good);
    flipped[flipped.length - 1000] ^= 0x10;
    writeFileSync(file, flipped);
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
    writeFileSync(file, good.subarray(0, good.length - 4));
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/truncated/) });
    const older = Buffer.from(good);
    const at = older.indexOf(`"formatVersion":${INDEX_FORMAT_VERSION}`);
    older.write(`"formatVersion":${INDEX_FORMAT_VERSION - 1}`, at);
    writeFileSync(file, older);
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/format/) });
    expect(await loadIndex(dir)).toMatchObject({ status: 'damaged' });
  });
});
