/**
 * The "Nearby" view: the files nearest in meaning to the active editor's file (or to a file
 * chosen with "Show Nearby Files"), with their scores; the file's own translations sit folded in
 * one row above them, and other pages' translations under those pages. Follows the active editor and the index;
 * the tree stays empty (so the welcome text shows) while there is no index or the file is not in it.
 * A toggle in the view's title switches to the section under the cursor: the nearest sections of
 * other files, asked of the worker again when the cursor settles in another section (debounced).
 */
import * as vscode from 'vscode';
import type { IndexSummary } from '../node/worker/workerProtocol.js';
import type { IndexController } from './indexController.js';
import { summaryOf } from './indexState.js';
import { isPassage, nearbyEntries, sectionEntries, subjectTranslationsEntry, type ResultNode } from './viewModels.js';

/** Wait after the cursor stops before asking for the section's neighbours (common practice debounce). */
const CURSOR_DELAY_MS = 250;
import { resultTreeItem } from './resultItem.js';

export class NearbyProvider implements vscode.TreeDataProvider<ResultNode>, vscode.Disposable {
  static readonly viewType = 'undertone.nearby';

  private _entries: ResultNode[] = [];
  private _subject: vscode.Uri | undefined;
  private _seq = 0;
  private _pending: Promise<void> = Promise.resolve();
  private _view: vscode.TreeView<ResultNode> | undefined;
  private _summary: IndexSummary | null = null;
  private _atCursor = false;
  private _line = 0;
  /** The section the list was made for ([start, end) lines), so moves inside it ask nothing. */
  private _span: readonly [number, number] | null = null;
  private _cursorTimer: ReturnType<typeof setTimeout> | undefined;
  private _sectionTitle: string | undefined;
  private readonly _onDidChangeTreeData = new vscode.EventEmitter<void>();
  private readonly _disposables: vscode.Disposable[] = [this._onDidChangeTreeData];
  readonly onDidChangeTreeData = this._onDidChangeTreeData.event;

  constructor(private readonly _controller: IndexController) {
    this._disposables.push(
      vscode.window.onDidChangeActiveTextEditor((editor) => {
        if (editor && editor.document.uri.scheme === 'file') void this.show(editor.document.uri);
      }),
      _controller.onDidChangeIndex(() => void this.refresh()),
      vscode.window.onDidChangeTextEditorSelection((e) => {
        if (!this._atCursor || e.textEditor.document.uri.toString() !== this._subject?.toString()) return;
        const line = e.selections[0]?.active.line ?? 0;
        clearTimeout(this._cursorTimer);
        this._cursorTimer = setTimeout(() => {
          this._line = line;
          if (!this._span || line < this._span[0] || line >= this._span[1]) void this.refresh();
        }, CURSOR_DELAY_MS);
      }),
      { dispose: () => clearTimeout(this._cursorTimer) },
      // Only when the index appears, goes or is replaced: progress updates need no new query.
      _controller.onDidChangeState((state) => {
        const summary = summaryOf(state);
        if (summary === this._summary) return;
        this._summary = summary;
        void this.refresh();
      }),
    );
    const active = vscode.window.activeTextEditor?.document.uri;
    if (active?.scheme === 'file') this._subject = active;
  }

  attach(view: vscode.TreeView<ResultNode>): void {
    this._view = view;
    this.describe();
  }

  /** The file whose neighbours are shown. */
  get subject(): vscode.Uri | undefined {
    return this._subject;
  }

  /** Whether the list follows the section under the cursor instead of the whole file. */
  get atCursor(): boolean {
    return this._atCursor;
  }

  async setAtCursor(on: boolean): Promise<void> {
    this._atCursor = on;
    this._span = null;
    const editor = vscode.window.activeTextEditor;
    if (editor && editor.document.uri.toString() === this._subject?.toString()) this._line = editor.selection.active.line;
    await vscode.commands.executeCommand('setContext', 'undertone.nearbyAtCursor', on);
    this.describe();
    await this.refresh();
  }

  show(uri: vscode.Uri): Promise<void> {
    this._subject = uri;
    this._span = null;
    const editor = vscode.window.activeTextEditor;
    this._line = editor && editor.document.uri.toString() === uri.toString() ? editor.selection.active.line : 0;
    this.describe();
    return this.refresh();
  }

  /** Asks the worker again; resolves when the view has the new entries. */
  refresh(): Promise<void> {
    const seq = ++this._seq;
    const subject = this._subject;
    this._pending = (async () => {
      let hits = null;
      let own: Awaited<ReturnType<IndexController['translations']>> = [];
      try {
        if (subject && subject.scheme === 'file' && this._atCursor) {
          const near = await this._controller.nearbySections(subject.fsPath, this._line, this._controller.settings.nearbyCount);
          if (seq !== this._seq) return;
          if (near) {
            this._span = [near.from.start, near.from.end];
            this._sectionTitle = near.from.title;
            this._entries = sectionEntries(near.hits, this._controller.multiRoot, 'nearby');
            this.describe();
            void vscode.commands.executeCommand('setContext', 'undertone.activeIndexed', true);
            this._onDidChangeTreeData.fire();
            return;
          }
          this._sectionTitle = undefined; // no sections for this file: the whole file's neighbours
          this._span = [0, Number.MAX_SAFE_INTEGER];
        }
        if (subject && subject.scheme === 'file') {
          hits = await this._controller.nearby(subject.fsPath, this._controller.settings.nearbyCount);
          if (hits) own = await this._controller.translations(subject.fsPath);
        }
      } catch {
        hits = null; // the worker is restarting or has no index: the welcome text explains
      }
      if (seq !== this._seq) return;
      const multiRoot = this._controller.multiRoot;
      this._entries =
        hits && subject
          ? [...subjectTranslationsEntry(subject.fsPath, subject.fsPath, own, multiRoot), ...nearbyEntries(hits, multiRoot)]
          : [];
      void vscode.commands.executeCommand('setContext', 'undertone.activeIndexed', hits !== null);
      this._onDidChangeTreeData.fire();
    })();
    return this._pending;
  }

  /** Resolves once the latest refresh has reached the view. */
  settled(): Promise<void> {
    return this._pending;
  }

  getTreeItem(node: ResultNode): vscode.TreeItem {
    return resultTreeItem(node);
  }

  getChildren(node?: ResultNode): ResultNode[] {
    if (!node) return this._entries;
    return isPassage(node) ? [] : [...(node.children ?? [])];
  }

  dispose(): void {
    clearTimeout(this._cursorTimer);
    for (const d of this._disposables.splice(0)) d.dispose();
  }

  private describe(): void {
    const name = this._subject ? vscode.workspace.asRelativePath(this._subject, false).split('/').pop() : undefined;
    if (this._view) this._view.description = name && this._atCursor && this._sectionTitle ? `${name} · ${this._sectionTitle}` : name;
  }
}
