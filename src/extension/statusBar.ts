/** The status bar item: building (with percentage), ready (files, k), out of date; a click opens the actions. */
import * as vscode from 'vscode';
import { statusBarModel, type IndexState } from './indexState.js';

export class IndexStatusBar implements vscode.Disposable {
  private readonly _item: vscode.StatusBarItem;

  constructor() {
    this._item = vscode.window.createStatusBarItem('undertone.status', vscode.StatusBarAlignment.Left, 50);
    this._item.name = 'Undertone Index';
    this._item.command = 'undertone.showActions';
  }

  render(state: IndexState): void {
    const model = statusBarModel(state);
    this._item.text = model.text;
    this._item.tooltip = model.tooltip;
    this._item.backgroundColor = model.background ? new vscode.ThemeColor(model.background) : undefined;
    this._item.show();
  }

  dispose(): void {
    this._item.dispose();
  }
}
