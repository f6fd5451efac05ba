/**
 * Entry point of a parallel worker thread (bundled to dist/parallelWorker.js): reads and
 * tokenizes batches of files for the folder indexer, and runs its share of the SVD's matrix
 * products on shared memory (kernelTasks.ts).
 */
import { parentPort } from 'node:worker_threads';
import { instantiateKernels, type KernelExports } from '../../core/matrix/wasm/wasmArena.js';
import { CTRL_FAILED, CTRL_FINISHED, drainTasks } from './kernelTasks.js';
import type { FileOutcome, FromWorker, ToWorker } from './protocol.js';
import { decodeUtf8 } from '../scanRead.js';
import { FileReader } from './readTextSync.js';
import { WordCounter } from './wordCounter.js';

if (!parentPort) throw new Error('parallelWorker.js must be started as a worker thread.');
const port = parentPort;
let counter: WordCounter | undefined;
const reader = new FileReader();
let maxFileBytes = 1_048_576;
let kernels: KernelExports | undefined;
let memory: WebAssembly.Memory | undefined;

port.on('message', (msg: ToWorker) => {
  if (msg.type === 'wasm-init') {
    kernels = instantiateKernels(msg.module, msg.memory);
    memory = msg.memory;
    return;
  }
  if (msg.type === 'kernel') {
    try {
      if (!kernels || !memory) throw new Error('kernel job before wasm-init');
      drainTasks(kernels, msg.job, msg.ctrl, memory);
    } catch {
      Atomics.store(msg.ctrl, CTRL_FAILED, 1);
    } finally {
      Atomics.add(msg.ctrl, CTRL_FINISHED, 1);
      Atomics.notify(msg.ctrl, CTRL_FINISHED);
    }
    return;
  }
  if (msg.type === 'sort-terms') {
    const order = (counter ?? new WordCounter({})).sortedTermOrder();
    const reply: FromWorker = { type: 'term-order', order };
    port.postMessage(reply, [order.buffer as ArrayBuffer]);
    return;
  }
  if (msg.type === 'setup') {
    counter = new WordCounter(msg.tokenize);
    maxFileBytes = msg.maxFileBytes;
    return;
  }
  try {
    const wc = counter ?? (counter = new WordCounter({}));
    const files: FileOutcome[] = [];
    const transfer: ArrayBuffer[] = [];
    for (const f of msg.files) {
      const got = reader.read(f.absPath, maxFileBytes);
      if (got.kind !== 'bytes') {
        files.push({ index: f.index, kind: got.kind });
        continue;
      }
      const c = got.ascii ? wc.countAscii(got.bytes) : wc.count(decodeUtf8(got.bytes));
      files.push({ index: f.index, kind: 'text', ids: c.ids, counts: c.counts, length: c.length });
      transfer.push(c.ids.buffer as ArrayBuffer, c.counts.buffer as ArrayBuffer);
    }
    const reply: FromWorker = { type: 'batch', batch: msg.batch, newTerms: wc.takeNewTerms(), files };
    port.postMessage(reply, transfer);
  } catch (err) {
    const reply: FromWorker = { type: 'error', message: err instanceof Error ? err.message : String(err) };
    port.postMessage(reply);
  }
});
