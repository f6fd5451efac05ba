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
  /**
   * Reads the messages waiting on the port and answers those an immediate handler can answer on
   * the spot (the others are dispatched as usual once this thread is free; cancels take effect at
   * once). For handlers that run long synchronous steps (the SVD): call it between steps.
   */
  readonly pump?: () => void;
}

export type Handlers = { [T in RequestType]: (params: ParamsOf<T>, ctx: HandlerContext) => Promise<ResultOf<T>> };

/**
 * Synchronous answers for requests read by pump() while a synchronous step runs: a result, or
 * undefined to have the request dispatched as usual afterwards.
 */
export type ImmediateHandlers = { [T in RequestType]?: (params: ParamsOf<T>) => ResultOf<T> | undefined };

/** The part of node:worker_threads' parentPort (or a MessagePort) the server uses. */
export interface ServerPort {
  postMessage(message: WorkerMessage): void;
  on(event: 'message', listener: (message: unknown) => void): unknown;
  /** The next waiting message, read synchronously (node:worker_threads' receiveMessageOnPort), if the port can. */
  receive?(): { readonly message: unknown } | undefined;
}

/** Starts answering requests arriving on the port. */
export function serve(port: ServerPort, handlers: Handlers, immediate: ImmediateHandlers = {}): void {
  const running = new Map<number, AbortController>();
  const dispatch = (message: unknown): void => {
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
      pump,
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
  };
  /** Answers now what can be answered now; the rest goes first once this thread is free (a microtask). */
  function pump(): void {
    for (let got = port.receive?.(); got !== undefined; got = port.receive?.()) {
      const message = got.message;
      if (!isHostMessage(message)) continue;
      const now = message.kind === 'request' ? (immediate[message.type] as ((p: unknown) => unknown) | undefined) : undefined;
      if (now && message.kind === 'request') {
        try {
          const result = now(message.params);
          if (result !== undefined) {
            port.postMessage({ kind: 'result', id: message.id, result });
            continue;
          }
        } catch (err) {
          port.postMessage({ kind: 'error', id: message.id, error: toWireError(err) });
          continue;
        }
      }
      if (message.kind === 'cancel') dispatch(message);
      else queueMicrotask(() => dispatch(message));
    }
  }
  port.on('message', dispatch);
}
