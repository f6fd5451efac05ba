/**
 * Topics of the index for the editor (core/topics/topics.ts): the topic tree with the index's
 * seed, readable words for the name terms learned from members of each topic, and the wire form
 * with file references. A topic lists its exemplar files first; a topic without sub-topics then
 * lists its other members closest to the centre first, at most MAX_FILES_PER_TOPIC of them.
 * For a folder (topicsOfFolder), how many of its files each topic of the tree holds.
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { inFolder, topicsOfFolder } from '../../core/topics/folderTopics.js';
import { topicSteps, walkTopics, type Topic, type TopicsReport } from '../../core/topics/topics.js';
import type { FolderTopicsWire, TopicFileWire, TopicsResult, TopicWire } from './insightProtocol.js';
import type { RootMap } from './rootMap.js';
import { formsFromFiles, type WordFor } from './wordForms.js';

/** Members read per first-level topic for spellings (as the command line does); 5 per deeper topic. */
export const FILES_READ_PER_TOPIC = 40;
/** Files listed under a topic (common practice: a tree past a few hundred rows is not read). */
export const MAX_FILES_PER_TOPIC = 200;

export interface TopicsTaskResult {
  readonly report: TopicsReport;
  readonly wordFor: WordFor;
  readonly result: TopicsResult;
}

/** How a run shares the worker: a pause between steps (messages waiting go first) and a stop. */
export interface TopicsPacing {
  readonly pause: () => Promise<void>;
  readonly signal?: AbortSignal;
}

/** The topics were not finished: the index changed (or the worker stopped) while they were computed. */
export class TopicsStoppedError extends Error {
  constructor() {
    super('The topics were stopped because the index changed.');
    this.name = 'TopicsStoppedError';
  }
}

export async function computeTopics(
  index: LsiIndex,
  roots: RootMap,
  maxFileBytes: number,
  pacing?: TopicsPacing,
): Promise<TopicsTaskResult> {
  const t0 = performance.now();
  const steps = topicSteps(index, { seed: index.settings.seed });
  let report: TopicsReport;
  for (;;) {
    if (pacing?.signal?.aborted) throw new TopicsStoppedError();
    const step = steps.next();
    if (step.done) {
      report = step.value;
      break;
    }
    if (pacing) await pacing.pause();
  }
  const all = [...walkTopics(report.topics)];
  const wanted = new Set(all.flatMap((t) => t.terms.map((x) => x.term)));
  const sample = [...new Set(all.flatMap((t) => t.members.slice(0, t.level === 1 ? FILES_READ_PER_TOPIC : 5)))];
  const wordFor = await formsFromFiles(roots, sample, { stem: index.settings.tokenize.stem, maxFileBytes, wanted, budget: sample.length });
  const wire = (t: Topic): TopicWire => {
    const picked = new Map(t.files.map((f) => [f.path, f]));
    const order =
      t.children.length > 0 ? t.files.map((f) => f.path) : [...t.files.map((f) => f.path), ...t.members.filter((p) => !picked.has(p))];
    const files: TopicFileWire[] = order.slice(0, MAX_FILES_PER_TOPIC).map((p) => {
      const ex = picked.get(p);
      return { ...roots.refOf(p), similarity: ex ? ex.similarity : null, exemplar: ex !== undefined, picked: ex?.picked ?? false };
    });
    return {
      id: t.id,
      path: t.path,
      level: t.level,
      size: t.size,
      cohesion: t.cohesion,
      terms: t.terms.map((x) => ({ word: wordFor(x.term), term: x.term, picked: x.picked })),
      files,
      moreFiles: Math.max(0, t.size - files.length),
      folders: t.folders.map((f) => ({ folder: f.folder, files: f.files, share: f.share })),
      children: t.children.map(wire),
    };
  };
  const result: TopicsResult = {
    topics: report.topics.map(wire),
    levels: report.levels,
    loose: report.loose.slice(0, MAX_FILES_PER_TOPIC).map((l) => ({ ...roots.refOf(l.path), nearest: l.nearest })),
    looseCount: report.loose.length,
    unplaced: report.unplaced.slice(0, MAX_FILES_PER_TOPIC).map((p) => roots.refOf(p)),
    unplacedCount: report.unplaced.length,
    chosen: report.count.chosen,
    cur: { method: report.cur.method, rank: report.cur.rank, errorRatio: report.cur.errorRatio },
    ms: performance.now() - t0,
  };
  return { report, wordFor, result };
}

/**
 * Which topics, at every level, hold files of the folder at fsPath (counts by topic path).
 * Returns null when the folder is outside the workspace's folders.
 */
export function folderTopics(report: TopicsReport, roots: RootMap, fsPath: string): FolderTopicsWire | null {
  const where = roots.locate(fsPath);
  if (!where) return null;
  const prefix = roots.prefixOf(where.root);
  const rel = where.rel === '.' ? '' : where.rel;
  const folder = [prefix.replace(/\/$/, ''), rel].filter(Boolean).join('/');
  const outside = [...report.loose.map((l) => l.path), ...report.unplaced];
  const counts: Record<string, number> = {};
  for (const t of walkTopics(report.topics)) {
    let n = 0;
    for (const m of t.members) if (inFolder(m, folder)) n++;
    if (n > 0) counts[t.path] = n;
  }
  const top = topicsOfFolder(report.topics, outside, folder);
  return { folder, fsPath, files: top.total, outside: top.outside, counts };
}
