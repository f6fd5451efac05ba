/** The map's zoom into the topic tree (src/webview/map/topicZoom.ts), on a hand-made tree (our example). */
import { describe, expect, it } from 'vitest';
import type { MapTopicTree } from '../../../src/core/map/topicTreeData.js';
import { firstLevelView, hasSubTopics, pathTo, subTopicView } from '../../../src/webview/map/topicZoom.js';

// Nodes: 0 "fare" (children 2 "refund", 3 "voucher"), 1 "tide"; files a..e.
const tree: MapTopicTree = {
  labels: ['fare', 'tide', 'refund', 'voucher'],
  parents: [-1, -1, 0, 0],
  levels: [1, 1, 2, 2],
  fileNodes: [2, 3, 2, 1, -1],
};

describe('topic zoom', () => {
  it('colours by the first level, then by the sub-topics of the topic zoomed into, greying the rest', () => {
    const first = firstLevelView([0, 0, 0, 1, -1], ['fare', 'tide'], tree);
    expect(Array.from(first.topicIds)).toEqual([0, 0, 0, 1, -1]);
    expect(first.nodes).toEqual([0, 1]);
    const zoomed = subTopicView(tree, 0);
    expect(zoomed.labels).toEqual(['refund', 'voucher']);
    expect(Array.from(zoomed.topicIds)).toEqual([0, 1, 0, -1, -1]);
    expect(zoomed.nodes).toEqual([2, 3]);
  });

  it('knows which topics open, and the way down to a topic', () => {
    expect(hasSubTopics(tree, 0)).toBe(true);
    expect(hasSubTopics(tree, 1)).toBe(false);
    expect(hasSubTopics(undefined, 0)).toBe(false);
    expect(pathTo(tree, 3)).toEqual([0, 3]);
    expect(pathTo(tree, null)).toEqual([]);
  });
});
