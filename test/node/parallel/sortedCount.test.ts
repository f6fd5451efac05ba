import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { mergeSorted } from '../../../src/node/parallel/sortedCount.js';

// Reference: the sorted union of the threads' term sets (Array.prototype.sort, UTF-16 order),
// and each local term's position in it, by brute force.
describe('mergeSorted', () => {
  it('gives the sorted union of overlapping term lists and maps every local id to its term', () => {
    const rnd = createRandom(3);
    const words = Array.from({ length: 3000 }, (_, i) => `${'abcé日'[i % 5]}${Math.floor(rnd.next() * 1e6).toString(36)}`);
    const lists = [0, 1, 2].map((w) => [...new Set(words.filter(() => rnd.next() < 0.4 + 0.2 * w))]);
    const orders = lists.map((l) => Int32Array.from([...l.keys()].sort((a, b) => (l[a] < l[b] ? -1 : l[a] > l[b] ? 1 : 0))));
    const { sorted, translate } = mergeSorted(lists, orders);
    const union = [...new Set(lists.flat())].sort();
    expect(sorted).toEqual(union);
    lists.forEach((l, w) => expect(Array.from(translate[w], (id) => sorted[id])).toEqual(l));
  });

  it('handles empty lists beside others', () => {
    const { sorted, translate } = mergeSorted([[], ['b', 'a'], []], [new Int32Array(0), Int32Array.from([1, 0]), new Int32Array(0)]);
    expect(sorted).toEqual(['a', 'b']);
    expect(Array.from(translate[1])).toEqual([1, 0]);
  });
});
