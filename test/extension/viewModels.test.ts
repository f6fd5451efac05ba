import { describe, expect, it } from 'vitest';
import {
  formatScore, locationOf, nearbyEntries, searchEntries, searchPickItems, searchViewDescription, withoutKeys,
} from '../../src/extension/viewModels.js';

const hit = (relPath: string, score: number, folder = 'ferry') => ({ key: relPath, fsPath: `/w/${folder}/${relPath}`, folder, relPath, score });

describe('result entries', () => {
  it('shows the file name, the score and the folder path relative to the workspace folder', () => {
    const [a, b] = nearbyEntries([hit('notes/safety/gale.md', 0.8612), hit('README.md', 0.5)], false);
    expect(a).toMatchObject({ key: 'notes/safety/gale.md', label: 'gale.md', description: '0.86 · notes/safety', fsPath: '/w/ferry/notes/safety/gale.md' });
    expect(a.tooltip.split('\n')[0]).toBe('notes/safety/gale.md');
    expect(b.description).toBe('0.50');
  });

  it('names the workspace folder when there are several', () => {
    expect(locationOf({ folder: 'api', relPath: 'src/a.ts' }, true)).toBe('api › src');
    expect(locationOf({ folder: 'api', relPath: 'a.ts' }, true)).toBe('api');
    expect(nearbyEntries([hit('src/a.ts', 0.3, 'api')], true)[0].tooltip.split('\n')[0]).toBe('api/src/a.ts');
  });

  it('gives search results their one-based line and the matching text', () => {
    const [e] = searchEntries([{ ...hit('notes/refunds.md', 0.7), line: 11, lineText: 'Money is paid back within five days.' }], false);
    expect(e).toMatchObject({ label: 'refunds.md', description: '0.70 · 12: Money is paid back within five days.', line: 11 });
  });

  it('builds quick pick rows with the path and the matching line', () => {
    const [item] = searchPickItems([{ ...hit('notes/refunds.md', 0.7), line: 0, lineText: 'Refunds' }], false);
    expect(item).toMatchObject({ label: '$(file) refunds.md', description: '0.70  notes/refunds.md', detail: '1: Refunds' });
    expect(item.entry.line).toBe(0);
  });

  it('drops removed files at once', () => {
    const entries = nearbyEntries([hit('a.md', 0.9), hit('b.md', 0.8), hit('c.md', 0.7)], false);
    expect(withoutKeys(entries, new Set(['b.md'])).map((e) => e.key)).toEqual(['a.md', 'c.md']);
  });

  it('rounds scores to two decimals and describes the last query', () => {
    expect(formatScore(0.125)).toBe('0.13');
    expect(formatScore(-0.004)).toBe('-0.00');
    expect(searchViewDescription(undefined, 0)).toBe('');
    expect(searchViewDescription('lost property', 1)).toBe('“lost property” · 1 result');
    expect(searchViewDescription('x'.repeat(50), 3)).toBe(`“${'x'.repeat(39)}…” · 3 results`);
  });
});

describe('search feedback (More Like This / Fewer Like This)', () => {
  it('moves a file between the lists, keeps the latest few, and describes them', async () => {
    const { NO_FEEDBACK, refineFeedback, feedbackDescription, MAX_FEEDBACK_FILES } = await import('../../src/extension/viewModels.js');
    let f = refineFeedback(NO_FEEDBACK, '/w/a.md', 'like');
    expect(f).toEqual({ like: ['/w/a.md'], unlike: [] });
    f = refineFeedback(f, '/w/b.md', 'unlike');
    f = refineFeedback(f, '/w/a.md', 'unlike');
    expect(f).toEqual({ like: [], unlike: ['/w/b.md', '/w/a.md'] });
    for (let i = 0; i < 9; i++) f = refineFeedback(f, `/w/${i}.md`, 'like');
    expect(f.like).toHaveLength(MAX_FEEDBACK_FILES);
    expect(f.like.at(-1)).toBe('/w/8.md');
    expect(feedbackDescription(f)).toBe(`more like ${MAX_FEEDBACK_FILES}, fewer like 2`);
    expect(feedbackDescription(NO_FEEDBACK)).toBe('');
  });
});
