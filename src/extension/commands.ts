/** The Undertone commands (ids `undertone.<verb>`, identical in the manifest). */
import * as vscode from 'vscode';
import { statusActions } from './indexState.js';
import type { IndexController } from './indexController.js';
import type { NearbyProvider } from './nearbyView.js';
import { openOptions } from './resultItem.js';
import type { SearchResultsProvider } from './searchView.js';
import {
  EMPTY_QUESTION_MESSAGE,
  NO_FEEDBACK,
  NO_MATCH_MESSAGE,
  noKnownWordsMessage,
  refineFeedback,
  SEARCH_PLACEHOLDER,
  searchEntries,
  searchPickItems,
  type ResultEntry,
  type SearchFeedback,
} from './viewModels.js';
import type { SearchMatch } from '../node/worker/workerProtocol.js';
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
    reg('undertone.search', () => askAndSearch(deps)),
    reg('undertone.searchSelection', async () => {
      const editor = vscode.window.activeTextEditor;
      const text = editor
        ? editor.selections
            .map((s) => editor.document.getText(s))
            .join('\n')
            .trim()
        : '';
      if (!text) {
        void vscode.window.showInformationMessage('Select some text first: it becomes the query of a search by meaning.');
        return;
      }
      await runSearch(deps, text.length > 2000 ? text.slice(0, 2000) : text);
    }),
    reg('undertone.rebuildIndex', () => controller.build('user')),
    reg('undertone.rankSections', () => search.setSections(true)),
    reg('undertone.rankFiles', () => search.setSections(false)),
    reg('undertone.nearbyAtCursor', () => nearby.setAtCursor(true)),
    reg('undertone.nearbyWholeFile', () => nearby.setAtCursor(false)),
    reg('undertone.cancelIndexing', () => controller.cancelBuild()),
    reg('undertone.showNearby', async (uri?: vscode.Uri) => {
      const target = uri instanceof vscode.Uri ? uri : vscode.window.activeTextEditor?.document.uri;
      if (!target || target.scheme !== 'file') {
        void vscode.window.showInformationMessage(
          'Open a file from this workspace (or pick one in the Explorer) to see the files nearest to it in meaning.',
        );
        return;
      }
      await vscode.commands.executeCommand('undertone.nearby.focus');
      await nearby.show(target);
    }),
    reg('undertone.deleteIndex', async () => {
      const choice = await vscode.window.showWarningMessage(
        'Delete the saved Undertone index of this workspace?',
        {
          modal: true,
          detail:
            'Search, Nearby and the other views have nothing to show until the index is built again with "Build Index" (unchanged files are read again too).',
        },
        'Delete',
      );
      if (choice !== 'Delete') return;
      const deleted = await controller.deleteIndex();
      search.clear();
      const where = deps.indexFile ? ` (${deps.indexFile})` : '';
      void vscode.window.showInformationMessage(
        deleted
          ? `Deleted the saved Undertone index${where}. Run "Build Index" to build it again.`
          : 'There was no saved Undertone index to delete.',
      );
    }),
    reg('undertone.clearSearchResults', () => search.clear()),
    reg('undertone.moreLikeThis', (entry?: ResultEntry) => steer(deps, entry, 'like')),
    reg('undertone.fewerLikeThis', (entry?: ResultEntry) => steer(deps, entry, 'unlike')),
    reg('undertone.showLog', () => log.show(true)),
    reg('undertone.showActions', async () => {
      const items = statusActions(controller.state);
      const pick = await vscode.window.showQuickPick(items, { title: 'Undertone', placeHolder: 'Choose an action' });
      if (pick) await vscode.commands.executeCommand(pick.command);
    }),
  ];
}

/**
 * "More Like This" / "Fewer Like This" on a result row. On a row of the shown search, the search is
 * run again with the file added to its feedback (Rocchio refinement, core/index/search/fusion.ts).
 * On a Nearby row: more like it is a search for files like that file; fewer like it is a search for
 * files like the file Nearby is about, and unlike that row.
 */
async function steer(deps: CommandDeps, entry: ResultEntry | undefined, kind: 'like' | 'unlike'): Promise<void> {
  if (!entry?.fsPath) {
    void vscode.window.showInformationMessage('Use this on a file in Search Results or Nearby.');
    return;
  }
  const { search, nearby } = deps;
  let query = '';
  let feedback: SearchFeedback;
  if (search.query !== undefined && search.lists(entry.key)) {
    query = search.query;
    feedback = refineFeedback(search.feedback, entry.fsPath, kind);
  } else if (kind === 'like') {
    feedback = { like: [entry.fsPath], unlike: [] };
  } else {
    const subject = nearby.subject?.fsPath;
    if (!subject) {
      void vscode.window.showInformationMessage('Open a file first: fewer like this searches for files like it and unlike this one.');
      return;
    }
    feedback = { like: [subject], unlike: [entry.fsPath] };
  }
  await vscode.commands.executeCommand('undertone.searchResults.focus');
  await showOutcome(deps, query, await searchOnce(deps, query, feedback), feedback, false);
}

type SearchOutcome =
  | { readonly kind: 'matches'; readonly matches: readonly SearchMatch[] }
  /** Nothing to show, said calmly (in the box when there is one). */
  | { readonly kind: 'message'; readonly text: string }
  | { readonly kind: 'no-index' }
  | { readonly kind: 'failed'; readonly text: string };

async function searchOnce(deps: CommandDeps, query: string, feedback: SearchFeedback = NO_FEEDBACK): Promise<SearchOutcome> {
  try {
    const matches = await vscode.window.withProgress({ location: vscode.ProgressLocation.Window, title: 'Undertone: searching' }, () =>
      deps.controller.search(query, SEARCH_TOP, feedback),
    );
    return matches.length ? { kind: 'matches', matches } : { kind: 'message', text: NO_MATCH_MESSAGE };
  } catch (err) {
    const kind = errorKind(err);
    if (kind === 'no-index') return { kind: 'no-index' };
    if (kind === 'no-known-terms') return { kind: 'message', text: noKnownWordsMessage(query) };
    return { kind: 'failed', text: (err as Error).message };
  }
}

/**
 * The search box. An empty question, or one with no word the index knows, is answered in the box
 * itself (it stays open with the text, for another try); results replace it with a quick pick.
 */
async function askAndSearch(deps: CommandDeps): Promise<void> {
  const box = vscode.window.createInputBox();
  box.title = 'Search Workspace by Meaning';
  box.prompt = 'Describe what you are looking for in your own words; files that use other words for it are found too.';
  box.placeholder = SEARCH_PLACEHOLDER;
  box.value = deps.search.query ?? '';
  box.ignoreFocusOut = true;
  const found = await new Promise<{ query: string; outcome: SearchOutcome } | undefined>((resolve) => {
    let result: { query: string; outcome: SearchOutcome } | undefined;
    const subs = [
      box.onDidChangeValue(() => {
        box.validationMessage = undefined;
      }),
      box.onDidAccept(async () => {
        const query = box.value.trim();
        if (!query) {
          box.validationMessage = { message: EMPTY_QUESTION_MESSAGE, severity: vscode.InputBoxValidationSeverity.Info };
          return;
        }
        // Busy only: a disabled box loses the keyboard focus, and the person may want to edit the text.
        box.busy = true;
        const outcome = await searchOnce(deps, query);
        box.busy = false;
        if (outcome.kind === 'message') {
          box.validationMessage = { message: outcome.text, severity: vscode.InputBoxValidationSeverity.Info };
          return;
        }
        result = { query, outcome };
        box.hide();
      }),
      box.onDidHide(() => {
        for (const d of subs) d.dispose();
        box.dispose();
        resolve(result);
      }),
    ];
    box.show();
  });
  if (found) await showOutcome(deps, found.query, found.outcome);
}

async function runSearch(deps: CommandDeps, query: string): Promise<void> {
  await showOutcome(deps, query, await searchOnce(deps, query));
}

async function showOutcome(
  deps: CommandDeps,
  query: string,
  outcome: SearchOutcome,
  feedback: SearchFeedback = NO_FEEDBACK,
  pickOne = true,
): Promise<void> {
  const { controller, search } = deps;
  if (outcome.kind === 'no-index') {
    const choice = await vscode.window.showInformationMessage('There is no Undertone index for this workspace yet.', 'Build Index');
    if (choice) await controller.build('user');
    return;
  }
  if (outcome.kind === 'message') {
    void vscode.window.showInformationMessage(outcome.text);
    return;
  }
  if (outcome.kind === 'failed') {
    void vscode.window.showErrorMessage(`Undertone search failed: ${outcome.text}`);
    return;
  }
  const matches = outcome.matches;
  search.show(query, searchEntries(matches, controller.multiRoot), feedback);
  if (!pickOne) return;
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
