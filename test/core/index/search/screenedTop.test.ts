import { describe, expect, it } from 'vitest';
import { ConceptCodes } from '../../../../src/core/index/search/conceptCodes.js';
import { ConceptRows } from '../../../../src/core/index/search/conceptRows.js';
import { ScreenScratch, screenedTop } from '../../../../src/core/index/search/screenedTop.js';
import { topN } from '../../../../src/core/index/search/topN.js';
import { createRandom } from '../../../../src/core/random.js';

describe('screenedTop', () => {
  it('returns the same slots and scores as ranking a full pass of exact products', () => {
    const k = 48;
    const n = 3000;
    const rnd = createRandom(17);
    const rows = new Float32Array(n * k);
    for (let j = 0; j < n; j++) {
      let ss = 0;
      for (let c = 0; c < k; c++) ss += (rows[j * k + c] = rnd.normal()) ** 2;
      for (let c = 0; c < k; c++) rows[j * k + c] /= Math.sqrt(ss);
    }
    // Exact duplicates make ties, which must break by slot as in a full pass.
    for (let j = 100; j < 120; j++) rows.copyWithin(j * k, 50 * k, 51 * k);
    const store = new ConceptRows(k, n, rows);
    const codes = ConceptCodes.create(k, n, rows, n)!;
    const scratch = new ScreenScratch();
    const extra = Float64Array.from({ length: n }, () => (rnd.next() < 0.7 ? 0 : rnd.next()));
    for (let t = 0; t < 12; t++) {
      const q = rows.slice(((t * 131) % n) * k, (((t * 131) % n) + 1) * k);
      const accept = (j: number): boolean => j % 7 !== t % 7;
      const full = store.dots(q, n).slice();
      const top = [1, 10, 25][t % 3];
      const plain = topN(full, top, accept);
      const screened = screenedTop({ codes, rows: store, q, n, top, accept, a: 1 }, scratch)!;
      expect(screened.ranked).toEqual(plain);
      expect(screened.candidates).toBeLessThan(n / 4);
      // The blended form a·product + b·extra, as the caller computes it.
      const blended = Float64Array.from(full, (v, j) => 0.5 * v + 0.5 * extra[j]);
      const screenedBlend = screenedTop({ codes, rows: store, q, n, top, accept, a: 0.5, extra: { b: 0.5, values: extra } }, scratch)!;
      expect(screenedBlend.ranked).toEqual(topN(blended, top, accept));
      for (const r of screenedBlend.ranked) expect(screenedBlend.product(r.slot)).toBe(full[r.slot]);
    }
  });

  it('declines when fewer rows than asked for are accepted', () => {
    const rows = new Float32Array([1, 0, 0, 1]);
    const codes = ConceptCodes.create(2, 2, rows, 2)!;
    const store = new ConceptRows(2, 2, rows);
    expect(
      screenedTop({ codes, rows: store, q: rows.subarray(0, 2), n: 2, top: 3, accept: () => true, a: 1 }, new ScreenScratch()),
    ).toBeNull();
  });
});
