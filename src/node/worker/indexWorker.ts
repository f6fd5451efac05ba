/**
 * Entry point of the index worker thread (bundled to dist/indexWorker.js). Scanning, reading,
 * tokenizing, the SVD, searches and saving all happen here, off the editor's extension host.
 */
import { parentPort, receiveMessageOnPort } from 'node:worker_threads';
import { IndexService } from './indexService.js';
import { serve } from './server.js';

if (!parentPort) throw new Error('indexWorker.js must be started as a worker thread.');
const port = parentPort;
const service = new IndexService();
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
