/** The Topics view's data: labels from the topic's words, sub-topics, folder mode, loose files (our examples). */
import { describe, expect, it } from 'vitest';
import { LABEL_CHARS, topicLabel, topicsSummary, topicsTree, type TopicFileNode, type TopicNode } from '../../src/extension/topicsModel.js';
import type { TopicsResult, TopicWire } from '../../src/node/worker/insightProtocol.js';
import type { FileRef } from '../../src/node/worker/workerProtocol.js';

const ref = (key: string, folder = 'ferry'): FileRef => ({ key, fsPath: `/w/${folder}/${key}`, folder, relPath: key });
const topic = (path: string, words: string[], files: string[], extra: Partial<TopicWire> = {}): TopicWire => ({
  id: Number(path.split('.').at(-1)),
  path,
  level: path.split('.').length,
  size: files.length,
  cohesion: 0.61,
  terms: words.map((w, i) => ({ word: w, term: w, picked: i === 0 })),
  files: files.map((f, i) => ({ ...ref(f), similarity: i === 0 ? 0.93 : null, exemplar: i === 0, picked: i === 0 })),
  moreFiles: 0,
  folders: [],
  children: [],
  ...extra,
});
const result = (topics: TopicWire[], extra: Partial<TopicsResult> = {}): TopicsResult => ({
  topics,
  levels: 2,
  loose: [],
  looseCount: 0,
  unplaced: [],
  unplacedCount: 0,
  chosen: 'auto',
  cur: { method: 'deim', rank: 10, errorRatio: 1.3 },
  ms: 1,
  ...extra,
});

describe('topics tree', () => {
  it('labels a topic by its words (never "Topic N"), with size and main folder in the description', () => {
    const words = ['tide', 'window', 'berth', 'ebb', 'draught'];
    const [node] = topicsTree(
      result([topic('1', words, ['notes/tides.md', 'notes/slip.md'], { folders: [{ folder: 'notes', files: 2, share: 1 }] })]),
      false,
    );
    expect(node.label).toBe('tide, window, berth');
    expect(node.description).toBe('2 files · all in notes');
    expect(node.icon).toBe('topic');
    // The hover speaks plainly: no jargon, only the title in bold.
    expect(node.tooltip).toContain('Words that set these files apart from the rest of the workspace: tide, window, berth, ebb, draught.');
    expect(node.tooltip).toContain('Where its files are: notes (100%).');
    expect(node.tooltip).not.toMatch(/cohesion|cosine|CUR/);
    expect(node.tooltip.match(/\*\*/g)).toHaveLength(2);
  });

  it('keeps a label short without cutting a word', () => {
    const label = topicLabel({
      terms: ['interoperability', 'internationalisation', 'x'].map((w) => ({ word: w, term: w, picked: false })),
    });
    expect(label).toBe('interoperability');
    expect(topicLabel({ terms: ['a', 'b', 'c', 'd'].map((w) => ({ word: w, term: w, picked: false })) })).toBe('a, b, c');
    expect(label.length).toBeLessThanOrEqual(LABEL_CHARS);
  });

  it('opens a topic into its sub-topics, and a sub-topic into its files, the typical one first', () => {
    const child1 = topic('1.1', ['refund'], ['notes/ticketing/refund-policy.md', 'README.md']);
    const child2 = topic('1.2', ['voucher'], ['notes/v.md']);
    const [node] = topicsTree(
      result([topic('1', ['fare'], ['notes/ticketing/refund-policy.md'], { size: 3, children: [child1, child2] })]),
      false,
    );
    const subs = node.children as TopicNode[];
    expect(subs.map((c) => c.label)).toEqual(['refund', 'voucher']);
    expect(subs[0].tooltip).toContain('Part of the topic “fare”.');
    const [ex, other] = subs[0].children as TopicFileNode[];
    expect(ex).toMatchObject({ label: 'refund-policy.md', description: 'typical · notes/ticketing' });
    expect(other).toMatchObject({ label: 'README.md', description: '' });
    const ids = [node, ...subs, ...subs.flatMap((s) => s.children)].map((n) => n.id);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('gathers loose files (with their nearest topic) and files without known words apart', () => {
    const nodes = topicsTree(
      result([topic('1', ['fare'], ['a.ts'], { size: 251, moreFiles: 250 })], {
        loose: [{ ...ref('odd.md'), nearest: '1' }],
        looseCount: 1,
        unplaced: [ref('empty.md')],
        unplacedCount: 2,
      }),
      false,
    );
    expect(nodes[0].children.at(-1)).toMatchObject({ type: 'note', label: '… and 250 more files' });
    expect(nodes[1]).toMatchObject({ label: 'Fits no topic well', icon: 'loose', description: '1 file' });
    expect((nodes[1].children[0] as TopicFileNode).tooltip).toContain('Nearest topic: fare.');
    expect(nodes[2]).toMatchObject({ label: 'No known words', description: '2 files' });
    expect(nodes[2].children.map((c) => c.label)).toEqual(['empty.md', '… and 1 more file']);
  });

  it('for a folder, shows only the topics holding its files, most first, with how many are here', () => {
    const t1 = topic('1', ['fare'], ['src/a.ts', 'notes/b.md']);
    const t2 = topic('2', ['tide'], ['notes/c.md', 'notes/d.md', 'notes/e.md']);
    const t3 = topic('3', ['crew'], ['src/f.ts']);
    const r = result([t1, t2, t3], {
      folder: { folder: 'notes', fsPath: '/w/ferry/notes', files: 5, outside: 1, counts: { '1': 1, '2': 3 } },
      loose: [
        { ...ref('notes/x.md'), nearest: '2' },
        { ...ref('src/y.md'), nearest: '1' },
      ],
      looseCount: 2,
    });
    const nodes = topicsTree(r, false);
    expect(nodes.map((n) => n.label)).toEqual(['tide', 'fare', 'Fits no topic well']);
    expect(nodes[0].description).toBe('3 of 3 files here');
    expect(nodes[1].children.map((c) => c.label)).toEqual(['b.md']);
    expect(nodes[2].children.map((c) => c.label)).toEqual(['x.md']);
    expect(topicsSummary(r)).toBe('notes: 5 files in 2 topics');
  });

  it('names the workspace folder of each file when there are several', () => {
    const t: TopicWire = {
      ...topic('1', ['x'], []),
      size: 1,
      files: [{ ...ref('api/a.ts', 'api'), relPath: 'a.ts', similarity: null, exemplar: false, picked: false }],
    };
    const nodes = topicsTree(result([t]), true);
    expect((nodes[0].children[0] as TopicFileNode).description).toBe('api');
    expect(topicsSummary(result([t]))).toBe('1 topic');
  });
});
