import { mkdtempSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { open } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { HeadFill, HeadFillError } from '../../src/node/headFill.js';

// The reference is the file's own bytes: what is filled must equal them, byte for byte.
const dir = mkdtempSync(join(tmpdir(), 'undertone-termfill-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function fileOf(name: string, size: number): { path: string; bytes: Uint8Array } {
  const bytes = new Uint8Array(size);
  for (let i = 0; i < size; i++) bytes[i] = (i * 31 + 7) & 0xff;
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return { path, bytes };
}

describe('HeadFill', () => {
  it('fills the bytes in the background, or at once when asked before it has ended, and both give the file', async () => {
    const { path, bytes } = fileOf('a.bin', 100_000);
    for (const chunk of [1, 4096, 1 << 20]) {
      const handle = await open(path, 'r');
      const into = new Uint8Array(60_000);
      const fill = new HeadFill(handle, path, into, 1000, () => false);
      await fill.start(chunk);
      expect(fill.done).toBe(true);
      expect(Buffer.compare(into, bytes.subarray(1000, 61_000))).toBe(0);
      fill.ensure(); // already in: nothing to do
      await handle.close();
    }
    // Asked at once, with the background reads under way.
    const handle = await open(path, 'r');
    const into = new Uint8Array(60_000);
    const fill = new HeadFill(handle, path, into, 40_000, () => false);
    const background = fill.start(512);
    fill.ensure();
    expect(fill.done).toBe(true);
    expect(Buffer.compare(into, bytes.subarray(40_000, 100_000))).toBe(0);
    await background;
    expect(Buffer.compare(into, bytes.subarray(40_000, 100_000))).toBe(0);
    await handle.close();
  });

  it('reports a closed descriptor or a file cut short with HeadFillError, never wrong bytes', async () => {
    const { path } = fileOf('b.bin', 10_000);
    const handle = await open(path, 'r');
    let closed = false;
    const fill = new HeadFill(handle, path, new Uint8Array(5000), 2000, () => closed);
    closed = true;
    expect(() => fill.ensure()).toThrow(HeadFillError);
    await handle.close();

    const short = await open(path, 'r');
    truncateSync(path, 4000);
    const cut = new HeadFill(short, path, new Uint8Array(5000), 2000, () => false);
    expect(() => cut.ensure()).toThrow(/end early/);
    const again = new HeadFill(short, path, new Uint8Array(5000), 2000, () => false, 'term vectors');
    await again.start(1024);
    expect(again.done).toBe(false);
    expect(() => again.ensure()).toThrow(/the term vectors of .* end early/);
    await short.close();
  });

  it('has nothing to fill for empty lists', async () => {
    const { path } = fileOf('c.bin', 16);
    const handle = await open(path, 'r');
    const fill = new HeadFill(handle, path, new Uint8Array(0), 16, () => true);
    expect(fill.done).toBe(true);
    expect(() => fill.ensure()).not.toThrow();
    await handle.close();
  });
});
