/**
 * Zooming into the topic tree on the map (core/map/topicTreeData.ts): the colours of one level at
 * a time. Unzoomed, the files wear their first-level topics; zoomed into a topic, its files wear
 * its sub-topics and every other file is greyed (colour −1). Pure data, no DOM: app.ts applies it.
 */
import type { MapTopicTree } from '../../core/map/topicTreeData.js';

export interface TopicLevelView {
  /** The topic zoomed into (a node of the tree), or null for the first level. */
  readonly focus: number | null;
  /** Colour index of each file (−1: not in a shown topic). */
  readonly topicIds: Int32Array;
  /** Label of each colour. */
  readonly labels: readonly string[];
  /** Tree node of each colour (null without a tree). */
  readonly nodes: readonly number[] | null;
}

export function firstLevelView(topicIds: ArrayLike<number>, labels: readonly string[], tree: MapTopicTree | undefined): TopicLevelView {
  return { focus: null, topicIds: Int32Array.from(topicIds), labels, nodes: tree ? labels.map((_, i) => i) : null };
}

/** True when the node opens into sub-topics. */
export function hasSubTopics(tree: MapTopicTree | undefined, node: number): boolean {
  return tree !== undefined && tree.parents.some((p) => p === node);
}

/** The view of a topic's sub-topics. */
export function subTopicView(tree: MapTopicTree, focus: number): TopicLevelView {
  const nodes: number[] = [];
  tree.parents.forEach((p, i) => p === focus && nodes.push(i));
  const colourOf = new Map(nodes.map((node, c) => [node, c]));
  const topicIds = new Int32Array(tree.fileNodes.length).fill(-1);
  tree.fileNodes.forEach((leaf, i) => {
    for (let node = leaf; node >= 0; node = tree.parents[node]) {
      const c = colourOf.get(node);
      if (c !== undefined) {
        topicIds[i] = c;
        break;
      }
    }
  });
  return { focus, topicIds, labels: nodes.map((n) => tree.labels[n]), nodes };
}

/** The topics from the first level down to the focus (for a breadcrumb). */
export function pathTo(tree: MapTopicTree, focus: number | null): number[] {
  const out: number[] = [];
  for (let node = focus ?? -1; node >= 0; node = tree.parents[node]) out.unshift(node);
  return out;
}
