import { describe, expect, it } from 'vitest';
import { garbageCollector } from '../../../src/node/worker/collectGarbage.js';

describe('garbageCollector', () => {
  it('frees an unreachable 64 MB buffer when called', () => {
    const collect = garbageCollector();
    collect();
    const before = process.memoryUsage().arrayBuffers;
    const held = [new Uint8Array(64 << 20).fill(1)];
    expect(process.memoryUsage().arrayBuffers - before).toBeGreaterThan(48 << 20);
    expect(held.pop()![123]).toBe(1);
    collect();
    expect(process.memoryUsage().arrayBuffers - before).toBeLessThan(16 << 20);
  });
});
