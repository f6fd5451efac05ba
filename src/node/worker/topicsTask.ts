/**
 * Topics of the index for the editor (core/topics/topics.ts): findTopics with the index's seed,
 * readable words for the signature terms learned from up to FILES_READ_PER_TOPIC members of each
 * topic, and the wire form with file references. A topic lists its exemplar files first, then its
 * other members closest to the centre first, at most MAX_FILES_PER_TOPIC of them.
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { findTopics, type TopicsReport } from '../../core/topics/topics.js';
import type { TopicFileWire, TopicsResult } from './insightProtocol.js';
import type { RootMap } from './rootMap.js';
import { formsFromFiles, type WordFor } from './wordForms.js';

/** Members read per topic for spellings (as the command line does). */
export const FILES_READ_PER_TOPIC = 40;
/** Files listed under a topic (common practice: a tree past a few hundred rows is not read). */
export const MAX_FILES_PER_TOPIC = 200;

export interface TopicsTaskResult {
  readonly report: TopicsReport;
  readonly wordFor: WordFor;
  readonly result: TopicsResult;
}

export async function computeTopics(index: LsiIndex, roots: RootMap, maxFileBytes: number): Promise<TopicsTaskResult> {
  const t0 = performance.now();
  const report = findTopics(index, { seed: index.settings.seed });
  const wanted = new Set(report.topics.flatMap((t) => t.terms.map((x) => x.term)));
  const sample = report.topics.flatMap((t) => t.members.slice(0, FILES_READ_PER_TOPIC));
  const wordFor = await formsFromFiles(roots, sample, { stem: index.settings.tokenize.stem, maxFileBytes, wanted, budget: sample.length });
  const result: TopicsResult = {
    topics: report.topics.map((t) => {
      const picked = new Map(t.files.map((f) => [f.path, f]));
      const order = [...t.files.map((f) => f.path), ...t.members.filter((p) => !picked.has(p))];
      const files: TopicFileWire[] = order.slice(0, MAX_FILES_PER_TOPIC).map((p) => {
        const ex = picked.get(p);
        return { ...roots.refOf(p), similarity: ex ? ex.similarity : null, exemplar: ex !== undefined, picked: ex?.picked ?? false };
      });
      return {
        id: t.id,
        size: t.size,
        cohesion: t.cohesion,
        terms: t.terms.map((x) => ({ word: wordFor(x.term), term: x.term, picked: x.picked })),
        files,
        moreFiles: Math.max(0, order.length - files.length),
      };
    }),
    unplaced: report.unplaced.slice(0, MAX_FILES_PER_TOPIC).map((p) => roots.refOf(p)),
    unplacedCount: report.unplaced.length,
    chosen: report.count.chosen,
    cur: { method: report.cur.method, rank: report.cur.rank, errorRatio: report.cur.errorRatio },
    ms: performance.now() - t0,
  };
  return { report, wordFor, result };
}
