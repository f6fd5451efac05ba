import { MessageChannel, receiveMessageOnPort } from 'node:worker_threads';
import { afterEach, describe, expect, it } from 'vitest';
import { WorkerClient, type PortLike } from '../../../src/node/worker/client.js';
import type { SearchMatch } from '../../../src/node/worker/workerProtocol.js';
import { serve, type Handlers } from '../../../src/node/worker/server.js';

// The server over an in-process MessageChannel (the structured-clone path of a worker thread),
// with the port read synchronously as indexWorker.ts reads parentPort.
const channels: MessageChannel[] = [];
afterEach(() => {
  for (const c of channels.splice(0)) {
    c.port1.close();
    c.port2.close();
  }
});

const match = (key: string): SearchMatch => ({ key, fsPath: `/w/${key}`, folder: 'w', relPath: key, score: 1, line: 0, lineText: '' });

describe('pump: messages read during a synchronous step', () => {
  it('answers a search on the spot while a handler holds the thread, and dispatches the others afterwards in order', async () => {
    const channel = new MessageChannel();
    channels.push(channel);
    const events: string[] = [];
    let holding = false;
    const handlers = {
      build: async (_p: unknown, ctx: { pump?: () => void }) => {
        holding = true;
        // A synchronous step that polls, as the SVD does through the pipeline's cancel checks.
        const until = Date.now() + 2000;
        while (Date.now() < until && !events.includes('search answered now')) ctx.pump?.();
        holding = false;
        events.push('build finished');
        return { summary: { files: 0, k: 0, terms: 0, staleness: {} }, read: 0, reused: 0, skipped: 0, seconds: 0 };
      },
      search: async () => {
        events.push('search dispatched');
        return [match('late.md')];
      },
      nearby: async () => {
        events.push(`nearby dispatched${holding ? ' while holding' : ''}`);
        return null;
      },
    } as unknown as Handlers;
    serve(
      {
        postMessage: (m) => channel.port2.postMessage(m),
        on: (e, l) => channel.port2.on(e, l),
        receive: () => receiveMessageOnPort(channel.port2),
      },
      handlers,
      {
        search: ({ query }) => {
          if (!holding) return undefined;
          events.push('search answered now');
          return [match(`${query}.md`)];
        },
      },
    );
    const client = new WorkerClient(channel.port1 as unknown as PortLike);
    const build = client.request('build', {});
    const search = client.request('search', { query: 'early', top: 5 });
    const nearby = client.request('nearby', { fsPath: '/w/a.md', top: 5 });
    const first = await Promise.race([search.then(() => 'search'), build.then(() => 'build')]);
    expect(first).toBe('search');
    expect((await search).map((m) => m.key)).toEqual(['early.md']);
    await build;
    expect(await nearby).toBeNull();
    // The nearby request was read during the step but handled only once the thread was free.
    expect(events).toEqual(['search answered now', 'build finished', 'nearby dispatched']);
  });
});
