/**
 * `undertone count`: one shard of a folder's files (the ADI collection, test/fixtures/corpora/adi,
 * written out as files, plus a binary file and a listed file that does not exist). Its counts
 * must be the saved index's counts of the same files term for term (the index is the reference:
 * the shard exists to reproduce it elsewhere), every listed file must be counted or recorded as
 * skipped with its reason, and --list must name exactly the files the index holds.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseMatrixMarket } from '../../src/core/matrix/matrixMarket.js';
import { loadIndex } from '../../src/node/persist.js';
import { indexFileFor } from '../../src/node/cacheDir.js';
import { runCli } from '../helpers/cliRunner.js';
import { loadCollection } from '../helpers/shared.js';

const adi = loadCollection('adi');

describe('undertone count', () => {
  let dir: string, folder: string, cache: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'undertone-count-'));
    folder = join(dir, 'ws');
    cache = join(dir, 'cache');
    mkdirSync(join(folder, 'sub'), { recursive: true });
    adi.docs.forEach((d, i) => writeFileSync(join(folder, i % 2 ? 'sub' : '.', `${d.id}.txt`), d.text));
    writeFileSync(join(folder, 'blob.bin'), Uint8Array.from([1, 0, 2, 0, 3]));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('writes the index’s counts, and records every file it did not count', async () => {
    expect((await runCli(['index', folder, '--cache-dir', cache, '--quiet'], [])).code).toBe(0);
    const listed = await runCli(['count', folder, '--list', '--cache-dir', cache], []);
    expect(listed.code).toBe(0);
    const paths = listed.out.split('\n');
    const loaded = await loadIndex(indexFileFor(folder, cache));
    if (loaded.status !== 'ok') throw new Error('no saved index');
    const index = loaded.index;
    expect([...paths].sort()).toEqual([...index.paths(), 'blob.bin'].sort());
    writeFileSync(join(dir, 'list.txt'), [...paths, 'gone.txt'].join('\n'));
    const r = await runCli(['count', folder, '--files', join(dir, 'list.txt'), '--out', join(dir, 'shard'), '--json'], []);
    expect(r.code, r.err).toBe(0);
    const manifest = JSON.parse(readFileSync(join(dir, 'shard.json'), 'utf8'));
    expect(manifest.listed).toBe(paths.length + 1);
    expect(manifest.skipped.map((s: { path: string; reason: string }) => `${s.path}:${s.reason}`).sort()).toEqual([
      'blob.bin:binary',
      'gone.txt:unreadable',
    ]);
    const files = readFileSync(join(dir, 'shard.files'), 'utf8').trimEnd().split('\n');
    const terms = readFileSync(join(dir, 'shard.terms'), 'utf8').trimEnd().split('\n');
    expect([...terms].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0))).toEqual(terms);
    const m = parseMatrixMarket(readFileSync(join(dir, 'shard.mtx'), 'utf8'));
    if (m.format !== 'coordinate') throw new Error('expected coordinate');
    expect([m.rows, m.cols]).toEqual([files.length, terms.length]);
    const got = files.map(() => new Map<string, number>());
    for (let t = 0; t < m.values.length; t++) got[m.rowIndex[t]].set(terms[m.colIndex[t]], m.values[t]);
    files.forEach((f, i) => {
      const t = index.termsOf(f);
      const want = new Map(Array.from(t.termIds, (id, j) => [index.vocab.termOf(id), t.counts[j]] as const));
      expect(got[i], f).toEqual(want);
    });
    expect((await runCli(['count', folder, '--out', join(dir, 'x')], [])).code).toBe(1);
    writeFileSync(join(dir, 'bad.txt'), '../outside.txt\n');
    expect((await runCli(['count', folder, '--files', join(dir, 'bad.txt'), '--out', join(dir, 'x')], [])).code).toBe(1);
  });
});
