import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { prepareInBackground, rehearseFolds, WARM_UP_FOLDS, WARM_UP_SEARCHES } from '../../../src/node/worker/backgroundPrepare.js';
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

  it('then rehearses fold-ins of indexed files, leaving the index as an index never rehearsed', async () => {
    const texts = new Map(adi.docs.map((d) => [`${d.id}.txt`, d.text]));
    const read: string[] = [];
    const readText = async (path: string): Promise<string | null> => {
      read.push(path);
      return texts.get(path) ?? null;
    };
    const rehearsed = adiIndex();
    const plain = adiIndex();
    expect(await prepareInBackground(rehearsed, { sliceMs: 0, pause: async () => undefined, readText }).done).toBe(true);
    expect(await prepareInBackground(plain, { sliceMs: 0, pause: async () => undefined }).done).toBe(true);
    expect(read.length).toBe(WARM_UP_FOLDS);
    expect(new Set(read).size).toBe(WARM_UP_FOLDS);
    expect(rehearsed.vocab.size).toBe(plain.vocab.size);
    const bytes = (v: Float32Array): Buffer => Buffer.from(v.buffer, v.byteOffset, v.byteLength);
    expect(bytes(rehearsed.vectors()).equals(bytes(plain.vectors()))).toBe(true);
    for (const q of adi.queries.slice(0, 5)) expect(rehearsed.search(q.text, { top: 10 })).toEqual(plain.search(q.text, { top: 10 }));
  });
});

describe('rehearseFolds', () => {
  it('passes over files it cannot read or that are too large, and stops at its count', async () => {
    const b = new IndexBuilder({ k: 20 });
    for (const d of adi.docs) b.addText({ path: `${d.id}.txt`, size: d.id.endsWith('7') ? 1 << 20 : d.text.length, mtimeMs: 0 }, d.text);
    const index = b.build();
    const texts = new Map(adi.docs.map((d) => [`${d.id}.txt`, d.text]));
    const asked: string[] = [];
    const readText = async (path: string): Promise<string | null> => {
      asked.push(path);
      if (asked.length % 2 === 0) return null;
      if (asked.length === 3) throw new Error('unreadable');
      return texts.get(path) ?? null;
    };
    expect(await rehearseFolds(index, readText, { count: 5 })).toBe(5);
    // None of the files marked larger than the limit was read.
    expect(asked.some((p) => p.replace('.txt', '').endsWith('7'))).toBe(false);
    // Every second read fails (null), the third throws: five rehearsed took eleven reads.
    expect(asked.length).toBe(11);
  });
});
