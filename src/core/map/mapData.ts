/**
 * What the map receives from the index, and the JSON-safe form the page gets. The index (built
 * elsewhere) supplies n files with unit concept vectors (n×k row-major float32), paths, token
 * counts (dot size), topic ids and labels (from the topics module; -1 = no topic), top terms per
 * file, and the spectrum: singular values, the chosen k and ‖A‖²_F. The page data carries only
 * what the page draws (positions, not vectors), plus the embedded query data in standalone files.
 */
import { InvalidInputError } from '../errors.js';
import type { EmbeddedQueryData } from './embeddedQueryData.js';
import { mapTopicTreeProblems, type MapTopicTree } from './topicTreeData.js';

export interface MapSource {
  readonly count: number;
  readonly dimensions: number;
  /** count×dimensions, row-major, unit rows. */
  readonly vectors: Float32Array;
  readonly paths: readonly string[];
  readonly tokenCounts: ArrayLike<number>;
  /** Topic of each file as an index into topicLabels, or -1. */
  readonly topicIds: ArrayLike<number>;
  readonly topicLabels: readonly string[];
  /** The topic tree (topicTreeData.ts), when the topics have sub-topics. */
  readonly topicTree?: MapTopicTree;
  readonly topTerms: readonly (readonly string[])[];
  readonly singularValues: Float64Array;
  /** The number of factors kept. */
  readonly k: number;
  /** Squared Frobenius norm of the weighted term-document matrix. */
  readonly totalEnergy: number;
}

export function checkMapSource(s: MapSource): void {
  const n = s.count;
  const problems: string[] = [];
  if (!Number.isInteger(n) || n < 0) problems.push(`file count ${n} is not a whole number`);
  if (s.vectors.length !== n * s.dimensions) problems.push(`vectors hold ${s.vectors.length} numbers, expected ${n}×${s.dimensions}`);
  for (const [name, len] of [
    ['paths', s.paths.length],
    ['tokenCounts', s.tokenCounts.length],
    ['topicIds', s.topicIds.length],
    ['topTerms', s.topTerms.length],
  ] as const) {
    if (len !== n) problems.push(`${name} has ${len} entries for ${n} files`);
  }
  for (let i = 0; i < s.topicIds.length; i++) {
    const t = s.topicIds[i];
    if (!Number.isInteger(t) || t < -1 || t >= s.topicLabels.length) {
      problems.push(`file ${i} has topic ${t}, but there are ${s.topicLabels.length} topics`);
      break;
    }
  }
  if (!(s.totalEnergy > 0)) problems.push(`total energy must be positive, got ${s.totalEnergy}`);
  if (!Number.isInteger(s.k) || s.k < 0 || s.k > s.singularValues.length)
    problems.push(`k=${s.k} does not fit ${s.singularValues.length} singular values`);
  if (problems.length > 0) throw new InvalidInputError(`map input is inconsistent: ${problems.join('; ')}`);
}

/** One layout as the page stores it. */
export interface PageLayout {
  readonly x: number[];
  readonly y: number[];
}

export type LayoutName = 'quick' | 'faithful';

export interface MapPageData {
  readonly version: 1;
  readonly title: string;
  readonly files: {
    readonly paths: string[];
    readonly tokenCounts: number[];
    readonly topicIds: number[];
    readonly topTerms: string[][];
  };
  readonly topicLabels: string[];
  /** Sub-topics for zooming (topicTreeData.ts); absent when there are none. */
  readonly topicTree?: MapTopicTree;
  readonly layouts: { readonly quick: PageLayout; readonly faithful: PageLayout | null };
  readonly spectrum: { readonly singularValues: number[]; readonly k: number; readonly totalEnergy: number };
  /** Present only in standalone files, where the page answers queries itself. */
  readonly embedded: EmbeddedQueryData | null;
}

export interface PageDataOptions {
  /** @default 'Concept map' */
  readonly title: string;
  /** Decimal places kept for coordinates (layouts have unit RMS radius). @default 5 */
  readonly digits: number;
  /** Top terms kept per file. @default 8 */
  readonly termsPerFile: number;
}

export const DEFAULT_PAGE_DATA_OPTIONS: PageDataOptions = { title: 'Concept map', digits: 5, termsPerFile: 8 };

export function toPageLayout(x: ArrayLike<number>, y: ArrayLike<number>, digits = DEFAULT_PAGE_DATA_OPTIONS.digits): PageLayout {
  const f = 10 ** digits;
  const round = (v: number) => Math.round(v * f) / f;
  return { x: Array.from(x, round), y: Array.from(y, round) };
}

export function buildMapPageData(
  source: MapSource,
  layouts: { quick: { x: ArrayLike<number>; y: ArrayLike<number> }; faithful: { x: ArrayLike<number>; y: ArrayLike<number> } | null },
  embedded: EmbeddedQueryData | null = null,
  options: Partial<PageDataOptions> = {},
): MapPageData {
  const opts = { ...DEFAULT_PAGE_DATA_OPTIONS, ...options };
  checkMapSource(source);
  for (const l of [layouts.quick, layouts.faithful]) {
    if (l !== null && (l.x.length !== source.count || l.y.length !== source.count)) {
      throw new InvalidInputError(`a layout has ${l.x.length} points for ${source.count} files`);
    }
  }
  return {
    version: 1,
    title: opts.title,
    files: {
      paths: [...source.paths],
      tokenCounts: Array.from(source.tokenCounts),
      topicIds: Array.from(source.topicIds),
      topTerms: source.topTerms.map((t) => t.slice(0, opts.termsPerFile)),
    },
    topicLabels: [...source.topicLabels],
    ...(source.topicTree ? { topicTree: source.topicTree } : {}),
    layouts: {
      quick: toPageLayout(layouts.quick.x, layouts.quick.y, opts.digits),
      faithful: layouts.faithful ? toPageLayout(layouts.faithful.x, layouts.faithful.y, opts.digits) : null,
    },
    spectrum: { singularValues: Array.from(source.singularValues), k: source.k, totalEnergy: source.totalEnergy },
    embedded,
  };
}

/** Problems with page data received over a message channel; empty when it is usable. */
export function pageDataProblems(d: unknown): string[] {
  if (typeof d !== 'object' || d === null) return ['map data is not an object'];
  const m = d as Partial<MapPageData>;
  const out: string[] = [];
  if (m.version !== 1) out.push(`unknown map data version ${String(m.version)}`);
  const n = Array.isArray(m.files?.paths) ? m.files.paths.length : -1;
  if (n < 0) return [...out, 'map data has no file paths'];
  for (const key of ['tokenCounts', 'topicIds', 'topTerms'] as const) {
    if (!Array.isArray(m.files?.[key]) || m.files[key].length !== n) out.push(`files.${key} does not have ${n} entries`);
  }
  if (!Array.isArray(m.topicLabels)) out.push('topicLabels is missing');
  if (m.topicTree !== undefined) out.push(...mapTopicTreeProblems(m.topicTree, n));
  const checkLayout = (l: unknown, name: string) => {
    const p = l as PageLayout;
    if (!Array.isArray(p?.x) || !Array.isArray(p?.y) || p.x.length !== n || p.y.length !== n)
      out.push(`layout ${name} does not have ${n} points`);
  };
  checkLayout(m.layouts?.quick, 'quick');
  if (m.layouts?.faithful !== null) checkLayout(m.layouts?.faithful, 'faithful');
  if (!Array.isArray(m.spectrum?.singularValues)) out.push('spectrum is missing');
  return out;
}
