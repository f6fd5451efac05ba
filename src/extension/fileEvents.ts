/**
 * Feeds file changes to the index: the editor's own save, create, delete and rename events (at
 * once), and a file-system watcher per workspace folder for changes made outside the editor
 * (batched briefly). The worker decides which files belong in the index.
 */
import * as vscode from 'vscode';
import type { FileChange, FileChangeKind } from '../node/worker/workerProtocol.js';
import type { IndexChange, IndexController } from './indexController.js';

/** Watcher events arriving within this many milliseconds go to the worker together (common practice). */
const BATCH_MS = 50;

export class FileEvents implements vscode.Disposable {
  private readonly _queue = new Map<string, FileChangeKind>();
  private _timer: ReturnType<typeof setTimeout> | undefined;
  private _watchers: vscode.Disposable[] = [];
  private readonly _disposables: vscode.Disposable[] = [];

  constructor(
    private readonly _controller: IndexController,
    /** Called after a saved file was handled, with the time the save event arrived (performance.now()). */
    private readonly _onSaved: (uri: vscode.Uri, change: IndexChange | undefined, t0: number) => void,
  ) {
    this._disposables.push(
      vscode.workspace.onDidSaveTextDocument((doc) => {
        if (doc.uri.scheme !== 'file') return;
        const t0 = performance.now();
        void this.send([{ kind: 'changed', fsPath: doc.uri.fsPath }]).then((change) => this._onSaved(doc.uri, change, t0));
      }),
      vscode.workspace.onDidCreateFiles((e) => void this.send(local(e.files).map((fsPath) => ({ kind: 'created', fsPath })))),
      vscode.workspace.onDidDeleteFiles((e) => void this.send(local(e.files).map((fsPath) => ({ kind: 'deleted', fsPath })))),
      vscode.workspace.onDidRenameFiles(
        (e) =>
          void this.send(
            e.files
              .filter((f) => f.oldUri.scheme === 'file')
              .flatMap((f) => [
                { kind: 'deleted' as const, fsPath: f.oldUri.fsPath },
                { kind: 'created' as const, fsPath: f.newUri.fsPath },
              ]),
          ),
      ),
    );
    this.watch();
  }

  /** (Re)creates one watcher per local workspace folder. */
  watch(): void {
    for (const w of this._watchers.splice(0)) w.dispose();
    for (const folder of vscode.workspace.workspaceFolders ?? []) {
      if (folder.uri.scheme !== 'file') continue;
      const watcher = vscode.workspace.createFileSystemWatcher(new vscode.RelativePattern(folder, '**/*'));
      watcher.onDidCreate((uri) => this.enqueue('created', uri));
      watcher.onDidChange((uri) => this.enqueue('changed', uri));
      watcher.onDidDelete((uri) => this.enqueue('deleted', uri));
      this._watchers.push(watcher);
    }
  }

  dispose(): void {
    clearTimeout(this._timer);
    for (const d of [...this._watchers.splice(0), ...this._disposables.splice(0)]) d.dispose();
  }

  private enqueue(kind: FileChangeKind, uri: vscode.Uri): void {
    this._queue.set(uri.fsPath, kind);
    this._timer ??= setTimeout(() => {
      this._timer = undefined;
      const changes = [...this._queue].map(([fsPath, k]) => ({ kind: k, fsPath }));
      this._queue.clear();
      void this.send(changes);
    }, BATCH_MS);
  }

  private async send(changes: FileChange[]): Promise<IndexChange | undefined> {
    if (changes.length === 0) return undefined;
    try {
      return await this._controller.applyChanges(changes);
    } catch {
      return undefined; // the worker is restarting; the next refresh catches up
    }
  }
}

function local(uris: readonly vscode.Uri[]): string[] {
  return uris.filter((u) => u.scheme === 'file').map((u) => u.fsPath);
}
