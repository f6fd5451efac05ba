/**
 * The worker's insight requests (look-alikes, topics, the concept map) and the "why" that search
 * and nearby results carry, as plain data for the thread boundary. workerProtocol.ts folds these into
 * its RequestMap; the handlers live in insightService.ts.
 */
import type { LayoutName, MapPageData } from '../../core/map/mapData.js';
import type { MapPoint } from '../../core/map/mapMessages.js';
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
  /** Nearby only: the other concepts' part, so concepts + conceptRest = score. */
  readonly conceptRest?: number;
}

export type LookalikeKind = 'exact' | 'near' | 'paraphrase';

export interface LookalikePairWire {
  readonly a: FileRef;
  readonly b: FileRef;
  /** 1 for exact copies, exact shingle Jaccard for near-copies, concept cosine for paraphrases. */
  readonly similarity: number;
  readonly jaccard: number;
  readonly sharedLines: number;
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
  /** Exact groups first, then near-copies, then paraphrases; largest first within each. */
  readonly groups: readonly LookalikeGroupWire[];
  readonly files: number;
  readonly emptyFiles: number;
  /** Files with fewer words than one shingle (left out of near-copy search). */
  readonly skippedShort: number;
  /** Indexed files that could not be read again. */
  readonly unreadable: number;
  readonly threshold: number;
  readonly paraphraseThreshold: number;
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

export interface TopicWire {
  readonly id: number;
  readonly size: number;
  readonly cohesion: number;
  readonly terms: readonly TopicTermWire[];
  /** Exemplars first, then the other members closest to the centre first (capped). */
  readonly files: readonly TopicFileWire[];
  readonly moreFiles: number;
}

export interface TopicsResult {
  readonly topics: readonly TopicWire[];
  /** Files without any word the model knows (capped). */
  readonly unplaced: readonly FileRef[];
  readonly unplacedCount: number;
  readonly chosen: 'auto' | 'given';
  readonly cur: { readonly method: string; readonly rank: number; readonly errorRatio: number | null };
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
  lookalikes: { params: { threshold: number; paraphraseThreshold: number }; result: LookalikesResult };
  topics: { params: Record<string, never>; result: TopicsResult };
  mapData: { params: Record<string, never>; result: MapDataResult };
  /** Places a query on the map named by token; fails with MapOutdatedError when it was replaced. */
  mapQuery: { params: { token: number; text: string }; result: MapQueryResult };
}

export type InsightRequestType = keyof InsightRequestMap;

export const INSIGHT_REQUEST_TYPES: readonly InsightRequestType[] = ['lookalikes', 'topics', 'mapData', 'mapQuery'];
