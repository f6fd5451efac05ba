/**
 * The one message format between the map page and its host (the editor adapter, or the page's own
 * standalone stand-in). Discriminated by `type`. Messages from the page cross a trust boundary, so
 * the host checks them with isPageToHostMessage before acting; the page checks host messages with
 * isHostToPageMessage.
 */
import type { LayoutName, MapPageData, PageLayout } from './mapData.js';
import { pageDataProblems } from './mapData.js';

export interface MapPoint {
  readonly x: number;
  readonly y: number;
}

export type ThemeKind = 'light' | 'dark' | 'high-contrast' | 'high-contrast-light';

/** Host → page. */
export type HostToPageMessage =
  | { readonly type: 'init'; readonly data: MapPageData }
  /** A layout finished after init (the faithful one is slower). */
  | { readonly type: 'layout'; readonly name: LayoutName; readonly layout: PageLayout }
  | {
      readonly type: 'queryResult';
      readonly requestId: number;
      readonly text: string;
      readonly positions: { readonly quick: MapPoint | null; readonly faithful: MapPoint | null };
      /** Nearest files, most similar first, with their cosine similarities. */
      readonly neighbours: number[];
      readonly similarities: number[];
    }
  | { readonly type: 'queryError'; readonly requestId: number; readonly message: string }
  /** Highlight a file (e.g. the active editor's), or clear with null. */
  | { readonly type: 'select'; readonly index: number | null }
  /** The editor theme changed; the page re-reads its colours. */
  | { readonly type: 'theme'; readonly kind: ThemeKind }
  /** The sections of the active file as a trail of points in reading order (sectionTrail.ts), or null to clear it. */
  | { readonly type: 'trail'; readonly trail: PageTrail | null };

/** A file's trail as the page gets it. */
export interface PageTrail {
  readonly path: string;
  readonly points: readonly {
    readonly title: string;
    readonly start: number;
    readonly end: number;
    readonly quick: MapPoint;
    readonly faithful: MapPoint | null;
  }[];
}

/** Page → host. */
export type PageToHostMessage =
  | { readonly type: 'ready' }
  | { readonly type: 'open'; readonly index: number; readonly path: string }
  | { readonly type: 'query'; readonly requestId: number; readonly text: string }
  | { readonly type: 'layoutChanged'; readonly layout: LayoutName }
  /** Open the trail's file at the first line of its point'th section (an index into the trail the host sent last). */
  | { readonly type: 'openSection'; readonly point: number };

/** Longest query text the host accepts (common practice: a generous bound on a search box). */
export const MAX_QUERY_LENGTH = 2000;

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null;
const isIndex = (v: unknown): v is number => typeof v === 'number' && Number.isInteger(v) && v >= 0;
const isLayoutName = (v: unknown): v is LayoutName => v === 'quick' || v === 'faithful';
const isPoint = (v: unknown): boolean => v === null || (isObject(v) && Number.isFinite(v.x) && Number.isFinite(v.y));
const isNumberArray = (v: unknown): v is number[] => Array.isArray(v) && v.every((x) => typeof x === 'number');

export function isPageToHostMessage(v: unknown): v is PageToHostMessage {
  if (!isObject(v)) return false;
  switch (v.type) {
    case 'ready':
      return true;
    case 'open':
      return isIndex(v.index) && typeof v.path === 'string';
    case 'query':
      return isIndex(v.requestId) && typeof v.text === 'string' && v.text.length <= MAX_QUERY_LENGTH;
    case 'layoutChanged':
      return isLayoutName(v.layout);
    case 'openSection':
      return isIndex(v.point);
    default:
      return false;
  }
}

export function isHostToPageMessage(v: unknown): v is HostToPageMessage {
  if (!isObject(v)) return false;
  switch (v.type) {
    case 'init':
      return pageDataProblems(v.data).length === 0;
    case 'layout':
      return isLayoutName(v.name) && isObject(v.layout) && isNumberArray(v.layout.x) && isNumberArray(v.layout.y);
    case 'queryResult':
      return (
        isIndex(v.requestId) &&
        typeof v.text === 'string' &&
        isObject(v.positions) &&
        isPoint(v.positions.quick) &&
        isPoint(v.positions.faithful) &&
        isNumberArray(v.neighbours) &&
        isNumberArray(v.similarities) &&
        v.neighbours.length === v.similarities.length
      );
    case 'queryError':
      return isIndex(v.requestId) && typeof v.message === 'string';
    case 'select':
      return v.index === null || isIndex(v.index);
    case 'theme':
      return v.kind === 'light' || v.kind === 'dark' || v.kind === 'high-contrast' || v.kind === 'high-contrast-light';
    case 'trail':
      return v.trail === null || isPageTrail(v.trail);
    default:
      return false;
  }
}

function isPageTrail(v: unknown): v is PageTrail {
  if (!isObject(v) || typeof v.path !== 'string' || !Array.isArray(v.points)) return false;
  return v.points.every(
    (p: unknown) =>
      isObject(p) &&
      typeof p.title === 'string' &&
      isIndex(p.start) &&
      isIndex(p.end) &&
      p.end >= p.start &&
      isObject(p.quick) &&
      isPoint(p.quick) &&
      isPoint(p.faithful),
  );
}
