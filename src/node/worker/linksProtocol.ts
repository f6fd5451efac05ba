/**
 * The worker's suggested-links request (core/links) as plain data for the thread boundary;
 * workerProtocol.ts folds it into its RequestMap, the handler lives in linkService.ts.
 */
import type { FileRef } from './fileRef.js';
import type { Why } from './insightProtocol.js';

export interface LinkSuggestionWire extends FileRef {
  /** The suggested note's title (front matter, first heading, or file name). */
  readonly title: string;
  /** Nearby's score for the pair (the order of the suggestions). */
  readonly score: number;
  /** The concept cosine discounted by how much of each note the space holds (core/links/suggestLinks.ts; what the threshold applies to). */
  readonly similarity: number;
  /** The link to insert in the subject note, in the collection's style, with the title as its text. */
  readonly link: string;
  /** The words behind the similarity (each term's exact share of it), when they could be worked out. */
  readonly why?: Why;
}

export interface LinkSuggestionsResult {
  /** The collection's link style (core/links/linkStyle.ts). */
  readonly style: 'markdown' | 'double-bracket';
  /** The least similarity suggested. */
  readonly minSimilarity: number;
  /** Notes the subject links to or is linked from (left out of the suggestions). */
  readonly linked: number;
  /** Best first; empty when nothing reaches minSimilarity. */
  readonly suggestions: readonly LinkSuggestionWire[];
  readonly ms: number;
}

export interface LinksRequestMap {
  /** Suggested links for the note at fsPath; null when it is not an indexed note. */
  suggestLinks: { params: { fsPath: string; top: number }; result: LinkSuggestionsResult | null };
}

export type LinksRequestType = keyof LinksRequestMap;

export const LINKS_REQUEST_TYPES: readonly LinksRequestType[] = ['suggestLinks'];
