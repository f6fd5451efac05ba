/**
 * The concept map for the editor, computed in the worker: the MapSource of the index
 * (core/map/fromIndex.ts) with the topics' assignment and readable words, both layouts
 * (core/map/mapLayouts.ts: quick principal axes, faithful landmark Isomap seeded by the index's
 * seed) and the page data. What placing a query needs (the index whose model folds it, the
 * layouts, the unit vectors) stays here in a MapModel; the editor gets a token naming it.
 * Queries are folded with that index's frozen model, projected on the quick layout
 * (projectQuick) and placed on the faithful one by its own rule (placeQueryFaithful).
 */
import { NoKnownTermsError } from '../../core/errors.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { mapSourceFromIndex, topicLabel, DEFAULT_MAP_FROM_INDEX_OPTIONS } from '../../core/map/fromIndex.js';
import { mapTopicTree } from '../../core/map/topicTreeData.js';
import type { FaithfulLayout } from '../../core/map/landmarkIsomap.js';
import { buildMapPageData, type MapPageData } from '../../core/map/mapData.js';
import { computeMapLayouts } from '../../core/map/mapLayouts.js';
import { DEFAULT_QUERY_PLACEMENT_OPTIONS, nearestByCosine, placeQueryFaithful } from '../../core/map/placeQuery.js';
import { projectQuick } from '../../core/map/quickProjection.js';
import { quickLayout, type QuickLayout } from '../../core/map/quickLayout.js';
import { placeSectionTrail } from '../../core/map/sectionTrail.js';
import type { PageTrail } from '../../core/map/mapMessages.js';
import type { TopicsReport } from '../../core/topics/topics.js';
import type { MapQueryResult } from './insightProtocol.js';
import type { RootMap } from './rootMap.js';
import { formsFromFiles, type WordFor } from './wordForms.js';

export { MapOutdatedError } from './workerErrors.js';

export interface MapModel {
  readonly token: number;
  readonly index: LsiIndex;
  readonly data: MapPageData;
  readonly fsPaths: readonly string[];
  readonly quick: QuickLayout;
  readonly faithful: FaithfulLayout | null;
  /** Unit concept vectors of the map's files, count × k. */
  readonly vectors: Float32Array;
  readonly count: number;
}

export interface MapTaskOptions {
  readonly token: number;
  readonly maxFileBytes: number;
  /** Readable words for the topic labels already learned by the topics task. */
  readonly topicWords?: WordFor;
  readonly title?: string;
}

export async function computeMap(index: LsiIndex, roots: RootMap, topics: TopicsReport | null, o: MapTaskOptions): Promise<MapModel> {
  const stems = mapSourceFromIndex(index, topics);
  const wanted = new Set(stems.topTerms.flat());
  const wordFor = await formsFromFiles(roots, stems.paths, { stem: index.settings.tokenize.stem, maxFileBytes: o.maxFileBytes, wanted });
  const labelWord = (t: string): string => (o.topicWords ? o.topicWords(t) : wordFor(t));
  const source = {
    ...stems,
    topTerms: stems.topTerms.map((terms) => terms.map(wordFor)),
    topicLabels: (topics?.topics ?? []).map((t) => topicLabel(t, DEFAULT_MAP_FROM_INDEX_OPTIONS.labelWords, labelWord)),
    ...(topics && topics.levels > 1
      ? { topicTree: mapTopicTree(stems.paths, topics, (t) => topicLabel(t, DEFAULT_MAP_FROM_INDEX_OPTIONS.labelWords, labelWord)) }
      : {}),
  };
  const n = source.count;
  let quick: QuickLayout;
  let faithful: FaithfulLayout | null = null;
  try {
    const both = computeMapLayouts(source.vectors, n, source.dimensions, { faithful: { seed: index.settings.seed } });
    quick = both.quick;
    faithful = both.faithful;
  } catch {
    // Too few files (or all alike) for the graph layout: the quick one still shows them.
    quick = quickLayout(source.vectors, n, source.dimensions);
  }
  const data = buildMapPageData(source, { quick, faithful }, null, { title: o.title ?? 'Concept map' });
  return {
    token: o.token,
    index,
    data,
    fsPaths: source.paths.map((p) => roots.refOf(p).fsPath),
    quick,
    faithful,
    vectors: source.vectors,
    count: n,
  };
}

const rowsByPath = new WeakMap<MapModel, Map<string, number>>();

/**
 * Places free text on both layouts (by its concept vector) and names the files to ring: the best
 * answers of a search for it (the index's own ranking, concept cosine blended with BM25), so the
 * map's first ringed file is the search's first answer. Files added since the map was drawn are
 * skipped (they have no dot yet).
 */
export function placeMapQuery(model: MapModel, text: string): MapQueryResult {
  const q = model.index.projectText(text);
  let ss = 0;
  for (const v of q) ss += v * v;
  if (!(ss > 0)) throw new NoKnownTermsError(text);
  const quick = projectQuick(model.quick, q);
  const placed = model.faithful ? placeQueryFaithful(model.faithful, q) : null;
  let neighbours: ArrayLike<number>;
  let similarities: ArrayLike<number>;
  const ringed = DEFAULT_QUERY_PLACEMENT_OPTIONS.neighbours;
  let rowOf = rowsByPath.get(model);
  if (!rowOf) rowsByPath.set(model, (rowOf = new Map(model.data.files.paths.map((p, i) => [p, i]))));
  const hits = model.index
    .search(text, { top: ringed * 2 })
    .filter((h) => rowOf.has(h.path))
    .slice(0, ringed);
  if (hits.length > 0) {
    neighbours = hits.map((h) => rowOf.get(h.path)!);
    similarities = hits.map((h) => h.score);
  } else if (placed) ({ neighbours, similarities } = placed);
  else
    ({ index: neighbours, similarity: similarities } = nearestByCosine(
      model.vectors,
      model.count,
      model.index.k,
      q,
      DEFAULT_QUERY_PLACEMENT_OPTIONS.neighbours,
    ));
  return {
    positions: { quick: { x: quick.x, y: quick.y }, faithful: placed ? { x: placed.x, y: placed.y } : null },
    neighbours: Array.from(neighbours),
    similarities: Array.from(similarities),
  };
}

/**
 * The sections of one indexed file as a trail on the map (core/map/sectionTrail.ts), placed like a
 * query; null when the file has no sections (or is not indexed). The sections are the index's
 * current ones, so a file edited since the map was drawn shows its new sections.
 */
export function placeMapTrail(model: MapModel, key: string): PageTrail | null {
  const sections = model.index.has(key) ? model.index.sections.get(key) : undefined;
  if (!sections || sections.starts.length === 0) return null;
  return { path: key, points: placeSectionTrail(model, sections, model.index.k) };
}
