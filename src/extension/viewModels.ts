/**
 * What the Nearby and Search Results views and the search quick pick show for each result, as
 * plain data (the tree providers turn these into TreeItems). Paths are shown relative to their
 * workspace folder; with several folders the folder's name is shown too.
 */
import type { Why } from '../node/worker/insightProtocol.js';
import type { ScoredFile, SearchMatch } from '../node/worker/workerProtocol.js';

export interface ResultEntry {
  readonly key: string;
  readonly fsPath: string;
  /** File name. */
  readonly label: string;
  readonly description: string;
  readonly tooltip: string;
  /** Zero-based line to reveal when opened (search results). */
  readonly line?: number;
  /** The terms contributing most to the score, for the tooltip (explainTooltip.ts). */
  readonly why?: Why;
}

/** A similarity score as shown: two decimals. */
export function formatScore(score: number): string {
  return score.toFixed(2);
}

/** Where a file is, for a description: its folder path relative to the workspace folder. */
export function locationOf(ref: { readonly folder: string; readonly relPath: string }, multiRoot: boolean): string {
  const slash = ref.relPath.lastIndexOf('/');
  const dir = slash < 0 ? '' : ref.relPath.slice(0, slash);
  if (multiRoot) return dir ? `${ref.folder} › ${dir}` : ref.folder;
  return dir;
}

function fileName(relPath: string): string {
  return relPath.slice(relPath.lastIndexOf('/') + 1);
}

function shownPath(ref: { readonly folder: string; readonly relPath: string }, multiRoot: boolean): string {
  return multiRoot ? `${ref.folder}/${ref.relPath}` : ref.relPath;
}

export function nearbyEntries(hits: readonly ScoredFile[], multiRoot: boolean): ResultEntry[] {
  return hits.map((h) => {
    const where = locationOf(h, multiRoot);
    return {
      key: h.key,
      fsPath: h.fsPath,
      label: fileName(h.relPath),
      description: where ? `${formatScore(h.score)} · ${where}` : formatScore(h.score),
      tooltip: `${shownPath(h, multiRoot)}\nSimilarity in meaning: ${formatScore(h.score)} (cosine, 1 = same concepts)`,
      why: h.why,
    };
  });
}

export function searchEntries(matches: readonly SearchMatch[], multiRoot: boolean): ResultEntry[] {
  return matches.map((m) => ({
    key: m.key,
    fsPath: m.fsPath,
    label: fileName(m.relPath),
    description: m.lineText ? `${formatScore(m.score)} · ${m.line + 1}: ${m.lineText}` : formatScore(m.score),
    tooltip: `${shownPath(m, multiRoot)}, line ${m.line + 1}\nScore: ${formatScore(m.score)}${m.lineText ? `\n${m.lineText}` : ''}`,
    line: m.line,
    why: m.why,
  }));
}

/** A quick pick row for a search result (plain data; the command adds the editor's fields). */
export interface SearchPickItem {
  readonly label: string;
  readonly description: string;
  readonly detail: string;
  readonly entry: ResultEntry;
}

export function searchPickItems(matches: readonly SearchMatch[], multiRoot: boolean): SearchPickItem[] {
  const entries = searchEntries(matches, multiRoot);
  return matches.map((m, i) => ({
    label: `$(file) ${fileName(m.relPath)}`,
    description: `${formatScore(m.score)}  ${shownPath(m, multiRoot)}`,
    detail: m.lineText ? `${m.line + 1}: ${m.lineText}` : '',
    entry: entries[i],
  }));
}

/** Entries without the given keys (files just deleted disappear at once, before any new query). */
export function withoutKeys<T extends { readonly key: string }>(entries: readonly T[], removed: ReadonlySet<string>): T[] {
  return entries.filter((e) => !removed.has(e.key));
}

/** The title-bar description of the Search Results view for a query. */
export function searchViewDescription(query: string | undefined, count: number): string {
  if (query === undefined) return '';
  const q = query.length > 40 ? `${query.slice(0, 39)}…` : query;
  return `“${q}” · ${count} ${count === 1 ? 'result' : 'results'}`;
}
