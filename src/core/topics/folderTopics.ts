/**
 * The topics a folder holds: for one folder (a '/'-separated prefix of the workspace paths) and a
 * cut of the topic tree, how many of the folder's files each topic holds, most first; the files
 * of the folder in no topic (loose or unplaced) are counted apart. This shows which concepts cut
 * across the folder structure (a plain count; no method to cite).
 */
import type { Topic } from './topics.js';

export interface FolderTopic {
  readonly topic: Topic;
  /** Files of the folder in this topic. */
  readonly files: number;
  /** files / the folder's files. */
  readonly shareOfFolder: number;
  /** files / the topic's size. */
  readonly shareOfTopic: number;
}

export interface FolderTopics {
  readonly folder: string;
  /** Files of the folder the tree knows of (in a topic, loose or unplaced). */
  readonly total: number;
  readonly topics: readonly FolderTopic[];
  /** Files of the folder in no topic. */
  readonly outside: number;
}

/** True when path lies in folder ('' is the whole workspace). */
export function inFolder(path: string, folder: string): boolean {
  return folder === '' || path.startsWith(`${folder}/`);
}

export function topicsOfFolder(cut: readonly Topic[], outsidePaths: readonly string[], folder: string): FolderTopics {
  const f = folder.replace(/^\.\/?/, '').replace(/\/+$/, '');
  const rows: { topic: Topic; files: number }[] = [];
  for (const topic of cut) {
    let files = 0;
    for (const m of topic.members) if (inFolder(m, f)) files++;
    if (files > 0) rows.push({ topic, files });
  }
  const outside = outsidePaths.filter((p) => inFolder(p, f)).length;
  const total = rows.reduce((s, r) => s + r.files, 0) + outside;
  rows.sort((a, b) => b.files - a.files || (a.topic.path < b.topic.path ? -1 : 1));
  return {
    folder: f,
    total,
    topics: rows.map((r) => ({ ...r, shareOfFolder: total > 0 ? r.files / total : 0, shareOfTopic: r.files / r.topic.size })),
    outside,
  };
}
