/**
 * Folding a local index into a shared concept model. Real text: the CISI collection
 * (test/fixtures/corpora/cisi). A model built from all of CISI, adopted by an index of the same
 * files, must give exactly the vectors, search and Nearby results of the index that built it
 * (adoption folds files in with the same arithmetic the build uses); adopted by an index of half
 * the files, the half's vectors equal the full index's vectors of those files, and terms only the
 * other half uses still count in queries.
 */
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { decodeConceptFile, encodeConceptFile } from '../../../../src/core/index/persistence/conceptFile.js';
import { portableFromIndex } from '../../../../src/core/index/model/portableFromIndex.js';
import { loadCollection } from '../../../helpers/shared.js';

const cisi = loadCollection('cisi');

describe('adoptSharedModel', () => {
  const build = (docs: (typeof cisi)['docs'], shared?: ReturnType<typeof decodeConceptFile>) => {
    const b = new IndexBuilder({ k: 60 });
    for (const d of docs) b.addText({ path: `${d.id}.txt`, size: d.text.length, mtimeMs: 0 }, d.text);
    return b.build(shared ? { sharedModel: shared } : {});
  };

  it('reproduces the building index exactly, and serves half of the files in the same space', () => {
    const full = build(cisi.docs);
    const shared = decodeConceptFile(encodeConceptFile(portableFromIndex(full)));
    const same = build(cisi.docs, shared);
    expect(same.k).toBe(full.k);
    for (const p of full.paths()) expect(Array.from(same.vectorOf(p))).toEqual(Array.from(full.vectorOf(p)));
    for (const q of cisi.queries.slice(0, 10)) {
      expect(same.search(q.text, { top: 10 }).map((h) => h.path)).toEqual(full.search(q.text, { top: 10 }).map((h) => h.path));
    }
    expect(same.nearby(full.paths()[5], { top: 10 }).map((h) => h.path)).toEqual(
      full.nearby(full.paths()[5], { top: 10 }).map((h) => h.path),
    );

    const half = build(cisi.docs.slice(0, 700), shared);
    for (const p of half.paths()) expect(Array.from(half.vectorOf(p))).toEqual(Array.from(full.vectorOf(p)));
    // Every model term is known to the half's vocabulary, even those only the other half uses.
    const known = shared.terms.filter((t) => half.vocab.idOf(t) !== undefined);
    expect(known.length).toBe(shared.terms.length);
    expect(half.model.keptIds.length).toBe(shared.terms.length);
  });

  it('refuses a model counted with other tokenizer options', () => {
    const full = build(cisi.docs.slice(0, 200));
    const other = { ...decodeConceptFile(encodeConceptFile(portableFromIndex(full))), tokenize: { stem: false, keepCompounds: true } };
    expect(() => build(cisi.docs.slice(0, 50), other)).toThrow(/tokenizer options/);
  });
});
