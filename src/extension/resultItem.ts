/** A result entry (viewModels.ts) as a tree item that opens its file, at its line when it has one. */
import * as vscode from 'vscode';
import { whyMarkdown } from './explainTooltip.js';
import type { ResultEntry } from './viewModels.js';

export function resultTreeItem(entry: ResultEntry): vscode.TreeItem {
  const item = new vscode.TreeItem(entry.label, vscode.TreeItemCollapsibleState.None);
  const uri = vscode.Uri.file(entry.fsPath);
  item.id = entry.key;
  item.resourceUri = uri;
  item.iconPath = vscode.ThemeIcon.File;
  item.description = entry.description;
  item.tooltip = entry.why ? new vscode.MarkdownString(whyMarkdown(entry.tooltip, entry.why, entry.line === undefined ? 'nearby' : 'search')) : entry.tooltip;
  item.contextValue = 'undertone.file';
  item.command = { command: 'vscode.open', title: 'Open File', arguments: [uri, openOptions(entry)] };
  return item;
}

export function openOptions(entry: ResultEntry): vscode.TextDocumentShowOptions {
  const options: vscode.TextDocumentShowOptions = { preview: true };
  if (entry.line !== undefined) options.selection = new vscode.Range(entry.line, 0, entry.line, 0);
  return options;
}
