/**
 * Saving and loading the index file: atomic writes (a temporary file in the same folder, flushed,
 * then renamed over the old one), and loads that report a missing or damaged file instead of
 * trusting it. Loading opens only a regular file, without blocking (a FIFO or a device at the
 * index path is reported, never waited on), reads and checks the header first and compares the
 * file's size with the size the header implies before reading the rest, so junk of any size at
 * the index path costs one small read. Temporary files left by a process that died before its
 * rename are removed on the next save or load.
 * The section vectors (most of a large tree's file) are not loaded: every byte is still checked
 * (streamed through the checksum and the unit-length check in blocks, nothing kept; from format 6
 * on, with checkRows 'later', after the load and before any of them is used: persistCheck.ts), then the rows
 * are read where they lie when a ranking needs them (sectionRowFile.ts), from a descriptor the
 * index keeps open. LoadOptions.sectionRows 'memory' reads them into memory as before. With rows
 * in the file, the section lists' saved 8-bit codes (format 5) are read where they lie too, from the
 * same descriptor; only lists filed again (after many edits, or from a format-4 file) put their
 * codes in a scratch file beside it (sectionCodeFile.ts).
 */
import { randomBytes } from 'node:crypto';
import { constants, writeSync } from 'node:fs';
import { mkdir, open, readdir, rename, rm, stat, type FileHandle } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { CancelledError, CorruptIndexError, UndertoneError } from '../core/errors.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import { Checksum32 } from '../core/index/persistence/checksum.js';
import { ConceptRows } from '../core/index/search/conceptRows.js';
import type { ByteSpill } from '../core/sections/types.js';
import {
  decodeIndex,
  decodeIndexWithRows,
  headerExtent,
  INDEX_PREAMBLE_BYTES,
  planIndexFile,
  readIndexHeader,
  sectionCodesOf,
  sectionRowsOf,
  termIndptrOf,
  termListsOf,
  termVectorsOf,
  vectorsOf,
  type TermListSource,
} from '../core/index/persistence/serialize.js';
import { checkTermVectorsBlock, TermListCheck } from '../core/index/persistence/indexFileCheck.js';
import { BackgroundWriter } from './backgroundWriter.js';
import { EarlyFlush } from './earlyFlush.js';
import { HeadFill } from './headFill.js';
import { openSpillBeside } from './sectionCodeFile.js';
import { FileSectionRows } from './sectionRowFile.js';
import { TailCheck } from './persistCheck.js';
import type { IndexSettings } from '../core/index/model/settings.js';
import { describeFsError } from './scanRead.js';

/** A file could not be written (the message names the path and the reason). */
export class SaveError extends UndertoneError {
  constructor(
    public readonly path: string,
    reason: string,
  ) {
    super(`cannot save ${path}: ${reason}`);
  }
}

/** A temporary file of writeFileAtomic: `<name>.<pid>.<8 hex>.tmp`. */
const TEMP_NAME = /^(.*)\.(\d+)\.[0-9a-f]{8}\.tmp$/;

/** Age after which a temporary file is stale even if its process id is alive again (pid reuse). */
const STALE_TEMP_MS = 24 * 3600 * 1000;

function processAlive(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Removes temporary files of `path` left in its folder by processes that no longer run (killed
 * between creating the temporary file and renaming it). Returns the names removed.
 */
export async function removeStaleTemporaries(path: string, now = Date.now()): Promise<string[]> {
  const dir = dirname(path);
  const name = basename(path);
  let entries: string[];
  try {
    entries = await readdir(dir);
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const entry of entries) {
    const m = TEMP_NAME.exec(entry);
    if (!m || m[1] !== name) continue;
    const full = join(dir, entry);
    const st = await stat(full).catch(() => undefined);
    if (!st?.isFile()) continue;
    if (processAlive(Number(m[2])) && now - st.mtimeMs < STALE_TEMP_MS) continue;
    if (
      await rm(full, { force: true }).then(
        () => true,
        () => false,
      )
    )
      removed.push(entry);
  }
  return removed;
}

/** Why path cannot be written, in words (the error's code kept in brackets). */
function saveReason(err: unknown): string {
  const code = (err as NodeJS.ErrnoException).code;
  switch (code) {
    case 'EACCES':
    case 'EPERM':
      return `permission denied (${code})`;
    case 'EROFS':
      return 'the file system is read-only (EROFS)';
    case 'ENOSPC':
      return 'no space left on the device (ENOSPC)';
    case 'EDQUOT':
      return 'disk quota exceeded (EDQUOT)';
    case 'EISDIR':
      return 'a folder of that name is in the way (EISDIR)';
    case 'ENOTDIR':
    case 'EEXIST':
      return `a file is in the way of its folder (${code})`;
    case 'ENOENT':
      return 'it cannot be created there (ENOENT)';
    default:
      return describeFsError(err);
  }
}

/**
 * Makes a folder and its missing parents, one level at a time (Node 20's recursive mkdir never
 * returns for a path under /proc).
 * @throws SaveError naming the folder and the reason (a file in the way, no permission, …).
 */
export async function ensureFolder(path: string, target = path): Promise<void> {
  const missing: string[] = [];
  for (let p = resolve(path); ;) {
    let st;
    try {
      st = await stat(p);
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code;
      if (code !== 'ENOENT' && code !== 'ENOTDIR') throw new SaveError(target, `${p}: ${saveReason(err)}`);
    }
    if (st) {
      if (!st.isDirectory()) throw new SaveError(target, `${p} is a file, not a folder`);
      break;
    }
    missing.push(p);
    const parent = dirname(p);
    if (parent === p) break;
    p = parent;
  }
  for (const dir of missing.reverse()) {
    try {
      await mkdir(dir);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST')
        throw new SaveError(target, dir === target ? saveReason(err) : `${dir}: ${saveReason(err)}`);
    }
  }
}

/**
 * Checks, before long work, that path can be written as a file: its folder exists or can be
 * made, nothing but a file is at path, and a file can be created beside it (a probe, removed).
 * @throws SaveError naming the path and the reason.
 */
export async function checkWritableFile(path: string): Promise<void> {
  const st = await stat(path).catch(() => undefined);
  if (st && !st.isFile()) throw new SaveError(path, st.isDirectory() ? 'it is a folder; name a file' : 'it is not a regular file');
  await ensureFolder(dirname(path), path);
  const probe = `${path}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`;
  try {
    await (await open(probe, 'wx')).close();
  } catch (err) {
    throw new SaveError(path, saveReason(err));
  }
  await rm(probe, { force: true });
}

/**
 * Writes bytes to path so that readers see either the old file or the new one, never a mix.
 * @throws SaveError naming the path and the reason when it cannot be written.
 */
export async function writeFileAtomic(path: string, bytes: Uint8Array): Promise<void> {
  await writeAtomically(path, (fd) => writeAllSync(fd, bytes, 0));
}

/**
 * The atomic write: write(fd) fills a new temporary file beside path (synchronously, so what it
 * writes is one consistent snapshot), which is then flushed and renamed over path. What write
 * returns (flushes it started: EarlyFlush.settled) is waited for before the final flush, also
 * when it failed.
 */
async function writeAtomically(path: string, write: (fd: number) => Promise<void> | void): Promise<void> {
  await ensureFolder(dirname(path), path);
  const existing = await stat(path).catch(() => undefined);
  if (existing && !existing.isFile())
    throw new SaveError(
      path,
      existing.isDirectory() ? 'a folder of that name is in the way (EISDIR)' : 'something other than a file is in the way',
    );
  await removeStaleTemporaries(path);
  const tmp = `${path}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`;
  let handle: FileHandle | undefined;
  let pending: Promise<void> | void = undefined;
  try {
    handle = await open(tmp, 'wx');
    pending = write(handle.fd);
    await pending;
    await handle.sync();
    await handle.close();
    handle = undefined;
    await rename(tmp, path);
  } catch (err) {
    await Promise.resolve(pending).catch(() => undefined);
    await handle?.close().catch(() => undefined);
    await rm(tmp, { force: true }).catch(() => undefined);
    throw new SaveError(path, saveReason(err));
  }
}

/** Writes all of bytes at position (writeSync may write less than asked). */
function writeAllSync(fd: number, bytes: Uint8Array, position: number): void {
  for (let done = 0; done < bytes.length;) done += writeSync(fd, bytes, done, bytes.length - done, position + done);
}

/** Bytes gathered before a write call: small pieces (one file's terms) go out together (our choice). */
export const SAVE_CHUNK_BYTES = 1 << 20;

/**
 * Payload bytes from which a thread of its own writes the file while the save goes on making it
 * (backgroundWriter.ts). Below it the save writes itself: on the Linux Documentation folder's
 * 94 MB index the thread made the save 0.06 s slower (median of 4 alternating builds: 0.52 against
 * 0.46 s); from here on the early flushes run as well (our choice: the same 256 MiB).
 */
export const BACKGROUND_WRITE_FROM = 256 << 20;

/**
 * Saves the index atomically, streaming it: the payload goes out piece by piece (views of the
 * index's arrays, small ones gathered into one SAVE_CHUNK_BYTES buffer; from writeFrom payload
 * bytes on, copied into the slots of a thread that writes them meanwhile) while its checksum is
 * computed, then the header goes in front; the disk is asked to write back what the file holds
 * every 256 MiB (EarlyFlush), so the final flush waits for little. The file is never held whole
 * in memory (the whole buffer of encodeIndex was the build's peak). Files' counts kept out of
 * memory (a build's parked counts, termLists) are streamed from where they are. Returns the
 * file's size.
 */
export async function saveIndex(
  path: string,
  index: LsiIndex,
  chunkBytes = SAVE_CHUNK_BYTES,
  termLists?: TermListSource,
  writeFrom = BACKGROUND_WRITE_FROM,
): Promise<number> {
  let size = 0;
  await writeAtomically(path, (fd): Promise<void> => {
    // The section lists' codes wait beside the index while the file is written (savedLists.ts).
    const plan = planIndexFile(index, new Date(), {
      termLists,
      openSpill: openSpillBeside(dirname(resolve(path)), 'the section codes being saved'),
    });
    const writer = plan.payloadBytes >= writeFrom ? BackgroundWriter.start(fd) : null;
    const early = new EarlyFlush(fd);
    try {
      const sum = new Checksum32();
      const single = writer ? null : new Uint8Array(Math.max(1, Math.min(chunkBytes, plan.payloadBytes)));
      let buf = writer ? writer.take() : single!;
      let fill = 0;
      let at = plan.start;
      let summed = 0;
      let headSum: number | undefined = plan.headBytes === 0 ? sum.digest() : undefined;
      const flush = (): void => {
        if (fill === 0) return;
        if (writer) {
          writer.send(fill, at);
          buf = writer.take();
        } else writeAllSync(fd, buf.subarray(0, fill), at);
        at += fill;
        fill = 0;
        early.written(writer ? writer.written : at - plan.start);
      };
      for (const p of plan.pieces()) {
        // The checksum of the part before the section vectors is taken where that part ends.
        const cut = headSum === undefined && summed + p.length >= plan.headBytes ? plan.headBytes - summed : -1;
        if (cut >= 0) {
          sum.update(p.subarray(0, cut));
          headSum = sum.digest();
          sum.update(p.subarray(cut));
        } else sum.update(p);
        summed += p.length;
        if (!writer && p.length >= buf.length) {
          // Written where it lies (one thread: no copy).
          flush();
          writeAllSync(fd, p, at);
          at += p.length;
          early.written(at - plan.start);
          continue;
        }
        // Into the buffer, or the writer's slots (a piece is valid only until the next is made).
        for (let from = 0; from < p.length;) {
          const n = Math.min(buf.length - fill, p.length - from);
          buf.set(p.subarray(from, from + n), fill);
          fill += n;
          from += n;
          if (fill === buf.length) flush();
        }
      }
      flush();
      writer?.finish();
      writeAllSync(fd, plan.head(sum.digest(), headSum ?? sum.digest()), 0);
      size = at;
    } catch (err) {
      // The flushes still running hold the descriptor: let them end before it closes.
      return early.settled().then(
        () => Promise.reject(err),
        () => Promise.reject(err),
      );
    } finally {
      writer?.close();
    }
    return early.settled();
  });
  return size;
}

/** Saves, and returns why it could not instead of throwing (undefined when saved). */
export async function trySaveIndex(path: string, index: LsiIndex, termLists?: TermListSource): Promise<string | undefined> {
  try {
    await saveIndex(path, index, SAVE_CHUNK_BYTES, termLists);
    return undefined;
  } catch (err) {
    if (err instanceof SaveError) return err.message;
    throw err;
  }
}

export type LoadOutcome =
  | {
      readonly status: 'ok';
      readonly index: LsiIndex;
      readonly bytes: number;
      /**
       * How the check of the section rows and codes ended (undefined: passed, else why it failed);
       * from format 6 on it runs after the load, and every read of a row or a code waits for it.
       */
      readonly checked: Promise<string | undefined>;
      /**
       * When the files' term lists and the model's term vectors are in memory: they are filled in
       * after the load (with rows in the file), and a slot asked for its terms, or a use of the term
       * vectors, before then reads them at once (headFill.ts). Never rejects; a failed fill is
       * reported by the first use of a slot's terms or of the term vectors.
       */
      readonly termsFilled: Promise<void>;
    }
  | { readonly status: 'missing' }
  | { readonly status: 'damaged'; readonly reason: string };

export interface LoadOptions {
  /** Bytes per read call: few calls for a big file, without holding the thread pool for long. */
  readChunkBytes: number;
  /**
   * 'file': the section vectors stay in the file, read on demand (the descriptor stays open until
   * `index.sections.closeRows()` or the index is garbage collected); 'memory': read with the rest.
   */
  sectionRows: 'file' | 'memory';
  /** Stops the load between reads (loadIndex then throws CancelledError). */
  signal?: AbortSignal;
  /**
   * 'now' (the default): every byte is checked before the index is returned, as before format 6.
   * 'later' (format 6 with rows in the file; the editor's worker): the index is returned once the
   * part before the section rows has passed its own checksum, and the rows and codes are checked
   * in the background; a read of a row or a code before that check has ended finishes it first,
   * so nothing unchecked is ever used (persistCheck.ts).
   */
  checkRows?: 'now' | 'later';
  /**
   * With checkRows 'later': called when the check after the load finds damage, unless the index's
   * rows were closed before (reads of rows and codes throw DamagedRowsError from then on).
   */
  onDamaged?: (reason: string) => void;
}

/**
 * Bytes of the scratch buffers the term lists are streamed through at load (two: one summed while
 * the next is read); small, so few fresh pages are made for them (our choice, not tuned).
 */
export const TERM_SCRATCH_BYTES = 4 * 1024 * 1024;

export const DEFAULT_LOAD_OPTIONS: LoadOptions = { readChunkBytes: 32 * 1024 * 1024, sectionRows: 'file' };

export { ROW_CHECK_BYTES } from './persistCheck.js';

/** Opened without blocking (O_NONBLOCK: a FIFO does not wait for a writer); O_NOFOLLOW is not used, links to a file are fine. */
const OPEN_FLAGS = constants.O_RDONLY | (constants.O_NONBLOCK ?? 0);

/** Reads exactly length bytes at position into buf (or fewer at end of file); returns how many. */
async function readAt(handle: FileHandle, buf: Uint8Array, position: number, length: number, chunk: number): Promise<number> {
  let done = 0;
  while (done < length) {
    const { bytesRead } = await handle.read(buf, done, Math.min(chunk, length - done), position + done);
    if (bytesRead === 0) break;
    done += bytesRead;
  }
  return done;
}

/** A file that cannot be an index (the reason is the whole story). */
class NotAnIndexFile extends Error {}

/** Reads the open file's header and checks it, and that the file's size matches it. */
async function openChecked(handle: FileHandle, path: string, chunk: number) {
  const st = await handle.stat();
  if (st.isDirectory()) throw new NotAnIndexFile(`${path} is a folder, not an index file`);
  if (!st.isFile()) throw new NotAnIndexFile(`${path} is not a regular file (a FIFO, socket or device)`);
  const size = st.size;
  const preamble = new Uint8Array(INDEX_PREAMBLE_BYTES);
  if ((await readAt(handle, preamble, 0, INDEX_PREAMBLE_BYTES, chunk)) < INDEX_PREAMBLE_BYTES)
    throw new CorruptIndexError('index file is shorter than its preamble');
  const start = headerExtent(preamble);
  if (start > size) throw new CorruptIndexError('index file is truncated inside its header');
  const head = new Uint8Array(start);
  if ((await readAt(handle, head, 0, start, chunk)) < start) throw new CorruptIndexError('index file is truncated inside its header');
  const header = readIndexHeader(head);
  const expected = start + header.payloadBytes;
  if (size !== expected) throw new CorruptIndexError(`index file is ${size} bytes, expected ${expected} (truncated or padded)`);
  return { header, start, size };
}

/**
 * Reads a checked index file into a buffer of its own (byte offset 0, so decodeIndex can view
 * its sections in place), in large chunks: fs.readFile reads big files 512 KiB at a time. Only
 * the header is read until it has been checked and the file's size matches it.
 */
async function readChecked(path: string, chunk: number): Promise<Uint8Array> {
  const handle = await open(path, OPEN_FLAGS);
  try {
    const { size } = await openChecked(handle, path, chunk);
    const buf = new Uint8Array(new ArrayBuffer(size));
    const got = await readAt(handle, buf, 0, size, chunk);
    return got === size ? buf : buf.subarray(0, got);
  } finally {
    await handle.close();
  }
}

/**
 * Reads a checked index file up to its section vectors into a buffer of its own, and checks the
 * rows and codes after it (payload checksum, unit length, code params) without keeping them:
 * from format 6 on, the part read is checked against its own checksum at once and the rest
 * afterwards (the returned check, not yet started: persistCheck.ts); formats 4 and 5 check the
 * rest before returning. Returns that head, a reader of the rows that owns the open descriptor,
 * and the check.
 */
async function readCheckedHead(
  path: string,
  chunk: number,
  signal: AbortSignal | undefined,
  later: boolean,
): Promise<{
  head: Uint8Array;
  rows: FileSectionRows;
  codes?: { codes: ByteSpill; params: ByteSpill };
  size: number;
  tail: TailCheck;
  /** The files' concept vectors, read into the ranking rows (their place in head is left unread). */
  vectors: ConceptRows;
  /** The files' term lists, checked but not yet in head (filled after the load). */
  terms: HeadFill;
  /** The model's term vectors, checked but not yet in head (filled after the load). */
  termVectors: HeadFill;
}> {
  const handle = await open(path, OPEN_FLAGS);
  let kept = false;
  try {
    const { header, start, size } = await openChecked(handle, path, chunk);
    const { at, rows, k } = sectionRowsOf(header, start);
    const head = new Uint8Array(new ArrayBuffer(at));
    // The files' concept vectors are read straight into the index's ranking rows (ConceptRows, in
    // the SIMD kernel's memory where it runs): no copy of them is made, and the head's pages for
    // them are never touched, so they take no memory (90 MB on the Linux tree).
    const v = vectorsOf(header, start);
    const conceptRows = new ConceptRows(k, header.docs);
    const vectors = conceptRows.rowBytes(header.docs);
    if (vectors.length !== v.bytes) throw new CorruptIndexError("the files' vectors are not k per document");
    // The files' term lists (termIds, termCounts) are streamed through a small scratch buffer for
    // the checksum and TermListCheck, their place in the head left untouched; they are filled in
    // after the load (headFill.ts), so their pages (173 MB on the Linux tree) are not made
    // before the index answers.
    const t = termListsOf(header, start);
    const ip = termIndptrOf(header, start);
    if (!(ip.at + 4 * ip.length <= t.at && t.at + t.bytes <= v.at))
      throw new CorruptIndexError('the term lists are out of place (a reader bug)');
    // The model's term vectors likewise (115 MB there): a query folds in only its few terms' rows,
    // and a reopened index's model fills them on first use (serialize.ts, FillGate).
    const tv = termVectorsOf(header, start);
    if (!(t.at + t.bytes <= tv.at && tv.at + tv.bytes <= v.at))
      throw new CorruptIndexError('the term vectors are out of place (a reader bug)');
    const scratchBytes = Math.max(8, Math.min(chunk, TERM_SCRATCH_BYTES) & ~7);
    const scratch = [new Uint8Array(scratchBytes), new Uint8Array(scratchBytes)];
    const parts: [number, number, Uint8Array | null, number][] = [
      [0, t.at, head, 0],
      [t.at, t.at + t.bytes, null, t.at],
      [t.at + t.bytes, tv.at, head, 0],
      [tv.at, tv.at + tv.bytes, null, tv.at],
      [tv.at + tv.bytes, v.at, head, 0],
      [v.at, v.at + v.bytes, vectors, v.at],
      [v.at + v.bytes, at, head, 0],
    ];
    // Read and summed in turns: each chunk is summed while the next one is read (on the thread pool).
    const chunks: [number, number, Uint8Array, boolean][] = [];
    let scratchUsed = 0;
    for (const [from, to, buf, base] of parts) {
      const step = buf ? chunk : scratchBytes;
      for (let p = from; p < to; p += step) {
        const end = Math.min(to, p + step);
        const into = buf ? buf.subarray(p - base, end - base) : scratch[scratchUsed++ % 2].subarray(0, end - p);
        chunks.push([p, end, into, !buf]);
      }
    }
    const sum = new Checksum32();
    const readChunk = (i: number): Promise<number> => {
      const [from, to, into] = chunks[i];
      return readAt(handle, into, from, to - from, chunk);
    };
    let check: TermListCheck | undefined;
    const idsEnd = t.at + t.idsBytes;
    const countsAt = t.at + t.bytes - 4 * t.total;
    let pending = chunks.length > 0 ? readChunk(0) : undefined;
    for (let i = 0; i < chunks.length; i++) {
      if (signal?.aborted) throw new CancelledError();
      const [from, to, into, lists] = chunks[i];
      if ((await pending!) < to - from) throw new CorruptIndexError('index file is shorter than its header says');
      if (i + 1 < chunks.length) pending = readChunk(i + 1);
      if (to > start) sum.update(into.subarray(Math.max(0, start - from)));
      if (lists && from >= tv.at) {
        // Scratch blocks start on 8 bytes past tv.at and end on a whole number of f32.
        checkTermVectorsBlock(new Float32Array(into.buffer, into.byteOffset, (to - from) >> 2));
      } else if (lists) {
        // termIndptr lies before the lists, so it is in the head by now.
        check ??= new TermListCheck(new Int32Array(head.buffer, ip.at, ip.length), t.total, ip.vocabSize);
        const a = Math.min(Math.max(from, t.at), idsEnd);
        const b = Math.min(to, idsEnd);
        if (b > a) check.ids(new Int32Array(into.buffer, into.byteOffset + (a - from), (b - a) >> 2));
        const c = Math.max(from, countsAt);
        if (to > c) check.counts(new Float32Array(into.buffer, into.byteOffset + (c - from), (to - c) >> 2));
      }
    }
    if (t.total > 0 || check) (check ?? new TermListCheck(new Int32Array(head.buffer, ip.at, ip.length), t.total, ip.vocabSize)).finish();
    if (signal?.aborted) throw new CancelledError();
    const codes = sectionCodesOf(header, start);
    const tail = new TailCheck(handle, path, sum, header.checksum, { rowsAt: at, rows, k, codes, size });
    if (header.headChecksum !== undefined && sum.digest() !== header.headChecksum)
      throw new CorruptIndexError('index payload fails its checksum (damaged file)');
    if (header.headChecksum === undefined || !later) {
      await tail.run(signal);
      if (tail.state === 'damaged') throw new CorruptIndexError(tail.reason!);
    }
    kept = true;
    const reader = new FileSectionRows(handle, path, at, rows, k, tail);
    const saved = codes
      ? { codes: reader.region(codes.codesAt, codes.codesBytes), params: reader.region(codes.paramsAt, codes.paramsBytes) }
      : undefined;
    const terms = new HeadFill(handle, path, head.subarray(t.at, t.at + t.bytes), t.at, () => reader.closed);
    const termVectors = new HeadFill(handle, path, head.subarray(tv.at, tv.at + tv.bytes), tv.at, () => reader.closed, 'term vectors');
    return { head, rows: reader, codes: saved, size, tail, vectors: conceptRows, terms, termVectors };
  } finally {
    if (!kept) await handle.close();
  }
}

/**
 * Loads a saved index; a missing, damaged, truncated, older or misplaced file is reported, never
 * trusted. With sectionRows 'file' (the default) the index reads its section vectors from the file
 * it was loaded from (see LoadOptions).
 * @throws CancelledError when options.signal stops it.
 */
export async function loadIndex(path: string, options: Partial<LoadOptions> = {}): Promise<LoadOutcome> {
  const chunk = Math.max(1, Math.floor(options.readChunkBytes ?? DEFAULT_LOAD_OPTIONS.readChunkBytes));
  const inFile = (options.sectionRows ?? DEFAULT_LOAD_OPTIONS.sectionRows) === 'file';
  await removeStaleTemporaries(path);
  let read: {
    head: Uint8Array;
    rows?: FileSectionRows;
    codes?: { codes: ByteSpill; params: ByteSpill };
    size?: number;
    tail?: TailCheck;
    vectors?: ConceptRows;
    terms?: HeadFill;
    termVectors?: HeadFill;
  };
  try {
    read = inFile
      ? await readCheckedHead(path, chunk, options.signal, options.checkRows === 'later')
      : { head: await readChecked(path, chunk) };
  } catch (err) {
    if (err instanceof CancelledError) throw err;
    if (err instanceof CorruptIndexError || err instanceof NotAnIndexFile) return { status: 'damaged', reason: `${path}: ${err.message}` };
    const code = (err as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') return { status: 'missing' };
    return { status: 'damaged', reason: `cannot read ${path}: ${describeFsError(err)}` };
  }
  const { head, rows, codes, size, tail, vectors, terms, termVectors } = read;
  try {
    const index = rows ? decodeIndexWithRows(head, rows, codes, vectors, terms, termVectors) : decodeIndex(head);
    // The term lists, then the term vectors, go into their place in the background (a slot asked
    // for its terms, or a use of the model's term vectors, first fills them at once).
    const termsFilled = terms ? terms.start(chunk).then(() => termVectors?.start(chunk)) : Promise.resolve();
    // Rows left in the file: the section lists' codes go to a scratch file beside it too.
    if (rows) index.sections.spillListsTo(openSpillBeside(dirname(resolve(path))));
    // The rows and codes not yet checked (format 6): checked in the background from now on, and
    // at once by the first read of a row or a code that comes before the end (persistCheck.ts).
    if (tail && tail.state === 'pending') {
      tail.start();
      if (options.onDamaged)
        void tail.done.then((reason) => reason !== undefined && !rows!.closed && options.onDamaged!(`${path}: ${reason}`));
    }
    return { status: 'ok', index, bytes: size ?? head.length, checked: tail?.done ?? Promise.resolve(undefined), termsFilled };
  } catch (err) {
    rows?.close();
    if (err instanceof CorruptIndexError) return { status: 'damaged', reason: `${path}: ${err.message}` };
    throw err;
  }
}

/**
 * The settings a saved index was built with, from its checked header alone (one small read), or
 * undefined when there is no readable, undamaged header at path.
 */
export async function readSavedSettings(path: string): Promise<IndexSettings | undefined> {
  let handle: FileHandle | undefined;
  try {
    handle = await open(path, OPEN_FLAGS);
    const st = await handle.stat();
    if (!st.isFile()) return undefined;
    const preamble = new Uint8Array(INDEX_PREAMBLE_BYTES);
    if ((await readAt(handle, preamble, 0, INDEX_PREAMBLE_BYTES, INDEX_PREAMBLE_BYTES)) < INDEX_PREAMBLE_BYTES) return undefined;
    const start = headerExtent(preamble);
    if (start > st.size) return undefined;
    const head = new Uint8Array(start);
    if ((await readAt(handle, head, 0, start, start)) < start) return undefined;
    return readIndexHeader(head).settings;
  } catch {
    return undefined;
  } finally {
    await handle?.close().catch(() => undefined);
  }
}
