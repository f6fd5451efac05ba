/** The rows and empty states of the Unlinked Neighbours view (src/extension/linkSuggestionsModel.ts). */
import { describe, expect, it } from 'vitest';
import { linkRows, linkViewState } from '../../src/extension/linkSuggestionsModel.js';
import type { LinkSuggestionsResult } from '../../src/node/worker/linksProtocol.js';

const result: LinkSuggestionsResult = {
  style: 'markdown',
  minSimilarity: 0.43,
  linked: 2,
  ms: 3,
  suggestions: [
    {
      key: 'notes/ferry.md',
      fsPath: '/ws/notes/ferry.md',
      folder: 'ws',
      relPath: 'notes/ferry.md',
      title: 'Ferry timetable',
      score: 0.8,
      similarity: 0.512,
      link: '[Ferry timetable](ferry.md)',
      why: {
        score: 0.512,
        terms: ['ferry', 'harbour', 'timetable', 'winter'].map((word) => ({ word, share: 0.1, inBoth: true })),
        rest: 0.112,
        restTerms: 9,
      },
    },
  ],
};

describe('linkRows', () => {
  it('labels each row with the title, its similarity and the first words behind it', () => {
    const [row] = linkRows('/ws/notes/today.md', result, false);
    expect(row.label).toBe('Ferry timetable');
    expect(row.description).toBe('0.51 · ferry, harbour, timetable');
    expect(row.subject).toBe('/ws/notes/today.md');
    expect(row.tooltip).toContain('Insert Link writes: [Ferry timetable](ferry.md)');
    expect(row.tooltip).toContain('notes/ferry.md');
    expect(linkRows('/ws/a.md', result, true)[0].tooltip).toContain('ws/notes/ferry.md');
  });

  it('has no rows without an answer', () => {
    expect(linkRows('/ws/a.md', null, false)).toEqual([]);
  });
});

describe('linkViewState', () => {
  it('tells apart no index, not a note, nothing worth linking and suggestions', () => {
    expect(linkViewState(result, false)).toBe('no-index');
    expect(linkViewState(null, true)).toBe('not-note');
    expect(linkViewState({ ...result, suggestions: [] }, true)).toBe('quiet');
    expect(linkViewState(result, true)).toBe('suggestions');
  });
});
