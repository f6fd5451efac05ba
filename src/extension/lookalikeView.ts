/**
 * The "Look-alikes" view: exact copies, near-copies and "same content, different words" pairs,
 * found in the worker (node/worker/lookalikeTask.ts). Computed when the view is shown and again
 * after each rebuild (only while the view is visible; otherwise on its next showing); a deleted
 * file leaves at once. Pairs marked "Not a look-alike" stay hidden across sessions.
 */
import * as vscode from 'vscode';
import type { LookalikesResult } from '../node/worker/insightProtocol.js';
import type { DismissedPairs } from './dismissedPairs.js';
import type { IndexController } from './indexController.js';
import { lookalikeSummary, lookalikeTree, type LookalikeNode, type LookalikeSettings, type LookalikeTree, type PairNode } from './lookalikeModel.js';

export class LookalikesProvider implements vscode.TreeDataProvider<LookalikeNode>, vscode.Disposable {
  static readonly viewType = 'undertone.lookalikes';

  private _result: LookalikesResult | undefined;
  private _tree: LookalikeTree = { sections: [], hidden: 0, shown: 0 };
  private _view: vscode.TreeView<LookalikeNode> | undefined;
  private _stale = true;
  private _seq = 0;
  private _pending: Promise<void> = Promise.resolve();
  private readonly _onDidChangeTreeData = new vscode.EventEmitter<void>();
  private readonly _disposables: vscode.Disposable[] = [this._onDidChangeTreeData];
  readonly onDidChangeTreeData = this._onDidChangeTreeData.event;

  constructor(
    private readonly _controller: IndexController,
    private readonly _dismissed: DismissedPairs,
    private readonly _settings: () => LookalikeSettings,
    private readonly _log: (line: string) => void,
  ) {
    this._disposables.push(
      _controller.onDidChangeIndex((change) => {
        if (change.all) this.invalidate();
        else if (change.removed.length > 0 && this._result) {
          const gone = new Set(change.removed);
          this.show({ ...this._result, groups: this._result.groups.map((g) => ({ ...g, pairs: g.pairs.filter((p) => !gone.has(p.a.key) && !gone.has(p.b.key)) })) });
        }
      }),
    );
  }

  attach(view: vscode.TreeView<LookalikeNode>): void {
    this._view = view;
    this._disposables.push(view.onDidChangeVisibility((e) => e.visible && this._stale && void this.refresh()));
    if (view.visible) void this.refresh();
  }

  /** Asks the worker again; resolves when the view shows the answer. */
  refresh(): Promise<void> {
    const seq = ++this._seq;
    this._stale = false;
    this._pending = (async () => {
      this.setMessage('Looking for look-alikes…');
      try {
        const settings = this._settings();
        const result = await this._controller.insight('lookalikes', settings);
        if (seq !== this._seq) return;
        if (!result) {
          // No index (deleted or not built): nothing to list, so the welcome text shows.
          this._result = undefined;
          this._tree = { sections: [], hidden: 0, shown: 0 };
          this.setMessage(undefined);
          this.render();
          this._stale = true;
          return;
        }
        this._log(`Look-alikes: ${result.groups.length} groups among ${result.files} files in ${Math.round(result.ms)} ms.`);
        this.show(result);
      } catch (err) {
        if (seq !== this._seq) return;
        this._stale = true;
        this.setMessage(`Look-alikes could not be found: ${err instanceof Error ? err.message : String(err)}`);
      }
    })();
    return this._pending;
  }

  /** Resolves once the latest refresh has reached the view. */
  settled(): Promise<void> {
    return this._pending;
  }

  async hide(pair: PairNode): Promise<void> {
    await this._dismissed.add(pair.key);
    if (this._result) this.show(this._result);
  }

  async restoreHidden(): Promise<number> {
    const n = await this._dismissed.clear();
    if (this._result) this.show(this._result);
    return n;
  }

  getTreeItem(node: LookalikeNode): vscode.TreeItem {
    const expanded = this._tree.shown <= 40 ? vscode.TreeItemCollapsibleState.Expanded : vscode.TreeItemCollapsibleState.Collapsed;
    if (node.type === 'section') {
      const item = new vscode.TreeItem(node.label, vscode.TreeItemCollapsibleState.Expanded);
      item.id = node.id;
      item.description = node.description;
      item.iconPath = new vscode.ThemeIcon(node.kind === 'exact' ? 'copy' : node.kind === 'near' ? 'files' : 'symbol-text');
      item.contextValue = 'undertone.lookalikeSection';
      return item;
    }
    if (node.type === 'group') {
      const item = new vscode.TreeItem(node.label, expanded);
      item.id = node.id;
      item.description = node.description;
      item.tooltip = node.tooltip;
      item.iconPath = new vscode.ThemeIcon('files');
      item.contextValue = 'undertone.lookalikeGroup';
      return item;
    }
    const item = new vscode.TreeItem(node.label, vscode.TreeItemCollapsibleState.None);
    item.id = node.id;
    item.description = node.description;
    item.tooltip = node.tooltip;
    item.iconPath = new vscode.ThemeIcon('diff');
    item.contextValue = 'undertone.lookalikePair';
    item.command = { command: 'undertone.compareLookalike', title: 'Compare', arguments: [node] };
    return item;
  }

  getChildren(node?: LookalikeNode): LookalikeNode[] {
    if (!node) return [...this._tree.sections];
    if (node.type === 'section') return [...node.children];
    if (node.type === 'group') return [...node.pairs];
    return [];
  }

  dispose(): void {
    for (const d of this._disposables.splice(0)) d.dispose();
  }

  private invalidate(): void {
    this._stale = true;
    if (this._view?.visible) void this.refresh();
  }

  private show(result: LookalikesResult): void {
    this._result = result;
    this._tree = lookalikeTree(result, this._dismissed.keys);
    this.setMessage(lookalikeSummary(result, this._tree) || undefined);
    this.render();
  }

  private render(): void {
    if (this._view) this._view.description = this._result ? `${this._tree.shown} ${this._tree.shown === 1 ? 'pair' : 'pairs'}` : undefined;
    this._onDidChangeTreeData.fire();
  }

  private setMessage(message: string | undefined): void {
    if (this._view) this._view.message = message;
  }
}
