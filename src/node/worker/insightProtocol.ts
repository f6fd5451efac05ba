/**
 * The worker's insight requests (look-alikes, topics, the concept map) and the "why" that search
 * and nearby results carry, as plain data for the thread boundary. workerProtocol.ts folds these into
 * its RequestMap; the handlers live in insightService.ts.
 */
import type { LayoutName, MapPageData } from '../../core/map/mapData.js';
import type { MapPoint, PageTrail } from '../../core/map/mapMessages.js';
import type { FileRef } from './fileRef.js';

/** One term's part of a similarity score (core/explain), under a readable word. */
export interface WhyTerm {
  readonly word: string;
  readonly share: number;
  /** The term occurs on both sides (query and file, or both files). */
  readonly inBoth: boolean;
}

/** The largest contributions to a score; `rest` sums the others, so shares + rest = score. */
export interface Why {
  readonly score: number;
  readonly terms: readonly WhyTerm[];
  readonly rest: number;
  readonly restTerms: number;
  /** Nearby only: the concepts both files share (core/explain/sharedConcepts.ts), named by readable words. */
  readonly concepts?: readonly { readonly words: readonly string[]; readonly share: number }[];
  /** Nearby only: the other concepts' part, so concepts + conceptRest + wordMatch = score. */
  readonly conceptRest?: number;
  /** Nearby only: the part of the score from the distinctive words the two files share (0 when none). */
  readonly wordMatch?: number;
}

/** The four overlap bands (core/lookalike/types.ts OverlapBand). */
export type LookalikeKind = 'exact' | 'near' | 'partial' | 'retold';

export interface LookalikePairWire {
  readonly a: FileRef;
  readonly b: FileRef;
  /** 1 for exact copies, exact shingle Jaccard for near and partial copies, term-space cosine for retold pairs. */
  readonly similarity: number;
  readonly jaccard: number;
  readonly sharedLines: number;
  /** Non-blank lines of a and b. */
  readonly lines: readonly [number, number];
  readonly sharedWords: number;
  readonly words: readonly [number, number];
  /** Retold pairs: margin of the cosine over each file's next neighbour. */
  readonly gap?: number;
  /** Retold pairs: rare names (long options, identifiers) both files hold. */
  readonly sharedNames?: number;
}

export interface LookalikeGroupWire {
  readonly kind: LookalikeKind;
  readonly files: readonly FileRef[];
  /** Exact copies: the first file paired with each other one. Others: the verified pairs. */
  readonly pairs: readonly LookalikePairWire[];
  /** Pairs left out to keep the message small (see MAX_PAIRS_PER_GROUP). */
  readonly morePairs: number;
}

export interface LookalikesResult {
  /** Exact groups (longest text first), then near, partial and retold pairs (one group each, strongest first). */
  readonly groups: readonly LookalikeGroupWire[];
  /** Pairs of each band left out past MAX_PAIRS_PER_BAND (lookalikeTask.ts). */
  readonly morePairs: Readonly<Record<LookalikeKind, number>>;
  /** Indexed paths that are links to a file already listed (the same file): left out. */
  readonly sameFile: number;
  readonly files: number;
  readonly emptyFiles: number;
  /** Files with fewer words than one shingle (left out of near-copy search). */
  readonly skippedShort: number;
  /** Indexed files that could not be read again. */
  readonly unreadable: number;
  readonly threshold: number;
  readonly partialThreshold: number;
  readonly ms: number;
}

export interface TopicTermWire {
  /** Readable form of the index term. */
  readonly word: string;
  readonly term: string;
  /** Picked by the CUR selection. */
  readonly picked: boolean;
}

export interface TopicFileWire extends FileRef {
  /** Cosine with the topic centre (exemplars only; members are listed closest first). */
  readonly similarity: number | null;
  /** One of the topic's exemplar files. */
  readonly exemplar: boolean;
  /** Picked by the CUR selection. */
  readonly picked: boolean;
}

export interface TopicFolderWire {
  /** Folder key ('/'-separated, prefixed by the root name when there are several; '' for the top). */
  readonly folder: string;
  readonly files: number;
  readonly share: number;
}

export interface TopicWire {
  /** Position among its siblings, from 1. */
  readonly id: number;
  /** Dotted position in the tree ("3.2"). */
  readonly path: string;
  /** 1 for the first level. */
  readonly level: number;
  readonly size: number;
  readonly cohesion: number;
  /** Distinctive words, best first (CUR picks first among them). */
  readonly terms: readonly TopicTermWire[];
  /** Exemplars first, then (for a topic without sub-topics) the other members closest to the centre (capped). */
  readonly files: readonly TopicFileWire[];
  /** Members not in files. */
  readonly moreFiles: number;
  /** Folders that hold most of its files. */
  readonly folders: readonly TopicFolderWire[];
  /** Sub-topics, largest first. */
  readonly children: readonly TopicWire[];
}

export interface LooseFileWire extends FileRef {
  /** Path of the first-level topic it was nearest to. */
  readonly nearest: string;
}

/** The topics one folder holds (request parameter folder). */
export interface FolderTopicsWire {
  /** The folder's key prefix ('' for a whole root of a one-root workspace). */
  readonly folder: string;
  readonly fsPath: string;
  /** Files of the folder the topics know (in a topic, loose or unplaced). */
  readonly files: number;
  /** Files of the folder in no topic. */
  readonly outside: number;
  /** Topic path → how many of the folder's files it holds (topics holding none are absent). */
  readonly counts: Readonly<Record<string, number>>;
}

export interface TopicsResult {
  /** First-level topics, largest first. */
  readonly topics: readonly TopicWire[];
  /** Levels the tree reaches. */
  readonly levels: number;
  /** Files that fit no topic well (capped). */
  readonly loose: readonly LooseFileWire[];
  readonly looseCount: number;
  /** Files without any word the model knows (capped). */
  readonly unplaced: readonly FileRef[];
  readonly unplacedCount: number;
  readonly chosen: 'auto' | 'given';
  readonly cur: { readonly method: string; readonly rank: number; readonly errorRatio: number | null };
  /** Present when the request named a folder. */
  readonly folder?: FolderTopicsWire;
  readonly ms: number;
}

export interface MapDataResult {
  /** Names this map; queries quote it so a map replaced meanwhile is noticed. */
  readonly token: number;
  readonly data: MapPageData;
  /** Absolute path of each file of data.files.paths (same order). */
  readonly fsPaths: readonly string[];
  readonly ms: number;
  /** True when the layouts came from the cache. */
  readonly cached: boolean;
}

export interface MapQueryResult {
  readonly positions: { readonly [L in LayoutName]: MapPoint | null };
  readonly neighbours: readonly number[];
  readonly similarities: readonly number[];
}

/** Each insight request with its parameters and result (merged into workerProtocol.ts's RequestMap). */
export interface InsightRequestMap {
  lookalikes: { params: { threshold: number }; result: LookalikesResult };
  /** folder: an absolute folder path; the result then says which topics hold its files. */
  topics: { params: { folder?: string }; result: TopicsResult };
  mapData: { params: Record<string, never>; result: MapDataResult };
  /** Places a query on the map named by token; fails with MapOutdatedError when it was replaced. */
  mapQuery: { params: { token: number; text: string }; result: MapQueryResult };
  /** The sections of a file (absolute path) placed on the map named by token; null when the file has no sections there. */
  mapTrail: { params: { token: number; fsPath: string }; result: PageTrail | null };
}

export type InsightRequestType = keyof InsightRequestMap;

export const INSIGHT_REQUEST_TYPES: readonly InsightRequestType[] = ['lookalikes', 'topics', 'mapData', 'mapQuery', 'mapTrail'];
