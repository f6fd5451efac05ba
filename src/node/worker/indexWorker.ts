/**
 * Entry point of the index worker thread (bundled to dist/indexWorker.js). Scanning, reading,
 * tokenizing, the SVD, searches and saving all happen here, off the editor's extension host.
 */
import { parentPort, receiveMessageOnPort } from 'node:worker_threads';
import { garbageCollector } from './collectGarbage.js';
import { IndexService } from './indexService.js';
import { serve } from './server.js';

if (!parentPort) throw new Error('indexWorker.js must be started as a worker thread.');
const port = parentPort;
// A full collection once the memory of a build or of reading the index file is garbage
// (collectGarbage.ts); the engine's flag is set only then.
let collect: (() => void) | undefined;
const service = new IndexService({ settled: () => (collect ??= garbageCollector())() });
serve(
  {
    postMessage: (message) => port.postMessage(message),
    on: (event, listener) => port.on(event, listener),
    // Read during the build's synchronous steps, so a first build can answer word-match searches.
    receive: () => receiveMessageOnPort(port),
  },
  service.handlers(),
  service.immediateHandlers(),
);
