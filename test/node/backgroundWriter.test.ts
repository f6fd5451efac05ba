/**
 * The background writer (src/node/backgroundWriter.ts): the bytes land where they were sent,
 * whatever the slot size and the number of slots in flight; a failing write reaches the caller
 * with the system's code. The early flushes (src/node/earlyFlush.ts): started every so many bytes,
 * waited for, and a failure reported. The failures are real ones from the system:
 * /dev/full answers every write with ENOSPC (a Linux device, man 4 full), and a descriptor open
 * only for reading with EBADF. Plain bytes: the index files it writes are compared with the whole
 * encoded file in test/node/persist.test.ts.
 */
import { closeSync, existsSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BackgroundWriteError, BackgroundWriter } from '../../src/node/backgroundWriter.js';
import { EarlyFlush } from '../../src/node/earlyFlush.js';

const dir = mkdtempSync(join(tmpdir(), 'undertone-writer-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Sends `bytes` in pieces of the given sizes, each copied into the writer's slots, from `at`. */
function sendAll(writer: BackgroundWriter, bytes: Uint8Array, at: number): void {
  let slot = writer.take();
  let fill = 0;
  let position = at;
  for (let from = 0; from < bytes.length;) {
    const n = Math.min(slot.length - fill, bytes.length - from);
    slot.set(bytes.subarray(from, from + n), fill);
    fill += n;
    from += n;
    if (fill === slot.length) {
      writer.send(fill, position);
      position += fill;
      fill = 0;
      slot = writer.take();
    }
  }
  if (fill > 0) writer.send(fill, position);
}

describe('BackgroundWriter', () => {
  it('writes every slot where it was sent, also out of order, and counts what it wrote', () => {
    const bytes = Uint8Array.from({ length: 20_011 }, (_, i) => (i * 31 + (i >> 9)) % 251);
    for (const [slots, slotBytes] of [
      [1, 3],
      [2, 7],
      [4, 512],
      [3, 1 << 20],
    ]) {
      const file = join(dir, `w-${slots}-${slotBytes}.bin`);
      const fd = openSync(file, 'w');
      const writer = BackgroundWriter.start(fd, { slots, slotBytes });
      expect(writer).not.toBeNull();
      // The second half first, then the first: positions, not the order of sending, place them.
      const half = 10_000;
      sendAll(writer!, bytes.subarray(half), half);
      sendAll(writer!, bytes.subarray(0, half), 0);
      writer!.finish();
      expect(writer!.written).toBe(bytes.length);
      closeSync(fd);
      expect(Buffer.compare(readFileSync(file), bytes)).toBe(0);
    }
  });

  it('reports a full disk (ENOSPC) to the caller, at the latest when it finishes', () => {
    if (!existsSync('/dev/full')) return; // Linux only
    const fd = openSync('/dev/full', 'w');
    try {
      const writer = BackgroundWriter.start(fd, { slots: 2, slotBytes: 1024 })!;
      let error: unknown;
      try {
        sendAll(writer, new Uint8Array(64 * 1024).fill(7), 0);
        writer.finish();
      } catch (err) {
        error = err;
      } finally {
        writer.close();
      }
      expect(error).toBeInstanceOf(BackgroundWriteError);
      expect((error as BackgroundWriteError).code).toBe('ENOSPC');
      expect((error as Error).message).toBe('writing failed (ENOSPC)');
    } finally {
      closeSync(fd);
    }
  });

  it('reports a descriptor that cannot be written (EBADF) and writes nothing after it', () => {
    const file = join(dir, 'read-only.bin');
    writeFileSync(file, 'unchanged');
    const fd = openSync(file, 'r');
    try {
      const writer = BackgroundWriter.start(fd, { slots: 1, slotBytes: 4 })!;
      expect(() => {
        sendAll(writer, new Uint8Array(40).fill(65), 0);
        writer.finish();
      }).toThrow(/writing failed \(EBADF\)/);
      writer.close();
    } finally {
      closeSync(fd);
    }
    expect(readFileSync(file, 'utf8')).toBe('unchanged');
  });

  it('refuses a slot sent twice or one longer than a slot', () => {
    const fd = openSync(join(dir, 'misuse.bin'), 'w');
    const writer = BackgroundWriter.start(fd, { slots: 2, slotBytes: 8 })!;
    try {
      writer.take();
      expect(() => writer.send(9, 0)).toThrow(RangeError);
      writer.send(8, 0);
      expect(() => writer.send(8, 8)).toThrow(/without a slot taken/);
      writer.finish();
    } finally {
      writer.close();
      closeSync(fd);
    }
  });
});

describe('EarlyFlush', () => {
  it('starts a flush each time another `every` bytes are written, and waits for them', async () => {
    const fd = openSync(join(dir, 'flushed.bin'), 'w');
    try {
      const early = new EarlyFlush(fd, 1000);
      for (const total of [10, 999, 1000, 1500, 1999, 2500, 2600, 3600]) early.written(total);
      // At 1000 (next at 2000), 2500 (next at 3500), 3600.
      expect(early.started).toBe(3);
      await expect(early.settled()).resolves.toBeUndefined();
      const none = new EarlyFlush(fd, 0);
      none.written(1e9);
      expect(none.started).toBe(0);
    } finally {
      closeSync(fd);
    }
  });

  it('reports a flush that failed (EBADF: no such descriptor)', async () => {
    const early = new EarlyFlush(1 << 20, 10);
    early.written(10);
    await expect(early.settled()).rejects.toMatchObject({ code: 'EBADF' });
  });
});
