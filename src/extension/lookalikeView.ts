/**
 * The "Overlaps" view: exact copies, near-copies, partial copies and "same content, other words"
 * pairs, found in the worker (node/worker/lookalikeTask.ts). Computed when the view is shown and
 * again after each rebuild (only while the view is visible; otherwise on its next showing); a
 * deleted file leaves at once, and when the index goes away (Delete Saved Index, a failed first
 * build) the view empties at once and asks again when an index is back. Each section shows a page
 * of its strongest entries and a "Show more" node. Dismissed pairs stay hidden across sessions.
 */
import * as vscode from 'vscode';
import type { LookalikesResult } from '../node/worker/insightProtocol.js';
import type { DismissedPairs } from './dismissedPairs.js';
import type { IndexController } from './indexController.js';
import type { LookalikeKind } from '../node/worker/insightProtocol.js';
import {
  lookalikeSummary,
  lookalikeTree,
  SECTION_PAGE,
  type LookalikeNode,
  type LookalikeSettings,
  type LookalikeTree,
  type MoreNode,
  type PairNode,
} from './lookalikeModel.js';

export class LookalikesProvider implements vscode.TreeDataProvider<LookalikeNode>, vscode.Disposable {
  static readonly viewType = 'undertone.overlaps';

  private _result: LookalikesResult | undefined;
  private _tree: LookalikeTree = { sections: [], hidden: 0, shown: 0 };
  private _view: vscode.TreeView<LookalikeNode> | undefined;
  private _stale = true;
  private _seq = 0;
  private _pending: Promise<void> = Promise.resolve();
  private readonly _limits: Partial<Record<LookalikeKind, number>> = {};
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
      _controller.onDidChangeState((state) => {
        if (state.kind === 'none') this.clear(`No index: ${state.reason}`);
      }),
      _controller.onDidChangeIndex((change) => {
        if (change.all) this.invalidate();
        else if (change.removed.length > 0 && this._result) {
          const gone = new Set(change.removed);
          this.show({
            ...this._result,
            groups: this._result.groups.map((g) => ({ ...g, pairs: g.pairs.filter((p) => !gone.has(p.a.key) && !gone.has(p.b.key)) })),
          });
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
      this.setMessage('Looking for overlaps…');
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
        this._log(`Overlaps: ${result.groups.length} groups and pairs among ${result.files} files in ${Math.round(result.ms)} ms.`);
        this.show(result);
      } catch (err) {
        if (seq !== this._seq) return;
        this._stale = true;
        this.setMessage(`Overlaps could not be found: ${err instanceof Error ? err.message : String(err)}`);
      }
    })();
    return this._pending;
  }

  /** Resolves once the latest refresh has reached the view. */
  settled(): Promise<void> {
    return this._pending;
  }

  /** "Show more" of a section: one more page. */
  showMore(node: MoreNode): void {
    this._limits[node.kind] = (this._limits[node.kind] ?? SECTION_PAGE) + SECTION_PAGE;
    if (this._result) this.show(this._result);
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
      item.tooltip = node.tooltip;
      item.iconPath = new vscode.ThemeIcon(
        node.kind === 'exact'
          ? 'copy'
          : node.kind === 'near'
            ? 'files'
            : node.kind === 'partial'
              ? 'split-horizontal'
              : 'comment-discussion',
      );
      item.contextValue = 'undertone.lookalikeSection';
      return item;
    }
    if (node.type === 'more') {
      const item = new vscode.TreeItem(node.label, vscode.TreeItemCollapsibleState.None);
      item.id = node.id;
      item.description = `${node.hidden} not shown yet`;
      item.iconPath = new vscode.ThemeIcon('ellipsis');
      item.contextValue = 'undertone.lookalikeMore';
      item.command = { command: 'undertone.showMoreOverlaps', title: 'Show More', arguments: [node] };
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
    item.contextValue = 'undertone.overlapPair';
    item.command = { command: 'undertone.compareOverlap', title: 'Compare', arguments: [node] };
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

  /** Empties the view (the index is gone); the next index brings a fresh search. */
  private clear(message: string): void {
    this._seq++;
    this._result = undefined;
    this._tree = { sections: [], hidden: 0, shown: 0 };
    this._stale = true;
    this.setMessage(message);
    this.render();
  }

  private invalidate(): void {
    this._stale = true;
    if (this._view?.visible) void this.refresh();
  }

  private show(result: LookalikesResult): void {
    this._result = result;
    this._tree = lookalikeTree(result, this._dismissed.keys, this._limits);
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
