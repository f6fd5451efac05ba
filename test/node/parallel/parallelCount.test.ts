/** BatchQueue (how batches are handed to the tokenizing threads) and translateRun, checked by brute force. */
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/core/random.js';
import { BatchQueue, mapRankedRun, rankSmallRun, translateRun, translateSmallRun } from '../../../src/node/parallel/parallelCount.js';
import { SECTION_COUNT_BIG } from '../../../src/node/parallel/wordCounter.js';

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

describe('translateRun', () => {
  // Runs of distinct local ids with counts, a local → final id map (a random permutation).
  const rnd = createRandom(11);
  const terms = 500;
  const tr = Int32Array.from({ length: terms }, (_, i) => i);
  for (let i = terms - 1; i > 0; i--) {
    const j = Math.floor(rnd.next() * (i + 1));
    [tr[i], tr[j]] = [tr[j], tr[i]];
  }
  const runs = [0, 40, 41, 300, 300, 520];
  const ids = new Int32Array(520);
  const counts = new Int32Array(520);
  for (let r = 0; r + 1 < runs.length; r++) {
    const pick = [...tr.keys()].sort(() => rnd.next() - 0.5).slice(0, runs[r + 1] - runs[r]);
    pick.forEach((id, i) => {
      ids[runs[r] + i] = id;
      counts[runs[r] + i] = 1 + Math.floor(rnd.next() * 3_000_000);
    });
  }
  // Brute force: each run's (final id, count) pairs sorted by final id.
  const expected = runs
    .slice(0, -1)
    .flatMap((from, r) =>
      Array.from({ length: runs[r + 1] - from }, (_, i) => [tr[ids[from + i]], counts[from + i]]).sort((a, b) => a[0] - b[0]),
    );

  it('sorts each run by final id, counts following, into fresh arrays', () => {
    const termIds = new Int32Array(520);
    const out = new Float32Array(520);
    for (let r = 0; r + 1 < runs.length; r++) translateRun(ids, counts, runs[r], runs[r + 1], tr, termIds, out);
    expect(Array.from(termIds, (id, i) => [id, out[i]])).toEqual(expected);
  });

  it('sorts short runs (by insertion) and long ones (native sort) alike, in place (reference: Array.prototype.sort)', () => {
    const lengths = Array.from({ length: 40 }, (_, i) => i).concat([64, 100]);
    const at = [0];
    for (const n of lengths) at.push(at.at(-1)! + n);
    const inIds = new Int32Array(at.at(-1)!);
    const inCounts = new Int32Array(inIds.length);
    for (let r = 0; r < lengths.length; r++) {
      const pick = [...tr.keys()].sort(() => rnd.next() - 0.5).slice(0, lengths[r]);
      pick.forEach((id, i) => {
        inIds[at[r] + i] = id;
        inCounts[at[r] + i] = 1 + i;
      });
    }
    const want = lengths.flatMap((n, r) =>
      Array.from({ length: n }, (_, i) => [tr[inIds[at[r] + i]], inCounts[at[r] + i]]).sort((a, b) => a[0] - b[0]),
    );
    const out = new Float32Array(inCounts.buffer);
    for (let r = 0; r < lengths.length; r++) translateRun(inIds, inCounts, at[r], at[r + 1], tr, inIds, out);
    expect(Array.from(inIds, (id, i) => [id, out[i]])).toEqual(want);
  });

  it('gives the same in place (ids overwritten, counts rewritten as f32 over their own buffer)', () => {
    const inIds = ids.slice();
    const inCounts = counts.slice();
    const out = new Float32Array(inCounts.buffer);
    for (let r = 0; r + 1 < runs.length; r++) translateRun(inIds, inCounts, runs[r], runs[r + 1], tr, inIds, out);
    expect(Array.from(inIds, (id, i) => [id, out[i]])).toEqual(expected);
  });

  it('gives the same from counts held as bytes, the larger ones beside them (translateSmallRun)', () => {
    const inIds = ids.slice();
    const small = Uint8Array.from(counts, (c) => Math.min(c, SECTION_COUNT_BIG));
    const big = new Map<number, number>();
    counts.forEach((c, i) => (c >= SECTION_COUNT_BIG ? big.set(i, c) : undefined));
    // Counts below the limit too (most section counts are): every fourth count made small.
    for (let i = 0; i < counts.length; i += 4) {
      small[i] = i % 200;
      big.delete(i);
    }
    const want = runs
      .slice(0, -1)
      .flatMap((from, r) =>
        Array.from({ length: runs[r + 1] - from }, (_, i) => [
          tr[ids[from + i]],
          (from + i) % 4 === 0 ? (from + i) % 200 : counts[from + i],
        ]).sort((a, b) => a[0] - b[0]),
      );
    const out = new Float32Array(small.length);
    for (let r = 0; r + 1 < runs.length; r++) translateSmallRun(inIds, small, big, runs[r], runs[r + 1], tr, inIds, out);
    expect(Array.from(inIds, (id, i) => [id, out[i]])).toEqual(want);
  });

  it('gives the same in two steps: runs put in rank order first (rankSmallRun), then mapped (mapRankedRun)', () => {
    // The thread's own sorted order of its terms (order[p]: the local id of the p-th term) and
    // the merge's final ids of that order, strictly increasing (every thread's terms keep their
    // order in the merge): the composition is a local → final map like tr above.
    const order = Int32Array.from({ length: terms }, (_, i) => i).sort((a, b) => tr[a] - tr[b]);
    const byRank = Int32Array.from(order, (id) => tr[id]);
    const rank = new Int32Array(terms);
    order.forEach((id, p) => (rank[id] = p));
    // Short runs and long ones, most counts small, some at or over the byte's limit (two or more in
    // one run, so their positions move past each other).
    const lengths = [0, 1, 2, 7, 24, 25, 31, 64, 100, 300];
    const at = [0];
    for (const n of lengths) at.push(at.at(-1)! + n);
    const ids0 = new Int32Array(at.at(-1)!);
    const counts0 = new Int32Array(ids0.length);
    for (let r = 0; r < lengths.length; r++) {
      const pick = [...tr.keys()].sort(() => rnd.next() - 0.5).slice(0, lengths[r]);
      pick.forEach((id, i) => {
        ids0[at[r] + i] = id;
        counts0[at[r] + i] = rnd.next() < 0.2 ? SECTION_COUNT_BIG + Math.floor(rnd.next() * 1000) : 1 + Math.floor(rnd.next() * 9);
      });
    }
    const pack = (): { ids: Int32Array; small: Uint8Array; big: Map<number, number> } => {
      const big = new Map<number, number>();
      counts0.forEach((c, i) => (c >= SECTION_COUNT_BIG ? big.set(i, c) : undefined));
      return { ids: ids0.slice(), small: Uint8Array.from(counts0, (c) => Math.min(c, SECTION_COUNT_BIG)), big };
    };
    expect([...pack().big.keys()].length).toBeGreaterThan(20);
    const one = pack();
    const want = new Float32Array(ids0.length);
    for (let r = 0; r < lengths.length; r++) translateSmallRun(one.ids, one.small, one.big, at[r], at[r + 1], tr, one.ids, want);
    const two = pack();
    for (let r = 0; r < lengths.length; r++) rankSmallRun(two.ids, two.small, two.big, at[r], at[r + 1], rank);
    // Ranked: each run ascending, and as many large counts kept as before.
    for (let r = 0; r < lengths.length; r++) for (let i = at[r] + 1; i < at[r + 1]; i++) expect(two.ids[i]).toBeGreaterThan(two.ids[i - 1]);
    expect(two.big.size).toBe(one.big.size);
    const got = new Float32Array(ids0.length);
    for (let r = 0; r < lengths.length; r++) mapRankedRun(two.ids, two.small, two.big, at[r], at[r + 1], byRank, two.ids, got);
    expect(Array.from(two.ids)).toEqual(Array.from(one.ids));
    expect(Array.from(got)).toEqual(Array.from(want));
    // Brute force as well: each run's (final id, count) pairs sorted by final id.
    const brute = lengths.flatMap((n, r) =>
      Array.from({ length: n }, (_, i) => [tr[ids0[at[r] + i]], counts0[at[r] + i]]).sort((a, b) => a[0] - b[0]),
    );
    expect(Array.from(two.ids, (id, i) => [id, got[i]])).toEqual(brute);
  });
});
