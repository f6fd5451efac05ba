/** A result row (viewModels.ts) as a tree item that opens its file, at its line when it has one. */
import * as vscode from 'vscode';
import { escapeMarkdown, whyMarkdown } from './explainTooltip.js';
import { isPassage, markedPassage, type PassageEntry, type ResultEntry, type ResultNode } from './viewModels.js';

export function resultTreeItem(node: ResultNode): vscode.TreeItem {
  return isPassage(node) ? passageTreeItem(node) : fileTreeItem(node);
}

function fileTreeItem(entry: ResultEntry): vscode.TreeItem {
  if (entry.heading) {
    const item = new vscode.TreeItem(
      entry.label,
      entry.expanded ? vscode.TreeItemCollapsibleState.Expanded : vscode.TreeItemCollapsibleState.Collapsed,
    );
    item.id = entry.key;
    item.iconPath = new vscode.ThemeIcon('globe');
    item.description = entry.description;
    item.tooltip = entry.tooltip;
    item.contextValue = 'undertone.translations';
    return item;
  }
  const state = !entry.children?.length
    ? vscode.TreeItemCollapsibleState.None
    : entry.expanded
      ? vscode.TreeItemCollapsibleState.Expanded
      : vscode.TreeItemCollapsibleState.Collapsed;
  const item = new vscode.TreeItem(entry.label, state);
  const uri = vscode.Uri.file(entry.fsPath);
  item.id = entry.key;
  item.resourceUri = uri;
  item.iconPath = vscode.ThemeIcon.File;
  item.description = entry.description;
  item.tooltip = entry.why
    ? new vscode.MarkdownString(whyMarkdown(entry.tooltip, entry.why, entry.whyKind ?? (entry.line === undefined ? 'nearby' : 'search')))
    : entry.tooltip;
  item.contextValue = 'undertone.file';
  item.command = { command: 'vscode.open', title: 'Open File', arguments: [uri, openOptions(entry)] };
  return item;
}

/** The matching passage under a search result: its words from the query are highlighted. */
function passageTreeItem(p: PassageEntry): vscode.TreeItem {
  const item = new vscode.TreeItem(
    { label: p.text, highlights: p.highlights.map(([a, b]) => [a, b] as [number, number]) },
    vscode.TreeItemCollapsibleState.None,
  );
  item.id = p.key;
  item.description = `line ${p.line + 1}`;
  item.tooltip = new vscode.MarkdownString(
    `${markedPassage(p.text, p.highlights, escapeMarkdown)}\n\n_Line ${p.line + 1}; the words of the question are in bold._`,
  );
  item.contextValue = 'undertone.passage';
  item.accessibilityInformation = { label: `Line ${p.line + 1}: ${p.text}` };
  item.command = { command: 'vscode.open', title: 'Open at Passage', arguments: [vscode.Uri.file(p.fsPath), openOptions(p)] };
  return item;
}

export function openOptions(entry: { readonly line?: number }): vscode.TextDocumentShowOptions {
  const options: vscode.TextDocumentShowOptions = { preview: true };
  if (entry.line !== undefined) options.selection = new vscode.Range(entry.line, 0, entry.line, 0);
  return options;
}
