/**
 * The host end of the worker protocol: numbered requests, one promise per request, progress
 * callbacks, cancellation by AbortSignal. Works over anything shaped like a worker's message port,
 * so tests can drive it without a thread. When the worker dies every pending request is rejected.
 */
import {
  isWorkerMessage,
  type HostMessage,
  type ParamsOf,
  type Progress,
  type Request,
  type RequestType,
  type ResultOf,
} from './workerProtocol.js';
import { errorKind, WorkerRequestError } from './workerErrors.js';

/** The part of node:worker_threads' Worker (or a MessagePort) the client uses. */
export interface PortLike {
  postMessage(message: HostMessage): void;
  on(event: 'message', listener: (message: unknown) => void): unknown;
  on(event: 'error', listener: (err: Error) => void): unknown;
  on(event: 'exit', listener: (code: number) => void): unknown;
}

export { WorkerRequestError } from './workerErrors.js';

/** The worker stopped (crashed or was terminated) while requests were pending. */
export class WorkerGoneError extends Error {
  constructor(detail: string) {
    super(`The index worker stopped: ${detail}`);
    this.name = 'WorkerGoneError';
  }
}

export interface RequestOptions {
  onProgress?: (p: Progress) => void;
  signal?: AbortSignal;
}

interface Pending {
  resolve: (value: unknown) => void;
  reject: (err: Error) => void;
  onProgress?: (p: Progress) => void;
  cleanup: () => void;
}

export class WorkerClient {
  private _nextId = 1;
  private readonly _pending = new Map<number, Pending>();
  private _gone: Error | undefined;

  constructor(private readonly _port: PortLike) {
    _port.on('message', (m) => this.onMessage(m));
    _port.on('error', (err) => this.fail(new WorkerGoneError(err.message)));
    _port.on('exit', (code) => this.fail(new WorkerGoneError(`exit code ${code}`)));
  }

  /** True until the worker has stopped. */
  get alive(): boolean {
    return this._gone === undefined;
  }

  get pendingCount(): number {
    return this._pending.size;
  }

  request<T extends RequestType>(type: T, params: ParamsOf<T>, options: RequestOptions = {}): Promise<ResultOf<T>> {
    if (this._gone) return Promise.reject(this._gone);
    const id = this._nextId++;
    return new Promise<ResultOf<T>>((resolve, reject) => {
      const { signal } = options;
      const cancelFlag = signal && typeof SharedArrayBuffer === 'function' ? new Int32Array(new SharedArrayBuffer(4)) : undefined;
      const onAbort = (): void => {
        if (cancelFlag) Atomics.store(cancelFlag, 0, 1);
        this._port.postMessage({ kind: 'cancel', id });
      };
      signal?.addEventListener('abort', onAbort, { once: true });
      this._pending.set(id, {
        resolve: resolve as (value: unknown) => void,
        reject,
        onProgress: options.onProgress,
        cleanup: () => signal?.removeEventListener('abort', onAbort),
      });
      this._port.postMessage({ kind: 'request', id, type, params, cancelFlag } as Request);
      if (signal?.aborted) onAbort();
    });
  }

  private onMessage(message: unknown): void {
    if (!isWorkerMessage(message)) return;
    const pending = this._pending.get(message.id);
    if (!pending) return;
    if (message.kind === 'progress') {
      pending.onProgress?.(message.progress);
      return;
    }
    this._pending.delete(message.id);
    pending.cleanup();
    if (message.kind === 'result') pending.resolve(message.result);
    else pending.reject(new WorkerRequestError(message.error));
  }

  private fail(err: Error): void {
    if (this._gone) return;
    this._gone = err;
    for (const p of this._pending.values()) {
      p.cleanup();
      p.reject(err);
    }
    this._pending.clear();
  }
}

/** True when an error from a request means it was cancelled. */
export function isCancelled(err: unknown): boolean {
  return errorKind(err) === 'cancelled';
}
