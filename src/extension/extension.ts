/**
 * Entry point of the editor extension: wiring only. Every registration goes into
 * context.subscriptions; the index itself lives in a worker thread (see indexController.ts).
 */
import { join } from 'node:path';
import * as vscode from 'vscode';
import { registerCommands } from './commands.js';
import { FileEvents } from './fileEvents.js';
import { IndexController, type ControllerHost } from './indexController.js';
import { summaryOf, type IndexState } from './indexState.js';
import { registerInsights } from './insights.js';
import { registerLinkSuggestions } from './linkSuggestionsView.js';
import { NearbyProvider } from './nearbyView.js';
import { SearchResultsProvider } from './searchView.js';
import { IndexStatusBar } from './statusBar.js';
import { startIndexWorker } from './workerHost.js';

/** Name of the index file inside the extension's workspace storage folder. */
export const INDEX_FILE_NAME = 'index.undertone';

/** What activate() returns: read-only access to the index state (used by the in-editor tests). */
export interface UndertoneApi {
  readonly state: () => IndexState;
  readonly onDidChangeState: (listener: (state: IndexState) => void) => vscode.Disposable;
  readonly indexFile: string | undefined;
}

export function activate(context: vscode.ExtensionContext): UndertoneApi {
  // First thing, so a person sees at once that Undertone is there and loading (the manifest
  // activates it at start-up for the same reason; everything heavy runs in the worker).
  const status = new IndexStatusBar();
  status.render({ kind: 'starting' });
  const log = vscode.window.createOutputChannel('Undertone', { log: true });
  const storage = context.storageUri?.scheme === 'file' ? context.storageUri.fsPath : undefined;
  const indexFile = storage ? join(storage, INDEX_FILE_NAME) : undefined;
  const host: ControllerHost = {
    startWorker: (onExit) => startIndexWorker(context.extensionPath, onExit),
    setting: (key) => vscode.workspace.getConfiguration('undertone').get(key),
    folders: () => {
      const all = vscode.workspace.workspaceFolders ?? [];
      return {
        local: all
          .filter((f) => f.uri.scheme === 'file')
          .map((f) => ({
            name: f.name,
            fsPath: f.uri.fsPath,
            filesExclude: vscode.workspace.getConfiguration('files', f.uri).get('exclude'),
          })),
        elsewhere: all.filter((f) => f.uri.scheme !== 'file').map((f) => `${f.name} (${f.uri.scheme})`),
      };
    },
    indexFile,
    withProgress: async (title, task) =>
      await vscode.window.withProgress({ location: vscode.ProgressLocation.Notification, title, cancellable: true }, (progress, token) => {
        const abort = new AbortController();
        token.onCancellationRequested(() => abort.abort());
        let shown = 0;
        return task((percent) => {
          if (percent <= shown) return;
          progress.report({ increment: percent - shown, message: `${percent}%` });
          shown = percent;
        }, abort.signal);
      }),
    showError: (message) => void vscode.window.showErrorMessage(message),
    log: (line) => log.info(line),
  };
  const controller = new IndexController(host);
  const nearby = new NearbyProvider(controller);
  const search = new SearchResultsProvider(controller);
  const nearbyView = vscode.window.createTreeView(NearbyProvider.viewType, { treeDataProvider: nearby });
  const searchView = vscode.window.createTreeView(SearchResultsProvider.viewType, { treeDataProvider: search });
  nearby.attach(nearbyView);
  search.attach(searchView);
  const setContext = (key: string, value: unknown) => void vscode.commands.executeCommand('setContext', key, value);
  const files = new FileEvents(controller, (uri, change, t0) => {
    if (!change || nearby.subject?.fsPath !== uri.fsPath) return;
    void nearby
      .settled()
      .then(() =>
        log.info(
          `Saved ${vscode.workspace.asRelativePath(uri)}: folded in and Nearby updated in ${Math.round(performance.now() - t0)} ms.`,
        ),
      );
  });
  let reconfigureTimer: ReturnType<typeof setTimeout> | undefined;
  const reconfigureSoon = () => {
    clearTimeout(reconfigureTimer);
    reconfigureTimer = setTimeout(() => void controller.reconfigure(), 500);
  };

  context.subscriptions.push(
    log,
    nearby,
    search,
    nearbyView,
    searchView,
    status,
    files,
    controller.onDidChangeState((state) => {
      status.render(state);
      setContext('undertone.state', state.kind);
      setContext('undertone.hasIndex', summaryOf(state) !== null);
    }),
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration('undertone.nearbyCount')) void nearby.refresh();
      const relevant = [
        'include',
        'exclude',
        'maxFileSizeKB',
        'dimensions',
        'weighting',
        'useGitignore',
        'followLinksOutside',
        'languages',
      ].some((k) => e.affectsConfiguration(`undertone.${k}`));
      if (relevant || e.affectsConfiguration('files.exclude')) reconfigureSoon();
    }),
    vscode.workspace.onDidChangeWorkspaceFolders(() => {
      files.watch();
      reconfigureSoon();
    }),
    ...registerCommands({ controller, nearby, search, log, indexFile }),
    ...registerLinkSuggestions(controller),
    ...registerInsights({
      controller,
      extensionUri: context.extensionUri,
      workspaceState: context.workspaceState,
      log: (line) => log.info(line),
    }),
    {
      dispose: () => {
        clearTimeout(reconfigureTimer);
        void controller.dispose();
      },
    },
  );
  status.render(controller.state);
  setContext('undertone.state', controller.state.kind);
  void controller.start().catch((err: unknown) => log.error(`Start-up failed: ${err instanceof Error ? err.message : String(err)}`));
  return {
    state: () => controller.state,
    onDidChangeState: (listener) => new vscode.Disposable(controller.onDidChangeState(listener).dispose),
    indexFile,
  };
}

export function deactivate(): void {
  // Everything is disposed through context.subscriptions; the worker saves edits as it goes.
}
