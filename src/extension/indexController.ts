/**
 * Runs the workspace index from the extension host: starts the worker, loads the saved index,
 * refreshes it, builds and rebuilds it, folds in file changes and decides (updatePolicy.ts) when a
 * background rebuild is due. It holds only light state (the summary, the folder list) and talks to
 * the editor through the small ControllerHost interface, so it runs under unit tests too.
 */
import {
  decideUpdate,
  DEFAULT_UPDATE_POLICY,
  describeReasons,
  rebuildDelay,
  type UpdatePolicy,
} from '../core/index/update/updatePolicy.js';
import { isCancelled, type WorkerClient } from '../node/worker/client.js';
import type { InsightRequestType } from '../node/worker/insightProtocol.js';
import {
  overallPercent,
  type FileChange,
  type IndexSummary,
  type ParamsOf,
  type ResultOf,
  type ScoredFile,
  type SearchMatch,
  type TranslationRef,
  SectionMatch,
} from '../node/worker/workerProtocol.js';
import { NO_FEEDBACK, type SearchFeedback } from './viewModels.js';
import { uniqueRootNames } from '../node/worker/rootMap.js';
import { noIndexReason, summaryOf, unavailableReason, type IndexState } from './indexState.js';
import { readSettings, toWorkerConfig, type ExtensionSettings } from './settings.js';
import type { BuildKind, ControllerHost, IndexChange } from './controllerHost.js';
import type { StartedWorker } from './workerHost.js';
import { errorKind } from '../node/worker/workerErrors.js';

export type { BuildKind, ControllerHost, IndexChange } from './controllerHost.js';

type Listener<T> = (value: T) => void;

/**
 * Title of the build's progress notification. The editor already names the extension under it
 * ("Source: Undertone"), so the title does not repeat the name.
 */
export const PROGRESS_TITLE = 'Indexing the workspace';

/** Batches larger than this many changes (and larger than the policy's share) are rescanned instead (common practice). */
const RESCAN_BATCH = 50;

export class IndexController {
  private _state: IndexState = { kind: 'starting' };
  private _worker: StartedWorker | undefined;
  private _multiRoot = false;
  private _build: { abort: AbortController; done: Promise<void> } | undefined;
  private _rebuildTimer: ReturnType<typeof setTimeout> | undefined;
  private _lastChangeAt = 0;
  /** The last configure found the index built with other model settings. */
  private _modelChanged = false;
  private readonly _stateListeners = new Set<Listener<IndexState>>();
  private readonly _changeListeners = new Set<Listener<IndexChange>>();

  constructor(
    private readonly _host: ControllerHost,
    private readonly _policy: UpdatePolicy = DEFAULT_UPDATE_POLICY,
  ) {}

  get state(): IndexState {
    return this._state;
  }

  get multiRoot(): boolean {
    return this._multiRoot;
  }

  get settings(): ExtensionSettings {
    return readSettings(this._host.setting);
  }

  get building(): boolean {
    return this._build !== undefined;
  }

  onDidChangeState(listener: Listener<IndexState>): { dispose(): void } {
    this._stateListeners.add(listener);
    return { dispose: () => this._stateListeners.delete(listener) };
  }

  onDidChangeIndex(listener: Listener<IndexChange>): { dispose(): void } {
    this._changeListeners.add(listener);
    return { dispose: () => this._changeListeners.delete(listener) };
  }

  /** Loads the saved index (or builds one, per settings) and folds in what changed meanwhile. */
  async start(): Promise<void> {
    const client = await this.connect();
    if (!client) return;
    const loaded = await client.request('load', {});
    if (loaded.outcome === 'loaded' && loaded.summary) {
      this._host.log(`Loaded the saved index (${loaded.summary.files} files, k=${loaded.summary.k}) in ${Math.round(loaded.ms)} ms.`);
      this.setState({ kind: 'ready', summary: loaded.summary });
      this.emitChange({ folded: [], removed: [], all: true });
      void this.rebuildIfDamaged(client).catch((err: unknown) =>
        this._host.log(`Checking the saved index failed: ${err instanceof Error ? err.message : String(err)}`),
      );
      await this.refresh();
      return;
    }
    const reason = noIndexReason(loaded.outcome, loaded.reason);
    this._host.log(`No usable saved index: ${reason}.`);
    if (this.settings.buildOnStartup) await this.build('initial');
    else this.setState({ kind: 'none', reason: `${reason}.` });
  }

  /**
   * The saved index's section rows are checked after the load, in the background (format 6): when
   * they fail that check, and the loaded index is still in use, it is built again from the files.
   */
  private async rebuildIfDamaged(client: WorkerClient): Promise<void> {
    const verdict = await client.request('checkSaved', {}).catch(() => ({ damaged: false, reason: undefined }));
    if (!verdict.damaged || this._worker?.client !== client) return;
    this._host.log(`The saved index is damaged (${verdict.reason ?? 'its section rows fail their check'}): rebuilding.`);
    await this.build('background');
  }

  /** Settings or folders changed: tell the worker, then rebuild or refresh as needed. */
  async reconfigure(): Promise<void> {
    if (!this._worker) return this.start();
    const client = await this.connect();
    if (!client || summaryOf(this._state) === null || this._build) return;
    if (this._modelChanged) {
      this._host.log('The index settings changed: rebuilding.');
      await this.build('background');
    } else await this.refresh();
  }

  /** Builds the index; a background build shows in the status bar only. Cancelling keeps the previous index. */
  async build(kind: BuildKind): Promise<void> {
    if (this._build) return this._build.done;
    clearTimeout(this._rebuildTimer);
    const client = await this.connect();
    if (!client) return;
    const abort = new AbortController();
    const previous = summaryOf(this._state);
    const background = kind === 'background';
    const run = async (report?: (percent: number) => void): Promise<void> => {
      this.setState({ kind: 'building', percent: 0, background, previous });
      const result = await client.request(
        'build',
        {},
        {
          signal: abort.signal,
          onProgress: (p) => {
            const percent = overallPercent(p);
            const wordMatch = previous ? undefined : p.wordMatch;
            if (this._state.kind === 'building' && (this._state.percent !== percent || this._state.wordMatch !== wordMatch))
              this.setState({ ...this._state, percent, ...(wordMatch === undefined ? {} : { wordMatch }) });
            report?.(percent);
          },
        },
      );
      this._host.log(
        `Built the index: ${result.summary.files} files (${result.read} read, ${result.reused} reused, ${result.skipped} skipped), k=${result.summary.k}, ${result.seconds.toFixed(2)} s.`,
      );
      if (result.saveProblem) {
        // The index is in use; only keeping it for the next session failed.
        this._host.log(`The index could not be saved: ${result.saveProblem}. It is used from memory and will be built again next time.`);
        if (!background)
          this._host.showError(
            `Undertone built the index but could not save it (${result.saveProblem}); it is used for this session only.`,
          );
      }
      this.setState({ kind: 'ready', summary: result.summary });
      this.emitChange({ folded: [], removed: [], all: true });
    };
    const done = (async () => {
      try {
        if (background) await run();
        else {
          await this._host.withProgress(PROGRESS_TITLE, (report, signal) => {
            signal.addEventListener('abort', () => abort.abort(), { once: true });
            return run(report);
          });
        }
      } catch (err) {
        if (isCancelled(err)) {
          this._host.log('Indexing cancelled; the previous index stays in use.');
          this.setState(previous ? { kind: 'ready', summary: previous } : { kind: 'none', reason: 'indexing was cancelled.' });
        } else if (err instanceof Error && errorKind(err) === 'empty') {
          // An empty folder is not an error worth a pop-up, unless the person asked for the build.
          this._host.log(err.message);
          this.setState(previous ? { kind: 'ready', summary: previous } : { kind: 'none', reason: err.message });
          if (kind === 'user') this._host.showError(err.message);
        } else {
          const message = err instanceof Error ? err.message : String(err);
          this._host.log(`Indexing failed: ${message}`);
          this.setState({ kind: 'failed', message: `Indexing failed: ${message}`, previous });
          if (!background) this._host.showError(`Undertone could not index the workspace: ${message}`);
        }
      } finally {
        this._build = undefined;
      }
    })();
    this._build = { abort, done };
    return done;
  }

  cancelBuild(): void {
    this._build?.abort.abort();
  }

  /** Folds in or removes changed files; views hear about it through onDidChangeIndex. */
  async applyChanges(changes: readonly FileChange[]): Promise<IndexChange | undefined> {
    const summary = summaryOf(this._state);
    if (!this._worker || changes.length === 0) return undefined;
    if (summary && changes.length > RESCAN_BATCH && changes.length > this._policy.maxChangedShare * summary.files) {
      await this.refresh();
      return { folded: [], removed: [], all: true };
    }
    const report = await this._worker.client.request('update', { changes });
    if (report.folded.length + report.removed.length === 0) return undefined;
    this._lastChangeAt = Date.now();
    const change = { folded: report.folded, removed: report.removed, all: false };
    if (report.summary && !this._build) this.judge(report.summary);
    this.emitChange(change);
    return change;
  }

  /** feedback: files (fsPaths) to find more / fewer like. */
  async search(query: string, top: number, feedback: SearchFeedback = NO_FEEDBACK): Promise<readonly SearchMatch[]> {
    const client = await this.connect();
    if (!client) return [];
    return client.request('search', { query, top, like: feedback.like, unlike: feedback.unlike });
  }

  /** The same page in other languages as the file at fsPath ([] without an index). */
  async translations(fsPath: string): Promise<readonly TranslationRef[]> {
    if (!this._worker || summaryOf(this._state) === null) return [];
    return this._worker.client.request('translations', { fsPath });
  }

  /** Suggested links for a note (node/worker/linkService.ts); null while there is no index or it is not an indexed note. */
  async suggestLinks(fsPath: string, top: number): Promise<ResultOf<'suggestLinks'> | null> {
    if (!this._worker || summaryOf(this._state) === null) return null;
    return this._worker.client.request('suggestLinks', { fsPath, top });
  }

  /** Sections ranked by a query instead of files ([] without an index). */
  async searchSections(query: string, top: number): Promise<readonly SectionMatch[]> {
    const client = await this.connect();
    if (!client) return [];
    return client.request('searchSections', { query, top });
  }

  /** Other files' sections nearest to the section at a zero-based line (null: no index or no sections). */
  async nearbySections(fsPath: string, line: number, top: number): Promise<{ from: SectionMatch; hits: readonly SectionMatch[] } | null> {
    if (!this._worker || summaryOf(this._state) === null) return null;
    return this._worker.client.request('nearbySections', { fsPath, line, top });
  }

  async nearby(fsPath: string, top: number): Promise<readonly ScoredFile[] | null> {
    if (!this._worker || summaryOf(this._state) === null) return null;
    return this._worker.client.request('nearby', { fsPath, top });
  }

  /** Look-alikes, topics or the concept map, worked out in the worker; null while there is no index. */
  async insight<T extends InsightRequestType>(type: T, params: ParamsOf<T>): Promise<ResultOf<T> | null> {
    if (!this._worker || summaryOf(this._state) === null) return null;
    return this._worker.client.request(type, params);
  }

  /** Cancels any build, forgets the index and removes the saved file. */
  async deleteIndex(): Promise<boolean> {
    clearTimeout(this._rebuildTimer);
    if (this._build) {
      this._build.abort.abort();
      await this._build.done;
    }
    const client = await this.connect();
    if (!client) return false;
    const { deleted } = await client.request('deleteIndex', {});
    this.setState({ kind: 'none', reason: 'the saved index was deleted.' });
    this.emitChange({ folded: [], removed: [], all: true });
    return deleted;
  }

  /** Saves pending edits and ends the worker. */
  async dispose(): Promise<void> {
    clearTimeout(this._rebuildTimer);
    this._build?.abort.abort();
    const worker = this._worker;
    this._worker = undefined;
    if (!worker) return;
    await Promise.race([worker.client.request('save', {}).catch(() => undefined), new Promise((r) => setTimeout(r, 2000))]);
    await worker.stop();
  }

  /** Starts the worker if needed and sends the current configuration; undefined when nothing can be indexed. */
  private async connect(): Promise<WorkerClient | undefined> {
    const { local, elsewhere } = this._host.folders();
    const indexFile = this._host.indexFile;
    if (local.length === 0 || indexFile === undefined) {
      const reason = unavailableReason(elsewhere);
      this.setState({ kind: 'unavailable', reason });
      return undefined;
    }
    if (elsewhere.length > 0) this._host.log(`Not indexed (not on the local disk): ${elsewhere.join(', ')}.`);
    if (!this._worker) {
      const started = this._host.startWorker((code) => this.onWorkerExit(started, code));
      this._worker = started;
    }
    const names = uniqueRootNames(local.map((f) => f.name));
    this._multiRoot = local.length > 1;
    const config = toWorkerConfig(
      this.settings,
      local.map((f, i) => ({ ...f, key: names[i] })),
      indexFile,
    );
    const { modelChanged } = await this._worker.client.request('configure', { config });
    this._modelChanged = modelChanged;
    return this._worker.client;
  }

  private async refresh(): Promise<void> {
    if (!this._worker) return;
    const r = await this._worker.client.request('refresh', { maxFoldShare: this._policy.maxChangedShare });
    const n = r.added + r.changed + r.removed;
    if (n > 0)
      this._host.log(
        `Since the index was saved: ${r.added} added, ${r.changed} changed, ${r.removed} removed${r.tooManyChanges ? ' (too many to fold in)' : ' (folded in)'}.`,
      );
    if (r.tooManyChanges && r.summary) {
      if (this.settings.autoRebuild) await this.build('background');
      else this.setState({ kind: 'stale', summary: r.summary, reason: `${n} files changed since it was built` });
      return;
    }
    if (r.summary) this.judge(r.summary);
    if (n > 0) this.emitChange({ folded: [], removed: [], all: true });
  }

  /** Applies the update policy to a fresh summary: stay ready, mark stale, or schedule a rebuild. */
  private judge(summary: IndexSummary): void {
    const decision = decideUpdate(summary.staleness, this._policy);
    if (decision.action === 'fold-in') {
      this.setState({ kind: 'ready', summary });
      return;
    }
    const reason = describeReasons(decision.reasons, summary.staleness);
    if (!this.settings.autoRebuild) {
      this.setState({ kind: 'stale', summary, reason });
      return;
    }
    this.setState({ kind: 'ready', summary });
    clearTimeout(this._rebuildTimer);
    this._rebuildTimer = setTimeout(
      () => {
        this._host.log(`Rebuilding in the background: ${reason}.`);
        void this.build('background');
      },
      rebuildDelay(this._lastChangeAt, Date.now(), this._policy),
    );
  }

  private onWorkerExit(worker: StartedWorker, code: number): void {
    if (this._worker !== worker) return;
    this._worker = undefined;
    const message = `The index worker stopped unexpectedly (exit code ${code}). Run "Build Index" to start it again.`;
    this._host.log(message);
    this.setState({ kind: 'failed', message, previous: null });
    this.emitChange({ folded: [], removed: [], all: true });
  }

  private setState(state: IndexState): void {
    this._state = state;
    for (const l of this._stateListeners) l(state);
  }

  private emitChange(change: IndexChange): void {
    for (const l of this._changeListeners) l(change);
  }
}
