/**
 * The "Unlinked Neighbours" view: for the note in the active editor, the notes nearest in meaning
 * that it does not link to and that do not link to it (worked out in the worker, see
 * node/worker/linkService.ts), with their similarity and the words behind it. "Insert Link"
 * writes a link to one of them at the cursor of the note, in the collection's own link style.
 * Follows the active editor and the index; the view says why when it is empty (welcome texts
 * keyed on undertone.linkIdeas).
 */
import * as vscode from 'vscode';
import type { IndexController } from './indexController.js';
import { summaryOf } from './indexState.js';
import { whyMarkdown } from './explainTooltip.js';
import { linkRows, linkViewState, type LinkSuggestionRow } from './linkSuggestionsModel.js';

export class LinkSuggestionsProvider implements vscode.TreeDataProvider<LinkSuggestionRow>, vscode.Disposable {
  static readonly viewType = 'undertone.unlinkedNeighbours';

  private _rows: LinkSuggestionRow[] = [];
  private _subject: vscode.Uri | undefined;
  private _seq = 0;
  private _pending: Promise<void> = Promise.resolve();
  private _summary: ReturnType<typeof summaryOf> = null;
  private readonly _onDidChangeTreeData = new vscode.EventEmitter<void>();
  private readonly _disposables: vscode.Disposable[] = [this._onDidChangeTreeData];
  readonly onDidChangeTreeData = this._onDidChangeTreeData.event;

  constructor(private readonly _controller: IndexController) {
    this._disposables.push(
      vscode.window.onDidChangeActiveTextEditor((editor) => {
        if (editor && editor.document.uri.scheme === 'file') void this.show(editor.document.uri);
      }),
      _controller.onDidChangeIndex(() => void this.refresh()),
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

  get subject(): vscode.Uri | undefined {
    return this._subject;
  }

  show(uri: vscode.Uri): Promise<void> {
    this._subject = uri;
    return this.refresh();
  }

  /** Asks the worker again; resolves when the view has the new rows. */
  refresh(): Promise<void> {
    const seq = ++this._seq;
    const subject = this._subject;
    this._pending = (async () => {
      let result = null;
      try {
        if (subject) result = await this._controller.suggestLinks(subject.fsPath, 5);
      } catch {
        result = null; // the worker is restarting or has no index: the welcome text explains
      }
      if (seq !== this._seq) return;
      this._rows = subject ? linkRows(subject.fsPath, result, this._controller.multiRoot) : [];
      const state = linkViewState(result, summaryOf(this._controller.state) !== null);
      void vscode.commands.executeCommand('setContext', 'undertone.linkIdeas', state);
      this._onDidChangeTreeData.fire();
    })();
    return this._pending;
  }

  settled(): Promise<void> {
    return this._pending;
  }

  getTreeItem(row: LinkSuggestionRow): vscode.TreeItem {
    const item = new vscode.TreeItem(row.label, vscode.TreeItemCollapsibleState.None);
    const uri = vscode.Uri.file(row.suggestion.fsPath);
    item.id = row.suggestion.key;
    item.resourceUri = uri;
    item.iconPath = new vscode.ThemeIcon('link');
    item.description = row.description;
    item.tooltip = new vscode.MarkdownString(whyMarkdown(row.tooltip, row.suggestion.why, 'nearby'));
    item.contextValue = 'undertone.linkSuggestion';
    item.command = { command: 'vscode.open', title: 'Open File', arguments: [uri, { preview: true }] };
    return item;
  }

  getChildren(row?: LinkSuggestionRow): LinkSuggestionRow[] {
    return row ? [] : this._rows;
  }

  dispose(): void {
    for (const d of this._disposables.splice(0)) d.dispose();
  }
}

/** Writes a suggested link at the cursor of its note (opening the note if it is not shown). */
async function insertLink(row: LinkSuggestionRow | undefined): Promise<void> {
  if (!row || row.type !== 'linkSuggestion') return;
  const target = vscode.Uri.file(row.subject);
  const shown = vscode.window.visibleTextEditors.find((e) => e.document.uri.fsPath === target.fsPath);
  const editor = shown ?? (await vscode.window.showTextDocument(target, { preview: false }));
  const at = editor.selection.active;
  const done = await editor.edit((b) => b.insert(at, row.suggestion.link));
  if (!done)
    void vscode.window.showWarningMessage(`The link to ${row.suggestion.title} could not be inserted (the note changed meanwhile).`);
}

/** The view, its provider and its commands, for context.subscriptions. */
export function registerLinkSuggestions(controller: IndexController): vscode.Disposable[] {
  const provider = new LinkSuggestionsProvider(controller);
  const view = vscode.window.createTreeView(LinkSuggestionsProvider.viewType, { treeDataProvider: provider });
  return [
    provider,
    view,
    vscode.commands.registerCommand('undertone.insertLink', (row?: LinkSuggestionRow) => insertLink(row)),
    vscode.commands.registerCommand('undertone.refreshLinkIdeas', () => provider.refresh()),
  ];
}
