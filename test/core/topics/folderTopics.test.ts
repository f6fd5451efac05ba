/** topicsOfFolder: counts checked by hand on a small tree (our example). */
import { describe, expect, it } from 'vitest';
import { inFolder, topicsOfFolder } from '../../../src/core/topics/folderTopics.js';
import type { Topic } from '../../../src/core/topics/topics.js';

const topic = (path: string, members: string[]): Topic => ({
  id: 1,
  path,
  level: 1,
  size: members.length,
  cohesion: 1,
  terms: [],
  files: [],
  members,
  folders: [],
  children: [],
});

describe('topicsOfFolder', () => {
  it('counts the folder files of each topic, most first, and the ones in no topic apart', () => {
    const cut = [topic('1', ['net/a.md', 'net/b.md', 'fs/c.md']), topic('2', ['net/d.md']), topic('3', ['fs/e.md'])];
    const got = topicsOfFolder(cut, ['net/loose.md', 'network.md'], 'net/');
    expect(got.folder).toBe('net');
    expect(got.total).toBe(4);
    expect(got.outside).toBe(1);
    expect(got.topics.map((t) => [t.topic.path, t.files, t.shareOfFolder, t.shareOfTopic])).toEqual([
      ['1', 2, 0.5, 2 / 3],
      ['2', 1, 0.25, 1],
    ]);
    expect(topicsOfFolder(cut, [], '').total).toBe(5);
    expect(inFolder('network.md', 'net')).toBe(false);
  });
});
