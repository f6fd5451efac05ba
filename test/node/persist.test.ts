import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { IndexBuilder } from '../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { encodeIndex, payloadOf, readIndexHeader, sealIndexFile } from '../../src/core/index/persistence/serialize.js';
import { SectionLists } from '../../src/core/sections/sectionLists.js';
import { DamagedRowsError } from '../../src/node/persistCheck.js';
import { loadIndex, readSavedSettings, removeStaleTemporaries, SaveError, saveIndex, trySaveIndex } from '../../src/node/persist.js';
import { numbaDocs, numbaSectionIndex } from '../helpers/numbaSections.js';
import { loadCollection } from '../helpers/shared.js';

// Real text: the ADI collection (test/fixtures/corpora/adi); the reference is the index that was saved.
const adi = loadCollection('adi');
const dir = mkdtempSync(join(tmpdir(), 'undertone-persist-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function buildAdi(): LsiIndex {
  const b = new IndexBuilder();
  for (const d of adi.docs) b.addText({ path: `adi/${d.id}.txt`, size: d.text.length, mtimeMs: 1000 + Number(d.id) }, d.text);
  return b.build();
}

function answers(index: LsiIndex) {
  return {
    search: adi.queries.slice(0, 20).map((q) => index.search(q.text, { top: 10 })),
    nearby: index.paths().map((p) => index.nearby(p, { top: 5 })),
    ids: index.vocab.terms.map((t) => index.vocab.idOf(t)),
  };
}

async function reopen(path: string, readChunkBytes?: number): Promise<LsiIndex> {
  const got = await loadIndex(path, { readChunkBytes });
  if (got.status !== 'ok') throw new Error(`expected a loadable index, got ${got.status}`);
  return got.index;
}

describe('persist', () => {
  it('reopens a saved index with the same answers, also after a fold-in and a second save', async () => {
    const index = buildAdi();
    const file = join(dir, 'a.undertone');
    const written = await saveIndex(file, index);
    expect(written).toBe(readFileSync(file).length);
    const copy = await reopen(file);
    expect(answers(copy)).toEqual(answers(index));
    const text = 'a thesaurus for qqnewterm retrieval';
    index.foldIn({ path: 'extra/t.md', size: text.length, mtimeMs: 3 }, text);
    copy.foldIn({ path: 'extra/t.md', size: text.length, mtimeMs: 3 }, text);
    expect(answers(copy)).toEqual(answers(index));
    await saveIndex(file, copy);
    expect(answers(await reopen(file))).toEqual(answers(index));
  });

  it('streams the same bytes as encoding the whole file at once, whatever the write chunk or thread', async () => {
    const index = buildAdi();
    // Folded-in Markdown files bring sections (the build of a folder adds them in src/node).
    for (const d of adi.docs.slice(0, 9)) {
      const text = `# Part ${d.id}\n\n${d.text}\n\n## More\n\n${adi.docs[40].text}\n`;
      index.foldIn({ path: `md/${d.id}.md`, size: text.length, mtimeMs: 1 }, text);
    }
    expect(index.sections.count).toBeGreaterThanOrEqual(9);
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-01-02T03:04:05Z') });
    try {
      const whole = encodeIndex(index, new Date());
      for (const chunk of [1, 7, 4096, 1 << 20]) {
        const file = join(dir, `chunk-${chunk}.undertone`);
        expect(await saveIndex(file, index, chunk)).toBe(whole.length);
        expect(Buffer.compare(readFileSync(file), whole)).toBe(0);
      }
      // Written by a thread of its own (payloads from BACKGROUND_WRITE_FROM on; here from 0 bytes).
      const threaded = join(dir, 'threaded.undertone');
      expect(await saveIndex(threaded, index, undefined, undefined, 0)).toBe(whole.length);
      expect(Buffer.compare(readFileSync(threaded), whole)).toBe(0);
    } finally {
      vi.useRealTimers();
    }
    expect(answers(await reopen(join(dir, 'chunk-7.undertone')))).toEqual(answers(index));
  });

  it('reads the same index whatever the read size, and still finds damage near the end', async () => {
    const index = buildAdi();
    const file = join(dir, 'c.undertone');
    await saveIndex(file, index);
    const whole = answers(index);
    for (const chunk of [7, 4096, 65_536]) expect(answers(await reopen(file, chunk))).toEqual(whole);
    const flipped = readFileSync(file);
    flipped[flipped.length - 3] ^= 0x02;
    writeFileSync(file, flipped);
    expect(await loadIndex(file, { readChunkBytes: 4096 })).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
  });

  it('reports a missing file as missing and a damaged, truncated or older file as damaged', async () => {
    expect(await loadIndex(join(dir, 'none.undertone'))).toEqual({ status: 'missing' });
    const file = join(dir, 'b.undertone');
    await saveIndex(file, buildAdi());
    const good = readFileSync(file);
    const flipped = Buffer.from(good);
    flipped[flipped.length - 1000] ^= 0x10;
    writeFileSync(file, flipped);
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
    writeFileSync(file, good.subarray(0, good.length - 4));
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/truncated/) });
    const older = Buffer.from(good);
    older.write('{"formatVersion":2,', 12); // a format-2 file had its JSON at byte 12
    writeFileSync(file, older);
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/older format/) });
    expect(await loadIndex(dir)).toMatchObject({ status: 'damaged' });
  });

  it('refuses NaN or an infinity in the saved counts, term vectors or file vectors even with good checksums', async () => {
    const bytes = encodeIndex(buildAdi());
    const header = readIndexHeader(bytes);
    const file = join(dir, 'non-finite.undertone');
    // IEEE 754 binary32 patterns: a quiet NaN, a NaN with payload and sign, +Infinity, -Infinity.
    const patterns = [0x7fc00000, 0xffc00001, 0x7f800000, 0xff800000];
    const cases: [string, RegExp][] = [
      ['termCounts', /termCounts holds a value out of range/],
      ['termVectors', /termVectors holds a value out of range/],
      ['vectors', /not of unit length/], // read straight into the ranking rows, checked there
    ];
    for (const [name, reason] of cases)
      for (const bits of patterns) {
        const payload = payloadOf(bytes).slice();
        const e = header.sections.find((s) => s.name === name)!;
        new DataView(payload.buffer).setUint32(e.offset + 4 * Math.floor(e.length / 3), bits, true);
        writeFileSync(file, sealIndexFile(header, payload));
        for (const options of [{}, { checkRows: 'later' as const }, { sectionRows: 'memory' as const }])
          expect(await loadIndex(file, options), `${name} ${bits.toString(16)}`).toEqual({
            status: 'damaged',
            reason: expect.stringMatching(reason),
          });
      }
  });

  it('checks the term lists as it streams them past (any read size) and refuses bad ones even with good checksums', async () => {
    const index = buildAdi();
    const bytes = encodeIndex(index);
    const header = readIndexHeader(bytes);
    const file = join(dir, 'term-lists.undertone');
    const ids = header.sections.find((s) => s.name === 'termIds')!;
    const counts = header.sections.find((s) => s.name === 'termCounts')!;
    const ip = header.sections.find((s) => s.name === 'termIndptr')!;
    const at = Math.floor(ids.length / 2);
    const damaged = (edit: (view: DataView) => void): Uint8Array => {
      const payload = payloadOf(bytes).slice();
      edit(new DataView(payload.buffer));
      return sealIndexFile(header, payload);
    };
    // A document's second id set to its first (a first id of 0 can only be pushed past the vocabulary).
    const indptr = new Int32Array(payloadOf(bytes).slice(ip.offset, ip.offset + 4 * ip.length).buffer);
    const doc = indptr.findIndex((a, j) => j < ip.length - 1 && indptr[j + 1] - a >= 2 && a >= at);
    const first = new DataView(payloadOf(bytes).slice().buffer).getInt32(ids.offset + 4 * indptr[doc], true);
    const cases: [string, Uint8Array, RegExp][] = [
      ['repeated id', damaged((v) => v.setInt32(ids.offset + 4 * (indptr[doc] + 1), first, true)), /term id out of order/],
      ['id past the vocabulary', damaged((v) => v.setInt32(ids.offset + 4 * at, index.vocab.size, true)), /term id/],
      ['negative id', damaged((v) => v.setInt32(ids.offset, -1, true)), /term id/],
      ['zero count', damaged((v) => v.setFloat32(counts.offset + 4 * at, 0, true)), /termCounts holds a value out of range/],
      ['last count NaN', damaged((v) => v.setUint32(counts.offset + 4 * (counts.length - 1), 0x7fc00000, true)), /termCounts/],
    ];
    for (const [what, damagedFile, reason] of cases) {
      writeFileSync(file, damagedFile);
      for (const options of [
        { readChunkBytes: 8 },
        { readChunkBytes: 4096 },
        { checkRows: 'later' as const },
        { sectionRows: 'memory' as const },
      ])
        expect(await loadIndex(file, options), `${what} ${JSON.stringify(options)}`).toEqual({
          status: 'damaged',
          reason: expect.stringMatching(reason),
        });
    }
    // A flipped bit in the lists fails the checksum (they are summed as they stream past).
    const flipped = Buffer.from(bytes);
    flipped[bytes.length - payloadOf(bytes).length + counts.offset + 4 * at + 1] ^= 0x04;
    writeFileSync(file, flipped);
    expect(await loadIndex(file, { checkRows: 'later' })).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
    // The good file reopens with the same answers at any read size (the lists filled after the load).
    writeFileSync(file, bytes);
    for (const chunk of [8, 4096, undefined]) expect(answers(await reopen(file, chunk))).toEqual(answers(index));
  });

  it('checks the term vectors as it streams them past (any read size) and fills them after the load as a whole read has them', async () => {
    const index = buildAdi();
    const bytes = encodeIndex(index);
    const header = readIndexHeader(bytes);
    const file = join(dir, 'term-vectors.undertone');
    const e = header.sections.find((s) => s.name === 'termVectors')!;
    // A NaN (IEEE 754 binary32 0x7fc00000) as the first, a middle and the last value, sealed with good checksums.
    for (const at of [0, Math.floor(e.length / 2), e.length - 1]) {
      const payload = payloadOf(bytes).slice();
      new DataView(payload.buffer).setUint32(e.offset + 4 * at, 0x7fc00000, true);
      writeFileSync(file, sealIndexFile(header, payload));
      for (const options of [
        { readChunkBytes: 8 },
        { readChunkBytes: 4096 },
        {},
        { checkRows: 'later' as const },
        { sectionRows: 'memory' as const },
      ])
        expect(await loadIndex(file, options), `${at} ${JSON.stringify(options)}`).toEqual({
          status: 'damaged',
          reason: expect.stringMatching(/termVectors holds a value out of range/),
        });
    }
    // A flipped bit in them fails the checksum (they are summed as they stream past).
    const flipped = Buffer.from(bytes);
    flipped[bytes.length - payloadOf(bytes).length + e.offset + 4 * Math.floor(e.length / 3) + 2] ^= 0x10;
    writeFileSync(file, flipped);
    for (const options of [{ checkRows: 'later' as const }, { sectionRows: 'memory' as const }])
      expect(await loadIndex(file, options)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
    // The good file: the term vectors read at once (before the fill ends) or after it, at any read
    // size, equal the saved model's and a whole read's (memory mode); the answers are the same.
    writeFileSync(file, bytes);
    const whole = await loadIndex(file, { sectionRows: 'memory' });
    if (whole.status !== 'ok') throw new Error('expected a loadable index');
    expect(whole.index.model.termVectors).toEqual(index.model.termVectors);
    for (const chunk of [8, 4096, undefined]) {
      const now = await loadIndex(file, { readChunkBytes: chunk });
      const later = await loadIndex(file, { readChunkBytes: chunk });
      if (now.status !== 'ok' || later.status !== 'ok') throw new Error('expected a loadable index');
      expect(now.index.model.termVectors).toEqual(whole.index.model.termVectors);
      await later.termsFilled;
      expect(later.index.model.termVectors).toEqual(whole.index.model.termVectors);
      expect({ ...later.index.model }).toEqual({ ...whole.index.model });
      expect(answers(now.index)).toEqual(answers(index));
      now.index.sections.closeRows();
      later.index.sections.closeRows();
    }
  });

  it('reports a vocabulary byte that is not UTF-8 as damage, however the file is read', async () => {
    const bytes = encodeIndex(buildAdi());
    const header = readIndexHeader(bytes);
    const payload = payloadOf(bytes).slice();
    const e = header.sections.find((s) => s.name === 'vocab')!;
    payload[e.offset + Math.floor(e.length / 2)] = 0xff; // never in UTF-8 (Unicode Standard, Table 3-7)
    const file = join(dir, 'vocab-utf8.undertone');
    writeFileSync(file, sealIndexFile(header, payload));
    for (const options of [{}, { checkRows: 'later' as const }, { sectionRows: 'memory' as const }])
      expect(await loadIndex(file, options)).toEqual({ status: 'damaged', reason: expect.stringMatching(/vocabulary is not valid UTF-8/) });
  });

  it('reports a folder, a FIFO or a device at the index path without blocking or reading it', async () => {
    const sub = join(dir, 'occupied');
    mkdirSync(join(sub, 'index.undertone'), { recursive: true });
    expect(await loadIndex(join(sub, 'index.undertone'))).toMatchObject({
      status: 'damaged',
      reason: expect.stringMatching(/is a folder/),
    });
    const fifo = join(dir, 'fifo.undertone');
    execFileSync('mkfifo', [fifo]);
    // Before the fix this never resolved (open waited for a writer).
    expect(await loadIndex(fifo)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/not a regular file/) });
    expect(await readSavedSettings(fifo)).toBeUndefined();
    expect(await loadIndex('/dev/zero')).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/not a regular file/) });
  });

  it('checks the header and the size before reading: 1.5 GB of junk or padding costs one small read', async () => {
    const junk = join(dir, 'junk.undertone');
    writeFileSync(junk, 'not an index at all, just text');
    truncateSync(junk, 1.5 * 1024 ** 3); // sparse: no disk space used
    const before = process.memoryUsage().arrayBuffers;
    expect(await loadIndex(junk)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/magic/) });
    expect(process.memoryUsage().arrayBuffers - before).toBeLessThan(64 * 1024 ** 2);
    const padded = join(dir, 'padded.undertone');
    await saveIndex(padded, buildAdi());
    const size = readFileSync(padded).length;
    truncateSync(padded, size + 1024 ** 3);
    const before2 = process.memoryUsage().arrayBuffers;
    expect(await loadIndex(padded)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(new RegExp(`expected ${size}`)) });
    expect(process.memoryUsage().arrayBuffers - before2).toBeLessThan(64 * 1024 ** 2);
    rmSync(junk);
    rmSync(padded);
  });

  it('says why a save failed, naming the path, and keeps going when asked to try', async () => {
    const sub = join(dir, 'blocked');
    mkdirSync(join(sub, 'index.undertone'), { recursive: true });
    await expect(saveIndex(join(sub, 'index.undertone'), buildAdi())).rejects.toThrow(SaveError);
    await expect(saveIndex(join(sub, 'index.undertone'), buildAdi())).rejects.toThrow(
      /blocked\/index\.undertone: a folder of that name is in the way/,
    );
    writeFileSync(join(dir, 'plainfile'), 'x');
    expect(await trySaveIndex(join(dir, 'plainfile', 'cache', 'index.undertone'), buildAdi())).toMatch(
      /plainfile\/cache\/index\.undertone: \S+plainfile is a file, not a folder/,
    );
    expect(readdirSync(sub)).toEqual(['index.undertone']); // no temporary file left behind
  });

  it('removes temporary files of dead processes (killed before the rename), not those of live ones', async () => {
    const sub = join(dir, 'temps');
    mkdirSync(sub);
    const file = join(sub, 'index.undertone');
    const gone = spawnSync(process.execPath, ['-e', '0']).pid!; // a process id that has ended
    const dead = `index.undertone.${gone}.0badc0de.tmp`;
    const live = `index.undertone.${process.pid}.12345678.tmp`;
    const other = `other.undertone.${gone}.0badc0de.tmp`;
    for (const n of [dead, live, other]) writeFileSync(join(sub, n), Buffer.alloc(1000));
    expect(await removeStaleTemporaries(file)).toEqual([dead]);
    writeFileSync(join(sub, dead), Buffer.alloc(10));
    await saveIndex(file, buildAdi());
    expect(existsSync(join(sub, dead))).toBe(false);
    expect(readdirSync(sub).sort()).toEqual(['index.undertone', live, other].sort());
    writeFileSync(join(sub, dead), Buffer.alloc(10));
    expect((await loadIndex(file)).status).toBe('ok');
    expect(existsSync(join(sub, dead))).toBe(false);
    expect(await readSavedSettings(file)).toMatchObject({ weighting: 'log-entropy', k: 'auto' });
  });
});

// Real text with sections: numba-doc 0.56.4 (Debian, BSD-2-Clause; test/fixtures/numba-doc-sections),
// lists from one section on so this small collection has them; the reference is the index saved.
describe('persist: the saved section lists (format 5)', () => {
  const numba = numbaDocs();
  const build = (): LsiIndex => numbaSectionIndex(numba, 1);
  const index = build();
  const k = index.model.k;
  const queries: Float32Array[] = [];
  let n = 0;
  for (const [, f] of index.sections.entries())
    for (let i = 0; i < f.starts.length; i++)
      if (n++ % 20 === 0 && f.vectors.subarray(i * k, (i + 1) * k).some((x) => x !== 0)) queries.push(f.vectors.slice(i * k, (i + 1) * k));

  it('reads the saved codes where they lie in the file: no training, no scratch file, the same rankings', async () => {
    const file = join(dir, 'lists.undertone');
    await saveIndex(file, index);
    const train = vi.spyOn(SectionLists, 'train');
    try {
      const back = await reopen(file);
      back.sections.setListsFrom(1);
      // Codes of any size stay in the file; filing them anew would open a scratch spill, which throws here.
      back.sections.spillListsTo(() => {
        throw new Error('a scratch spill was opened');
      }, 0);
      expect(queries.length).toBeGreaterThan(20);
      // prepare() sets the saved listing up (so the first section search or edit does not wait for it).
      expect(back.sections.savedListingPending).toBe(true);
      await back.prepare({ sliceMs: 1000, pause: async () => undefined });
      expect(back.sections.savedListingPending).toBe(false);
      for (const q of queries) expect(back.sections.rank(q, 10, undefined, 2)).toEqual(index.sections.rank(q, 10, undefined, 2));
      expect(train).not.toHaveBeenCalled();
      // Saved again from the file (codes copied from it, not coded again): the same payload.
      const again = join(dir, 'lists-again.undertone');
      await saveIndex(again, back);
      expect(Buffer.from(payloadOf(readFileSync(again))).equals(Buffer.from(payloadOf(readFileSync(file))))).toBe(true);
      back.sections.closeRows();
    } finally {
      train.mockRestore();
    }
  });

  it('finds damage in the codes and their params (checksum), and refuses a negative scale even with a good checksum', async () => {
    const bytes = encodeIndex(index);
    const header = readIndexHeader(bytes);
    const start = bytes.length - header.payloadBytes;
    const codes = header.sections.find((s) => s.name === 'sectionCodes')!;
    const params = header.sections.find((s) => s.name === 'sectionCodeParams')!;
    const file = join(dir, 'damaged-lists.undertone');
    // Format 6 opens at once and checks the rows and codes afterwards: the check says why it
    // failed, and every read of a row or a code throws from then on.
    const damagedLater = async (reason: RegExp): Promise<void> => {
      // By default the same damage is found before the index is returned.
      expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(reason) });
      const got = await loadIndex(file, { checkRows: 'later' });
      expect(got.status).toBe('ok');
      if (got.status !== 'ok') return;
      expect(await got.checked).toMatch(reason);
      const [, f] = got.index.sections.entries().next().value!;
      expect(() => f.vectors).toThrow(DamagedRowsError);
      got.index.sections.closeRows();
    };
    for (const at of [start + codes.offset + 7, start + params.offset + 8 * params.length - 3]) {
      const copy = bytes.slice();
      copy[at] ^= 0x10;
      writeFileSync(file, copy);
      await damagedLater(/checksum/);
      // A format-5 file (no checksum of its own for the first part) is refused at once.
      const v5 = sealIndexFile({ ...header, formatVersion: 5 }, payloadOf(bytes));
      v5[at - start + (v5.length - header.payloadBytes)] ^= 0x10;
      writeFileSync(file, v5);
      expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
    }
    const payload = payloadOf(bytes).slice();
    new DataView(payload.buffer).setFloat64(params.offset + 8, -0.5, true);
    writeFileSync(file, sealIndexFile(header, payload));
    await damagedLater(/sectionCodeParams hold a value out of range/);
    writeFileSync(file, sealIndexFile({ ...header, formatVersion: 5 }, payload));
    const got = await loadIndex(file);
    expect(got.status).toBe('damaged');
    if (got.status === 'damaged') expect(got.reason).toMatch(/sectionCodeParams hold a value out of range/);
  });
});
