import { describe, expect, it } from 'vitest';
import { DismissedPairs, DISMISSED_STATE_KEY, type StateStore } from '../../src/extension/dismissedPairs.js';
import { pairKey } from '../../src/extension/lookalikeModel.js';

/** A workspace-state stand-in that keeps values as the editor does (a copy of what was stored). */
function memoryStore(initial: Record<string, unknown> = {}): StateStore & { data: Record<string, unknown> } {
  const data: Record<string, unknown> = { ...initial };
  return {
    data,
    get: <T>(key: string) => data[key] as T | undefined,
    update: async (key: string, value: unknown) => {
      data[key] = JSON.parse(JSON.stringify(value));
    },
  };
}

describe('pairs marked "Not a look-alike"', () => {
  it('are remembered by a later session reading the same workspace state', async () => {
    const store = memoryStore();
    const first = new DismissedPairs(store);
    await first.add(pairKey('notes/b.md', 'notes/a.md'));
    await first.add(pairKey('notes/a.md', 'notes/b.md'));
    const later = new DismissedPairs(store);
    expect([...later.keys]).toEqual([pairKey('notes/a.md', 'notes/b.md')]);
    expect(store.data[DISMISSED_STATE_KEY]).toEqual(['notes/a.md\nnotes/b.md']);
  });

  it('are all shown again after clear, in this session and the next', async () => {
    const store = memoryStore();
    const pairs = new DismissedPairs(store);
    await pairs.add('a\nb');
    await pairs.add('c\nd');
    expect(await pairs.clear()).toBe(2);
    expect(pairs.size).toBe(0);
    expect(new DismissedPairs(store).size).toBe(0);
  });

  it('ignore a damaged stored value instead of failing', () => {
    expect(new DismissedPairs(memoryStore({ [DISMISSED_STATE_KEY]: 'not a list' })).size).toBe(0);
    expect([...new DismissedPairs(memoryStore({ [DISMISSED_STATE_KEY]: ['a\nb', 3, null] })).keys]).toEqual(['a\nb']);
  });
});
