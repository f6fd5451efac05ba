/** BatchQueue (how batches are handed to the tokenizing threads), checked by brute force. */
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { BatchQueue } from '../../../src/node/parallel/parallelCount.js';

describe('BatchQueue', () => {
  it('hands out every batch exactly once, whatever order the workers ask in', () => {
    const rnd = createRandom(3);
    for (const [count, workers] of [
      [0, 2],
      [1, 2],
      [7, 2],
      [100, 3],
      [185, 2],
      [5, 8],
    ]) {
      const q = new BatchQueue(count, workers);
      const got: number[] = [];
      for (;;) {
        const b = q.next(Math.floor(rnd.next() * workers));
        if (b < 0) break;
        got.push(b);
      }
      expect(q.empty).toBe(true);
      expect(got.sort((a, b) => a - b)).toEqual(Array.from({ length: count }, (_, i) => i));
    }
  });

  it('gives each worker its own contiguous share first, then the back of the largest share left', () => {
    const q = new BatchQueue(10, 2);
    expect([q.next(0), q.next(0), q.next(1), q.next(0)]).toEqual([0, 1, 5, 2]);
    expect([q.next(0), q.next(0)]).toEqual([3, 4]);
    // Worker 0's share is done; worker 1 has 6..9 left: 0 takes from the back.
    expect([q.next(0), q.next(1), q.next(0)]).toEqual([9, 6, 8]);
    expect([q.next(1), q.next(1)]).toEqual([7, -1]);
  });
});
