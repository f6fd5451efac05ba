/** mapTopicTree: the map's form of the topic tree, checked on a hand-made tree (our example). */
import { describe, expect, it } from 'vitest';
import { mapTopicTree, mapTopicTreeProblems } from '../../../src/core/map/topicTreeData.js';
import type { Topic, TopicsReport } from '../../../src/core/topics/topics.js';

const t = (path: string, members: string[], children: Topic[] = []): Topic => ({
  id: 1,
  path,
  level: path.split('.').length,
  size: members.length,
  cohesion: 1,
  terms: [],
  files: [],
  members,
  folders: [],
  children,
});

describe('mapTopicTree', () => {
  it('numbers first-level topics first, then deeper ones level by level, and gives each file its deepest topic', () => {
    const report = { topics: [t('1', ['a', 'b', 'c'], [t('1.1', ['a', 'b']), t('1.2', ['c'])]), t('2', ['d'])] } as unknown as TopicsReport;
    const tree = mapTopicTree(['a', 'b', 'c', 'd', 'loose'], report, (x) => `T${x.path}`);
    expect(tree).toEqual({
      labels: ['T1', 'T2', 'T1.1', 'T1.2'],
      parents: [-1, -1, 0, 0],
      levels: [1, 1, 2, 2],
      fileNodes: [2, 2, 3, 1, -1],
    });
    expect(mapTopicTreeProblems(tree, 5)).toEqual([]);
    expect(mapTopicTreeProblems({ ...tree, parents: [-1, -1, 3, 0] }, 5)).toHaveLength(1);
    expect(mapTopicTreeProblems(tree, 4)).toHaveLength(1);
  });
});
