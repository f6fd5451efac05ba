/**
 * The threads' section counts parked in a scratch file during the SVD (src/node/parkedSections.ts):
 * every file's counts read back the same (ids and counts of two shared packs, as two threads give
 * them), whole or a file at a time (lines), no name left in the folder, nothing parked below the threshold or without a file, and
 * the file given back by close(). Counts: CRAN abstracts (test/fixtures/corpora/cran), cut and
 * counted as the sections stage does.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { Vocabulary } from '../../src/core/counting/termCounts.js';
import type { CountedSections } from '../../src/core/sections/sectionVectors.js';
import type { ByteSpill, OpenSpill } from '../../src/core/sections/types.js';
import { ParkedSections } from '../../src/node/parkedSections.js';
import { openSpillBeside } from '../../src/node/sectionCodeFile.js';
import { watchedSpill } from '../helpers/watchedSpill.js';
import { countSections } from '../helpers/countedSections.js';
import { loadCollection } from '../helpers/shared.js';

const folder = mkdtempSync(join(tmpdir(), 'undertone-park-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** 40 abstracts' sections, the files of each half sharing one pair of arrays (offsets absolute). */
function counted(): Map<string, CountedSections> {
  const docs = loadCollection('cran').docs.slice(0, 40);
  const vocab = new Vocabulary();
  const out = new Map<string, CountedSections>();
  for (const half of [docs.slice(0, 20), docs.slice(20)]) {
    // A line a sentence: several windows a file.
    const files = half.map((d) => ({ path: `${d.id}.txt`, text: d.text.replace(/\. /g, '.\n') }));
    const sections = countSections(files, vocab, { grow: true, split: { windowLines: 3, windowOverlap: 1 } });
    half.forEach((d, i) => out.set(d.id, sections[i]));
  }
  return out;
}

describe('ParkedSections', () => {
  it('parks the counts in a scratch file and reads every file back the same', () => {
    const before = counted();
    const map = new Map(before);
    const opened: ByteSpill[] = [];
    const beside = openSpillBeside(folder);
    const open: OpenSpill = () => {
      const s = beside();
      if (s) opened.push(s);
      return s;
    };
    const parked = ParkedSections.park(map, open, 0)!;
    expect(parked).not.toBeNull();
    expect(opened.length).toBe(1);
    expect(map.size).toBe(0); // nothing of the counts left here
    expect(readdirSync(folder)).toEqual([]); // unlinked as soon as made
    parked.unpark(map);
    expect([...map.keys()]).toEqual([...before.keys()]);
    const packs = new Set<Int32Array>();
    for (const [key, want] of before) {
      const got = map.get(key)!;
      packs.add(got.termIds);
      expect(got.titles).toEqual(want.titles);
      expect(got.offsets).toBe(want.offsets);
      const [a, b] = [want.offsets[0], want.offsets[want.offsets.length - 1]];
      expect(Array.from(got.termIds.subarray(a, b))).toEqual(Array.from(want.termIds.subarray(a, b)));
      expect(Array.from(got.counts.subarray(a, b))).toEqual(Array.from(want.counts.subarray(a, b)));
    }
    expect(packs.size).toBe(2); // still one pair a half, as the threads gave them
    // Read back once: the file is closed (a second read is refused).
    expect(() => parked.unpark(new Map())).toThrow();
  });

  it("gives the files their sections without the counts and reads each file's counts from the scratch file", () => {
    const before = counted();
    const map = new Map(before);
    const parked = ParkedSections.park(map, openSpillBeside(folder), 0)!;
    const read = parked.lines(map);
    expect([...map.keys()]).toEqual([...before.keys()]);
    for (const [key, want] of before) {
      const got = map.get(key)!;
      // Lines, titles and offsets as they were; no counts resident.
      expect(got.titles).toEqual(want.titles);
      expect(got.offsets).toBe(want.offsets);
      expect(got.termIds.length + got.counts.length).toBe(0);
      const [a, b] = [want.offsets[0], want.offsets[want.offsets.length - 1]];
      const terms = read(key)!;
      expect(terms.first).toBe(a);
      expect(Array.from(terms.termIds)).toEqual(Array.from(want.termIds.subarray(a, b)));
      expect(Array.from(terms.counts)).toEqual(Array.from(want.counts.subarray(a, b)));
    }
    expect(read('not parked')).toBeUndefined();
    // The reader's file stays open until close(); then it reads no more.
    parked.close();
    expect(() => read(before.keys().next().value!)).toThrow();
    expect(readdirSync(folder)).toEqual([]);
  });

  it('parks nothing below the threshold or without a scratch file, and close() gives the file back', () => {
    const map = counted();
    let opens = 0;
    expect(ParkedSections.park(map, () => (opens++, null), 0)).toBeNull();
    expect(ParkedSections.park(map, undefined, 0)).toBeNull();
    expect(ParkedSections.park(map, openSpillBeside(folder), Number.MAX_SAFE_INTEGER)).toBeNull();
    expect(opens).toBe(1);
    expect(map.size).toBe(40); // left as it was
    const { open, seen } = watchedSpill(folder);
    const parked = ParkedSections.park(map, open, 0)!;
    parked.close();
    expect(seen.closes).toBe(1);
  });
});
