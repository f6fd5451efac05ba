/**
 * What the index worker does: holds the workspace index and answers the protocol's requests
 * (see workerProtocol.ts). Builds run one at a time and swap in only once saved; edits that arrive
 * during a build are applied to the index in use and replayed on the new one after the swap.
 * Folded-in edits are saved a short while after the last one (and on request).
 * During the first build of a workspace (no index in use), searches are answered by word match
 * alone from the moment counting ends (wordMatchIndex.ts; marked wordMatchOnly), also while the
 * synchronous SVD runs: the build polls the port there (server.ts, pump) and such a search is
 * answered on the spot. Progress events then carry `wordMatch` (the files it covers).
 * Once an index is loaded or built, what its searches need is prepared in the background
 * (backgroundPrepare.ts) in slices of ~15 ms, each run only after the messages already waiting
 * (setImmediate), so a search that arrives meanwhile waits about one slice.
 */
import { rm, stat } from 'node:fs/promises';
import { basename, dirname } from 'node:path';
import { NotIndexedError } from '../../core/errors.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { modelSettingsKey, resolveSettings } from '../../core/index/model/settings.js';
import { SECTION_LISTS_FROM } from '../../core/sections/sectionStore.js';
import { collectGarbage } from '../collectGarbage.js';
import { loadIndex, trySaveIndex } from '../persist.js';
import { readIndexableText } from '../scan.js';
import { prepareInBackground } from './backgroundPrepare.js';
import { bestMatchingLine, queryScorer } from './bestLine.js';
import { nearbyWhy, searchWhy, sectionNearbyWhy, sectionSearchWhy, type TextOf } from './explainHits.js';
import type { Why } from './insightProtocol.js';
import { FileAdmission } from './fileAdmission.js';
import { collapseTranslations } from '../../core/translations/groupTranslations.js';
import { questionFit, questionUnits } from '../../core/translations/language.js';
import { translationPath } from '../../core/translations/pathKey.js';
import { TranslationFinder } from './translationFinder.js';
import { InsightService } from './insightService.js';
import { LinkService } from './linkService.js';
import type {
  FileChange,
  IndexSummary,
  Progress,
  RefreshReport,
  ScoredFile,
  SearchMatch,
  SectionMatch,
  SectionPlace,
  TranslationRef,
  UpdateReport,
  WorkerConfig,
} from './workerProtocol.js';
import { RootMap } from './rootMap.js';
import { bestSections, nearbySections, searchSections } from '../../core/sections/sectionSearch.js';
import { splitLines } from '../../core/sections/splitSections.js';
import type { SectionHit } from '../../core/sections/sectionStore.js';
import type { HandlerContext, Handlers, ImmediateHandlers } from './server.js';
import { readTextNow, wordMatchLine } from './wordMatchLine.js';
import { WordMatchIndex } from './wordMatchIndex.js';
import { formsFromTexts } from './wordForms.js';
import { NoIndexError } from './workerErrors.js';
import { buildWorkspaceIndex, scanWorkspace, type WorkspaceScan } from './workspaceIndexer.js';

export { NoIndexError } from './workerErrors.js';

export interface IndexServiceOptions {
  /** Milliseconds after the last folded edit before the index is saved (common practice). @default 2000 */
  readonly saveDelayMs: number;
  /** Milliseconds of background preparation between two looks at waiting messages. @default 15 */
  readonly prepareSliceMs: number;
  /** Awaited before and between preparation slices. @default setImmediate (after waiting I/O and messages) */
  readonly preparePause: () => Promise<void>;
  /**
   * After preparing, compute the topic tree in the background (in steps, stopped when the index
   * changes). @default false: the tree is computed when the Topics view or the map first asks
   * for it, and kept until the index changes (it held about 74 MB on an 8.9k-file folder, for
   * views that may never be opened).
   */
  readonly prepareTopics: boolean;
  /**
   * Sections from which, once a build is saved, the index answers from the saved file as after a
   * reopen (its section rows and saved section lists stay in the file): where section search uses
   * lists, the built index holds them in memory (Linux tree, the worker after a section search:
   * 1,526 MB against 1,039 MB). Below it the built index answers: a smaller index gains nothing,
   * and the built index's freed memory would stay in the process beside the loaded one
   * (Documentation folder: 196 MB settled against 269 MB). @default SECTION_LISTS_FROM
   */
  readonly reopenFromSections: number;
}

export const DEFAULT_INDEX_SERVICE_OPTIONS: IndexServiceOptions = {
  saveDelayMs: 2000,
  prepareSliceMs: 15,
  preparePause: () => new Promise<void>((resolve) => setImmediate(resolve)),
  prepareTopics: false,
  reopenFromSections: SECTION_LISTS_FROM,
};

export class IndexService {
  private _config: WorkerConfig | undefined;
  private _roots = new RootMap([]);
  private _admission = new Map<string, FileAdmission>();
  private _index: LsiIndex | undefined;
  /**
   * The last loaded index while it is in use, its background check's outcome (a reason when
   * damaged) and a promise settled when another index replaces it (the check then stops unsettled).
   */
  private _loadCheck:
    | {
        readonly index: LsiIndex;
        readonly done: Promise<string | undefined>;
        readonly replaced: Promise<void>;
        readonly replace: () => void;
      }
    | undefined;
  private _dirty = false;
  private _saveProblem: string | undefined;
  private _saveTimer: ReturnType<typeof setTimeout> | undefined;
  private _build: Promise<unknown> = Promise.resolve();
  private _duringBuild: FileChange[] | undefined;
  /** Word-match answers during a first build, from its counts (until the built index is in use). */
  private _early: WordMatchIndex | undefined;
  private _preparing: { readonly controller: AbortController; readonly done: Promise<boolean> } | undefined;
  private readonly _options: IndexServiceOptions;
  private readonly _insights = new InsightService(
    {
      requireIndex: () => this.requireIndex(),
      roots: () => this._roots,
      maxFileBytes: () => this.config().maxFileBytes,
    },
    () => this._options.preparePause(),
  );

  private readonly _links = new LinkService({
    index: () => this._index,
    roots: () => this._roots,
    maxFileBytes: () => this.config().maxFileBytes,
  });

  /** An indexed file's current text by its index key (null when it is not text). */
  private readonly readKeyText = async (key: string): Promise<string | null> => {
    const got = await readIndexableText(this._roots.refOf(key).fsPath, this.config().maxFileBytes);
    return got.kind === 'text' ? got.text : null;
  };

  private readonly _translations = new TranslationFinder(this.readKeyText);

  constructor(options: Partial<IndexServiceOptions> = {}) {
    this._options = { ...DEFAULT_INDEX_SERVICE_OPTIONS, ...options };
  }

  get index(): LsiIndex | undefined {
    return this._index;
  }

  /** The background preparation in progress (true when it completed, false when stopped), if any. */
  get preparing(): Promise<boolean> | undefined {
    return this._preparing?.done;
  }

  handlers(): Handlers {
    return {
      configure: async ({ config }) => this.configure(config),
      load: async () => this.load(),
      checkSaved: async () => this.checkSaved(),
      refresh: async ({ maxFoldShare }) => this.refresh(maxFoldShare),
      build: async (_p, ctx) => this.build(ctx),
      update: async ({ changes }) => this.update(changes),
      search: async ({ query, top, like, unlike }) =>
        !this._index && this._early ? this.wordMatchSearch(this._early, query, top, readTextNow) : this.search(query, top, like, unlike),
      nearby: async ({ fsPath, top }) => this.nearby(fsPath, top),
      searchSections: async ({ query, top }) => this.searchSections(query, top),
      nearbySections: async ({ fsPath, line, top }) => this.nearbySections(fsPath, line, top),
      translations: async ({ fsPath }) => this.translationsOf(fsPath),
      save: async () => {
        const saved = await this.save();
        return this._saveProblem ? { saved, problem: this._saveProblem } : { saved };
      },
      deleteIndex: async () => this.deleteIndex(),
      ...this._insights.handlers(),
      ...this._links.handlers(),
    };
  }

  /** Answers given on the spot while a build runs its synchronous steps (server.ts, ImmediateHandlers). */
  immediateHandlers(): ImmediateHandlers {
    return {
      search: ({ query, top }) => (!this._index && this._early ? this.wordMatchSearch(this._early, query, top, readTextNow) : undefined),
    };
  }

  /** Word-match answers of the first build in progress, if there are any yet. */
  get wordMatch(): WordMatchIndex | undefined {
    return this._index ? undefined : this._early;
  }

  configure(config: WorkerConfig): { modelChanged: boolean } {
    this._config = config;
    this._roots = new RootMap(config.roots);
    this._admission = new Map(
      config.roots.map((r) => [
        r.name,
        new FileAdmission(r.fsPath, {
          include: config.include,
          exclude: [...config.exclude, ...r.exclude],
          honourGitignore: config.honourGitignore,
        }),
      ]),
    );
    const modelChanged =
      this._index !== undefined && modelSettingsKey(this._index.settings) !== modelSettingsKey(resolveSettings(config.settings));
    return { modelChanged };
  }

  async load() {
    const config = this.config();
    const t0 = performance.now();
    // The section rows and codes are checked after the load, before any of them is used (persistCheck.ts).
    const loaded = await loadIndex(config.indexFile, { checkRows: 'later' });
    const ms = performance.now() - t0;
    if (loaded.status === 'missing') return { outcome: 'missing' as const, summary: this.summary(), ms };
    if (loaded.status === 'damaged') return { outcome: 'damaged' as const, reason: loaded.reason, summary: this.summary(), ms };
    if (modelSettingsKey(loaded.index.settings) !== modelSettingsKey(resolveSettings(config.settings))) {
      return { outcome: 'settings-changed' as const, summary: this.summary(), ms };
    }
    this.useLoaded(loaded.index, loaded.termsFilled, loaded.checked);
    this._dirty = false;
    return { outcome: 'loaded' as const, summary: this.summary(), ms };
  }

  /**
   * Uses the index just saved to `file` in place of the built one (checked as a load checks it);
   * false, with nothing changed, when it cannot be read back or is another model.
   */
  private async reopenSaved(file: string, built: LsiIndex): Promise<boolean> {
    const loaded = await loadIndex(file, { checkRows: 'later' }).catch(() => undefined);
    if (
      loaded?.status !== 'ok' ||
      modelSettingsKey(loaded.index.settings) !== modelSettingsKey(built.settings) ||
      loaded.index.size !== built.size
    ) {
      if (loaded?.status === 'ok') loaded.index.sections.closeRows();
      return false;
    }
    built.sections.closeRows();
    this.useLoaded(loaded.index, loaded.termsFilled, loaded.checked);
    // The built index's memory goes now (a synchronous build gives the collector no idle time).
    collectGarbage();
    return true;
  }

  /** Puts a loaded index in use, its background check of the saved rows watched by checkSaved. */
  private useLoaded(index: LsiIndex, termsFilled: Promise<void>, checked: Promise<string | undefined>): void {
    this.use(index, termsFilled);
    let replace = (): void => undefined;
    const replaced = new Promise<void>((resolve) => (replace = resolve));
    this._loadCheck = { index, done: checked, replaced, replace };
  }

  /** The end of the loaded index's background check; damage counts only while that index is in use. */
  async checkSaved(): Promise<{ damaged: boolean; reason?: string }> {
    const check = this._loadCheck;
    if (!check) return { damaged: false };
    const reason = await Promise.race([check.done, check.replaced.then(() => undefined)]);
    return reason !== undefined && this._index === check.index ? { damaged: true, reason } : { damaged: false };
  }

  async refresh(maxFoldShare: number): Promise<RefreshReport> {
    const config = this.config();
    if (!this._index) return { summary: null, added: 0, changed: 0, removed: 0, tooManyChanges: false };
    const scan = await scanWorkspace(this._roots, config);
    return this.foldDifferences(scan, maxFoldShare, [], []);
  }

  async build(ctx: HandlerContext) {
    const run = this._build.catch(() => undefined).then(() => this.buildNow(ctx));
    this._build = run;
    return run;
  }

  async update(changes: readonly FileChange[]): Promise<UpdateReport> {
    const t0 = performance.now();
    this._duringBuild?.push(...changes);
    const folded: string[] = [];
    const removed: string[] = [];
    let rescan = false;
    if (this._index) {
      for (const change of changes) rescan = (await this.apply(this._index, change, folded, removed)) || rescan;
      if (rescan) await this.foldDifferences(await scanWorkspace(this._roots, this.config()), Infinity, folded, removed);
      if (folded.length + removed.length > 0) this.markDirty();
    }
    return { summary: this.summary(), folded, removed, ms: performance.now() - t0 };
  }

  /**
   * The best files for a query. A page and its translations (core/translations/) make one result,
   * shown in the member that fits the question's words best, the others listed under it; a few
   * extra hits are ranked so that collapsing groups still fills `top`.
   */
  async search(query: string, top: number, like: readonly string[] = [], unlike: readonly string[] = []): Promise<SearchMatch[]> {
    const index = this.requireIndex();
    const keyOf = (fsPath: string): string => {
      const key = this._roots.keyOf(fsPath);
      if (key === undefined || !index.has(key)) throw new NotIndexedError(fsPath);
      return key;
    };
    const feedback = { like: like.map(keyOf), unlike: unlike.map(keyOf) };
    const hits = index.search(query, { top: top + Math.min(top, 20), ...feedback });
    const groups = await this._translations.groupsOf(
      index,
      hits.map((h) => h.path),
    );
    const units = questionUnits(query);
    const scoreOf = new Map(hits.map((h) => [h.path, h.score]));
    const picked = collapseTranslations(hits, groups, (m) => questionFit(units, this._translations.units(m)), top);
    const why = searchWhy(
      index,
      query,
      picked.map((p) => p.key),
      formsFromTexts([query], index.settings.tokenize.stem),
      feedback,
    );
    const scorer = queryScorer(index, query);
    const places = bestSections(
      index,
      query,
      picked.map((p) => p.key),
    );
    return Promise.all(
      picked.map(async (p, i) => {
        const ref = this._roots.refOf(p.key);
        const got = await readIndexableText(ref.fsPath, this.config().maxFileBytes);
        const line = got.kind === 'text' ? bestMatchingLine(got.text, index, query, scorer) : { line: 0, text: '', highlights: [] };
        // A member shown in place of a ranked translation gets its own score where it can be worked out.
        const score = scoreOf.get(p.key) ?? why[i]?.score ?? scoreOf.get(p.others.find((o) => scoreOf.has(o)) ?? '') ?? 0;
        return {
          ...ref,
          score,
          why: why[i],
          line: line.line,
          lineText: line.text,
          highlights: line.highlights,
          ...sectionField(places.get(p.key)),
          ...this.translationFields(p.key, p.others),
        };
      }),
    );
  }

  /**
   * Files ranked by the query's words alone (BM25 over the counts of the build in progress), each
   * with its best-matching line; synchronous, so it can answer while the SVD holds the thread.
   */
  wordMatchSearch(early: WordMatchIndex, query: string, top: number, readText: (fsPath: string) => string | null): SearchMatch[] {
    const q = early.queryTerms(query);
    return early.search(query, top).map((h) => {
      const ref = this._roots.refOf(h.path);
      const text = readText(ref.fsPath);
      const line = text === null ? { line: 0, text: '', highlights: [] } : wordMatchLine(text, q.termIds, (t) => early.queryTerms(t));
      return { ...ref, score: h.score, line: line.line, lineText: line.text, highlights: line.highlights, wordMatchOnly: true as const };
    });
  }

  /** Sections ranked by a query (file keys turned into file references), each with why it matches. */
  async searchSections(query: string, top: number): Promise<SectionMatch[]> {
    const index = this.requireIndex();
    const hits = searchSections(index, query, { top });
    const textOf = await this.textsOf(hits.map((h) => h.path));
    if (this._index !== index) return []; // replaced during the reads: the next search asks again
    const why = sectionSearchWhy(index, query, hits, textOf, formsFromTexts([query], index.settings.tokenize.stem));
    return hits.map((h, i) => ({ ...this._roots.refOf(h.path), ...sectionField(h).section!, score: h.score, why: why[i] }));
  }

  /** Nearby at the cursor: other files' sections nearest to the section holding `line`, each with why it is near. */
  async nearbySections(fsPath: string, line: number, top: number): Promise<{ from: SectionMatch; hits: SectionMatch[] } | null> {
    const key = this._roots.keyOf(fsPath);
    const index = this._index;
    if (!index || key === undefined || !index.has(key)) return null;
    const near = nearbySections(index, key, line, { top });
    if (!near) return null;
    const keys = [...new Set([key, ...near.hits.map((h) => h.path)])];
    const textOf = await this.textsOf(keys);
    // Readable words from the sections themselves (their words are the ones shown), not the whole files.
    const texts = [near.from, ...near.hits].map((h) =>
      splitLines(textOf(h.path) ?? '')
        .slice(h.start, h.end)
        .join('\n'),
    );
    const why =
      this._index === index
        ? sectionNearbyWhy(index, near.from, near.hits, textOf, formsFromTexts(texts, index.settings.tokenize.stem))
        : [];
    const match = (h: SectionHit, w?: Why): SectionMatch => ({
      ...this._roots.refOf(h.path),
      ...sectionField(h).section!,
      score: h.score,
      why: w,
    });
    return { from: match(near.from), hits: near.hits.map((h, i) => match(h, why[i])) };
  }

  /** The current text of some indexed files, read once each (unreadable ones give undefined). */
  private async textsOf(keys: readonly string[]): Promise<TextOf> {
    const texts = new Map<string, string>();
    for (const key of new Set(keys)) {
      const got = await readIndexableText(this._roots.refOf(key).fsPath, this.config().maxFileBytes).catch(() => null);
      if (got?.kind === 'text') texts.set(key, got.text);
    }
    return (key) => texts.get(key);
  }

  /**
   * The nearest files, each with why it is near (readable words learned from the subject file).
   * The subject's own translations are left out (the view lists them apart, see translationsOf);
   * other pages with translations make one entry, in the subject's language where they have it.
   */
  async nearby(fsPath: string, top: number): Promise<ScoredFile[] | null> {
    const key = this._roots.keyOf(fsPath);
    if (!this._index || key === undefined || !this._index.has(key)) return null;
    const got = await readIndexableText(fsPath, this.config().maxFileBytes).catch(() => null);
    const index = this._index; // read again: an edit may have landed during the read
    if (!index || !index.has(key)) return null;
    const hits = index.nearby(key, { top: top + Math.min(top, 20) });
    const groups = await this._translations.groupsOf(index, [key, ...hits.map((h) => h.path)]);
    const own = new Set(groups.get(key) ?? [key]);
    const locale = translationPath(key).locale;
    const scoreOf = new Map(hits.map((h) => [h.path, h.score]));
    const picked = collapseTranslations(hits, groups, (m) => (translationPath(m).locale === locale ? 1 : 0), top, own).map((p) => ({
      ...p,
      score: scoreOf.get(p.key) ?? p.hit.score,
    }));
    const why = nearbyWhy(
      index,
      key,
      picked.map((p) => p.key),
      formsFromTexts(got?.kind === 'text' ? [got.text] : [], index.settings.tokenize.stem),
    );
    return picked.map((p, i) => ({
      ...this._roots.refOf(p.key),
      score: scoreOf.has(p.key) ? p.score : (why[i]?.score ?? p.score),
      why: why[i],
      ...this.translationFields(p.key, p.others),
    }));
  }

  /** The same page in other languages as the file at fsPath. */
  async translationsOf(fsPath: string): Promise<TranslationRef[]> {
    const key = this._roots.keyOf(fsPath);
    const index = this._index;
    if (!index || key === undefined || !index.has(key)) return [];
    const group = (await this._translations.groupsOf(index, [key])).get(key) ?? [];
    return group.filter((k) => k !== key).map((k) => ({ ...this._roots.refOf(k), language: this._translations.label(k) }));
  }

  private translationFields(key: string, others: readonly string[]): Pick<ScoredFile, 'language' | 'translations'> {
    if (others.length === 0) return {};
    return {
      language: this._translations.label(key),
      translations: others.map((k) => ({ ...this._roots.refOf(k), language: this._translations.label(k) })),
    };
  }

  /** Saves a changed index; false (and saveProblem set) when it could not be written. */
  async save(): Promise<boolean> {
    clearTimeout(this._saveTimer);
    this._saveTimer = undefined;
    if (!this._index || !this._dirty || !this._config || this._duringBuild) return false;
    this._dirty = false;
    this._saveProblem = await trySaveIndex(this._config.indexFile, this._index);
    return this._saveProblem === undefined;
  }

  /** Why the last save failed (the index stays in use, in memory), or undefined. */
  get saveProblem(): string | undefined {
    return this._saveProblem;
  }

  async deleteIndex(): Promise<{ deleted: boolean }> {
    clearTimeout(this._saveTimer);
    this._saveTimer = undefined;
    this.use(undefined);
    this._dirty = false;
    const file = this.config().indexFile;
    const existed = await stat(file).then(
      () => true,
      () => false,
    );
    await rm(file, { force: true });
    return { deleted: existed };
  }

  summary(): IndexSummary | null {
    const i = this._index;
    return i ? { files: i.size, k: i.k, terms: i.model.keptIds.length, staleness: i.staleness() } : null;
  }

  private async buildNow(ctx: HandlerContext) {
    const config = this.config();
    this._duringBuild = [];
    const first = this._index === undefined;
    const progress = (p: Progress): void => ctx.progress(this._early && !this._index ? { ...p, wordMatch: this._early.size } : p);
    try {
      const built = await buildWorkspaceIndex(this._roots, config, {
        previous: this._index,
        signal: ctx.signal,
        isCancelled: ctx.isCancelled,
        onProgress: progress,
        // A first build: word-match answers from the counts until the concept model is ready.
        onCounted: first
          ? (counted) => {
              this._early = new WordMatchIndex(counted);
              progress({ stage: 'matrix', done: 0, total: 1 });
            }
          : undefined,
        poll: first ? () => this._early && ctx.pump?.() : undefined,
        // A large build's scratch files beside the index file (kept in memory when the folder is not there yet).
        scratchFolder: dirname(config.indexFile),
      });
      progress({ stage: 'save', done: 0, total: 1 });
      // An index that cannot be saved (read-only storage, a folder or FIFO at its path) is still used.
      this._saveProblem = await trySaveIndex(config.indexFile, built.index);
      // A large index answers from the saved file once it is saved (reopenFromSections); where the
      // file cannot be read back, the built index answers.
      const reopen = !this._saveProblem && built.index.sections.count >= this._options.reopenFromSections;
      const reopened = reopen && (await this.reopenSaved(config.indexFile, built.index));
      if (!reopened) this.use(built.index);
      this._dirty = false;
      const replay = this._duringBuild;
      this._duringBuild = undefined;
      if (replay.length > 0) await this.update(replay);
      ctx.progress({ stage: 'save', done: 1, total: 1 });
      const saveProblem = this._saveProblem;
      return {
        summary: this.summary()!,
        read: built.read,
        reused: built.reused,
        skipped: built.skipped,
        seconds: built.seconds,
        ...(saveProblem ? { saveProblem } : {}),
      };
    } finally {
      this._duringBuild = undefined;
      this._early = undefined;
    }
  }

  /** Applies one change to the index; true when the folders must be rescanned (a folder or .gitignore changed). */
  private async apply(index: LsiIndex, change: FileChange, folded: string[], removed: string[]): Promise<boolean> {
    const at = this._roots.locate(change.fsPath);
    if (!at || at.rel === '') return false;
    const key = this._roots.prefixOf(at.root) + at.rel;
    const drop = (): void => {
      for (const k of index.has(key) ? [key] : []) if (index.remove(k)) removed.push(k);
      for (const k of index.paths()) if (k.startsWith(`${key}/`) && index.remove(k)) removed.push(k);
    };
    if (change.kind === 'deleted') {
      drop();
      return false;
    }
    const st = await stat(change.fsPath).catch(() => undefined);
    if (!st) {
      drop();
      return false;
    }
    if (st.isDirectory()) return true;
    const rescan = basename(change.fsPath) === '.gitignore';
    if (rescan) this._admission.get(at.root.name)?.forget();
    const config = this.config();
    const admitted = st.isFile() && st.size <= config.maxFileBytes && (await this._admission.get(at.root.name)!.admits(at.rel));
    const old = index.meta(key);
    if (!admitted) {
      if (old && index.remove(key)) removed.push(key);
      return rescan;
    }
    if (old && old.size === st.size && old.mtimeMs === st.mtimeMs) return rescan;
    const got = await readIndexableText(change.fsPath, config.maxFileBytes);
    if (got.kind === 'text') {
      index.foldIn({ path: key, size: st.size, mtimeMs: st.mtimeMs }, got.text);
      folded.push(key);
    } else if (old && index.remove(key)) removed.push(key);
    return rescan;
  }

  /** Folds in what a scan shows changed since the index saw it (unless it is more than maxFoldShare of the files). */
  private async foldDifferences(scan: WorkspaceScan, maxFoldShare: number, folded: string[], removed: string[]): Promise<RefreshReport> {
    const index = this._index!;
    const present = new Set<string>();
    const stale = scan.files.filter((f) => {
      present.add(f.key);
      const m = index.meta(f.key);
      return !m || m.size !== f.size || m.mtimeMs !== f.mtimeMs;
    });
    const gone = index.paths().filter((k) => !present.has(k));
    const added = stale.filter((f) => !index.has(f.key)).length;
    const report = { added, changed: stale.length - added, removed: gone.length };
    if (stale.length + gone.length > maxFoldShare * Math.max(1, index.size)) {
      return { summary: this.summary(), ...report, tooManyChanges: true };
    }
    for (const k of gone) if (index.remove(k)) removed.push(k);
    for (const f of stale) {
      const got = await readIndexableText(f.absPath, this.config().maxFileBytes);
      if (got.kind === 'text') {
        index.foldIn({ path: f.key, size: f.size, mtimeMs: f.mtimeMs }, got.text);
        folded.push(f.key);
      } else if (index.remove(f.key)) removed.push(f.key);
    }
    if (stale.length + gone.length > 0) this.markDirty();
    return { summary: this.summary(), ...report, tooManyChanges: false };
  }

  /** True when the topic tree of the index in use is computed or under way (see prepareTopics). */
  topicsStarted(): boolean {
    return this._index !== undefined && this._insights.topicsStarted();
  }

  /** Puts an index in use (or none) and prepares it in the background, stopping any earlier preparation. */
  private use(index: LsiIndex | undefined, filled?: Promise<void>): void {
    this._preparing?.controller.abort();
    this._preparing = undefined;
    // What was computed for the index going away (topic tree, overlaps, map) is dropped with it.
    if (index !== this._index) this._insights.forget();
    // The index going away gives back the file its section rows were read from (a reopened index
    // keeps it open: a rebuild renamed a new file over it, or another file was loaded).
    if (index !== this._index) this._index?.sections.closeRows();
    if (this._loadCheck && index !== this._loadCheck.index) {
      this._loadCheck.replace();
      this._loadCheck = undefined;
    }
    this._index = index;
    if (!index) return;
    const { prepareSliceMs: sliceMs, preparePause: pause } = this._options;
    const { controller, done } = prepareInBackground(index, { sliceMs, pause, after: filled, readText: this.readKeyText });
    this._preparing = {
      controller,
      done: done
        .then((ready) => {
          // Then, when asked to, the topic tree, so the Topics view and the map open without waiting for it.
          if (ready && this._options.prepareTopics && this._index === index && !controller.signal.aborted) this._insights.prepareTopics();
          return ready;
        })
        .finally(() => {
          if (this._preparing?.controller === controller) this._preparing = undefined;
        }),
    };
  }

  private markDirty(): void {
    this._dirty = true;
    clearTimeout(this._saveTimer);
    this._saveTimer = setTimeout(() => void this.save().catch(() => undefined), this._options.saveDelayMs);
    this._saveTimer.unref?.();
  }

  private config(): WorkerConfig {
    if (!this._config) throw new NoIndexError('The index worker has not been told which folders to index yet.');
    return this._config;
  }

  private requireIndex(): LsiIndex {
    if (!this._index && this._early)
      throw new NoIndexError('The index is still being built: only search by words is ready; this waits for the concept model.');
    if (!this._index) throw new NoIndexError('There is no index yet: build it first.');
    return this._index;
  }
}

/** A section hit as the wire's SectionPlace (nothing when there is none). */
function sectionField(h: SectionHit | undefined): { section?: SectionPlace } {
  return h ? { section: { title: h.title, start: h.start, end: h.end } } : {};
}
