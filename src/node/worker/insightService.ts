/**
 * The worker's insight requests (insightProtocol.ts): look-alikes, topics and the concept map of
 * the index in use. Each result is cached until the index changes (a build, a fold-in, a removal)
 * or the folders do, so opening a view again or the map a second time costs nothing; the map's
 * layouts are computed once per index state. Concurrent requests for the same thing share one run.
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { InvalidInputError } from '../../core/errors.js';
import type { InsightRequestType, LookalikesResult, MapDataResult, TopicsResult } from './insightProtocol.js';
import { computeLookalikes } from './lookalikeTask.js';
import { computeMap, MapOutdatedError, placeMapQuery, placeMapTrail, type MapModel } from './mapTask.js';
import type { PageTrail } from '../../core/map/mapMessages.js';
import type { RootMap } from './rootMap.js';
import type { Handlers } from './server.js';
import { computeTopics, folderTopics, type TopicsTaskResult } from './topicsTask.js';

/** What the insight service needs from the index service. */
export interface InsightSource {
  /** The index in use (throws NoIndexError when there is none). */
  requireIndex(): LsiIndex;
  roots(): RootMap;
  maxFileBytes(): number;
}

/** One remembered run, by key; a run that fails is forgotten so the next request tries again. */
class Memo<T> {
  private _entry: { readonly key: string; readonly run: Promise<T> } | undefined;

  holds(key: string): boolean {
    return this._entry?.key === key;
  }

  clear(): void {
    this._entry = undefined;
  }

  get(key: string, start: () => Promise<T>): Promise<T> {
    if (this._entry?.key === key) return this._entry.run;
    const entry = { key, run: start() };
    this._entry = entry;
    entry.run.catch(() => {
      if (this._entry === entry) this._entry = undefined;
    });
    return entry.run;
  }
}

const indexIds = new WeakMap<LsiIndex, number>();
let nextIndexId = 1;

/**
 * Names an index state: which index object, and counters that move with every fold-in and
 * removal (slots, live files, folded tokens, removed built files), plus the folders.
 */
export function indexStateKey(index: LsiIndex, roots: RootMap): string {
  let id = indexIds.get(index);
  if (id === undefined) indexIds.set(index, (id = nextIndexId++));
  const c = index.counters();
  const folders = roots.roots.map((r) => `${r.name}=${r.fsPath}`).join('|');
  return `${id}:${index.slots().length}:${index.size}:${c.foldedTokens}:${c.removedSinceBuild}:${folders}`;
}

export class InsightService {
  private readonly _topics = new Memo<TopicsTaskResult>();
  private readonly _lookalikes = new Memo<LookalikesResult>();
  private readonly _map = new Memo<MapModel>();
  private _latestMap: MapModel | undefined;
  private _topicsStop: AbortController | undefined;
  private _nextToken = 1;

  constructor(
    private readonly _source: InsightSource,
    /** Between two steps of a topic tree (setImmediate in the worker: waiting messages go first). */
    private readonly _pause: () => Promise<void> = () => new Promise<void>((resolve) => setImmediate(resolve)),
  ) {}

  handlers(): Pick<Handlers, InsightRequestType> {
    return {
      lookalikes: async (p) => this.lookalikes(p.threshold),
      topics: async (p) => this.topics(p?.folder),
      mapData: async () => this.mapData(),
      mapQuery: async ({ token, text }) => this.mapQuery(token, text),
      mapTrail: async ({ token, fsPath }) => this.mapTrail(token, fsPath),
    };
  }

  lookalikes(threshold: number): Promise<LookalikesResult> {
    const index = this._source.requireIndex();
    const roots = this._source.roots();
    const key = `${indexStateKey(index, roots)}:${threshold}`;
    return this._lookalikes.get(key, () => computeLookalikes(index, roots, { threshold, maxFileBytes: this._source.maxFileBytes() }));
  }

  /** The topic tree; with a folder, also which topics hold its files. */
  async topics(folder?: string): Promise<TopicsResult> {
    const run = await this.topicsRun();
    if (folder === undefined) return run.result;
    const got = folderTopics(run.report, this._source.roots(), folder);
    if (!got) throw new InvalidInputError(`${folder} is not inside a folder of this workspace.`);
    return { ...run.result, folder: got };
  }

  /**
   * The topic tree of the index in use, computed in steps with a pause between them; a run for an
   * older index state is stopped when one for a newer state starts.
   */
  topicsRun(): Promise<TopicsTaskResult> {
    const index = this._source.requireIndex();
    const roots = this._source.roots();
    return this._topics.get(indexStateKey(index, roots), () => {
      this._topicsStop?.abort();
      const stop = new AbortController();
      this._topicsStop = stop;
      return computeTopics(index, roots, this._source.maxFileBytes(), { pause: this._pause, signal: stop.signal });
    });
  }

  /**
   * Starts the topic tree of the index in use in the background (after a build or a load, once the
   * searches are prepared, when IndexServiceOptions.prepareTopics asks for it). Never rejects.
   */
  prepareTopics(): void {
    try {
      void this.topicsRun().catch(() => undefined);
    } catch {
      // No index in use: nothing to prepare.
    }
  }

  /** True when the topic tree of the index in use is computed or being computed. */
  topicsStarted(): boolean {
    return this._topics.holds(indexStateKey(this._source.requireIndex(), this._source.roots()));
  }

  /** Stops a topic tree being computed (the index is going away). */
  stopTopics(): void {
    this._topicsStop?.abort();
  }

  /**
   * Stops a topic tree being computed and drops every kept result (the index in use is being
   * replaced), so nothing computed for the old index stays resident until the next request.
   */
  forget(): void {
    this.stopTopics();
    this._topics.clear();
    this._lookalikes.clear();
    this._map.clear();
    this._latestMap = undefined;
  }

  async mapData(): Promise<MapDataResult> {
    const t0 = performance.now();
    const index = this._source.requireIndex();
    const roots = this._source.roots();
    const key = indexStateKey(index, roots);
    const cached = this._map.holds(key);
    const model = await this._map.get(key, async () => {
      // Topics of this very state: an edit folded in while they were computed would leave them naming other files.
      let topics: TopicsTaskResult | undefined;
      for (let attempt = 0; attempt < 3 && (topics === undefined || !this._topics.holds(indexStateKey(index, roots))); attempt++) {
        topics = await this.topicsRun().catch(() => undefined);
        if (topics === undefined) break;
      }
      if (topics && !this._topics.holds(indexStateKey(index, roots))) topics = undefined;
      const title = roots.roots.length === 1 ? `Concept map · ${roots.roots[0].name}` : 'Concept map';
      return computeMap(index, roots, topics?.report ?? null, {
        token: this._nextToken++,
        maxFileBytes: this._source.maxFileBytes(),
        topicWords: topics?.wordFor,
        title,
      });
    });
    this._latestMap = model;
    return { token: model.token, data: model.data, fsPaths: model.fsPaths, ms: performance.now() - t0, cached };
  }

  mapQuery(token: number, text: string) {
    const model = this._latestMap;
    if (!model || model.token !== token) throw new MapOutdatedError('The index changed since this map was drawn; it is being redrawn.');
    return placeMapQuery(model, text);
  }

  /** The sections of a file as a trail on the current map (null: not indexed, or no sections). */
  mapTrail(token: number, fsPath: string): PageTrail | null {
    const model = this._latestMap;
    if (!model || model.token !== token) throw new MapOutdatedError('The index changed since this map was drawn; it is being redrawn.');
    const key = this._source.roots().keyOf(fsPath);
    return key === undefined ? null : placeMapTrail(model, key);
  }
}
