/**
 * The inverted file's quantizer (src/core/sections/sectionLists.ts) on public documentation:
 * section vectors of numba-doc 0.56.4 (Debian, BSD-2-Clause; test/fixtures/numba-doc-sections).
 * Checks: the same rows and seed give the same centroids and filing; filing with every group
 * tried is the nearest centroid; probing orders centroids by cosine; filing a block of rows at
 * once (the SIMD kernel assembly/fileRows.ts) gives every row the list file() gives it.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { dotModule } from '../../../src/core/matrix/wasm/dotKernel.js';
import { SectionLists, type RowSource } from '../../../src/core/sections/sectionLists.js';
import { foldContextOf, foldSections } from '../../../src/core/sections/sectionVectors.js';
import { fixturePath } from '../../helpers/shared.js';

const docs = gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.trim())
  .map((l) => JSON.parse(l) as { id: string; text: string });

describe('SectionLists', () => {
  const builder = new IndexBuilder({});
  for (const d of docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = builder.build();
  const k = index.model.k;
  const ctx = foldContextOf(index);
  const blocks = docs.map((d) => foldSections(ctx, d.id, d.text).vectors).filter((v) => v.length > 0);
  const all = new Float32Array(blocks.reduce((a, b) => a + b.length, 0));
  blocks.reduce((at, b) => (all.set(b, at), at + b.length), 0);
  const rows: RowSource = { n: all.length / k, row: (j) => ({ block: all, at: j * k }) };
  const dot = (a: Float32Array, ao: number, b: ArrayLike<number>, bo: number): number => {
    let s = 0;
    for (let c = 0; c < k; c++) s += a[ao + c] * b[bo + c];
    return s;
  };

  it('gives the same centroids and filing for the same seed, other centroids for another', () => {
    const a = SectionLists.train(k, rows, { seed: 7 });
    const b = SectionLists.train(k, rows, { seed: 7 });
    const c = SectionLists.train(k, rows, { seed: 8 });
    expect(rows.n).toBeGreaterThan(1000);
    expect(a.centroids).toEqual(b.centroids);
    expect(c.centroids).not.toEqual(a.centroids);
    for (let j = 0; j < rows.n; j += 7) expect(a.file(all, j * k)).toBe(b.file(all, j * k));
    // About √n lists (each group's share is rounded).
    expect(Math.abs(a.lists - Math.ceil(Math.sqrt(rows.n)))).toBeLessThanOrEqual(Math.ceil(Math.sqrt(a.lists)));
  });

  it('files a vector under its nearest centroid when every group is tried, and probes centroids best first', () => {
    const lists = SectionLists.train(k, rows, { fileGroups: 1000 });
    for (let j = 0; j < rows.n; j += 5) {
      let best = 0;
      for (let l = 1; l < lists.lists; l++)
        if (dot(lists.centroids, l * k, all, j * k) > dot(lists.centroids, best * k, all, j * k)) best = l;
      expect(lists.file(all, j * k)).toBe(best);
    }
    const q = all.subarray(0, k);
    const order = lists.nearest(q, lists.lists);
    expect(new Set(order).size).toBe(lists.lists);
    for (let i = 1; i < order.length; i++)
      expect(dot(lists.centroids, order[i - 1] * k, q, 0)).toBeGreaterThanOrEqual(dot(lists.centroids, order[i] * k, q, 0));
    expect(lists.nearest(q).length).toBe(Math.min(lists.probe, lists.lists));
  });

  it('files a block of rows as file() files each row, ties and all', () => {
    expect(dotModule()).not.toBeNull(); // the kernel path is the one under test
    for (const options of [{ seed: 3 }, { seed: 3, fileGroups: 2 }]) {
      const lists = SectionLists.train(k, rows, options);
      const got = new Int32Array(rows.n + 5).fill(-7);
      // From row 1 on, into out from 3 on: offsets on both sides; blocks of 256 and a rest.
      lists.fileRows(all, k, rows.n - 1, got, 3);
      expect(got.subarray(0, 3)).toEqual(Int32Array.of(-7, -7, -7));
      for (let j = 1; j < rows.n; j++) expect(got[j + 2]).toBe(lists.file(all, j * k));
      expect(got[rows.n + 2]).toBe(-7);
    }
    // Equal scores: the first group and the first centroid win, as in file(); a row of NaN
    // (no score wins) goes to list 0, and a row of zeros to the first centroid of the first group.
    const a = all.subarray(0, k);
    const b = all.subarray(k, 2 * k);
    const c = all.subarray(2 * k, 3 * k);
    const tied = SectionLists.restore(
      k,
      Float32Array.from([...b, ...b, ...c, ...c]),
      Float32Array.from([...a, ...a]),
      Int32Array.of(0, 3, 4),
    );
    const probes = Float32Array.from([...a, ...b, ...c, ...new Array<number>(k).fill(Number.NaN), ...new Array<number>(k).fill(0)]);
    const out = new Int32Array(5);
    tied.fileRows(probes, 0, 5, out, 0);
    expect(Array.from(out)).toEqual([0, 1, 2, 3, 4].map((j) => tied.file(probes, j * k)));
    expect(out[3]).toBe(0);
    expect(out[4]).toBe(0);
  });
});
