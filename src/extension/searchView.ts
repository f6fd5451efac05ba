/**
 * The "Search Results" view: the results of the last search by meaning, each with its score and
 * best-matching passage (a row under it, the question's words highlighted) and, for a page with
 * translations, the other languages. When the index changes, deleted files leave at once and the
 * search is run again so scores and passages follow the edits; when the index goes (deleted,
 * lost), the results go too and the view's welcome text says why. A toggle in the view's title
 * ranks sections (headings, declarations) instead of files.
 */
import * as vscode from 'vscode';
import type { IndexController } from './indexController.js';
import { canSearch } from './indexState.js';
import { resultTreeItem } from './resultItem.js';
import {
  feedbackDescription,
  isPassage,
  NO_FEEDBACK,
  searchEntries,
  searchViewDescription,
  sectionEntries,
  withoutKeys,
  type ResultEntry,
  type ResultNode,
  type SearchFeedback,
} from './viewModels.js';

/** Delay before re-running the last search after index changes (common practice debounce). */
const RERUN_DELAY_MS = 150;

export class SearchResultsProvider implements vscode.TreeDataProvider<ResultNode>, vscode.Disposable {
  static readonly viewType = 'undertone.searchResults';

  private _entries: ResultEntry[] = [];
  private _query: string | undefined;
  private _feedback: SearchFeedback = NO_FEEDBACK;
  private _view: vscode.TreeView<ResultNode> | undefined;
  private _rerun: ReturnType<typeof setTimeout> | undefined;
  private _seq = 0;
  private _sections = false;
  private readonly _onDidChangeTreeData = new vscode.EventEmitter<void>();
  private readonly _disposables: vscode.Disposable[] = [this._onDidChangeTreeData];
  readonly onDidChangeTreeData = this._onDidChangeTreeData.event;

  constructor(private readonly _controller: IndexController) {
    this._disposables.push(
      _controller.onDidChangeIndex((change) => {
        if (this._query === undefined) return;
        if (change.removed.length > 0) this.setEntries(withoutKeys(this._entries, new Set(change.removed)));
        clearTimeout(this._rerun);
        this._rerun = setTimeout(() => void this.rerun(), RERUN_DELAY_MS);
      }),
      // No index (deleted, lost, never built): nothing to show, and nothing to re-run.
      _controller.onDidChangeState((state) => {
        if (!canSearch(state) && (this._query !== undefined || this._entries.length > 0)) this.clear();
      }),
    );
  }

  attach(view: vscode.TreeView<ResultNode>): void {
    this._view = view;
  }

  get query(): string | undefined {
    return this._query;
  }

  /** The files the shown search was asked to find more / fewer like. */
  get feedback(): SearchFeedback {
    return this._feedback;
  }

  /** Whether a file is among the shown results. */
  lists(key: string): boolean {
    return this._entries.some((e) => e.key === key);
  }

  /** Shows the results of a search just made (ranked again by sections when the toggle is on). */
  show(query: string, entries: ResultEntry[], feedback: SearchFeedback = NO_FEEDBACK): void {
    this._seq++;
    this._query = query;
    this._feedback = feedback;
    this.setEntries(entries);
    if (this._sections) void this.rerun();
  }

  /** Whether sections are ranked instead of files. */
  get sections(): boolean {
    return this._sections;
  }

  /** Switches between ranking files and ranking sections, and runs the shown search again. */
  async setSections(on: boolean): Promise<void> {
    this._sections = on;
    await vscode.commands.executeCommand('setContext', 'undertone.searchSections', on);
    await this.rerun();
  }

  clear(): void {
    clearTimeout(this._rerun);
    this._seq++;
    this._query = undefined;
    this._feedback = NO_FEEDBACK;
    this.setEntries([]);
  }

  getTreeItem(node: ResultNode): vscode.TreeItem {
    return resultTreeItem(node);
  }

  getChildren(node?: ResultNode): ResultNode[] {
    if (!node) return this._entries;
    return isPassage(node) ? [] : [...(node.children ?? [])];
  }

  dispose(): void {
    clearTimeout(this._rerun);
    for (const d of this._disposables.splice(0)) d.dispose();
  }

  private async rerun(): Promise<void> {
    const query = this._query;
    if (query === undefined) return;
    const seq = ++this._seq;
    try {
      const top = this._controller.settings.nearbyCount * 2;
      if (this._sections) {
        const sections = await this._controller.searchSections(query, top);
        if (seq === this._seq) this.setEntries(sectionEntries(sections, this._controller.multiRoot));
        return;
      }
      const matches = await this._controller.search(query, top, this._feedback);
      if (seq === this._seq) this.setEntries(searchEntries(matches, this._controller.multiRoot));
    } catch {
      if (seq === this._seq) this.setEntries([]);
    }
  }

  private setEntries(entries: ResultEntry[]): void {
    this._entries = entries;
    const steer = feedbackDescription(this._feedback);
    if (this._view) this._view.description = searchViewDescription(this._query, entries.length) + (steer ? ` · ${steer}` : '');
    this._onDidChangeTreeData.fire();
  }
}
