import { MessageChannel } from 'node:worker_threads';
import { afterEach, describe, expect, it } from 'vitest';
import { CancelledError } from '../../../src/core/errors.js';
import { isCancelled, WorkerClient, WorkerGoneError, type PortLike } from '../../../src/node/worker/client.js';
import type { Progress } from '../../../src/node/worker/workerProtocol.js';
import { serve, type Handlers } from '../../../src/node/worker/server.js';

// Client and server over an in-process MessageChannel: the same structured-clone path a worker
// thread uses, without starting one.
const channels: MessageChannel[] = [];
afterEach(() => {
  for (const c of channels.splice(0)) {
    c.port1.close();
    c.port2.close();
  }
});

function connect(overrides: Partial<Handlers>): WorkerClient {
  const channel = new MessageChannel();
  channels.push(channel);
  const fail = async (): Promise<never> => {
    throw new Error('not used in this test');
  };
  const handlers = {
    configure: fail,
    load: fail,
    refresh: fail,
    build: fail,
    update: fail,
    search: fail,
    nearby: fail,
    save: fail,
    deleteIndex: fail,
    ...overrides,
  } as Handlers;
  serve(channel.port2, handlers);
  return new WorkerClient(channel.port1 as unknown as PortLike);
}

describe('WorkerClient with serve()', () => {
  it('matches each answer to its request even when answers come back out of order', async () => {
    const client = connect({
      nearby: async ({ fsPath, top }) => {
        await new Promise((r) => setTimeout(r, fsPath === 'slow' ? 30 : 1));
        return [{ key: fsPath, fsPath, folder: 'f', relPath: fsPath, score: top }];
      },
    });
    const [slow, fast] = await Promise.all([
      client.request('nearby', { fsPath: 'slow', top: 1 }),
      client.request('nearby', { fsPath: 'fast', top: 2 }),
    ]);
    expect(slow![0]).toMatchObject({ key: 'slow', score: 1 });
    expect(fast![0]).toMatchObject({ key: 'fast', score: 2 });
    expect(client.pendingCount).toBe(0);
  });

  it('delivers progress events before the result', async () => {
    const client = connect({
      build: async (_p, ctx) => {
        ctx.progress({ stage: 'read', done: 1, total: 2 });
        ctx.progress({ stage: 'svd', done: 2, total: 2 });
        return {
          summary: { files: 1, k: 1, terms: 1, staleness: { changedFiles: 0, changedShare: 0, newTermMass: 0, residualRatio: 1 } },
          read: 1,
          reused: 0,
          skipped: 0,
          seconds: 0,
        };
      },
    });
    const seen: Progress[] = [];
    const report = await client.request('build', {}, { onProgress: (p) => seen.push(p) });
    expect(seen.map((p) => p.stage)).toEqual(['read', 'svd']);
    expect(report.read).toBe(1);
  });

  it('rejects with the worker-side error name and message', async () => {
    const client = connect({ search: async () => Promise.reject(new RangeError('query too long')) });
    await expect(client.request('search', { query: 'x', top: 1 })).rejects.toMatchObject({ name: 'RangeError', message: 'query too long' });
  });

  it('cancels a running request through its signal', async () => {
    const client = connect({
      build: async (_p, ctx) => {
        await new Promise<void>((resolve) => ctx.signal.addEventListener('abort', () => resolve(), { once: true }));
        if (ctx.isCancelled()) throw new CancelledError();
        throw new Error('not cancelled');
      },
    });
    const controller = new AbortController();
    const pending = client.request('build', {}, { signal: controller.signal });
    setTimeout(() => controller.abort(), 5);
    const err = await pending.catch((e: unknown) => e);
    expect(isCancelled(err)).toBe(true);
  });

  it('rejects every pending request when the worker goes away', async () => {
    const listeners = new Map<string, (x: never) => void>();
    const port: PortLike = {
      postMessage: () => undefined,
      on: (event: string, fn: (x: never) => void) => listeners.set(event, fn),
    } as PortLike;
    const client = new WorkerClient(port);
    const a = client.request('save', {});
    const b = client.request('load', {});
    listeners.get('exit')!(1 as never);
    await expect(a).rejects.toBeInstanceOf(WorkerGoneError);
    await expect(b).rejects.toBeInstanceOf(WorkerGoneError);
    expect(client.alive).toBe(false);
    await expect(client.request('save', {})).rejects.toBeInstanceOf(WorkerGoneError);
  });
});
