/**
 * The worker end of the protocol: dispatches each request to its handler with an AbortSignal
 * (fired by a cancel message for that id) and a progress callback, and answers exactly once.
 * Requests run concurrently as far as their handlers await; a handler that must not overlap with
 * another guards itself.
 */
import {
  isHostMessage,
  toWireError,
  type ParamsOf,
  type Progress,
  type RequestType,
  type ResultOf,
  type WorkerMessage,
} from './workerProtocol.js';

export interface HandlerContext {
  /** Fired when the cancel message is read. */
  readonly signal: AbortSignal;
  /** True once cancelled, read from shared memory too, so it works inside synchronous steps. */
  readonly isCancelled: () => boolean;
  readonly progress: (p: Progress) => void;
}

export type Handlers = { [T in RequestType]: (params: ParamsOf<T>, ctx: HandlerContext) => Promise<ResultOf<T>> };

/** The part of node:worker_threads' parentPort (or a MessagePort) the server uses. */
export interface ServerPort {
  postMessage(message: WorkerMessage): void;
  on(event: 'message', listener: (message: unknown) => void): unknown;
}

/** Starts answering requests arriving on the port. */
export function serve(port: ServerPort, handlers: Handlers): void {
  const running = new Map<number, AbortController>();
  port.on('message', (message) => {
    if (!isHostMessage(message)) return;
    if (message.kind === 'cancel') {
      running.get(message.id)?.abort();
      return;
    }
    const { id } = message;
    const controller = new AbortController();
    running.set(id, controller);
    const flag = message.cancelFlag;
    const ctx: HandlerContext = {
      signal: controller.signal,
      isCancelled: () => controller.signal.aborted || (flag !== undefined && Atomics.load(flag, 0) === 1),
      progress: (progress) => port.postMessage({ kind: 'progress', id, progress }),
    };
    const handler = handlers[message.type] as (params: unknown, ctx: HandlerContext) => Promise<unknown>;
    let answer: Promise<unknown>;
    try {
      answer = handler(message.params, ctx);
    } catch (err) {
      answer = Promise.reject(err);
    }
    answer
      .then(
        (result) => port.postMessage({ kind: 'result', id, result }),
        (err: unknown) => port.postMessage({ kind: 'error', id, error: toWireError(err) }),
      )
      .finally(() => running.delete(id));
  });
}
