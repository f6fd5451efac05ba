/** Top-N selection over a score array with a deterministic tie order (higher score, then lower slot). */

export interface Ranked {
  readonly slot: number;
  readonly score: number;
}

export function topN(scores: Float64Array | Float32Array, n: number, accept: (slot: number) => boolean = () => true): Ranked[] {
  if (n <= 0) return [];
  // A bounded min-heap keeps this O(N log n).
  const heapSlots: number[] = [];
  const worse = (a: number, b: number): boolean => scores[a] < scores[b] || (scores[a] === scores[b] && a > b);
  const siftDown = (i: number): void => {
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < heapSlots.length && worse(heapSlots[l], heapSlots[m])) m = l;
      if (r < heapSlots.length && worse(heapSlots[r], heapSlots[m])) m = r;
      if (m === i) return;
      [heapSlots[i], heapSlots[m]] = [heapSlots[m], heapSlots[i]];
      i = m;
    }
  };
  const siftUp = (i: number): void => {
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!worse(heapSlots[i], heapSlots[p])) return;
      [heapSlots[i], heapSlots[p]] = [heapSlots[p], heapSlots[i]];
      i = p;
    }
  };
  // Once the heap is full, a slot is offered to accept only if it would enter: slots are visited
  // in ascending order, so a later slot enters only with a strictly higher score than the root.
  let bar = Number.NEGATIVE_INFINITY;
  for (let s = 0; s < scores.length; s++) {
    const v = scores[s];
    if (v <= bar && heapSlots.length === n) continue;
    if (Number.isNaN(v) || !accept(s)) continue;
    if (heapSlots.length < n) {
      heapSlots.push(s);
      siftUp(heapSlots.length - 1);
    } else {
      heapSlots[0] = s;
      siftDown(0);
    }
    if (heapSlots.length === n) bar = scores[heapSlots[0]];
  }
  return heapSlots.sort((a, b) => (worse(a, b) ? 1 : worse(b, a) ? -1 : 0)).map((slot) => ({ slot, score: scores[slot] }));
}
