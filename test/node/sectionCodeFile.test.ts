/**
 * The section lists' scratch file (src/node/sectionCodeFile.ts): bytes read back where they were
 * written, no name left in the folder, reads after close refused, and no spill (null) where the
 * folder takes no new file. Plain bytes: the file stores what it is given (the rankings it serves
 * are checked against in-memory codes in test/core/sections/sectionStore.test.ts and, through a
 * saved index, test/node/sectionRowFile.test.ts).
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { SectionRowsClosedError, SectionRowsError } from '../../src/core/sections/sectionRows.js';
import { FileSpill, openSpillBeside } from '../../src/node/sectionCodeFile.js';

const folder = mkdtempSync(join(tmpdir(), 'undertone-spill-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('FileSpill', () => {
  it('reads back what was written, in any order, and leaves no name behind', () => {
    const spill = new FileSpill(folder);
    expect(readdirSync(folder)).toEqual([]);
    const a = Uint8Array.from({ length: 5000 }, (_, i) => (i * 7) % 251);
    const b = Uint8Array.from({ length: 300 }, (_, i) => 255 - i);
    spill.write(b, 10_000);
    spill.write(a, 0);
    const got = new Uint8Array(300);
    spill.read(got, 10_000);
    expect(got).toEqual(b);
    const part = new Uint8Array(1000);
    spill.read(part, 4000);
    expect(part).toEqual(a.subarray(4000, 5000));
    // Past the end: an error that says so, not zeros.
    expect(() => spill.read(new Uint8Array(10), 10_295)).toThrow(SectionRowsError);
    spill.close();
    spill.close();
    expect(() => spill.read(got, 0)).toThrow(SectionRowsClosedError);
    expect(() => spill.write(got, 0)).toThrow(SectionRowsClosedError);
  });

  it('gives no spill where the folder takes no new file', () => {
    expect(openSpillBeside(join(folder, 'missing', 'deeper'))()).toBeNull();
    const spill = openSpillBeside(folder)();
    expect(spill).toBeInstanceOf(FileSpill);
    spill!.close();
  });
});
