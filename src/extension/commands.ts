/** The Undertone commands (ids `undertone.<verb>`, identical in the manifest). */
import * as vscode from 'vscode';
import { statusActions } from './indexState.js';
import type { IndexController } from './indexController.js';
import type { NearbyProvider } from './nearbyView.js';
import { openOptions } from './resultItem.js';
import type { SearchResultsProvider } from './searchView.js';
import { searchEntries, searchPickItems, type ResultEntry } from './viewModels.js';
import { errorKind } from '../node/worker/workerErrors.js';

export interface CommandDeps {
  readonly controller: IndexController;
  readonly nearby: NearbyProvider;
  readonly search: SearchResultsProvider;
  readonly log: vscode.OutputChannel;
  readonly indexFile: string | undefined;
}

/** How many results a search shows (common practice: one screen of a quick pick). */
const SEARCH_TOP = 20;

export function registerCommands(deps: CommandDeps): vscode.Disposable[] {
  const { controller, nearby, search, log } = deps;
  const reg = vscode.commands.registerCommand;
  return [
    reg('undertone.search', async () => {
      const query = await vscode.window.showInputBox({
        title: 'Search Workspace by Meaning',
        prompt: 'Describe what you are looking for in your own words; files that use other words for it are found too.',
        placeHolder: 'e.g. what happens to tickets when a crossing is called off',
        value: search.query,
        ignoreFocusOut: true,
      });
      if (query?.trim()) await runSearch(deps, query.trim());
    }),
    reg('undertone.searchSelection', async () => {
      const editor = vscode.window.activeTextEditor;
      const text = editor ? editor.selections.map((s) => editor.document.getText(s)).join('\n').trim() : '';
      if (!text) {
        void vscode.window.showInformationMessage('Select some text first: it becomes the query of a search by meaning.');
        return;
      }
      await runSearch(deps, text.length > 2000 ? text.slice(0, 2000) : text);
    }),
    reg('undertone.rebuildIndex', () => controller.build('user')),
    reg('undertone.cancelIndexing', () => controller.cancelBuild()),
    reg('undertone.showNearby', async (uri?: vscode.Uri) => {
      const target = uri instanceof vscode.Uri ? uri : vscode.window.activeTextEditor?.document.uri;
      if (!target || target.scheme !== 'file') {
        void vscode.window.showInformationMessage('Open a file from this workspace (or pick one in the Explorer) to see the files nearest to it in meaning.');
        return;
      }
      await vscode.commands.executeCommand('undertone.nearby.focus');
      await nearby.show(target);
    }),
    reg('undertone.deleteIndex', async () => {
      const deleted = await controller.deleteIndex();
      search.clear();
      const where = deps.indexFile ? ` (${deps.indexFile})` : '';
      void vscode.window.showInformationMessage(
        deleted ? `Deleted the saved Undertone index${where}. Run "Rebuild Index" to build it again.` : 'There was no saved Undertone index to delete.',
      );
    }),
    reg('undertone.clearSearchResults', () => search.clear()),
    reg('undertone.showLog', () => log.show(true)),
    reg('undertone.showActions', async () => {
      const items = statusActions(controller.state);
      const pick = await vscode.window.showQuickPick(items, { title: 'Undertone', placeHolder: 'Choose an action' });
      if (pick) await vscode.commands.executeCommand(pick.command);
    }),
  ];
}

async function runSearch(deps: CommandDeps, query: string): Promise<void> {
  const { controller, search } = deps;
  let matches;
  try {
    matches = await vscode.window.withProgress({ location: vscode.ProgressLocation.Window, title: 'Undertone: searching' }, () =>
      controller.search(query, SEARCH_TOP),
    );
  } catch (err) {
    const e = err as Error;
    const kind = errorKind(err);
    if (kind === 'no-index') {
      const choice = await vscode.window.showInformationMessage('There is no Undertone index for this workspace yet.', 'Build Index');
      if (choice) await controller.build('user');
    } else if (kind === 'no-known-terms') void vscode.window.showInformationMessage(e.message);
    else void vscode.window.showErrorMessage(`Undertone search failed: ${e.message}`);
    return;
  }
  search.show(query, searchEntries(matches, controller.multiRoot));
  if (matches.length === 0) {
    void vscode.window.showInformationMessage('No indexed file matches that search.');
    return;
  }
  const items = searchPickItems(matches, controller.multiRoot);
  const pick = await vscode.window.showQuickPick(items, {
    title: `Undertone: ${matches.length} files by meaning`,
    placeHolder: query,
    matchOnDescription: true,
    matchOnDetail: true,
  });
  if (pick) await open(pick.entry);
}

async function open(entry: ResultEntry): Promise<void> {
  await vscode.window.showTextDocument(vscode.Uri.file(entry.fsPath), openOptions(entry));
}
