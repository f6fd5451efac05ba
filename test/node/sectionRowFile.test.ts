/**
 * Section vectors read from the saved index file (src/node/sectionRowFile.ts, persist.ts'
 * sectionRows 'file') on public documentation: numba-doc 0.56.4 (Debian, BSD-2-Clause;
 * test/fixtures/numba-doc-sections), each page's sections folded as a build folds them. The index
 * reopened with its rows left in the file must answer as the one read whole into memory: section
 * search and Nearby, file search and Nearby, the probed lists, bit for bit; saving it again must
 * write the same payload. Then the ways it can go wrong: the file cut short or replaced after the
 * load, the rows closed, a damaged or forged row, a cancelled load.
 */
import { readFileSync, renameSync, rmSync, truncateSync, writeFileSync, mkdtempSync } from 'node:fs';
import { open } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CancelledError, InvalidInputError, NoKnownTermsError } from '../../src/core/errors.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { IndexBuilder } from '../../src/core/index/model/indexBuilder.js';
import { payloadOf, readIndexHeader, sealIndexFile, sectionRowsOf, headerExtent } from '../../src/core/index/persistence/serialize.js';
import { SectionRowsClosedError, SectionRowsError } from '../../src/core/sections/sectionRows.js';
import { nearbySections, searchSections } from '../../src/core/sections/sectionSearch.js';
import { foldContextOf, foldSections } from '../../src/core/sections/sectionVectors.js';
import { loadIndex, saveIndex, type LoadOptions } from '../../src/node/persist.js';
import { FileSectionRows } from '../../src/node/sectionRowFile.js';
import { fixturePath } from '../helpers/shared.js';

const docs = gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.trim())
  .map((l) => JSON.parse(l) as { id: string; text: string });
const queries = (
  JSON.parse(`[${readFileSync(fixturePath('numba-doc-sections/queries.jsonl'), 'utf8').trim().split('\n').join(',')}]`) as {
    query?: string;
    text?: string;
  }[]
)
  .map((q) => q.query ?? q.text ?? '')
  .filter((q) => q.trim());

const dir = mkdtempSync(join(tmpdir(), 'undertone-section-rows-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function build(): LsiIndex {
  const b = new IndexBuilder({});
  for (const d of docs) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = b.build();
  const ctx = foldContextOf(index);
  for (const d of docs) index.sections.set(d.id, foldSections(ctx, d.id, d.text));
  return index;
}

async function reopen(path: string, options: Partial<LoadOptions> = {}): Promise<LsiIndex> {
  const got = await loadIndex(path, options);
  if (got.status !== 'ok') throw new Error(`expected a loadable index, got ${got.status}: ${got.status === 'damaged' ? got.reason : ''}`);
  return got.index;
}

/** The answer, or null for a query without a known word. */
function known<T>(f: () => T): T | null {
  try {
    return f();
  } catch (err) {
    if (err instanceof NoKnownTermsError) return null;
    throw err;
  }
}

/** Top 20 of section search and Nearby, file search and Nearby, and the probed lists, for every query and every fifth page. */
function answers(index: LsiIndex) {
  const pages = index.paths().filter((_, i) => i % 5 === 0);
  return {
    sectionSearch: queries.map((q) => known(() => searchSections(index, q, { top: 20 }))),
    sectionNearby: pages.map((p) => nearbySections(index, p, 0, { top: 20 })),
    fileSearch: queries.map((q) => known(() => index.search(q, { top: 20 }))),
    fileNearby: pages.map((p) => index.nearby(p, { top: 20 })),
    lists: queries.slice(0, 30).map((q) => known(() => index.sections.rankLists(index.projectText(q), 10, undefined, 3))),
  };
}

describe('section rows read from the saved index file', () => {
  const file = join(dir, 'numba.undertone');
  let built: LsiIndex;
  beforeAll(async () => {
    built = build();
    await saveIndex(file, built);
  });

  it('answers as the index read whole into memory, and saves the same payload again', async () => {
    expect(built.sections.count).toBeGreaterThan(1000);
    const inFile = await reopen(file);
    const inMemory = await reopen(file, { sectionRows: 'memory' });
    const [a, b] = [answers(inFile), answers(inMemory)];
    expect(queries.length).toBeGreaterThan(20);
    expect(a.sectionSearch.flat().filter((h) => h).length).toBeGreaterThan(100);
    expect(a).toEqual(b);
    const again = join(dir, 'again.undertone');
    await saveIndex(again, inFile);
    expect(Buffer.compare(payloadOf(readFileSync(again)), payloadOf(readFileSync(file)))).toBe(0);
    inFile.sections.closeRows();
  });

  it('keeps reading the file it was loaded from when a save renames another over it', async () => {
    const path = join(dir, 'replaced.undertone');
    await saveIndex(path, built);
    const index = await reopen(path);
    const before = answers(index);
    const other = new IndexBuilder({});
    other.addText({ path: 'x.md', size: 5, mtimeMs: 0 }, 'other words entirely');
    await saveIndex(`${path}.new`, other.build());
    renameSync(`${path}.new`, path);
    expect(answers(index)).toEqual(before);
    index.sections.closeRows();
  });

  it('reports a file cut short after the load with SectionRowsError, and closed rows with SectionRowsClosedError', async () => {
    const path = join(dir, 'cut.undertone');
    await saveIndex(path, built);
    const index = await reopen(path);
    const q = index.projectText('compile a function for the GPU');
    truncateSync(path, 4096);
    expect(() => index.sections.rankExact(q, 10)).toThrow(SectionRowsError);
    index.sections.closeRows();
    expect(() => index.sections.rankExact(q, 10)).toThrow(SectionRowsClosedError);
  });

  it('finds a damaged row after loading (checksum), and a forged one whose checksum was made again (unit length)', async () => {
    const bytes = readFileSync(file);
    const header = readIndexHeader(bytes);
    const { at, k } = sectionRowsOf(header, headerExtent(bytes));
    const damaged = Buffer.from(bytes);
    damaged[at + 4 * k * 7 + 2] ^= 0x40;
    writeFileSync(join(dir, 'damaged.undertone'), damaged);
    // Format 6 with checkRows 'later': the rows are checked after the load (persistCheck.ts), before any of them is used.
    const reasonOf = async (path: string): Promise<string | undefined> => {
      const got = await loadIndex(path, { checkRows: 'later' });
      if (got.status !== 'ok') return `${got.status}: ${got.status === 'damaged' ? got.reason : ''}`;
      const reason = await got.checked;
      got.index.sections.closeRows();
      return reason;
    };
    expect(await reasonOf(join(dir, 'damaged.undertone'))).toMatch(/^index payload fails its checksum/);
    const payload = Buffer.from(payloadOf(bytes));
    const row = new Float32Array(payload.buffer, payload.byteOffset + at - headerExtent(bytes) + 4 * k * 3, k);
    row[0] = 2;
    writeFileSync(join(dir, 'forged.undertone'), sealIndexFile(header, payload));
    expect(await reasonOf(join(dir, 'forged.undertone'))).toMatch(/^index payload: a section vector is not of unit length/);
  });

  it('stops a cancelled load with CancelledError', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(loadIndex(file, { signal: controller.signal })).rejects.toThrow(CancelledError);
  });
});

describe('FileSectionRows', () => {
  it('reads the rows a saved file holds, refuses rows outside it, and closes once', async () => {
    const bytes = readFileSync(join(dir, 'numba.undertone'));
    const { at, rows, k } = sectionRowsOf(readIndexHeader(bytes), headerExtent(bytes));
    const expected = new Float32Array(bytes.buffer.slice(bytes.byteOffset + at, bytes.byteOffset + at + 4 * k * rows));
    const reader = new FileSectionRows(await open(join(dir, 'numba.undertone')), 'numba.undertone', at, rows, k);
    const into = new Float32Array(3 * k + 5);
    reader.read(rows - 3, 3, into, 5);
    expect(into.subarray(5)).toEqual(expected.subarray((rows - 3) * k));
    expect(() => reader.read(rows - 1, 2, new Float32Array(2 * k))).toThrow(InvalidInputError);
    reader.close();
    reader.close();
    expect(() => reader.read(0, 1, new Float32Array(k))).toThrow(SectionRowsClosedError);
  });
});
