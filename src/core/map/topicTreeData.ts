/**
 * The topic tree as the concept map gets it (core/topics/topics.ts), so the page can colour the
 * files by any level and zoom into a topic's sub-topics: every topic is a node with its label and
 * its parent; nodes 0…K−1 are the first-level topics in the order of the map's topicLabels, deeper
 * nodes follow level by level; each file names the deepest node holding it (−1: no topic).
 */
import { InvalidInputError } from '../errors.js';
import type { Topic, TopicsReport } from '../topics/topics.js';

export interface MapTopicTree {
  readonly labels: string[];
  /** Parent node of each node (−1 for a first-level topic). */
  readonly parents: number[];
  /** Level of each node (1 = first). */
  readonly levels: number[];
  /** Deepest node of each file of the map (same order as its paths), −1 when in no topic. */
  readonly fileNodes: number[];
}

export function mapTopicTree(paths: readonly string[], report: TopicsReport, label: (t: Topic) => string): MapTopicTree {
  const rowOf = new Map(paths.map((p, i) => [p, i]));
  const labels: string[] = [];
  const parents: number[] = [];
  const levels: number[] = [];
  const fileNodes = new Array<number>(paths.length).fill(-1);
  let queue: { t: Topic; parent: number }[] = report.topics.map((t) => ({ t, parent: -1 }));
  while (queue.length > 0) {
    const next: { t: Topic; parent: number }[] = [];
    for (const { t, parent } of queue) {
      const id = labels.length;
      labels.push(label(t));
      parents.push(parent);
      levels.push(t.level);
      for (const p of t.members) {
        const r = rowOf.get(p);
        if (r === undefined) throw new InvalidInputError(`topic ${t.path} lists "${p}", which is not on the map`);
        fileNodes[r] = id; // deeper levels come later and overwrite
      }
      for (const c of t.children) next.push({ t: c, parent: id });
    }
    queue = next;
  }
  return { labels, parents, levels, fileNodes };
}

/** Problems with a tree received over a message channel (n files); empty when usable. */
export function mapTopicTreeProblems(tree: unknown, n: number): string[] {
  const t = tree as Partial<MapTopicTree>;
  const out: string[] = [];
  const m = Array.isArray(t?.labels) ? t.labels.length : -1;
  if (m < 0) return ['topicTree.labels is missing'];
  if (!Array.isArray(t.parents) || t.parents.length !== m || t.parents.some((p, i) => !Number.isInteger(p) || p < -1 || p >= i))
    out.push('topicTree.parents is not a list of earlier nodes');
  if (!Array.isArray(t.levels) || t.levels.length !== m) out.push('topicTree.levels is not one per node');
  if (!Array.isArray(t.fileNodes) || t.fileNodes.length !== n || t.fileNodes.some((x) => !Number.isInteger(x) || x < -1 || x >= m))
    out.push(`topicTree.fileNodes is not one node per file`);
  return out;
}
