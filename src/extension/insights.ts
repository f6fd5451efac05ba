/**
 * Wiring of the insight features (wiring only): the Look-alikes and Topics views, the concept map
 * panel, their commands (ids `undertone.<verb>`, identical in the manifest) and the look-alike
 * settings. Returns every registration for context.subscriptions.
 */
import * as vscode from 'vscode';
import { DismissedPairs } from './dismissedPairs.js';
import type { IndexController } from './indexController.js';
import { summaryOf } from './indexState.js';
import { readLookalikeSettings, type LookalikeNode, type MoreNode, type PairNode } from './lookalikeModel.js';
import { LookalikesProvider } from './lookalikeView.js';
import { ConceptMapPanel } from './mapPanel.js';
import { TopicsProvider } from './topicsView.js';
import type { TopicsTreeNode } from './topicsModel.js';

export interface InsightDeps {
  readonly controller: IndexController;
  readonly extensionUri: vscode.Uri;
  readonly workspaceState: vscode.Memento;
  readonly log: (line: string) => void;
}

export function registerInsights(deps: InsightDeps): vscode.Disposable[] {
  const { controller, log } = deps;
  const settings = () => readLookalikeSettings((key) => vscode.workspace.getConfiguration('undertone').get(key));
  const lookalikes = new LookalikesProvider(controller, new DismissedPairs(deps.workspaceState), settings, log);
  const topics = new TopicsProvider(controller, log);
  const lookalikeView = vscode.window.createTreeView<LookalikeNode>(LookalikesProvider.viewType, {
    treeDataProvider: lookalikes,
    showCollapseAll: true,
  });
  const topicsView = vscode.window.createTreeView<TopicsTreeNode>(TopicsProvider.viewType, {
    treeDataProvider: topics,
    showCollapseAll: true,
  });
  lookalikes.attach(lookalikeView);
  topics.attach(topicsView);
  let map: ConceptMapPanel | undefined;
  const reg = vscode.commands.registerCommand;
  const isPair = (x: unknown): x is PairNode => typeof x === 'object' && x !== null && (x as PairNode).type === 'pair';

  return [
    lookalikes,
    topics,
    lookalikeView,
    topicsView,
    { dispose: () => map?.dispose() },
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration('undertone.lookalikeThreshold')) void lookalikes.refresh();
    }),
    reg('undertone.openMap', async () => {
      if (summaryOf(controller.state) === null) {
        const choice = await vscode.window.showInformationMessage(
          'The concept map needs the Undertone index of this workspace, and there is none yet.',
          'Build Index',
        );
        if (choice) await controller.build('user');
        return;
      }
      if (map) map.reveal();
      else map = new ConceptMapPanel(deps.extensionUri, controller, log, () => (map = undefined));
    }),
    reg('undertone.refreshOverlaps', () => lookalikes.refresh()),
    reg('undertone.showMoreOverlaps', (node?: unknown) => {
      if (node && typeof node === 'object' && (node as { type?: unknown }).type === 'more') lookalikes.showMore(node as MoreNode);
    }),
    reg('undertone.refreshTopics', () => topics.refresh()),
    reg('undertone.showFolderTopics', async (uri?: unknown) => {
      const target = uri instanceof vscode.Uri ? uri : undefined;
      if (!target) return;
      await topics.showFolder(target.fsPath);
    }),
    reg('undertone.showAllTopics', () => topics.showAll()),
    reg('undertone.compareOverlap', async (node?: unknown) => {
      if (!isPair(node)) return;
      const title = `${node.label} (${node.description})`;
      await vscode.commands.executeCommand('vscode.diff', vscode.Uri.file(node.a.fsPath), vscode.Uri.file(node.b.fsPath), title, {
        preview: true,
      });
    }),
    reg('undertone.dismissOverlap', async (node?: unknown) => {
      if (isPair(node)) await lookalikes.hide(node);
    }),
    reg('undertone.restoreOverlaps', async () => {
      const n = await lookalikes.restoreHidden();
      void vscode.window.showInformationMessage(
        n > 0 ? `${n} dismissed ${n === 1 ? 'pair is' : 'pairs are'} shown again.` : 'No pairs were dismissed.',
      );
    }),
  ];
}
