import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../src/core/errors.js';
import { BINARY_SNIFF_BYTES, decodeUtf8, looksBinary, readIndexableText } from '../../src/node/scanRead.js';

const dir = mkdtempSync(join(tmpdir(), 'undertone-read-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

let n = 0;
function fileWith(bytes: Uint8Array | string): string {
  const p = join(dir, `f${n++}`);
  writeFileSync(p, bytes);
  return p;
}

const CAP = 1_048_576;

let hasMkfifo = process.platform !== 'win32';
try {
  if (hasMkfifo) execFileSync('sh', ['-c', 'command -v mkfifo'], { stdio: 'ignore' });
} catch {
  hasMkfifo = false;
}

describe('readIndexableText', () => {
  it('returns the text of a UTF-8 file', async () => {
    expect(await readIndexableText(fileWith('héllo wörld\n'), CAP)).toEqual({ kind: 'text', text: 'héllo wörld\n' });
  });

  it('returns empty text for an empty file', async () => {
    expect(await readIndexableText(fileWith(''), CAP)).toEqual({ kind: 'text', text: '' });
  });

  it('drops a leading UTF-8 byte order mark but keeps one in the middle', async () => {
    // The BOM is EF BB BF (Unicode Standard, ch. 23.8); only a leading one is a signature.
    const bytes = Buffer.from([0xef, 0xbb, 0xbf, 0x61, 0xef, 0xbb, 0xbf, 0x62]);
    expect(await readIndexableText(fileWith(bytes), CAP)).toEqual({ kind: 'text', text: 'a\uFEFFb' });
  });

  it('replaces each maximal invalid UTF-8 subpart with U+FFFD', async () => {
    // Unicode Standard ch. 3.9, Table 3-8 "Use of U+FFFD in UTF-8 Conversion" (recalled from
    // memory): 61 F1 80 80 E1 80 C2 62 80 63 80 BF 64 decodes to a,FFFD,FFFD,FFFD,b,FFFD,c,FFFD,FFFD,d.
    // The WHATWG Encoding Standard's UTF-8 decoder, which TextDecoder implements, follows it.
    const bytes = Buffer.from([0x61, 0xf1, 0x80, 0x80, 0xe1, 0x80, 0xc2, 0x62, 0x80, 0x63, 0x80, 0xbf, 0x64]);
    expect(await readIndexableText(fileWith(bytes), CAP)).toEqual({
      kind: 'text',
      text: 'a\uFFFD\uFFFD\uFFFDb\uFFFDc\uFFFD\uFFFDd',
    });
  });

  it('reads a file with a NUL byte early on as binary', async () => {
    const bytes = Buffer.from('PNG-like header\0\x01\x02 then text');
    expect(await readIndexableText(fileWith(bytes), CAP)).toEqual({ kind: 'binary' });
  });

  it('looks for NUL bytes only in the first 8 KiB', async () => {
    const late = Buffer.alloc(BINARY_SNIFF_BYTES + 10, 0x61);
    late[BINARY_SNIFF_BYTES] = 0; // first byte past the sniffed window
    const got = await readIndexableText(fileWith(late), CAP);
    expect(got.kind).toBe('text');
    const edge = Buffer.alloc(BINARY_SNIFF_BYTES + 10, 0x61);
    edge[BINARY_SNIFF_BYTES - 1] = 0; // last byte inside the window
    expect(await readIndexableText(fileWith(edge), CAP)).toEqual({ kind: 'binary' });
  });

  it('treats UTF-16 text as binary, as git does (its NUL bytes)', async () => {
    const utf16 = Buffer.from('\uFEFFplain words', 'utf16le');
    expect(await readIndexableText(fileWith(utf16), CAP)).toEqual({ kind: 'binary' });
  });

  it('reads a file of exactly the cap and refuses one byte more', async () => {
    expect((await readIndexableText(fileWith('x'.repeat(100)), 100)).kind).toBe('text');
    expect(await readIndexableText(fileWith('x'.repeat(101)), 100)).toEqual({ kind: 'too-large' });
  });

  it('reads a large file (180,000 bytes) in full', async () => {
    const text = 'abcdefgh\n'.repeat(20_000); // 180,000 bytes
    const got = await readIndexableText(fileWith(text), CAP);
    expect(got).toEqual({ kind: 'text', text });
  });

  it('reports a missing file, a folder and an unreadable file as unreadable without throwing', async () => {
    const missing = await readIndexableText(join(dir, 'no-such-file'), CAP);
    expect(missing.kind).toBe('unreadable');
    expect(missing.kind === 'unreadable' && missing.message).toMatch(/ENOENT/);
    const folder = join(dir, 'a-folder');
    mkdirSync(folder);
    expect((await readIndexableText(folder, CAP)).kind).toBe('unreadable');
  });

  it.skipIf(!hasMkfifo)('does not hang on a FIFO (named pipe) with no writer (skipped without mkfifo)', async () => {
    const fifo = join(dir, 'pipe.txt');
    execFileSync('mkfifo', [fifo]);
    expect(await readIndexableText(fifo, CAP)).toEqual({ kind: 'unreadable', message: 'Not a regular file.' });
  });

  it('rejects a cap that is not a positive whole number', async () => {
    await expect(readIndexableText(fileWith('x'), 0)).rejects.toBeInstanceOf(InvalidInputError);
    await expect(readIndexableText(fileWith('x'), 1.5)).rejects.toBeInstanceOf(InvalidInputError);
  });
});

describe('looksBinary and decodeUtf8', () => {
  it('agrees with a brute-force NUL search over the window', () => {
    for (const at of [0, 1, 100, BINARY_SNIFF_BYTES - 1, BINARY_SNIFF_BYTES, BINARY_SNIFF_BYTES + 5]) {
      const b = new Uint8Array(BINARY_SNIFF_BYTES + 10).fill(32);
      b[at] = 0;
      expect(looksBinary(b)).toBe(b.subarray(0, BINARY_SNIFF_BYTES).includes(0));
    }
  });

  it('decodes valid UTF-8 exactly as Buffer#toString does', () => {
    // Reference: Node's own UTF-8 decoder, on text with 1- to 4-byte sequences.
    const text = 'a é 中 😀 z';
    expect(decodeUtf8(Buffer.from(text, 'utf8'))).toBe(Buffer.from(text, 'utf8').toString('utf8'));
  });
});
