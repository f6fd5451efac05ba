/**
 * FileReader (the tokenizing threads' synchronous reader) against readIndexableText (scanRead.ts),
 * the reader the rest of the indexer uses: the same outcome for every kind of file, with the
 * text decoded by decodeUtf8 as readIndexableText decodes it.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { FileReader, type IndexableBytes } from '../../../src/node/parallel/readTextSync.js';
import { decodeUtf8, readIndexableText, type IndexableText } from '../../../src/node/scanRead.js';

const dir = mkdtempSync(join(tmpdir(), 'undertone-readsync-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

let n = 0;
function fileWith(bytes: Uint8Array | string): string {
  const p = join(dir, `f${n++}`);
  writeFileSync(p, bytes);
  return p;
}

function asText(got: IndexableBytes): IndexableText {
  return got.kind === 'bytes' ? { kind: 'text', text: decodeUtf8(got.bytes) } : got;
}

describe('FileReader', () => {
  it('gives what readIndexableText gives, file by file, with one reader reused throughout', async () => {
    const sub = join(dir, 'folder');
    mkdirSync(sub);
    const paths = [
      fileWith('plain ASCII text\n'),
      fileWith('héllo wörld — “quoted”\n'),
      fileWith(Buffer.from([0xef, 0xbb, 0xbf, 0x61, 0xef, 0xbb, 0xbf, 0x62])), // BOM: only the leading one goes
      fileWith(Buffer.from([0x61, 0xff, 0xfe, 0x62])), // invalid UTF-8 becomes U+FFFD
      fileWith(Buffer.from([0x61, 0x00, 0x62])), // NUL byte: binary
      fileWith('x'.repeat(200_000)), // bigger than the reader's first buffer
      fileWith('short after a long one'),
      fileWith(''),
      fileWith('y'.repeat(300_000)), // over the cap below
      join(dir, 'missing'),
      sub,
    ];
    const reader = new FileReader();
    for (const p of paths) {
      const want = await readIndexableText(p, 250_000);
      const got = reader.read(p, 250_000);
      expect(asText(got), p).toEqual(want);
    }
  });

  it('reports too-large over the cap and flags all-ASCII bytes', async () => {
    const reader = new FileReader();
    const big = fileWith('z'.repeat(5000));
    expect(reader.read(big, 4999)).toEqual(await readIndexableText(big, 4999));
    expect(reader.read(big, 4999).kind).toBe('too-large');
    const ascii = reader.read(fileWith('only ASCII here'), 100);
    expect(ascii.kind === 'bytes' && ascii.ascii).toBe(true);
    const other = reader.read(fileWith('não'), 100);
    expect(other.kind === 'bytes' && other.ascii).toBe(false);
  });
});
