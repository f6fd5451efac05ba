/**
 * The "Topics" view: the workspace's topic tree (found in the worker, node/worker/topicsTask.ts,
 * and kept there until the index changes), each topic named by its words, opening into sub-topics
 * and then files; clicking a file opens it. Computed when the view is shown and again after each
 * rebuild (while visible; otherwise on its next showing). showFolder() narrows it to the topics
 * holding one folder's files (Explorer: Show Topics of Folder) until showAll().
 */
import * as vscode from 'vscode';
import type { TopicsResult } from '../node/worker/insightProtocol.js';
import type { IndexController } from './indexController.js';
import { topicsSummary, topicsTree, type TopicNode, type TopicsTreeNode } from './topicsModel.js';
import { errorKind } from '../node/worker/workerErrors.js';

export class TopicsProvider implements vscode.TreeDataProvider<TopicsTreeNode>, vscode.Disposable {
  static readonly viewType = 'undertone.topics';

  private _nodes: TopicNode[] = [];
  private _view: vscode.TreeView<TopicsTreeNode> | undefined;
  private _stale = true;
  private _seq = 0;
  private _pending: Promise<void> = Promise.resolve();
  private _folder: string | undefined;
  private readonly _onDidChangeTreeData = new vscode.EventEmitter<void>();
  private readonly _disposables: vscode.Disposable[] = [this._onDidChangeTreeData];
  readonly onDidChangeTreeData = this._onDidChangeTreeData.event;

  constructor(
    private readonly _controller: IndexController,
    private readonly _log: (line: string) => void,
  ) {
    this._disposables.push(
      _controller.onDidChangeIndex((change) => {
        if (!change.all) return;
        this._stale = true;
        if (this._view?.visible) void this.refresh();
      }),
    );
  }

  attach(view: vscode.TreeView<TopicsTreeNode>): void {
    this._view = view;
    this._disposables.push(view.onDidChangeVisibility((e) => e.visible && this._stale && void this.refresh()));
    if (view.visible) void this.refresh();
  }

  /** Shows the topics holding the files of one folder (absolute path). */
  async showFolder(fsPath: string): Promise<void> {
    this._folder = fsPath;
    void vscode.commands.executeCommand('setContext', 'undertone.topicsFolder', true);
    await vscode.commands.executeCommand(`${TopicsProvider.viewType}.focus`);
    return this.refresh();
  }

  showAll(): Promise<void> {
    this._folder = undefined;
    void vscode.commands.executeCommand('setContext', 'undertone.topicsFolder', false);
    return this.refresh();
  }

  refresh(): Promise<void> {
    const seq = ++this._seq;
    this._stale = false;
    this._pending = (async () => {
      this.setMessage('Finding topics…');
      try {
        const result: TopicsResult | null = await this._controller.insight('topics', this._folder ? { folder: this._folder } : {});
        if (seq !== this._seq) return;
        if (!result) this._stale = true;
        else
          this._log(
            `Topics: ${result.topics.length} first-level topics, ${result.levels} level${result.levels === 1 ? '' : 's'}, found in ${Math.round(result.ms)} ms.`,
          );
        this._nodes = result ? topicsTree(result, this._controller.multiRoot) : [];
        this.setMessage(result?.folder && result.folder.files === 0 ? 'No file of this folder is in the index.' : undefined);
        if (this._view) this._view.description = result ? topicsSummary(result) : undefined;
        this._onDidChangeTreeData.fire();
      } catch (err) {
        if (seq !== this._seq) return;
        this._stale = true;
        this._nodes = [];
        this._onDidChangeTreeData.fire();
        this.setMessage(
          err instanceof Error && errorKind(err) === 'empty'
            ? err.message
            : `Topics could not be found: ${err instanceof Error ? err.message : String(err)}`,
        );
      }
    })();
    return this._pending;
  }

  settled(): Promise<void> {
    return this._pending;
  }

  getTreeItem(node: TopicsTreeNode): vscode.TreeItem {
    if (node.type === 'topic') {
      const item = new vscode.TreeItem(
        node.label,
        node.children.length > 0 ? vscode.TreeItemCollapsibleState.Collapsed : vscode.TreeItemCollapsibleState.None,
      );
      item.id = node.id;
      item.description = node.description;
      item.tooltip = new vscode.MarkdownString(node.tooltip);
      item.iconPath = new vscode.ThemeIcon(node.icon === 'topic' ? 'tag' : node.icon === 'loose' ? 'question' : 'circle-slash');
      item.contextValue = node.icon === 'topic' ? 'undertone.topic' : 'undertone.topicGroup';
      return item;
    }
    if (node.type === 'note') {
      const item = new vscode.TreeItem(node.label, vscode.TreeItemCollapsibleState.None);
      item.id = node.id;
      return item;
    }
    const uri = vscode.Uri.file(node.file.fsPath);
    const item = new vscode.TreeItem(node.label, vscode.TreeItemCollapsibleState.None);
    item.id = node.id;
    item.resourceUri = uri;
    item.iconPath = vscode.ThemeIcon.File;
    item.description = node.description;
    item.tooltip = node.tooltip;
    item.contextValue = 'undertone.file';
    item.command = { command: 'vscode.open', title: 'Open File', arguments: [uri, { preview: true }] };
    return item;
  }

  getChildren(node?: TopicsTreeNode): TopicsTreeNode[] {
    if (!node) return this._nodes;
    return node.type === 'topic' ? [...node.children] : [];
  }

  dispose(): void {
    for (const d of this._disposables.splice(0)) d.dispose();
  }

  private setMessage(message: string | undefined): void {
    if (this._view) this._view.message = message;
  }
}
