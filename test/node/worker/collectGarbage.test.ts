import { describe, expect, it } from 'vitest';
import { garbageCollector } from '../../../src/node/worker/collectGarbage.js';

/** Makes a 64 MB buffer that is garbage once this returns; the buffers' total while it lived. */
function allocateAndDrop(): number {
  const block = new Uint8Array(64 << 20).fill(1);
  return process.memoryUsage().arrayBuffers + block[123] - 1;
}

describe('garbageCollector', () => {
  it('frees an unreachable 64 MB buffer when called', () => {
    const collect = garbageCollector();
    collect();
    const before = process.memoryUsage().arrayBuffers;
    expect(allocateAndDrop() - before).toBeGreaterThan(48 << 20);
    collect();
    expect(process.memoryUsage().arrayBuffers - before).toBeLessThan(16 << 20);
  });
});
