import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { prepareInBackground, WARM_UP_SEARCHES } from '../../../src/node/worker/backgroundPrepare.js';
import { loadCollection } from '../../helpers/shared.js';

// ADI (test/fixtures/corpora/adi, 82 abstracts): a real small index to prepare.
const adi = loadCollection('adi');

function adiIndex() {
  const b = new IndexBuilder({ k: 20 });
  for (const d of adi.docs) b.addText({ path: `${d.id}.txt`, size: d.text.length, mtimeMs: 0 }, d.text);
  return b.build();
}

describe('prepareInBackground', () => {
  it('prepares the index in slices between pauses, then runs its warm-up searches, and resolves true', async () => {
    const index = adiIndex();
    let pauses = 0;
    const { done } = prepareInBackground(index, { sliceMs: 0, pause: async () => void pauses++ });
    expect(await done).toBe(true);
    // One pause before the first slice, at least one between slices, one before each warm-up search.
    expect(pauses).toBeGreaterThanOrEqual(2 + WARM_UP_SEARCHES);
    // Nothing is left to prepare: one more slice finds everything ready.
    expect(index.prepareSlice(0)).toBe(true);
  });

  it('stops when aborted and resolves false, leaving the index usable', async () => {
    const index = adiIndex();
    const held: (() => void)[] = [];
    const { controller, done } = prepareInBackground(index, { sliceMs: 0, pause: () => new Promise<void>((go) => held.push(go)) });
    controller.abort();
    held.splice(0).forEach((go) => go());
    expect(await done).toBe(false);
    expect(index.search(adi.queries[0].text, { top: 5 }).length).toBe(5);
  });

  it('waits for `after` (the term lists of a reopened index being filled) before its first slice', async () => {
    const index = adiIndex();
    let pauses = 0;
    let fill = (): void => undefined;
    const after = new Promise<void>((go) => (fill = go));
    const { done } = prepareInBackground(index, { sliceMs: 0, pause: async () => void pauses++, after });
    for (let i = 0; i < 5; i++) await new Promise<void>((go) => setImmediate(go));
    expect(pauses).toBe(0);
    fill();
    expect(await done).toBe(true);
    expect(pauses).toBeGreaterThanOrEqual(2 + WARM_UP_SEARCHES);
  });
});
