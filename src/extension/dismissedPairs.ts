/**
 * The pairs a person marked "Not a look-alike", kept in the workspace's state (the editor's
 * Memento for this workspace), so they stay hidden in later sessions. Keys are order-free pair
 * keys (lookalikeModel.ts pairKey). Needs only get/update, so tests pass a plain object.
 */

/** The part of the editor's Memento used here. */
export interface StateStore {
  get<T>(key: string): T | undefined;
  update(key: string, value: unknown): PromiseLike<void>;
}

/** Where the keys live in workspace state. */
export const DISMISSED_STATE_KEY = 'undertone.dismissedLookalikes';

export class DismissedPairs {
  private _keys: Set<string>;

  constructor(private readonly _store: StateStore) {
    const saved = _store.get<unknown>(DISMISSED_STATE_KEY);
    this._keys = new Set(Array.isArray(saved) ? saved.filter((k): k is string => typeof k === 'string') : []);
  }

  get keys(): ReadonlySet<string> {
    return this._keys;
  }

  get size(): number {
    return this._keys.size;
  }

  async add(key: string): Promise<void> {
    if (this._keys.has(key)) return;
    this._keys.add(key);
    await this.save();
  }

  /** Shows every hidden pair again; returns how many there were. */
  async clear(): Promise<number> {
    const n = this._keys.size;
    this._keys = new Set();
    await this.save();
    return n;
  }

  private async save(): Promise<void> {
    await this._store.update(DISMISSED_STATE_KEY, [...this._keys].sort());
  }
}
