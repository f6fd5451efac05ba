/**
 * The screened section ranking against the full pass, on public documentation: numba-doc 0.56.4
 * (Debian, BSD-2-Clause; test/fixtures/numba-doc-sections). Queries: every tenth section's own
 * vector (Nearby at a section) and the concept vector of section titles (search), with and without
 * a per-file cap and a file filter. The lists must be equal (paths, positions and scores), and the
 * screen must skip sections (else it would check nothing).
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { SectionStore } from '../../../src/core/sections/sectionStore.js';
import { foldContextOf, foldSections } from '../../../src/core/sections/sectionVectors.js';
import { fixturePath } from '../../helpers/shared.js';

const docs = gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.trim())
  .map((l) => JSON.parse(l) as { id: string; text: string });

describe('SectionStore.rank with 8-bit screening', () => {
  const builder = new IndexBuilder({});
  for (const d of docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = builder.build();
  const ctx = foldContextOf(index);
  const store = new SectionStore(index.model.k, 1);
  for (const d of docs) store.set(d.id, foldSections(ctx, d.id, d.text));

  const queries: Float32Array[] = [];
  let n = 0;
  for (const [, f] of store.entries())
    for (let i = 0; i < f.starts.length; i++) {
      if (n++ % 10 === 0) queries.push(f.vectors.slice(i * index.model.k, (i + 1) * index.model.k));
      if (n % 25 === 0 && f.titles[i].trim()) {
        try {
          queries.push(index.projectText(f.titles[i]));
        } catch {
          // a title without a known word
        }
      }
    }

  it('lists exactly what the full pass lists', () => {
    expect(store.screened).toBeGreaterThan(1000);
    expect(queries.length).toBeGreaterThan(100);
    let exact = 0;
    const skipOdd = (p: string): boolean => p.length % 2 === 0;
    for (const q of queries)
      for (const [top, perFile, accept] of [
        [10, 3, undefined],
        [64, 3, undefined],
        [5, Number.POSITIVE_INFINITY, skipOdd],
        [10, 1, skipOdd],
      ] as const) {
        const got = store.rank(q, top, accept, perFile);
        exact += store.lastExact;
        expect(got).toEqual(store.rankExact(q, top, accept, perFile));
      }
    // The screen multiplied well under all sections on average.
    expect(exact / (queries.length * 4)).toBeLessThan(store.screened / 2);
  });
});
