/**
 * The concept map in an editor panel. The page (media/map, built from src/webview/map) runs in a
 * webview locked down by buildMapWebviewHtml: a Content Security Policy from default-src 'none'
 * with scripts only by a fresh random nonce, resources only from media/map. The worker computes
 * the map (node/worker/mapTask.ts); this side passes messages, each page message checked with
 * isPageToHostMessage: 'ready' → the data, 'query' → placed by the worker, 'open' → the file.
 * The panel follows the editor's theme and highlights the file in the active editor, with that
 * file's sections as a trail of points (asked of the worker again when the index changes, so a
 * saved edit moves it); 'openSection' → the file at the section's first line. After a rebuild it
 * asks for the new map. Everything it registers is disposed with it.
 */
import { randomBytes } from 'node:crypto';
import * as vscode from 'vscode';
import { buildMapWebviewHtml } from '../core/map/mapHtml.js';
import { isPageToHostMessage, type HostToPageMessage, type PageToHostMessage, type PageTrail } from '../core/map/mapMessages.js';
import type { IndexController } from './indexController.js';
import { MapSession, themeKindName } from './mapPanelModel.js';
import { errorKind } from '../node/worker/workerErrors.js';

export class ConceptMapPanel implements vscode.Disposable {
  static readonly viewType = 'undertone.conceptMap';

  private readonly _panel: vscode.WebviewPanel;
  private readonly _disposables: vscode.Disposable[] = [];
  private _session: MapSession | undefined;
  private _pageReady = false;
  private _loadSeq = 0;
  private _disposed = false;
  private _trailSeq = 0;

  constructor(
    extensionUri: vscode.Uri,
    private readonly _controller: IndexController,
    private readonly _log: (line: string) => void,
    onDispose: () => void,
  ) {
    const root = vscode.Uri.joinPath(extensionUri, 'media', 'map');
    this._panel = vscode.window.createWebviewPanel(ConceptMapPanel.viewType, 'Concept Map', vscode.ViewColumn.Active, {
      enableScripts: true,
      localResourceRoots: [root],
      retainContextWhenHidden: true,
    });
    this._panel.iconPath = vscode.Uri.joinPath(extensionUri, 'media', 'icon.svg');
    const webview = this._panel.webview;
    webview.html = buildMapWebviewHtml({
      nonce: randomBytes(18).toString('base64'),
      cspSource: webview.cspSource,
      scriptUri: webview.asWebviewUri(vscode.Uri.joinPath(root, 'map.js')).toString(),
      styleUri: webview.asWebviewUri(vscode.Uri.joinPath(root, 'map.css')).toString(),
      title: 'Concept map',
    });
    this._panel.onDidDispose(
      () => {
        this.dispose();
        onDispose();
      },
      null,
      this._disposables,
    );
    webview.onDidReceiveMessage((m: unknown) => this.receive(m), null, this._disposables);
    vscode.window.onDidChangeActiveColorTheme((t) => this.post({ type: 'theme', kind: themeKindName(t.kind) }), null, this._disposables);
    vscode.window.onDidChangeActiveTextEditor(() => this.selectActive(), null, this._disposables);
    this._disposables.push(
      new vscode.Disposable(_controller.onDidChangeIndex((change) => (change.all ? void this.load() : void this.showTrail())).dispose),
    );
    void this.load();
  }

  reveal(): void {
    this._panel.reveal();
  }

  dispose(): void {
    if (this._disposed) return;
    this._disposed = true;
    this._loadSeq++;
    this._panel.dispose();
    for (const d of this._disposables.splice(0)) d.dispose();
  }

  /** Asks the worker for the map of the index in use and shows it once the page is ready. */
  private async load(): Promise<void> {
    const seq = ++this._loadSeq;
    try {
      const result = await vscode.window.withProgress(
        { location: vscode.ProgressLocation.Window, title: 'Undertone: drawing the concept map' },
        () => this._controller.insight('mapData', {}),
      );
      if (seq !== this._loadSeq) return;
      if (!result) {
        this._panel.title = 'Concept Map (no index)';
        return;
      }
      this._session = new MapSession(result);
      this._panel.title = 'Concept Map';
      this._log(
        `Concept map: ${result.data.files.paths.length} files ${result.cached ? 'from the cache' : 'laid out'} in ${Math.round(result.ms)} ms.`,
      );
      if (this._pageReady) this.sendInit();
    } catch (err) {
      if (seq !== this._loadSeq) return;
      const message = err instanceof Error ? err.message : String(err);
      this._log(`Concept map failed: ${message}`);
      void vscode.window.showErrorMessage(`Undertone could not draw the concept map: ${message}`);
    }
  }

  private receive(raw: unknown): void {
    if (!isPageToHostMessage(raw)) {
      this._log('Concept map: ignored a malformed message from the page.');
      return;
    }
    const m: PageToHostMessage = raw;
    switch (m.type) {
      case 'ready':
        this._pageReady = true;
        if (this._session) this.sendInit();
        break;
      case 'open': {
        const fsPath = this._session?.fileToOpen(m);
        if (fsPath) void vscode.window.showTextDocument(vscode.Uri.file(fsPath), { preview: true, viewColumn: vscode.ViewColumn.Beside });
        break;
      }
      case 'query':
        void this.answer(m.requestId, m.text);
        break;
      case 'openSection': {
        const at = this._session?.sectionToOpen(m);
        if (at)
          void vscode.window.showTextDocument(vscode.Uri.file(at.fsPath), {
            preview: true,
            viewColumn: vscode.ViewColumn.Beside,
            selection: new vscode.Range(at.line, 0, at.line, 0),
          });
        break;
      }
      case 'layoutChanged':
        break;
    }
  }

  /** Sends the trail of the active editor's file (its sections placed on the map), or clears it. */
  private async showTrail(): Promise<void> {
    const session = this._session;
    const uri = vscode.window.activeTextEditor?.document.uri;
    if (!session || !uri) return; // the map itself has the focus: keep the trail
    const seq = ++this._trailSeq;
    const fsPath = uri.scheme === 'file' ? uri.fsPath : null;
    let trail: PageTrail | null = null;
    if (fsPath !== null) {
      try {
        trail = await this._controller.insight('mapTrail', { token: session.token, fsPath });
      } catch (err) {
        if (errorKind(err) !== 'map-outdated') this._log(`Concept map: no trail for ${fsPath}: ${(err as Error).message}`);
        trail = null;
      }
    }
    if (seq !== this._trailSeq || session !== this._session) return;
    session.setTrail(fsPath, trail);
    this.post({ type: 'trail', trail });
  }

  private async answer(requestId: number, text: string): Promise<void> {
    const session = this._session;
    if (!session) return;
    try {
      const r = await this._controller.insight('mapQuery', { token: session.token, text });
      if (!r) throw new Error('There is no index any more.');
      this.post({
        type: 'queryResult',
        requestId,
        text,
        positions: r.positions,
        neighbours: [...r.neighbours],
        similarities: [...r.similarities],
      });
    } catch (err) {
      const e = err as Error;
      if (errorKind(err) === 'map-outdated') void this.load();
      this.post({ type: 'queryError', requestId, message: e.message });
    }
  }

  private sendInit(): void {
    if (!this._session) return;
    this.post({ type: 'init', data: this._session.data });
    this.post({ type: 'theme', kind: themeKindName(vscode.window.activeColorTheme.kind) });
    this.selectActive();
  }

  /** Rings the dot of the file in the active editor (none for a file the map does not show). */
  private selectActive(): void {
    const uri = vscode.window.activeTextEditor?.document.uri;
    if (!uri || !this._session) return; // the map itself has the focus: keep the selection
    this.post({ type: 'select', index: this._session.rowOf(uri.scheme === 'file' ? uri.fsPath : undefined) });
    void this.showTrail();
  }

  private post(message: HostToPageMessage): void {
    if (!this._disposed && this._pageReady) void this._panel.webview.postMessage(message);
  }
}
