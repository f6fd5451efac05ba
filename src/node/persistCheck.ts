/**
 * The check of a saved index's section rows and codes (most of a large tree's file: 1.9 of its
 * 2.4 GB on the Linux tree), apart from the rest of the file: the payload checksum continued over
 * them from where the part before them ended, every row's unit length and the codes' params, in
 * blocks of ROW_CHECK_BYTES (nothing kept). From format 6 on the part before the rows has its own
 * checksum, so a reopen trusts that part at once and runs this check afterwards: in the background
 * (start(), asynchronous reads between which the thread answers other requests), and to the end at
 * once (ensure(), synchronous reads) as soon as anything wants to read a row or a code before the
 * background has finished. So no unchecked byte is ever used: a file-level answer uses only the
 * checked part, and a section-level one waits for the check. A failed check makes every later read
 * throw DamagedRowsError (the index must be built again); `done` says how it ended. Formats 4 and 5
 * run the same check to the end before the index is used (await run()).
 */
import { readSync } from 'node:fs';
import type { FileHandle } from 'node:fs/promises';
import { CancelledError, CorruptIndexError } from '../core/errors.js';
import type { Checksum32 } from '../core/index/persistence/checksum.js';
import { checkCodeParams, checkSectionRows } from '../core/index/persistence/indexFileCheck.js';
import { SectionRowsError } from '../core/sections/sectionRows.js';
import { describeFsError } from './scanRead.js';

/** Bytes of section rows checked at a time (a scratch block, not kept; common practice). */
export const ROW_CHECK_BYTES = 4 * 1024 * 1024;

/** The saved section rows or codes failed their check after the index was opened. */
export class DamagedRowsError extends SectionRowsError {
  constructor(
    readonly path: string,
    readonly reason: string,
  ) {
    super(`the saved index ${path} is damaged (${reason}): build the index again`);
  }
}

/** A stretch of the file checked one way: [from, to) bytes, in whole units of `unit` bytes. */
interface Segment {
  readonly from: number;
  readonly to: number;
  readonly unit: number;
  /** Checks a block (whole units), given as the scratch's bytes. */
  readonly check?: (block: ArrayBuffer, bytes: number) => void;
}

/** Where the rows and codes lie (byte offsets in the file; see serialize.ts sectionRowsOf / sectionCodesOf). */
export interface TailLayout {
  readonly rowsAt: number;
  readonly rows: number;
  readonly k: number;
  readonly codes: { readonly paramsAt: number; readonly paramsBytes: number } | null;
  /** The file's size: the payload ends here. */
  readonly size: number;
}

export type TailState = 'pending' | 'ok' | 'damaged';

export class TailCheck {
  private _state: TailState = 'pending';
  private _reason: string | undefined;
  private readonly segments: Segment[];
  private seg = 0;
  private pos: number;
  /** A block that failed its own check: reported after the checksum (damage reads as damage). */
  private badBlock: string | undefined;
  private settle!: (reason: string | undefined) => void;
  private running = false;
  private stopped = false;
  /** Undefined once the check passed, else why it failed (never rejects). */
  readonly done: Promise<string | undefined>;

  /**
   * @param sum the payload checksum over every byte before layout.rowsAt (continued here).
   * @param expected the payload checksum the header holds.
   */
  constructor(
    private readonly handle: FileHandle,
    private readonly path: string,
    private readonly sum: Checksum32,
    private readonly expected: number,
    layout: TailLayout,
  ) {
    const { rowsAt, rows, k, codes, size } = layout;
    const rowBytes = 4 * Math.max(1, k);
    const tailAt = rowsAt + rows * 4 * k;
    const segments: Segment[] = [
      {
        from: rowsAt,
        to: tailAt,
        unit: rowBytes,
        check: (b: ArrayBuffer, n: number) => checkSectionRows(new Float32Array(b, 0, n / 4), n / rowBytes, k),
      },
      ...(codes
        ? [
            { from: tailAt, to: codes.paramsAt, unit: 8 },
            {
              from: codes.paramsAt,
              to: codes.paramsAt + codes.paramsBytes,
              unit: 8,
              check: (b: ArrayBuffer, n: number) => checkCodeParams(new Float64Array(b, 0, n / 8)),
            },
            { from: codes.paramsAt + codes.paramsBytes, to: size, unit: 8 },
          ]
        : [{ from: tailAt, to: size, unit: 8 }]),
    ];
    this.segments = segments.filter((s) => s.to > s.from);
    this.pos = this.segments[0]?.from ?? size;
    this.done = new Promise((resolve) => (this.settle = resolve));
    if (this.segments.length === 0) this.finish();
  }

  get state(): TailState {
    return this._state;
  }

  /** Why the check failed (undefined while pending or once passed). */
  get reason(): string | undefined {
    return this._reason;
  }

  /**
   * Runs the check with asynchronous reads until it ends (or ensure() ends it first); `signal`
   * stops it (CancelledError, and the check stays pending). Resolves when the check has ended.
   */
  async run(signal?: AbortSignal): Promise<void> {
    if (this.running) return;
    this.running = true;
    try {
      const scratch = new ArrayBuffer(this.blockBytes());
      const bytes = new Uint8Array(scratch);
      while (this._state === 'pending' && !this.stopped) {
        if (signal?.aborted) throw new CancelledError();
        const block = this.next();
        if (!block) break;
        let got = 0;
        try {
          while (got < block.len) {
            const { bytesRead } = await this.handle.read(bytes, got, block.len - got, block.at + got);
            if (bytesRead === 0) break;
            got += bytesRead;
          }
        } catch (err) {
          if (this._state !== 'pending' || this.stopped) break;
          this.fail(`cannot read it: ${describeFsError(err)}`);
          break;
        }
        if (this.stopped) break;
        // ensure() may have finished the check while the read was under way.
        if (this._state !== 'pending' || this.pos !== block.at) continue;
        if (got < block.len) this.fail('index file is shorter than its header says');
        else this.apply(scratch, block.len);
      }
    } finally {
      this.running = false;
    }
  }

  /** Stops a background run without a verdict (the file is being closed); ensure() still works until then. */
  stop(): void {
    this.stopped = true;
  }

  /** Starts run() in the background (never rejects). */
  start(): void {
    void this.run().catch(() => undefined);
  }

  /**
   * Finishes the check now, with synchronous reads, if it has not ended; throws DamagedRowsError
   * when it failed (now or before). Called before every read of a row or a code.
   */
  ensure(): void {
    if (this._state === 'pending') {
      const scratch = new ArrayBuffer(this.blockBytes());
      const bytes = new Uint8Array(scratch);
      for (let block = this.next(); block && this._state === 'pending'; block = this.next()) {
        let got = 0;
        try {
          while (got < block.len) {
            const n = readSync(this.handle.fd, bytes, got, block.len - got, block.at + got);
            if (n === 0) break;
            got += n;
          }
        } catch (err) {
          this.fail(`cannot read it: ${describeFsError(err)}`);
          break;
        }
        if (got < block.len) this.fail('index file is shorter than its header says');
        else this.apply(scratch, block.len);
      }
    }
    if (this._state === 'damaged') throw new DamagedRowsError(this.path, this._reason!);
  }

  /** Whole units of the widest segment's unit in ROW_CHECK_BYTES (at least one unit). */
  private blockBytes(): number {
    const unit = Math.max(8, ...this.segments.map((s) => s.unit));
    return Math.max(unit, ROW_CHECK_BYTES - (ROW_CHECK_BYTES % unit));
  }

  /** The next block to read: its byte offset and length (whole units of its segment), or null at the end. */
  private next(): { at: number; len: number } | null {
    const s = this.segments[this.seg];
    if (!s) return null;
    const room = Math.max(s.unit, this.blockBytes() - (this.blockBytes() % s.unit));
    return { at: this.pos, len: Math.min(room, s.to - this.pos) };
  }

  /** Takes the block at pos (its bytes at the start of scratch) into the checksum and checks it. */
  private apply(scratch: ArrayBuffer, len: number): void {
    const s = this.segments[this.seg];
    this.sum.update(new Uint8Array(scratch, 0, len));
    if (s.check && this.badBlock === undefined) {
      try {
        s.check(scratch, len);
      } catch (err) {
        this.badBlock = err instanceof CorruptIndexError ? err.message : String(err);
      }
    }
    this.pos += len;
    if (this.pos >= s.to) {
      this.seg++;
      if (this.seg < this.segments.length) this.pos = this.segments[this.seg].from;
      else this.finish();
    }
  }

  private finish(): void {
    if (this.sum.digest() !== this.expected) this.fail('index payload fails its checksum (damaged file)');
    else if (this.badBlock !== undefined) this.fail(this.badBlock);
    else {
      this._state = 'ok';
      this.settle(undefined);
    }
  }

  private fail(reason: string): void {
    if (this._state !== 'pending') return;
    this._state = 'damaged';
    this._reason = reason;
    this.settle(reason);
  }
}
