/**
 * Real text with sections for the section tests: numba-doc 0.56.4 (Debian, BSD-2-Clause;
 * test/fixtures/numba-doc-sections, provenance in its README).
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { IndexBuilder } from '../../src/core/index/model/indexBuilder.js';
import { foldContextOf, foldSections } from '../../src/core/sections/sectionVectors.js';
import { fixturePath } from './shared.js';

export interface NumbaDoc {
  id: string;
  text: string;
}

/** The fixture's pages. */
export function numbaDocs(): NumbaDoc[] {
  return gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
    .toString('utf8')
    .split('\n')
    .filter((l) => l.trim())
    .map((l) => JSON.parse(l) as NumbaDoc);
}

/** An index of the pages with their sections folded in, section lists used from `listsFrom` sections on. */
export function numbaSectionIndex(docs: readonly NumbaDoc[], listsFrom: number): LsiIndex {
  const builder = new IndexBuilder({});
  for (const d of docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = builder.build();
  const ctx = foldContextOf(index);
  for (const d of docs) index.sections.set(d.id, foldSections(ctx, d.id, d.text));
  index.sections.setListsFrom(listsFrom);
  return index;
}
