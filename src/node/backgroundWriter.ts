/**
 * Writes a file's bytes on a thread of their own while the caller goes on making them: the caller
 * fills a slot of one shared buffer (take), hands it over with its position (send), and takes the
 * next; the thread writes each slot (writeSync, in the order sent) and gives it back. The caller
 * stays synchronous (it waits with Atomics.wait only when every slot is out), so what it writes is
 * still one snapshot of its data. `written` says how many bytes the thread has written so far.
 * A failed write is reported to the caller by its next take, send or finish, as an Error carrying
 * the system's code (ENOSPC, EIO, …); nothing after it is written.
 * Defaults (common practice, not tuned): 4 slots of 4 MB.
 */
import { Worker } from 'node:worker_threads';
import { UndertoneError } from '../core/errors.js';

export interface BackgroundWriterOptions {
  /** Slots (buffers in flight). @default 4 */
  readonly slots: number;
  /** Bytes of a slot. @default 4 MiB */
  readonly slotBytes: number;
}

export const DEFAULT_BACKGROUND_WRITER_OPTIONS: BackgroundWriterOptions = Object.freeze({
  slots: 4,
  slotBytes: 4 << 20,
});

// The shared control words.
/** Slots sent so far. */
const SENT = 0;
/** Slots written (or passed over after a failure) so far. */
const DONE = 1;
/** 1 once a write failed. */
const FAILED = 2;
/** 1 once the caller has no more to send. */
const STOP = 3;
/** Bumped on every send and on stop: what the thread waits on. */
const WAKE = 4;
/** 1 once the thread runs. */
const STARTED = 5;
const CONTROL_WORDS = 6;
/** How long a caller waits for a thread that never started before giving up (our choice). */
const START_TIMEOUT_MS = 30_000;
/** Bytes for the failure's code (ASCII). */
const CODE_BYTES = 32;

/** The thread (plain CommonJS, evaluated: no bundled file to find). */
const THREAD = `
const { workerData } = require('node:worker_threads');
const { writeSync } = require('node:fs');
const { fd, control, meta, data, code, slots, slotBytes } = workerData;
const [SENT, DONE, FAILED, STOP, WAKE] = [${SENT}, ${DONE}, ${FAILED}, ${STOP}, ${WAKE}];
Atomics.store(control, ${STARTED}, 1);
let done = 0;
for (;;) {
  const wake = Atomics.load(control, WAKE);
  if (done < Atomics.load(control, SENT)) {
    const slot = done % slots;
    if (Atomics.load(control, FAILED) === 0) {
      try {
        const length = meta[2 * slot];
        const position = meta[2 * slot + 1];
        const bytes = new Uint8Array(data, slot * slotBytes, length);
        for (let at = 0; at < length; ) at += writeSync(fd, bytes, at, length - at, position + at);
        meta[2 * slots] += length;
      } catch (err) {
        const text = String((err && err.code) || (err && err.message) || 'write failed').slice(0, code.length);
        for (let i = 0; i < text.length; i++) code[i] = text.charCodeAt(i) & 127;
        Atomics.store(control, FAILED, 1);
      }
    }
    done++;
    Atomics.store(control, DONE, done);
    Atomics.notify(control, DONE);
    continue;
  }
  if (Atomics.load(control, STOP) === 1) break;
  Atomics.wait(control, WAKE, wake);
}
`;

/** The code of a thread that never started. */
const NOT_STARTED = 'ENOTHREAD';

/** A write of the background thread failed; `code` is the system's code (ENOSPC, …). */
export class BackgroundWriteError extends UndertoneError {
  constructor(readonly code: string) {
    super(code === NOT_STARTED ? 'the writing thread did not start' : `writing failed (${code})`);
  }
}

export class BackgroundWriter {
  private readonly _control: Int32Array;
  private readonly _meta: Float64Array;
  private readonly _data: SharedArrayBuffer;
  private readonly _code: Uint8Array;
  private readonly _worker: Worker;
  private _sent = 0;
  private _taken = -1;
  private _stopped = false;

  /**
   * Starts the thread for a descriptor open for writing (the caller closes it, after finish).
   * @returns null where no thread can be started (then the caller writes itself).
   */
  static start(fd: number, options: Partial<BackgroundWriterOptions> = {}): BackgroundWriter | null {
    const o = { ...DEFAULT_BACKGROUND_WRITER_OPTIONS, ...options };
    try {
      return new BackgroundWriter(fd, Math.max(1, Math.floor(o.slots)), Math.max(1, Math.floor(o.slotBytes)));
    } catch {
      return null;
    }
  }

  private constructor(
    fd: number,
    private readonly _slots: number,
    readonly slotBytes: number,
  ) {
    this._control = new Int32Array(new SharedArrayBuffer(4 * CONTROL_WORDS));
    // Each slot's length and position, then the bytes written in all.
    this._meta = new Float64Array(new SharedArrayBuffer(16 * _slots + 8));
    this._data = new SharedArrayBuffer(_slots * slotBytes);
    this._code = new Uint8Array(new SharedArrayBuffer(CODE_BYTES));
    this._worker = new Worker(THREAD, {
      eval: true,
      name: 'undertone-writer',
      workerData: { fd, control: this._control, meta: this._meta, data: this._data, code: this._code, slots: _slots, slotBytes },
      resourceLimits: { maxOldGenerationSizeMb: 16, maxYoungGenerationSizeMb: 2 },
    });
    this._worker.unref();
    // A thread that dies reports through 'error' (seen only when the caller is not waiting: a
    // thread that never starts is caught by the start timeout instead).
    this._worker.on('error', (err) => this._fail(String((err as NodeJS.ErrnoException).code ?? err.message)));
  }

  /** Bytes the thread has written so far (in the order sent). */
  get written(): number {
    Atomics.load(this._control, DONE); // what the thread wrote before it counted a slot done
    return this._meta[2 * this._slots];
  }

  /**
   * The next slot to fill (slotBytes long), once the thread has given it back.
   * @throws BackgroundWriteError when an earlier write failed.
   */
  take(): Uint8Array {
    if (this._taken >= 0) return new Uint8Array(this._data, this._taken * this.slotBytes, this.slotBytes);
    this._check();
    // Wait while every slot is out.
    for (;;) {
      const done = Atomics.load(this._control, DONE);
      if (this._sent - done < this._slots) break;
      this._wait(done);
    }
    this._taken = this._sent % this._slots;
    return new Uint8Array(this._data, this._taken * this.slotBytes, this.slotBytes);
  }

  /**
   * Hands the slot last taken to the thread: its first `length` bytes go to `position`.
   * @throws BackgroundWriteError when an earlier write failed.
   */
  send(length: number, position: number): void {
    if (this._taken < 0) throw new RangeError('send without a slot taken');
    if (length < 0 || length > this.slotBytes) throw new RangeError(`a slot holds 0 to ${this.slotBytes} bytes, not ${length}`);
    this._check();
    this._meta[2 * this._taken] = length;
    this._meta[2 * this._taken + 1] = position;
    this._taken = -1;
    this._sent++;
    Atomics.store(this._control, SENT, this._sent);
    Atomics.add(this._control, WAKE, 1);
    Atomics.notify(this._control, WAKE);
  }

  /**
   * Waits until everything sent is written, then lets the thread end.
   * @throws BackgroundWriteError when a write failed.
   */
  finish(): void {
    for (;;) {
      const done = Atomics.load(this._control, DONE);
      if (done >= this._sent) break;
      this._wait(done);
    }
    this.close();
    this._check();
  }

  /** Lets the thread end (after what was sent; nothing more can be sent). */
  close(): void {
    if (this._stopped) return;
    this._stopped = true;
    Atomics.store(this._control, STOP, 1);
    Atomics.add(this._control, WAKE, 1);
    Atomics.notify(this._control, WAKE);
  }

  /** Waits for the thread to write more than `done` slots. */
  private _wait(done: number): void {
    const from = Date.now();
    while (Atomics.load(this._control, DONE) === done) {
      this._check();
      if (Atomics.load(this._control, STARTED) === 0 && Date.now() - from > START_TIMEOUT_MS) this._fail(NOT_STARTED);
      else Atomics.wait(this._control, DONE, done, 1000);
    }
    this._check();
  }

  private _fail(code: string): void {
    const text = code.slice(0, CODE_BYTES);
    for (let i = 0; i < text.length; i++) this._code[i] = text.charCodeAt(i) & 127;
    Atomics.store(this._control, FAILED, 1);
    // Nothing more will be written: release a caller waiting for a slot.
    Atomics.store(this._control, DONE, 2 ** 31 - 1);
    Atomics.notify(this._control, DONE);
  }

  private _check(): void {
    if (Atomics.load(this._control, FAILED) === 0) return;
    let end = 0;
    while (end < CODE_BYTES && this._code[end] !== 0) end++;
    throw new BackgroundWriteError(String.fromCharCode(...this._code.subarray(0, end)) || 'write failed');
  }
}
