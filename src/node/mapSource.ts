/**
 * The concept map's input for a folder on disk: the core's MapSource of its index
 * (core/map/fromIndex.ts), with readable words in place of index stems in the tooltips' top terms
 * and the topic labels. The index keeps stems only, so the spellings are learned from the files
 * themselves (core/text/surfaceForms.ts): every file when there are at most formsFileBudget,
 * otherwise that many spread evenly over the path order; a stem never seen keeps its stem.
 * Budget 2000 files (our choice: a few seconds of reading at most, and frequent stems, which are
 * the ones shown, turn up in any sample of that size).
 */
import { join, resolve } from 'node:path';
import { evenSpread } from '../core/evenSpread.js';
import { mapSourceFromIndex, topicLabel, DEFAULT_MAP_FROM_INDEX_OPTIONS } from '../core/map/fromIndex.js';
import type { MapSource } from '../core/map/mapData.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import { SurfaceForms } from '../core/text/surfaceForms.js';
import { walkTopics, type TopicsReport } from '../core/topics/topics.js';
import { mapTopicTree } from '../core/map/topicTreeData.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from './scan.js';

export interface FolderMapSourceOptions {
  /** @default 8 */
  readonly termsPerFile: number;
  /** @default 3 */
  readonly labelWords: number;
  /** Files read to learn spellings. @default 2000 */
  readonly formsFileBudget: number;
  /** Larger files are not read for spellings. @default DEFAULT_MAX_FILE_BYTES (1 MiB) */
  readonly maxFileBytes: number;
}

export const DEFAULT_FOLDER_MAP_SOURCE_OPTIONS: FolderMapSourceOptions = {
  termsPerFile: DEFAULT_MAP_FROM_INDEX_OPTIONS.termsPerFile,
  labelWords: DEFAULT_MAP_FROM_INDEX_OPTIONS.labelWords,
  formsFileBudget: 2000,
  maxFileBytes: DEFAULT_MAX_FILE_BYTES,
};

/** The map input of the folder's index (paths in the index are relative to folder). */
export async function folderMapSource(
  folder: string,
  index: LsiIndex,
  topics: TopicsReport | null,
  options: Partial<FolderMapSourceOptions> = {},
): Promise<MapSource> {
  const opts = { ...DEFAULT_FOLDER_MAP_SOURCE_OPTIONS, ...options };
  const stems = mapSourceFromIndex(index, topics, { termsPerFile: opts.termsPerFile, labelWords: opts.labelWords });
  const stem = index.settings.tokenize.stem;
  const tree = (word: (t: string) => string) =>
    topics && topics.levels > 1 ? { topicTree: mapTopicTree(stems.paths, topics, (t) => topicLabel(t, opts.labelWords, word)) } : {};
  if (!stem) return { ...stems, ...tree((t) => t) };
  const wanted = new Set(stems.topTerms.flat());
  for (const t of walkTopics(topics?.topics ?? [])) for (const x of t.terms.slice(0, opts.labelWords)) wanted.add(x.term);
  const forms = new SurfaceForms({ stem }, wanted);
  const root = resolve(folder);
  for (const row of evenSpread(stems.count, opts.formsFileBudget)) {
    const got = await readIndexableText(join(root, stems.paths[row]), opts.maxFileBytes).catch(() => null);
    if (got?.kind === 'text') forms.add(got.text);
  }
  const word = (t: string): string => forms.wordFor(t);
  return {
    ...stems,
    topTerms: stems.topTerms.map((terms) => terms.map(word)),
    topicLabels: (topics?.topics ?? []).map((t) => topicLabel(t, opts.labelWords, word)),
    ...tree(word),
  };
}
