/**
 * Entry point of the index worker thread (bundled to dist/indexWorker.js). Scanning, reading,
 * tokenizing, the SVD, searches and saving all happen here, off the editor's extension host.
 */
import { parentPort } from 'node:worker_threads';
import { IndexService } from './indexService.js';
import { serve } from './server.js';

if (!parentPort) throw new Error('indexWorker.js must be started as a worker thread.');
serve(parentPort, new IndexService().handlers());
