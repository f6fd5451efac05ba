import { describe, expect, it } from 'vitest';
import { DESCRIPTION_WORDS, topicsSummary, topicsTree, type TopicFileNode } from '../../src/extension/topicsModel.js';
import type { TopicsResult, TopicWire } from '../../src/node/worker/insightProtocol.js';
import type { FileRef } from '../../src/node/worker/workerProtocol.js';

const ref = (key: string, folder = 'ferry'): FileRef => ({ key, fsPath: `/w/${folder}/${key}`, folder, relPath: key });
const topic = (id: number, words: string[], files: string[], moreFiles = 0): TopicWire => ({
  id,
  size: files.length + moreFiles,
  cohesion: 0.61,
  terms: words.map((w, i) => ({ word: w, term: w, picked: i === 0 })),
  files: files.map((f, i) => ({ ...ref(f), similarity: i === 0 ? 0.93 : null, exemplar: i === 0, picked: i === 0 })),
  moreFiles,
});
const result = (topics: TopicWire[], unplaced: string[] = [], unplacedCount = unplaced.length): TopicsResult => ({
  topics, unplaced: unplaced.map((p) => ref(p)), unplacedCount, chosen: 'auto', cur: { method: 'deim', rank: 10, errorRatio: 1.3 }, ms: 1,
});

describe('topics tree', () => {
  it('shows each topic with its file count in the label and its signature words in the description', () => {
    const words = ['tide', 'window', 'berth', 'ebb', 'draught', 'slip', 'timetable', 'sailing'];
    const [node] = topicsTree(result([topic(1, words, ['src/timetable/tidalWindow.ts', 'notes/tides.md'])]), false);
    expect(node.label).toBe('Topic 1 (2)');
    expect(node.description).toBe(`${words.slice(0, DESCRIPTION_WORDS).join(', ')}, …`);
    expect(node.tooltip).toContain('**tide**, window');
  });

  it('lists the topic’s files, the exemplar marked with its similarity and every file with its folder', () => {
    const [node] = topicsTree(result([topic(2, ['refund'], ['notes/ticketing/refund-policy.md', 'README.md'])]), false);
    const [ex, other] = node.children as TopicFileNode[];
    expect(ex).toMatchObject({ label: 'refund-policy.md', description: 'exemplar 0.93 · notes/ticketing' });
    expect(ex.tooltip).toContain('CUR selection');
    expect(other).toMatchObject({ label: 'README.md', description: '' });
    expect(other.file.fsPath).toBe('/w/ferry/README.md');
  });

  it('says how many files are not listed, and gathers files without a topic', () => {
    const nodes = topicsTree(result([topic(1, ['fare'], ['a.ts'], 250)], ['empty.md', 'blank.txt'], 3), false);
    expect(nodes[0].children.at(-1)).toMatchObject({ type: 'note', label: '… and 250 more files' });
    expect(nodes[1]).toMatchObject({ label: 'No topic (3)' });
    expect(nodes[1].children.map((c) => c.label)).toEqual(['empty.md', 'blank.txt', '… and 1 more file']);
  });

  it('names the workspace folder of each file when there are several, and keeps ids unique', () => {
    const t: TopicWire = { ...topic(1, ['x'], []), size: 2, files: [{ ...ref('api/a.ts', 'api'), relPath: 'a.ts', similarity: null, exemplar: false, picked: false }] };
    const nodes = topicsTree(result([t, topic(2, ['y'], ['a.ts'])]), true);
    expect((nodes[0].children[0] as TopicFileNode).description).toBe('api');
    const ids = nodes.flatMap((n) => [n.id, ...n.children.map((c) => c.id)]);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('summarises the count and how it was chosen', () => {
    expect(topicsSummary(result([topic(1, ['x'], ['a'])]))).toBe('1 topic (count chosen automatically)');
    expect(topicsSummary({ ...result([]), chosen: 'given' })).toBe('0 topics');
  });
});
