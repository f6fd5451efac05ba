import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { open } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { Checksum32, checksum32 } from '../../src/core/index/persistence/checksum.js';
import {
  encodeIndex,
  payloadOf,
  readIndexHeader,
  sealIndexFile,
  sectionCodesOf,
  sectionRowsOf,
} from '../../src/core/index/persistence/serialize.js';
import { loadIndex } from '../../src/node/persist.js';
import { DamagedRowsError, TailCheck } from '../../src/node/persistCheck.js';
import { numbaDocs, numbaSectionIndex } from '../helpers/numbaSections.js';

// Real text with sections: numba-doc 0.56.4 (test/fixtures/numba-doc-sections, provenance in its README).
const index = numbaSectionIndex(numbaDocs(), 1);
const bytes = encodeIndex(index);
const header = readIndexHeader(bytes);
const start = bytes.length - header.payloadBytes;
const rowsAt = sectionRowsOf(header, start).at;
const dir = mkdtempSync(join(tmpdir(), 'undertone-persist-check-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A check of the file's rows and codes, the checksum continued from the part before them. */
async function tailOf(file: string, blockSource = readFileSync(file)) {
  const handle = await open(file, 'r');
  const h = readIndexHeader(blockSource);
  const { at, rows, k } = sectionRowsOf(h, start);
  const sum = new Checksum32().update(blockSource.subarray(start, at));
  return {
    handle,
    tail: new TailCheck(handle, file, sum, h.checksum, { rowsAt: at, rows, k, codes: sectionCodesOf(h, start), size: blockSource.length }),
  };
}

describe('TailCheck (the section rows and codes, checked after the rest of the file)', () => {
  it('passes a good file, in the background or at once, and gives the whole payload checksum', async () => {
    const file = join(dir, 'good.undertone');
    writeFileSync(file, bytes);
    // The format's own sums: the whole payload, and the part before the rows (format 6).
    expect(header.checksum).toBe(checksum32(bytes.subarray(start)));
    expect(header.headChecksum).toBe(checksum32(bytes.subarray(start, rowsAt)));
    for (const how of ['background', 'at once', 'both'] as const) {
      const { handle, tail } = await tailOf(file);
      expect(tail.state).toBe('pending');
      if (how !== 'at once') tail.start();
      if (how !== 'background') tail.ensure(); // finishes synchronously what the background has not
      expect(await tail.done).toBeUndefined();
      expect(tail.state).toBe('ok');
      await handle.close();
    }
  });

  it('finds a flipped byte anywhere after the rows start, and a row that is not of unit length', async () => {
    const file = join(dir, 'bad.undertone');
    for (const at of [rowsAt + 5, Math.floor((rowsAt + bytes.length) / 2), bytes.length - 2]) {
      const copy = bytes.slice();
      copy[start + (at - start)] ^= 0x04;
      writeFileSync(file, copy);
      const { handle, tail } = await tailOf(file, Buffer.from(bytes));
      tail.start();
      expect(await tail.done).toMatch(/checksum/);
      expect(() => tail.ensure()).toThrow(DamagedRowsError);
      await handle.close();
    }
    // A row twice its length, both checksums sealed anew: only the row's own check can see it.
    const payload = payloadOf(bytes).slice();
    const row = new Float32Array(payload.buffer, rowsAt - start + 4 * index.model.k * 3, index.model.k);
    for (let c = 0; c < row.length; c++) row[c] *= 2;
    const sealed = sealIndexFile(header, payload);
    writeFileSync(file, sealed);
    const { handle, tail } = await tailOf(file);
    tail.start();
    expect(await tail.done).toMatch(/not of unit length/);
    await handle.close();
  });
});

describe("loadIndex with a format-6 file, checkRows 'later'", () => {
  it('opens before the rows are checked, and a read of rows before the end finishes the check first', async () => {
    const file = join(dir, 'early.undertone');
    writeFileSync(file, bytes);
    const got = await loadIndex(file, { checkRows: 'later' });
    expect(got.status).toBe('ok');
    if (got.status !== 'ok') return;
    // Read at once, before the background check can have ended: the same numbers as the build's.
    for (const [path, f] of got.index.sections.entries()) expect(f.vectors).toEqual(index.sections.get(path)!.vectors);
    expect(await got.checked).toBeUndefined();
    got.index.sections.closeRows();
  });

  it('opens a format-5 file (no checksum of the first part) after checking all of it', async () => {
    const file = join(dir, 'v5.undertone');
    writeFileSync(file, sealIndexFile({ ...header, formatVersion: 5 }, payloadOf(bytes)));
    const got = await loadIndex(file, { checkRows: 'later' });
    expect(got.status).toBe('ok');
    if (got.status !== 'ok') return;
    expect(await got.checked).toBeUndefined();
    for (const [path, f] of got.index.sections.entries()) expect(f.vectors).toEqual(index.sections.get(path)!.vectors);
    got.index.sections.closeRows();
  });

  it('refuses damage before the rows at once (the first part has its own checksum)', async () => {
    const file = join(dir, 'head.undertone');
    const copy = bytes.slice();
    copy[rowsAt - 9] ^= 0x01;
    writeFileSync(file, copy);
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) });
  });

  it('tells the owner when the check after the load finds damage', async () => {
    const file = join(dir, 'late.undertone');
    const copy = bytes.slice();
    copy[bytes.length - 5] ^= 0x20;
    writeFileSync(file, copy);
    const reasons: string[] = [];
    expect(await loadIndex(file)).toMatchObject({ status: 'damaged', reason: expect.stringMatching(/checksum/) }); // checkRows 'now'
    const got = await loadIndex(file, { checkRows: 'later', onDamaged: (r) => reasons.push(r) });
    expect(got.status).toBe('ok');
    if (got.status !== 'ok') return;
    expect(await got.checked).toMatch(/checksum/);
    await new Promise((r) => setImmediate(r));
    expect(reasons).toEqual([expect.stringMatching(/late\.undertone: .*checksum/)]);
    got.index.sections.closeRows();
  });
});
