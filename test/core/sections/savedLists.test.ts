/**
 * The section lists saved in the index (format 5) against the lists of the index they were saved
 * from, on public documentation: numba-doc 0.56.4 (Debian, BSD-2-Clause;
 * test/fixtures/numba-doc-sections). Lists are used from one section on (setListsFrom(1)) so this
 * small collection has them. Checks: a reopened index ranks sections through the probed lists
 * exactly as the index it was saved from (paths, positions, scores), without training; the same
 * index saves to the same bytes; a format-4 file (no lists) still opens and trains as before; and a
 * file with a list that does not exist or a negative code scale is refused.
 */
import { describe, expect, it, vi } from 'vitest';
import { CorruptIndexError } from '../../../src/core/errors.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { SECTION_LAYOUT_4, align8, BYTES_PER } from '../../../src/core/index/persistence/indexFileCheck.js';
import { decodeIndex, encodeIndex, payloadOf, readIndexHeader, sealIndexFile } from '../../../src/core/index/persistence/serialize.js';
import { createWasmExecutor } from '../../../src/core/matrix/wasm/wasmExecutor.js';
import { SectionLists } from '../../../src/core/sections/sectionLists.js';
import { numbaDocs, numbaSectionIndex } from '../../helpers/numbaSections.js';
import { memorySpill } from '../../helpers/memorySpill.js';

const docs = numbaDocs();

/** The index of the pages, lists from one section on so this small collection has them. */
function build(): LsiIndex {
  return numbaSectionIndex(docs, 1);
}

/** Queries: every 25th section's own vector (Nearby at a section) and a few title projections (search). */
function queriesOf(index: LsiIndex): Float32Array[] {
  const k = index.model.k;
  const out: Float32Array[] = [];
  let n = 0;
  for (const [, f] of index.sections.entries())
    for (let i = 0; i < f.starts.length; i++) {
      if (n % 25 === 0) out.push(f.vectors.slice(i * k, (i + 1) * k));
      if (n++ % 97 === 0 && f.titles[i].trim())
        try {
          out.push(index.projectText(f.titles[i]));
        } catch {
          // a title without a known word
        }
    }
  // A query without a model word scores every section 0: only the order of the files would rank them.
  return out.filter((q) => q.some((x) => x !== 0));
}

const at = new Date('2026-01-01T00:00:00Z');

describe('saved section lists', () => {
  const index = build();
  const bytes = encodeIndex(index, at);
  const queries = queriesOf(index);

  it('are saved, and a reopened index ranks through them as the saved one does, without training', () => {
    const header = readIndexHeader(bytes);
    const len = (name: string): number => header.sections.find((s) => s.name === name)!.length;
    expect(header.formatVersion).toBe(6);
    expect(len('sectionList')).toBe(index.sections.count);
    expect(len('sectionCodes')).toBe(index.sections.count * index.model.k);
    const train = vi.spyOn(SectionLists, 'train');
    try {
      const back = decodeIndex(bytes);
      back.sections.setListsFrom(1);
      expect(queries.length).toBeGreaterThan(20);
      for (const q of queries) {
        for (const [top, perFile] of [
          [10, Infinity],
          [20, 2],
        ])
          expect(back.sections.rank(q, top, undefined, perFile)).toEqual(index.sections.rank(q, top, undefined, perFile));
      }
      expect(train).not.toHaveBeenCalled();
      // An edit after the reopen files the new sections under the saved lists, still without training.
      const d = docs[3];
      back.sections.set(d.id, index.sections.get(d.id)!);
      // (as a set: the file moved to the end of the order, which only ties see)
      const key = (h: { path: string; index: number; score: number }): string => `${h.path}#${h.index}:${h.score}`;
      for (const q of queries.slice(0, 10))
        expect(back.sections.rank(q, 10).map(key).sort()).toEqual(index.sections.rank(q, 10).map(key).sort());
      expect(train).not.toHaveBeenCalled();
    } finally {
      train.mockRestore();
    }
  });

  it('save to the same bytes from the same input and seed, and again after a reopen', () => {
    expect(Buffer.from(encodeIndex(build(), at)).equals(Buffer.from(bytes))).toBe(true);
    const back = decodeIndex(bytes);
    back.sections.setListsFrom(1);
    expect(Buffer.from(encodeIndex(back, at)).equals(Buffer.from(bytes))).toBe(true);
  });

  it('save the same bytes when rows are coded as they are filed, their codes waiting in memory or in a spill, fresh and after an edit', () => {
    const spill = memorySpill();
    // Below the spill's byte count the chains stay in memory: no spill is opened.
    expect(Buffer.from(encodeIndex(build(), at, { openSpill: spill.open })).equals(Buffer.from(bytes))).toBe(true);
    expect(spill.opened()).toBe(0);
    // From one byte on they go to the spill, which is given back once the codes are written.
    const spilled = build();
    spilled.sections.spillListsTo(spill.open, 1);
    expect(Buffer.from(encodeIndex(spilled, at)).equals(Buffer.from(bytes))).toBe(true);
    expect(spill.opened()).toBeGreaterThan(0);
    expect(spill.closes()).toBe(spill.opened());
    // A reopened index with edited files: their rows are filed and coded anew, the others' codes
    // copied from the saved listing, interleaved within each list.
    const edited = (): LsiIndex => {
      const back = decodeIndex(bytes);
      back.sections.setListsFrom(1);
      back.sections.rank(queries[0], 5); // lists filed from the saved listing
      for (const d of [docs[3], docs[10], docs[11]]) back.sections.set(d.id, index.sections.get(d.id)!);
      return back;
    };
    const plain = encodeIndex(edited(), at);
    const chained = encodeIndex(edited(), at, { openSpill: spill.open });
    expect(Buffer.from(chained).equals(Buffer.from(plain))).toBe(true);
    const viaSpill = edited();
    viaSpill.sections.spillListsTo(spill.open, 1);
    viaSpill.sections.rank(queries[0], 5);
    expect(Buffer.from(encodeIndex(viaSpill, at)).equals(Buffer.from(plain))).toBe(true);
  });

  it('are trained as before when a format-4 file is opened', () => {
    const header = readIndexHeader(bytes);
    const payload = payloadOf(bytes);
    // The format-4 file of the same index: its sections without the lists', laid out again.
    const parts: Uint8Array[] = [];
    let offset = 0;
    const sections = SECTION_LAYOUT_4.map(([name, kind]) => {
      const e = header.sections.find((s) => s.name === name)!;
      const data = payload.subarray(e.offset, e.offset + e.length * BYTES_PER[kind]);
      const entry = { name, kind, offset, length: e.length };
      const padded = new Uint8Array(align8(data.length));
      padded.set(data);
      parts.push(padded);
      offset += padded.length;
      return entry;
    });
    const old = new Uint8Array(offset);
    let p = 0;
    for (const x of parts) {
      old.set(x, p);
      p += x.length;
    }
    const v4 = decodeIndex(sealIndexFile({ ...header, formatVersion: 4, sections, payloadBytes: offset }, old));
    v4.sections.setListsFrom(1);
    // The same file of format 5 with its saved lists dropped: trained on the same rows in the same order.
    const retrained = decodeIndex(bytes);
    retrained.sections.setListsFrom(1);
    retrained.sections.configureLists({});
    const train = vi.spyOn(SectionLists, 'train');
    try {
      for (const q of queries.slice(0, 10)) expect(v4.sections.rank(q, 10)).toEqual(retrained.sections.rank(q, 10));
      expect(train).toHaveBeenCalledTimes(2);
    } finally {
      train.mockRestore();
    }
  });

  it("save the same bytes when the sections are filed on an executor (the build's threads at a save)", () => {
    const ex = createWasmExecutor();
    if (!ex) return expect(ex).toBeUndefined(); // no WebAssembly SIMD here: filed on this thread only
    const other = build();
    const filed = vi.spyOn(ex, 'fileRows');
    other.sections.fileOn(ex);
    const again = encodeIndex(other, at);
    other.sections.fileOn(undefined);
    expect(filed).toHaveBeenCalled();
    expect(Buffer.from(again).equals(Buffer.from(bytes))).toBe(true);
  });

  it('refuse a list that does not exist and a negative code scale', () => {
    const header = readIndexHeader(bytes);
    const entry = (name: string) => header.sections.find((s) => s.name === name)!;
    const lists = entry('listCentroids').length / index.model.k;
    const wrongList = payloadOf(bytes).slice();
    new DataView(wrongList.buffer).setInt32(entry('sectionList').offset + 4 * 5, lists, true);
    expect(() => decodeIndex(sealIndexFile(header, wrongList))).toThrow(CorruptIndexError);
    expect(() => decodeIndex(sealIndexFile(header, wrongList))).toThrow(/sectionList holds a list that does not exist/);
    const negative = payloadOf(bytes).slice();
    new DataView(negative.buffer).setFloat64(entry('sectionCodeParams').offset + 8 * 3, -1, true);
    expect(() => decodeIndex(sealIndexFile(header, negative))).toThrow(/sectionCodeParams hold a value out of range/);
  });
});
