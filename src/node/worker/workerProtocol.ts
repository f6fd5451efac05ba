/**
 * The messages between the editor host and the index worker (node:worker_threads), shared by both
 * ends. The host sends requests, each with a fresh id, and may cancel one by id; the worker
 * answers each request exactly once (a result or an error) and may send progress events for it
 * before that. Everything crosses the thread boundary by structured clone, so only plain data
 * lives here; `isWorkerMessage` and `isHostMessage` check shapes at the door.
 */
import type { Staleness } from '../../core/index/lsiIndex.js';
import type { IndexSettings } from '../../core/index/model/settings.js';
import type { FileRef } from './fileRef.js';
import { INSIGHT_REQUEST_TYPES, type InsightRequestMap, type Why } from './insightProtocol.js';
import { LINKS_REQUEST_TYPES, type LinksRequestMap } from './linksProtocol.js';

/** One workspace folder. Names are unique and become the path prefix when there are several. */
export interface WorkspaceRoot {
  readonly name: string;
  /** Absolute file-system path of the folder. */
  readonly fsPath: string;
  /** Extra exclude patterns for this folder only (gitignore syntax, e.g. from files.exclude). */
  readonly exclude: readonly string[];
}

/** What to index and where to keep it. */
export interface WorkerConfig {
  readonly roots: readonly WorkspaceRoot[];
  /** The saved index file (the extension's workspace storage). */
  readonly indexFile: string;
  readonly settings: Partial<IndexSettings>;
  readonly include: readonly string[];
  readonly exclude: readonly string[];
  readonly maxFileBytes: number;
  readonly honourGitignore: boolean;
  /** Read files that links reach outside the workspace folders (setting undertone.followLinksOutside). @default false */
  readonly followLinksOutside?: boolean;
}

export type { FileRef } from './fileRef.js';

/** A translation of a result file (core/translations/groupTranslations.ts). */
export interface TranslationRef extends FileRef {
  /** How its language is shown: the language code of its path and/or the language of its text. */
  readonly language: string;
}

export interface ScoredFile extends FileRef {
  readonly score: number;
  /** The terms contributing most to the score (insightProtocol.ts), when they could be worked out. */
  readonly why?: Why;
  /** Its language as shown, when it has translations. */
  readonly language?: string;
  /** The same page in other languages (listed under it instead of as results of their own). */
  readonly translations?: readonly TranslationRef[];
}

export interface SearchMatch extends ScoredFile {
  /** Zero-based line where the best-matching passage starts, and the passage (cleaned, shortened). */
  readonly line: number;
  readonly lineText: string;
  /** [start, end) ranges of lineText holding the query's words. */
  readonly highlights?: readonly (readonly [number, number])[];
  /** The file's section that best matches the query, when the index has its sections. */
  readonly section?: SectionPlace;
  /** Ranked by the query's words alone (BM25): the first index is still being built (wordMatchIndex.ts). */
  readonly wordMatchOnly?: true;
}

/** A section of a file (src/core/sections): zero-based first line, the line after its last, its title. */
export interface SectionPlace {
  readonly title: string;
  readonly start: number;
  readonly end: number;
}

/** A section as a result (section search, Nearby at the cursor). */
export interface SectionMatch extends FileRef, SectionPlace {
  readonly score: number;
  /** The terms contributing most to the score, from the section's own vector and terms, when they could be worked out. */
  readonly why?: Why;
}

export interface IndexSummary {
  readonly files: number;
  readonly k: number;
  readonly terms: number;
  readonly staleness: Staleness;
}

export type BuildStage = 'scan' | 'read' | 'matrix' | 'svd' | 'sections' | 'save';

export interface Progress {
  readonly stage: BuildStage;
  readonly done: number;
  readonly total: number;
  /** During a first build, once counting has ended: files that search can already rank by word match. */
  readonly wordMatch?: number;
}

export type FileChangeKind = 'changed' | 'created' | 'deleted';

export interface FileChange {
  readonly kind: FileChangeKind;
  readonly fsPath: string;
}

export type LoadOutcome = 'loaded' | 'missing' | 'damaged' | 'settings-changed';

export interface BuildReport {
  readonly summary: IndexSummary;
  readonly read: number;
  readonly reused: number;
  readonly skipped: number;
  readonly seconds: number;
  /** Why the built index (now in use) could not be saved, when it could not. */
  readonly saveProblem?: string;
}

export interface RefreshReport {
  readonly summary: IndexSummary | null;
  readonly added: number;
  readonly changed: number;
  readonly removed: number;
  /** True when too much changed to fold in: nothing was folded, a rebuild is advised. */
  readonly tooManyChanges: boolean;
}

export interface UpdateReport {
  readonly summary: IndexSummary | null;
  /** Keys folded in (new or changed). */
  readonly folded: readonly string[];
  /** Keys removed (deleted, now excluded, or no longer text). */
  readonly removed: readonly string[];
  readonly ms: number;
}

/** Each request type with its parameters and its result (the insight requests: insightProtocol.ts). */
export interface RequestMap extends InsightRequestMap, LinksRequestMap {
  /** Sets what to index; `modelChanged` says the current index was built with other model settings. */
  configure: { params: { config: WorkerConfig }; result: { modelChanged: boolean } };
  /** Loads the saved index, if it exists, is intact and matches the settings. */
  load: { params: Record<string, never>; result: { outcome: LoadOutcome; reason?: string; summary: IndexSummary | null; ms: number } };
  /**
   * Waits for the check, after a load, of the saved index's section rows and codes (format 6
   * checks them in the background: src/node/persistCheck.ts). `damaged`: they failed it and the
   * loaded index is still the one in use, so it should be built again.
   */
  checkSaved: { params: Record<string, never>; result: { damaged: boolean; reason?: string } };
  /** Scans the folders and folds in files changed since the index was saved (or advises a rebuild). */
  refresh: { params: { maxFoldShare: number }; result: RefreshReport };
  /** Full rebuild (reusing unchanged files' counts), saved, then swapped in. Cancel keeps the old one. */
  build: { params: Record<string, never>; result: BuildReport };
  /** Folds in or removes changed files. */
  update: { params: { changes: readonly FileChange[] }; result: UpdateReport };
  /** `like` / `unlike`: files (fsPaths) to find more / fewer like (Rocchio feedback; they are not listed). */
  search: { params: { query: string; top: number; like?: readonly string[]; unlike?: readonly string[] }; result: readonly SearchMatch[] };
  /** The translations of a file (the same page in other languages); [] when it has none or is not indexed. */
  translations: { params: { fsPath: string }; result: readonly TranslationRef[] };
  /** Files nearest in meaning; null when the file is not in the index. */
  nearby: { params: { fsPath: string; top: number }; result: readonly ScoredFile[] | null };
  /** Sections ranked instead of files (src/core/sections/sectionSearch.ts). */
  searchSections: { params: { query: string; top: number }; result: readonly SectionMatch[] };
  /** The sections of other files nearest to the section at a zero-based line; null without sections. */
  nearbySections: {
    params: { fsPath: string; line: number; top: number };
    result: { from: SectionMatch; hits: readonly SectionMatch[] } | null;
  };
  /** Writes the index if it changed since it was last saved. */
  save: { params: Record<string, never>; result: { saved: boolean; problem?: string } };
  /** Forgets the index and removes the saved file. */
  deleteIndex: { params: Record<string, never>; result: { deleted: boolean } };
}

export type RequestType = keyof RequestMap;
export type ParamsOf<T extends RequestType> = RequestMap[T]['params'];
export type ResultOf<T extends RequestType> = RequestMap[T]['result'];

/**
 * A request. `cancelFlag`, when present, is one Int32 in shared memory that the host sets to 1 on
 * cancel: the worker can see it even while a long synchronous step (the SVD) keeps its event loop
 * from reading the cancel message.
 */
export type Request = {
  [T in RequestType]: {
    readonly kind: 'request';
    readonly id: number;
    readonly type: T;
    readonly params: ParamsOf<T>;
    readonly cancelFlag?: Int32Array;
  };
}[RequestType];

export interface CancelMessage {
  readonly kind: 'cancel';
  readonly id: number;
}

export type HostMessage = Request | CancelMessage;

import { isWireError, type WireError } from './workerErrors.js';
export { toWireError, type WireError } from './workerErrors.js';

export type WorkerMessage =
  | { readonly kind: 'result'; readonly id: number; readonly result: unknown }
  | { readonly kind: 'error'; readonly id: number; readonly error: WireError }
  | { readonly kind: 'progress'; readonly id: number; readonly progress: Progress };

export const REQUEST_TYPES: readonly RequestType[] = [
  'configure',
  'load',
  'checkSaved',
  'refresh',
  'build',
  'update',
  'search',
  'nearby',
  'searchSections',
  'nearbySections',
  'translations',
  'save',
  'deleteIndex',
  ...INSIGHT_REQUEST_TYPES,
  ...LINKS_REQUEST_TYPES,
];

const isObject = (x: unknown): x is Record<string, unknown> => typeof x === 'object' && x !== null;
const isId = (x: unknown): x is number => Number.isSafeInteger(x) && (x as number) >= 0;

export function isHostMessage(x: unknown): x is HostMessage {
  if (!isObject(x) || !isId(x.id)) return false;
  if (x.kind === 'cancel') return true;
  return x.kind === 'request' && REQUEST_TYPES.includes(x.type as RequestType) && isObject(x.params);
}

export function isWorkerMessage(x: unknown): x is WorkerMessage {
  if (!isObject(x) || !isId(x.id)) return false;
  if (x.kind === 'result') return 'result' in x;
  if (x.kind === 'error') return isWireError(x.error);
  if (x.kind === 'progress') {
    const p = x.progress;
    return isObject(p) && typeof p.stage === 'string' && typeof p.done === 'number' && typeof p.total === 'number';
  }
  return false;
}

/** Stage weights for one overall percentage (common practice: rough shares of a typical build's time). */
const STAGE_SPAN: Record<BuildStage, readonly [number, number]> = {
  scan: [0, 10],
  read: [10, 60],
  matrix: [60, 65],
  svd: [65, 85],
  sections: [85, 95],
  save: [95, 100],
};

/** Overall percentage (0–100, whole numbers) of a build at the given progress event. */
export function overallPercent(p: Progress): number {
  const [from, to] = STAGE_SPAN[p.stage];
  const share = p.total > 0 ? Math.min(1, Math.max(0, p.done / p.total)) : 0;
  return Math.floor(from + (to - from) * share);
}
