/**
 * The index's state as the editor shows it (status bar, welcome text, context keys), as plain
 * data with pure functions, so it can be tested without the editor.
 */
import type { IndexSummary, LoadOutcome } from '../node/worker/workerProtocol.js';

export type IndexState =
  | { readonly kind: 'starting' }
  /** No folder open, or none on the local disk. */
  | { readonly kind: 'unavailable'; readonly reason: string }
  /** Folders are open but there is no index (never built, deleted, or settings changed). */
  | { readonly kind: 'none'; readonly reason?: string }
  | {
      readonly kind: 'building';
      readonly percent: number;
      readonly background: boolean;
      readonly previous: IndexSummary | null;
      /** A first build past its counting stage: files search can rank by word match meanwhile. */
      readonly wordMatch?: number;
    }
  | { readonly kind: 'ready'; readonly summary: IndexSummary }
  /** Usable, but enough changed that a rebuild is advised (automatic rebuilds off). */
  | { readonly kind: 'stale'; readonly summary: IndexSummary; readonly reason: string }
  | { readonly kind: 'failed'; readonly message: string; readonly previous: IndexSummary | null };

/** The summary of the index in use, whatever the state. */
export function summaryOf(state: IndexState): IndexSummary | null {
  switch (state.kind) {
    case 'ready':
    case 'stale':
      return state.summary;
    case 'building':
    case 'failed':
      return state.previous;
    default:
      return null;
  }
}

/** True when search can answer: an index is in use, or a first build offers word-match results. */
export function canSearch(state: IndexState): boolean {
  return summaryOf(state) !== null || (state.kind === 'building' && state.wordMatch !== undefined);
}

/** Why a workspace has no usable saved index (after a load that did not return one). */
export function noIndexReason(outcome: LoadOutcome, detail?: string): string {
  if (outcome === 'damaged') return `the saved index could not be used (${detail ?? 'damaged'})`;
  if (outcome === 'settings-changed') return 'the index settings changed since the saved index was built';
  return 'there is no index for this workspace yet';
}

/** Why nothing can be indexed: no folder open, or only folders that are not on the local disk. */
export function unavailableReason(elsewhere: readonly string[]): string {
  if (elsewhere.length === 0) return 'open a folder to index it.';
  const many = elsewhere.length > 1;
  return `the folder${many ? 's' : ''} ${elsewhere.join(', ')} ${many ? 'are' : 'is'} not on this machine's disk (a virtual or remote file system), and Undertone only indexes local files.`;
}

/** Value of the `undertone.state` context key used by the manifest's `when` clauses. */
export function contextState(state: IndexState): string {
  return state.kind;
}

export interface StatusBarModel {
  readonly text: string;
  readonly tooltip: string;
  /** Theme colour id for the background, when the state needs attention. */
  readonly background?: 'statusBarItem.warningBackground' | 'statusBarItem.errorBackground';
}

const files = (n: number): string => `${n.toLocaleString('en-US')} ${n === 1 ? 'file' : 'files'}`;

export function statusBarModel(state: IndexState): StatusBarModel {
  const click = 'Click for Undertone actions.';
  switch (state.kind) {
    case 'starting':
      return { text: '$(sync~spin) Undertone: loading…', tooltip: `Undertone: loading the index… ${click}` };
    case 'unavailable':
      return { text: '$(circle-slash) Undertone', tooltip: `Undertone: ${state.reason}` };
    case 'none':
      return {
        text: '$(circle-outline) Undertone: no index',
        tooltip: `Undertone: ${state.reason ?? 'there is no index for this workspace yet.'} ${click}`,
      };
    case 'building':
      if (state.wordMatch !== undefined && !state.previous)
        return {
          text: `$(sync~spin) Undertone: word match only — concepts ${state.percent}%`,
          tooltip:
            `Undertone: search ranks the ${files(state.wordMatch)} by their words alone while the concept model is built (${state.percent}%). ` +
            `Results by meaning, Nearby, topics and the map follow when it is done. ${click}`,
        };
      return {
        text: `$(sync~spin) Undertone: indexing ${state.percent}%`,
        tooltip:
          `Undertone: ${state.background ? 'rebuilding the index in the background' : 'building the index'} (${state.percent}%).` +
          (state.previous ? ` The previous index (${files(state.previous.files)}) stays in use until it is done.` : '') +
          ` ${click}`,
      };
    case 'ready':
      return {
        text: `$(pulse) Undertone: ${files(state.summary.files)}, k=${state.summary.k}`,
        tooltip: `Undertone: index ready — ${files(state.summary.files)}, ${state.summary.terms.toLocaleString('en-US')} terms, ${state.summary.k} concept dimensions. ${click}`,
      };
    case 'stale':
      return {
        text: `$(warning) Undertone: out of date`,
        tooltip: `Undertone: the index (${files(state.summary.files)}) is out of date: ${state.reason}. Run "Build Index" for the best results. ${click}`,
        background: 'statusBarItem.warningBackground',
      };
    case 'failed':
      return { text: '$(error) Undertone', tooltip: `Undertone: ${state.message} ${click}`, background: 'statusBarItem.errorBackground' };
  }
}

/** An entry of the status bar's quick pick: a label and the command it runs. */
export interface ActionItem {
  readonly label: string;
  readonly command: string;
  readonly description?: string;
}

export function statusActions(state: IndexState): ActionItem[] {
  if (state.kind === 'unavailable') return [];
  const items: ActionItem[] = [];
  const has = summaryOf(state) !== null;
  if (canSearch(state))
    items.push({
      label: '$(search) Search Workspace by Meaning…',
      command: 'undertone.search',
      description: has ? undefined : 'word match only until the index is built',
    });
  if (has) items.push({ label: '$(list-tree) Show Nearby Files', command: 'undertone.showNearby', description: 'for the active file' });
  if (state.kind === 'building')
    items.push({ label: '$(debug-stop) Cancel Indexing', command: 'undertone.cancelIndexing', description: 'keeps the previous index' });
  else
    items.push({
      label: has ? '$(refresh) Build Index' : '$(database) Build Index',
      command: 'undertone.rebuildIndex',
      description: has ? 'again, from the files' : undefined,
    });
  if (has || state.kind === 'none' || state.kind === 'failed')
    items.push({ label: '$(trash) Delete Saved Index', command: 'undertone.deleteIndex' });
  items.push({ label: '$(output) Show Log', command: 'undertone.showLog' });
  return items;
}
