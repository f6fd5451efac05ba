import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { INDEX_WORKER_LIMITS, indexWorkerOptions } from '../../../src/node/worker/workerLimits.js';

/** Node's worker_threads documentation: a worker sees its own limits as `resourceLimits`. */
describe('INDEX_WORKER_LIMITS', () => {
  it('caps the young generation below the default of V8 (semi-spaces of up to 16 MB each, from memory)', () => {
    expect(INDEX_WORKER_LIMITS.maxYoungGenerationSizeMb).toBeGreaterThan(0);
    expect(INDEX_WORKER_LIMITS.maxYoungGenerationSizeMb).toBeLessThan(16);
  });

  it('is accepted by a worker thread started as the extension starts it, which then runs under that cap', async () => {
    const src = "const { parentPort, resourceLimits } = require('node:worker_threads'); parentPort.postMessage(resourceLimits);";
    const worker = new Worker(src, { ...indexWorkerOptions(), eval: true });
    const seen = await new Promise<{ maxYoungGenerationSizeMb: number }>((resolve, reject) => {
      worker.once('message', resolve);
      worker.once('error', reject);
    });
    await worker.terminate();
    expect(seen.maxYoungGenerationSizeMb).toBe(INDEX_WORKER_LIMITS.maxYoungGenerationSizeMb);
  });
});
