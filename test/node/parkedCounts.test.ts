/**
 * The files' raw counts parked in a scratch file from the weighting to the save
 * (src/node/parkedCounts.ts): every file's ids and counts read back the same into the same
 * objects, emptied while parked, streamed to a save from the file (source), no name left in the folder, nothing parked below the threshold
 * or without a file, and the file given back by close(). Counts: CRAN abstracts
 * (test/fixtures/corpora/cran), tokenized and counted as the build does.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { countTerms, EMPTY_DOC_TERMS, Vocabulary, type DocTerms } from '../../src/core/counting/termCounts.js';
import { tokenize } from '../../src/core/text/tokenize.js';
import { ParkedCounts } from '../../src/node/parkedCounts.js';
import { openSpillBeside } from '../../src/node/sectionCodeFile.js';
import { watchedSpill } from '../helpers/watchedSpill.js';
import { loadCollection } from '../helpers/shared.js';

const folder = mkdtempSync(join(tmpdir(), 'undertone-park-counts-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function counted(): DocTerms[] {
  const vocab = new Vocabulary();
  const docs = loadCollection('cran')
    .docs.slice(0, 200)
    .map((d) => countTerms(tokenize(d.text), vocab, true));
  return [...docs, EMPTY_DOC_TERMS];
}

function copies(docs: readonly DocTerms[]): { ids: number[]; counts: number[]; length: number }[] {
  return docs.map((d) => ({ ids: [...d.termIds], counts: [...d.counts], length: d.length }));
}

describe('ParkedCounts', () => {
  it('parks the counts in a scratch file, empties them, and reads every file back the same', () => {
    const docs = counted();
    const before = copies(docs);
    const { open, seen } = watchedSpill(folder, 'test');
    const parked = ParkedCounts.park(docs, open, 0);
    expect(parked).not.toBeNull();
    expect(readdirSync(folder)).toEqual([]); // unlinked as soon as made
    expect(docs.every((d) => d.termIds.length === 0 && d.counts.length === 0)).toBe(true);
    expect(docs.map((d) => d.length)).toEqual(before.map((d) => d.length));
    parked!.unpark();
    expect(seen.closes).toBe(1);
    expect(copies(docs)).toEqual(before);
    expect(before.reduce((n, d) => n + d.ids.length, 0)).toBeGreaterThan(1000);
  });

  it("gives a save every parked file's lists from the scratch file, in few reads, and nothing once they are back", () => {
    const docs = counted();
    const before = copies(docs);
    const { open, seen } = watchedSpill(folder, 'test');
    const parked = ParkedCounts.park(docs, open, 0)!;
    const source = parked.source();
    const read = (order: number[]) => {
      const got = docs.map(() => ({ ids: [] as number[], counts: [] as number[] }));
      for (const i of order) got[i].ids = [...(source.ids(docs[i]) ?? [])];
      for (const i of order) got[i].counts = [...(source.counts(docs[i]) ?? [])];
      return got;
    };
    const parkedDocs = docs.map((_, i) => i).filter((i) => before[i].ids.length > 0);
    // In the order a save asks (the order they were parked in): the same lists, the whole file in one read.
    const inOrder = read(parkedDocs);
    for (const i of parkedDocs) {
      expect(source.length(docs[i])).toBe(before[i].ids.length);
      expect(inOrder[i]).toEqual({ ids: before[i].ids, counts: before[i].counts });
    }
    expect(seen.reads).toBe(1);
    // Backwards: still the same lists.
    const backwards = read([...parkedDocs].reverse());
    for (const i of parkedDocs) expect(backwards[i]).toEqual({ ids: before[i].ids, counts: before[i].counts });
    // A file not parked here (the empty one) is left to its own arrays.
    expect(source.length(docs[docs.length - 1])).toBeUndefined();
    expect(source.ids(docs[docs.length - 1])).toBeUndefined();
    // Once the counts are back in their files, the source holds nothing.
    parked.unpark();
    expect(copies(docs)).toEqual(before);
    expect(source.length(docs[0])).toBeUndefined();
    expect(source.counts(docs[0])).toBeUndefined();
  });

  it('leaves the counts in the scratch file until they are read, then gives every file its counts back at once', () => {
    const docs = counted();
    const before = copies(docs);
    const { open, seen } = watchedSpill(folder, 'test');
    const parked = ParkedCounts.park(docs, open, 0)!;
    parked.unparkOnUse();
    expect(seen.closes).toBe(0); // still parked
    expect(docs[5].length).toBe(before[5].length); // the total is no count: no read
    expect(seen.closes).toBe(0);
    expect([...docs[7].counts]).toEqual(before[7].counts);
    expect(seen.closes).toBe(1); // all read back at the first use
    expect(copies(docs)).toEqual(before);
    expect(Object.getOwnPropertyDescriptor(docs[7], 'termIds')?.get).toBeUndefined(); // plain fields again
    // Closed before any use: a read is refused, not answered with empty counts.
    const again = counted();
    const p2 = ParkedCounts.park(again, openSpillBeside(folder, 'test'), 0)!;
    p2.unparkOnUse();
    p2.close();
    expect(() => again[0].termIds).toThrow('could not be read back');
  });

  it('parks nothing below the threshold or without a scratch file, and close() gives the file back', () => {
    const docs = counted();
    const before = copies(docs);
    expect(ParkedCounts.park(docs, openSpillBeside(folder, 'test'), Number.MAX_SAFE_INTEGER)).toBeNull();
    expect(ParkedCounts.park(docs, () => null, 0)).toBeNull();
    expect(ParkedCounts.park(docs, undefined, 0)).toBeNull();
    expect(copies(docs)).toEqual(before);
    const { open, seen } = watchedSpill(folder, 'test');
    const parked = ParkedCounts.park(docs, open, 0);
    parked!.close();
    expect(seen.closes).toBe(1);
  });
});
