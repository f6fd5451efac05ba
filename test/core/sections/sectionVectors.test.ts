/**
 * Section vectors: folded with the frozen model, saved in the index file and kept current when a
 * file is folded in after an edit. Files: TypeScript sources of rxjs 7.8.2 (npm, Apache-2.0;
 * test/fixtures/rxjs-src, comments blanked). Tolerances: f32 storage (2^-24 relative per number,
 * summed over k terms), common practice.
 */
import { describe, expect, it } from 'vitest';
import { CancelledError, CorruptIndexError } from '../../../src/core/errors.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { decodeIndex, encodeIndex, readIndexHeader, sealIndexFile, payloadOf } from '../../../src/core/index/persistence/serialize.js';
import { serialExecutor } from '../../../src/core/matrix/executor.js';
import {
  foldContextOf,
  foldCountedSections,
  wholeTermVectorsFor,
  foldSections,
  FOLD_CHUNK_SECTIONS,
  type CountedSections,
} from '../../../src/core/sections/sectionVectors.js';
import { SectionRowsClosedError } from '../../../src/core/sections/sectionRows.js';
import { SectionStore } from '../../../src/core/sections/sectionStore.js';
import { memorySpill } from '../../helpers/memorySpill.js';
import { countSections } from '../../helpers/countedSections.js';
import { loadRankingFixture } from '../../helpers/rankingChecks.js';

const fx = loadRankingFixture('rxjs-src');
const docs = [...fx.docs.slice(0, 120), ...fx.docs.filter((d) => d.id === 'internal/Subject.ts')];

function buildWithSections(): LsiIndex {
  const b = new IndexBuilder();
  for (const d of docs) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = b.build();
  const ctx = foldContextOf(index);
  for (const d of docs) index.sections.set(d.id, foldSections(ctx, d.id, d.text));
  return index;
}

/**
 * Each file's section counts in one pair of arrays, as the tokenizing threads give them; all
 * files share one pair here (offsets are absolute), as the files of one thread do.
 */
function countedOf(index: LsiIndex): CountedSections[] {
  const ctx = foldContextOf(index);
  return countSections(
    docs.map((d) => ({ path: d.id, text: d.text })),
    ctx.vocab,
    { grow: false, tokenize: ctx.tokenize },
  );
}

function maxDiff(a: Float32Array, b: Float32Array): number {
  expect(a.length).toBe(b.length);
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

describe('section vectors', () => {
  it('a file that is one section gets the vector the build gave the file', () => {
    const index = buildWithSections();
    const ctx = foldContextOf(index);
    let checked = 0;
    for (const d of docs) {
      // As a plain-text file (one window when short), the single section is the whole text.
      const one = foldSections(ctx, `${d.id}.log`, d.text, { windowLines: 10_000 });
      if (one.starts.length !== 1) continue;
      expect(maxDiff(one.vectors, index.vectorOf(d.id))).toBeLessThan(1e-5);
      checked++;
    }
    expect(checked).toBeGreaterThan(100);
  });

  it('fold-in on edit gives the sections a fresh pass over the saved index gives, and leaves other sections alone', () => {
    const index = buildWithSections();
    const target = docs.at(-1)!; // internal/Subject.ts: the class Subject and its methods, then AnonymousSubject
    const before = index.sections.get(target.id)!;
    const lines = target.text.split('\n');
    // Edit the body of the last section: a statement with known words before its closing line.
    const at = before.ends.at(-1)! - 1;
    const edited = [
      ...lines.slice(0, at),
      '    this._throwIfClosed(); this.thrownError = err; this.hasError = true;',
      ...lines.slice(at),
    ].join('\n');
    const saved = encodeIndex(index);
    index.foldIn({ path: target.id, size: edited.length, mtimeMs: 1 }, edited);
    const after = index.sections.get(target.id)!;
    // A fresh process: reopen the saved index (before the edit) and fold the edited file's sections.
    const reopened = decodeIndex(saved);
    const fresh = foldSections(foldContextOf(reopened), target.id, edited);
    expect(Array.from(after.starts)).toEqual(Array.from(fresh.starts));
    expect(Array.from(after.starts)).toEqual(Array.from(before.starts));
    expect(maxDiff(after.vectors, fresh.vectors)).toBeLessThan(1e-6);
    // Sections before the edited one keep their vectors.
    const k = index.k;
    const same = before.starts.length - 1;
    expect(maxDiff(after.vectors.subarray(0, same * k), before.vectors.subarray(0, same * k))).toBeLessThan(1e-7);
    expect(maxDiff(after.vectors.subarray(same * k), before.vectors.subarray(same * k))).toBeGreaterThan(1e-4);
  });

  it('folds counted sections of many files at once as projectTerms folds each (serial and WebAssembly products)', () => {
    const index = buildWithSections();
    const counted = countedOf(index);
    const total = counted.reduce((n, c) => n + c.starts.length, 0);
    expect(total).toBeGreaterThan(300);
    expect(counted.some((c) => c.starts.length === 0)).toBe(false);
    // Products of the default size, and of 37 sections (chunks end inside files); U_k in f64
    // column blocks of 3 (the last one narrower unless 3 divides k), in one f64 block, or whole
    // in f32 where it lies (the plain executor always reads the model's own array).
    const threeColumns = 8 * index.model.weights.length * 3;
    const byRun: Float32Array[][] = [];
    for (const [executor, chunkSections, blockBytes, wholeTermVectors] of [
      [serialExecutor, FOLD_CHUNK_SECTIONS, undefined, undefined],
      [undefined, FOLD_CHUNK_SECTIONS, undefined, false],
      [undefined, 37, undefined, false],
      // Many chunks over a split U_k: each chunk gathers its column blocks again.
      [undefined, 37, threeColumns, false],
      [serialExecutor, 37, threeColumns, undefined],
      // U_k copied whole into the executor's memory as f32 (spmm_x32).
      [undefined, 37, threeColumns, true],
      [undefined, FOLD_CHUNK_SECTIONS, undefined, true],
    ] as const) {
      const folded = foldCountedSections(index.model, counted, { executor, chunkSections, blockBytes, wholeTermVectors });
      docs.forEach((d, i) => {
        const want = index.sections.get(d.id)!;
        expect(folded[i].titles).toEqual(want.titles);
        expect(Array.from(folded[i].starts)).toEqual(Array.from(want.starts));
        expect(maxDiff(folded[i].vectors, want.vectors)).toBeLessThanOrEqual(1e-6);
      });
      byRun.push(folded.map((f) => f.vectors));
    }
    expect(index.model.k % 3).not.toBe(0);
    // Column blocks, f32 reads and chunk sizes change no arithmetic: the same bits every way.
    for (let r = 1; r < byRun.length; r++) expect(byRun[r]).toEqual(byRun[0]);
  });

  it('gives the executor one f32 copy of U_k when the sections outnumber the terms (wholeTermVectorsFor)', () => {
    expect(wholeTermVectorsFor(1_329_882, 100_000)).toBe(true);
    expect(wholeTermVectorsFor(36_567, 51_651)).toBe(false);
  });

  it('reads the counts of files whose own arrays are empty from termsOf, a file at a time: the same bits', () => {
    const index = buildWithSections();
    const counted = countedOf(index);
    const inMemory = foldCountedSections(index.model, counted, { executor: serialExecutor, chunkSections: 37 });
    // Every other file's counts kept elsewhere (here: the shared arrays, handed over as a copy of
    // the file's own stretch, in one buffer reused from file to file).
    const empty = counted.map((c, i) => (i % 2 === 0 ? { ...c, termIds: new Int32Array(0), counts: new Float32Array(0) } : c));
    const buffer = { ids: new Int32Array(1 << 16), counts: new Float32Array(1 << 16) };
    const asked: number[] = [];
    const termsOf = (i: number) => {
      asked.push(i);
      if (i % 2 !== 0) return undefined;
      const c = counted[i];
      const [a, b] = [c.offsets[0], c.offsets[c.offsets.length - 1]];
      buffer.ids.set(c.termIds.subarray(a, b));
      buffer.counts.set(c.counts.subarray(a, b));
      return { termIds: buffer.ids.subarray(0, b - a), counts: buffer.counts.subarray(0, b - a), first: a };
    };
    const read = foldCountedSections(index.model, empty, { executor: serialExecutor, chunkSections: 37, termsOf });
    expect(asked).toEqual(counted.map((_, i) => i)); // once a file, in order
    expect(read.map((f) => f.vectors)).toEqual(inMemory.map((f) => f.vectors));
    // Empty arrays and nothing to read them from: refused, not folded as empty sections.
    expect(() => foldCountedSections(index.model, empty, { executor: serialExecutor })).toThrow('section counts missing');
  });

  it('writes the rows to a spill from the threshold on: the same bits, read back as stored rows; the spill given back on a cancel', () => {
    const index = buildWithSections();
    const counted = countedOf(index);
    // A spill held in a growing array (the node side is a scratch file, sectionCodeFile.ts).
    const { open, opened, closes: closed } = memorySpill();
    const inMemory = foldCountedSections(index.model, counted, { executor: serialExecutor, chunkSections: 37 });
    const rows = counted.reduce((n, c) => n + c.starts.length, 0);
    const bytes = 4 * rows * index.k;
    // Below the threshold: no spill is opened.
    const below = foldCountedSections(index.model, counted, {
      executor: serialExecutor,
      chunkSections: 37,
      spill: open,
      spillFromBytes: bytes + 1,
    });
    expect(opened()).toBe(0);
    expect(below.every((f) => f.stored === undefined)).toBe(true);
    // At it: every file's rows in the spill, in file order, the same bits as in memory.
    const spilled = foldCountedSections(index.model, counted, {
      executor: serialExecutor,
      chunkSections: 37,
      spill: open,
      spillFromBytes: bytes,
    });
    expect(opened()).toBe(1);
    let first = 0;
    spilled.forEach((f, i) => {
      expect(f.stored?.first).toBe(first);
      expect(f.stored?.reader).toBe(spilled[0].stored?.reader);
      first += f.starts.length;
      expect(f.vectors).toEqual(inMemory[i].vectors);
      expect(f.titles).toEqual(inMemory[i].titles);
    });
    expect(spilled[0].stored!.reader.rows).toBe(rows);
    // A store reads them as a reopened index's rows, and closing its rows gives the spill back.
    const store = new SectionStore(index.k);
    docs.forEach((d, i) => store.set(d.id, spilled[i]));
    expect(store.get(docs[3].id)!.vectors).toEqual(inMemory[3].vectors);
    store.closeRows();
    expect(closed()).toBe(1);
    expect(() => spilled[0].vectors).toThrow(SectionRowsClosedError);
    // Cancelled after the first chunk: the spill is closed before the error leaves.
    let polls = 0;
    const signal = {
      get aborted() {
        return ++polls > 1;
      },
    };
    expect(() =>
      foldCountedSections(index.model, counted, { executor: serialExecutor, chunkSections: 37, spill: open, spillFromBytes: 0, signal }),
    ).toThrow(CancelledError);
    expect(opened()).toBe(2);
    expect(closed()).toBe(2);
    // No spill to be had: the rows stay in memory.
    const none = foldCountedSections(index.model, counted, {
      executor: serialExecutor,
      chunkSections: 37,
      spill: () => null,
      spillFromBytes: 0,
    });
    expect(none.every((f) => f.stored === undefined)).toBe(true);
    expect(none.map((f) => f.vectors)).toEqual(inMemory.map((f) => f.vectors));
  });

  it('saves and reopens every section exactly; removing a file drops its sections', () => {
    const index = buildWithSections();
    const back = decodeIndex(encodeIndex(index));
    expect(back.sections.count).toBe(index.sections.count);
    for (const d of docs) {
      const a = index.sections.get(d.id)!;
      const b = back.sections.get(d.id)!;
      expect(b.titles).toEqual(a.titles);
      expect(Array.from(b.starts)).toEqual(Array.from(a.starts));
      expect(Array.from(b.ends)).toEqual(Array.from(a.ends));
      expect(maxDiff(a.vectors, b.vectors)).toBe(0);
    }
    const gone = docs[0].id;
    const n = back.sections.get(gone)!.starts.length;
    back.remove(gone);
    expect(back.sections.get(gone)).toBeUndefined();
    expect(back.sections.count).toBe(index.sections.count - n);
  });

  it('refuses a file of the format before sections (it is rebuilt, never read)', () => {
    const bytes = encodeIndex(buildWithSections());
    const header = readIndexHeader(bytes);
    const kept = header.sections.filter((s) => !s.name.startsWith('section'));
    const last = kept.at(-1)!;
    const end = Math.ceil((last.offset + last.length * 4) / 8) * 8;
    const old = sealIndexFile({ ...header, formatVersion: 3, sections: kept, payloadBytes: end }, payloadOf(bytes).slice(0, end));
    expect(() => decodeIndex(old)).toThrow(CorruptIndexError);
    expect(() => decodeIndex(old)).toThrow(/format 3 is not the current format 6/);
  });

  it('refuses a saved section vector that is not of unit length', () => {
    const bytes = encodeIndex(buildWithSections());
    const header = readIndexHeader(bytes);
    const e = header.sections.find((s) => s.name === 'sectionVectors')!;
    const payload = payloadOf(bytes).slice();
    new Float32Array(payload.buffer, e.offset, e.length)[0] += 0.5;
    expect(() => decodeIndex(sealIndexFile(header, payload))).toThrow(/section vector is not of unit length/);
  });
});
