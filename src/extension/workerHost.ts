/**
 * Starts the index worker (dist/indexWorker.js beside dist/extension.js) and hands back a client
 * plus a disposer that ends the thread. The worker holds the index; the extension host keeps
 * only paths and scores.
 */
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { WorkerClient } from '../node/worker/client.js';
import { indexWorkerOptions } from '../node/worker/workerLimits.js';

export interface StartedWorker {
  readonly client: WorkerClient;
  /** Ends the thread (pending requests are rejected). */
  stop(): Promise<void>;
}

export function startIndexWorker(extensionPath: string, onExit: (code: number) => void): StartedWorker {
  const worker = new Worker(join(extensionPath, 'dist', 'indexWorker.js'), indexWorkerOptions());
  const client = new WorkerClient(worker);
  let stopping = false;
  worker.on('exit', (code) => {
    if (!stopping) onExit(code);
  });
  worker.on('error', () => undefined); // reported to the client, which fails pending requests
  return {
    client,
    async stop() {
      stopping = true;
      await worker.terminate();
    },
  };
}
