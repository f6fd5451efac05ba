/**
 * Section rows kept out of memory (src/core/sections/sectionRows.ts) on public documentation:
 * numba-doc 0.56.4 (Debian, BSD-2-Clause; test/fixtures/numba-doc-sections). The sections of every
 * page are folded as a build folds them, then held twice: as arrays, and as positions in one saved
 * table whose rows are read through a reader. Every ranking of the store (the screen, the full
 * pass, the probed lists, a file's best section, the section at a line) must give the same hits,
 * bit for bit, from both.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it, vi } from 'vitest';
import { InvalidInputError } from '../../../src/core/errors.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import {
  MemoryRows,
  RowScratch,
  SectionRowsClosedError,
  StoredFileSections,
  type SavedSectionTable,
} from '../../../src/core/sections/sectionRows.js';
import { SectionStore } from '../../../src/core/sections/sectionStore.js';
import { foldContextOf, foldSections, type FileSections } from '../../../src/core/sections/sectionVectors.js';
import { fixturePath } from '../../helpers/shared.js';

const docs = gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.trim())
  .map((l) => JSON.parse(l) as { id: string; text: string });

const builder = new IndexBuilder({});
for (const d of docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
const index = builder.build();
const k = index.model.k;
const ctx = foldContextOf(index);
const folded = docs.map((d) => [d.id, foldSections(ctx, d.id, d.text)] as const).filter(([, f]) => f.starts.length > 0);

/** The folded sections laid out as the index file holds them, read back through `reader`. */
function savedTable(): { table: SavedSectionTable; files: (readonly [string, StoredFileSections])[] } {
  const count = folded.reduce((s, [, f]) => s + f.starts.length, 0);
  const lines = new Int32Array(2 * count);
  const vectors = new Float32Array(count * k);
  const titles: string[] = [];
  let at = 0;
  for (const [, f] of folded) {
    for (let i = 0; i < f.starts.length; i++) [lines[2 * (at + i)], lines[2 * (at + i) + 1]] = [f.starts[i], f.ends[i]];
    vectors.set(f.vectors, at * k);
    titles.push(...f.titles);
    at += f.starts.length;
  }
  const enc = new TextEncoder();
  const titleBytes = enc.encode(titles.join('\0'));
  const titleStarts = new Int32Array(count + 1);
  for (let i = 0; i < count; i++) titleStarts[i + 1] = titleStarts[i] + enc.encode(titles[i]).length + 1;
  const table = { lines, titleBytes, titleStarts, rows: new MemoryRows(vectors, k) };
  let first = 0;
  const files = folded.map(([id, f]) => {
    const stored = new StoredFileSections(table, first, f.starts.length);
    first += f.starts.length;
    return [id, stored] as const;
  });
  return { table, files };
}

function storeOf(files: readonly (readonly [string, FileSections])[], listsFrom?: number): SectionStore {
  const store = new SectionStore(k, 1, listsFrom);
  for (const [id, f] of files) store.set(id, f);
  return store;
}

describe('MemoryRows', () => {
  it('copies the asked rows where asked, and refuses rows outside it or a short destination', () => {
    const v = Float32Array.from({ length: 12 }, (_, i) => i + 0.5);
    const rows = new MemoryRows(v, 3);
    expect(rows.rows).toBe(4);
    const into = new Float32Array(8);
    rows.read(1, 2, into, 1);
    expect([...into]).toEqual([0, 3.5, 4.5, 5.5, 6.5, 7.5, 8.5, 0]);
    expect(() => rows.read(3, 2, new Float32Array(6))).toThrow(InvalidInputError);
    expect(() => rows.read(-1, 1, new Float32Array(3))).toThrow(InvalidInputError);
    expect(() => rows.read(0, 2, new Float32Array(5))).toThrow(InvalidInputError);
    expect(() => new MemoryRows(new Float32Array(5), 3)).toThrow(InvalidInputError);
  });

  it('throws SectionRowsClosedError once closed', () => {
    const rows = new MemoryRows(new Float32Array(6), 3);
    rows.close();
    rows.close();
    expect(rows.closed).toBe(true);
    expect(() => rows.read(0, 1, new Float32Array(3))).toThrow(SectionRowsClosedError);
  });
});

describe('StoredFileSections', () => {
  const { table, files } = savedTable();

  it('gives back the lines, titles and vectors it was saved with, and one section alone', () => {
    expect(files.length).toBeGreaterThan(50);
    files.forEach(([, s], j) => {
      const f = folded[j][1];
      expect(s.starts).toEqual(f.starts);
      expect(s.ends).toEqual(f.ends);
      expect(s.titles).toEqual(f.titles);
      expect(s.vectors).toEqual(f.vectors);
      const i = f.starts.length - 1;
      expect(s.section(i)).toEqual({ start: f.starts[i], end: f.ends[i], title: f.titles[i] });
    });
    const scratch = new RowScratch(k);
    const [, last] = files[files.length - 1];
    const n = last.starts.length;
    const { block, at } = scratch.rows(last, n - 1, 1);
    expect(block.slice(at, at + k)).toEqual(folded[folded.length - 1][1].vectors.slice((n - 1) * k, n * k));
  });

  it('refuses a position outside the table', () => {
    expect(() => new StoredFileSections(table, table.rows.rows - 1, 2)).toThrow(InvalidInputError);
  });
});

describe('SectionStore over stored rows', () => {
  const { files } = savedTable();
  const queries: Float32Array[] = [];
  folded.forEach(([, f], j) => {
    if (j % 3 === 0) queries.push(f.vectors.slice(0, k));
    if (j % 5 === 0 && f.titles[0].trim())
      try {
        queries.push(index.projectText(f.titles[0]));
      } catch {
        // a title without a known word
      }
  });
  const skipOdd = (p: string): boolean => p.length % 2 === 0;

  it("takes a saved table's files without making their titles or lines (a reopen of the Linux tree decoded 1.33 M titles)", () => {
    const titles = vi.spyOn(StoredFileSections.prototype, 'titles', 'get');
    const starts = vi.spyOn(StoredFileSections.prototype, 'starts', 'get');
    try {
      const stored = storeOf(files);
      expect(stored.count).toBe(files.reduce((n, [, f]) => n + f.count, 0));
      expect(titles).not.toHaveBeenCalled();
      expect(starts).not.toHaveBeenCalled();
      stored.delete(files[0][0]);
      expect(stored.count).toBe(files.reduce((n, [, f]) => n + f.count, 0) - files[0][1].count);
      expect(starts).not.toHaveBeenCalled();
    } finally {
      titles.mockRestore();
      starts.mockRestore();
    }
  });

  it('ranks as the same sections held in memory: screen, full pass, best section and section at a line', () => {
    const held = storeOf(folded);
    const stored = storeOf(files);
    expect(queries.length).toBeGreaterThan(50);
    expect(stored.screened).toBeGreaterThan(1000);
    for (const q of queries) {
      for (const [top, perFile, accept] of [
        [10, 3, undefined],
        [20, Number.POSITIVE_INFINITY, skipOdd],
      ] as const) {
        expect(stored.rank(q, top, accept, perFile)).toEqual(held.rank(q, top, accept, perFile));
        expect(stored.rankExact(q, top, accept, perFile)).toEqual(held.rankExact(q, top, accept, perFile));
      }
    }
    for (const [id, f] of folded.slice(0, 40)) {
      expect(stored.best(id, queries[0])).toEqual(held.best(id, queries[0]));
      const line = f.ends[f.ends.length - 1] - 1;
      expect(stored.at(id, line)).toEqual(held.at(id, line));
    }
  });

  it('ranks as the same sections held in memory over the probed lists, also after an edit', () => {
    const held = storeOf(folded, 1);
    const stored = storeOf(files, 1);
    const also = [folded[1][0], folded[7][0]];
    for (const q of queries) expect(stored.rank(q, 10, undefined, 3, also)).toEqual(held.rank(q, 10, undefined, 3, also));
    // A page edited in the editor: its new sections are held in memory beside the stored ones.
    const id = folded[4][0];
    const edited = foldSections(ctx, id, docs[9].text);
    expect(edited.starts.length).toBeGreaterThan(0);
    held.set(id, edited);
    stored.set(id, edited);
    for (const q of queries.slice(0, 20)) expect(stored.rank(q, 10, skipOdd, 2, also)).toEqual(held.rank(q, 10, skipOdd, 2, also));
  });

  it('reports rows read after closeRows with SectionRowsClosedError', () => {
    const stored = storeOf(savedTable().files);
    stored.closeRows();
    expect(() => stored.rankExact(queries[0], 10)).toThrow(SectionRowsClosedError);
  });
});
