import { describe, expect, it } from 'vitest';
import {
  EMPTY_QUESTION_MESSAGE,
  formatScore,
  locationOf,
  markedPassage,
  nearbyEntries,
  noKnownWordsMessage,
  SEARCH_PLACEHOLDER,
  searchEntries,
  searchPickItems,
  searchViewDescription,
  sectionEntries,
  subjectTranslationsEntry,
  withoutKeys,
} from '../../src/extension/viewModels.js';

const hit = (relPath: string, score: number, folder = 'ferry') => ({
  key: relPath,
  fsPath: `/w/${folder}/${relPath}`,
  folder,
  relPath,
  score,
});

describe('result entries', () => {
  it('shows the file name, the score and the folder path relative to the workspace folder', () => {
    const [a, b] = nearbyEntries([hit('notes/safety/gale.md', 0.8612), hit('README.md', 0.5)], false);
    expect(a).toMatchObject({
      key: 'notes/safety/gale.md',
      label: 'gale.md',
      description: '0.86 · notes/safety',
      fsPath: '/w/ferry/notes/safety/gale.md',
    });
    expect(a.tooltip.split('\n')[0]).toBe('notes/safety/gale.md');
    expect(b.description).toBe('0.50');
  });

  it('names the workspace folder when there are several', () => {
    expect(locationOf({ folder: 'api', relPath: 'src/a.ts' }, true)).toBe('api › src');
    expect(locationOf({ folder: 'api', relPath: 'a.ts' }, true)).toBe('api');
    expect(nearbyEntries([hit('src/a.ts', 0.3, 'api')], true)[0].tooltip.split('\n')[0]).toBe('api/src/a.ts');
  });

  it('shows the folder beside a search result, and its passage as a row under it with the query words marked', () => {
    // Two files of one name in different folders (249 index.rst files in a real tree): the folder tells them apart.
    const [e, f] = searchEntries(
      [
        { ...hit('notes/refunds.md', 0.7), line: 11, lineText: 'Money is paid back within five days.', highlights: [[0, 5]] },
        { ...hit('archive/refunds.md', 0.6), line: 0, lineText: '' },
      ],
      false,
    );
    expect(e).toMatchObject({ label: 'refunds.md', description: '0.70 · notes', line: 11, expanded: true });
    expect(f).toMatchObject({ label: 'refunds.md', description: '0.60 · archive' });
    expect(f.children).toBeUndefined();
    expect(e.children).toEqual([
      {
        kind: 'passage',
        key: 'notes/refunds.md#passage',
        fsPath: '/w/ferry/notes/refunds.md',
        text: 'Money is paid back within five days.',
        highlights: [[0, 5]],
        line: 11,
      },
    ]);
    expect(
      markedPassage(
        'Money is paid back',
        [
          [0, 5],
          [9, 13],
        ],
        (x) => x,
      ),
    ).toBe('**Money** is **paid** back');
  });

  it("folds a page's translations under it and says how many there are", () => {
    const t = (relPath: string, language: string) => ({ key: relPath, fsPath: `/w/docs/${relPath}`, folder: 'docs', relPath, language });
    const [e] = searchEntries(
      [
        {
          ...hit('power/suspend.page', 0.5),
          line: 2,
          lineText: 'Suspend sends it to sleep.',
          language: 'original',
          translations: [t('de/power/suspend.page', 'de, German'), t('zh_CN/power/suspend.page', 'zh_CN, Chinese')],
        },
      ],
      false,
    );
    expect(e.description).toBe('0.50 · power · +2 languages');
    expect(e.children!.map((c) => ('label' in c ? `${c.label}: ${c.description}` : c.kind))).toEqual([
      'passage',
      'In 2 other languages: de, zh_CN',
    ]);
    const folded = e.children![1] as unknown as { children: { label: string; description: string }[]; expanded: boolean };
    expect(folded.expanded).toBe(false);
    expect(folded.children.map((c) => `${c.label} ${c.description}`)).toEqual([
      'suspend.page de, German · de/power',
      'suspend.page zh_CN, Chinese · zh_CN/power',
    ]);
    const [n] = nearbyEntries(
      [{ ...hit('power/suspend.page', 0.5), language: 'original', translations: [t('de/power/suspend.page', 'de, German')] }],
      false,
    );
    expect(n).toMatchObject({ description: '0.50 · power · +1 language', expanded: false });
    expect(subjectTranslationsEntry('k', '/w/k', [], false)).toEqual([]);
    expect(subjectTranslationsEntry('k', '/w/k', [t('de/power/suspend.page', 'de, German')], false)[0]).toMatchObject({
      label: 'This page in 1 other language',
      heading: true,
    });
  });

  it('builds quick pick rows with the folder and the matching passage', () => {
    const [item] = searchPickItems([{ ...hit('notes/refunds.md', 0.7), line: 0, lineText: 'Refunds are paid within five days' }], false);
    expect(item).toMatchObject({ label: '$(file) refunds.md', description: '0.70 · notes', detail: 'Refunds are paid within five days' });
    expect(item.entry.line).toBe(0);
  });

  it('answers an empty question and one with no known words calmly, with a neutral placeholder', () => {
    // The placeholder must not come from any one workspace (it was a question about the demo's ferries).
    expect(SEARCH_PLACEHOLDER).not.toMatch(/ticket|crossing|ferry|e\.g\./i);
    expect(EMPTY_QUESTION_MESSAGE).toMatch(/^Type a question/);
    expect(noKnownWordsMessage('zzqx')).toMatch(/None of the words in “zzqx” occur in the indexed files/);
    expect(noKnownWordsMessage('x'.repeat(60))).toContain('…');
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

describe('sections in results', () => {
  it('a search result names its best section and opens there when the passage lies outside it', () => {
    const section = { title: 'Refund window', start: 20, end: 41 };
    const [inside, outside] = searchEntries(
      [
        { ...hit('notes/refunds.md', 0.7), line: 25, lineText: 'Paid back within five days.', section },
        { ...hit('notes/fares.md', 0.6), line: 3, lineText: 'Fares change in spring.', section },
      ],
      false,
    );
    expect(inside.description).toBe('0.70 · notes · Refund window');
    expect(inside.line).toBe(25);
    expect(outside.line).toBe(20);
    expect(inside.tooltip).toContain('Best section: Refund window (lines 21–41)');
  });

  it('a section row is titled by the section, opens at its first line and names its file and lines', () => {
    const [row] = sectionEntries([{ ...hit('notes/refunds.md', 0.5), title: 'Refund window', start: 20, end: 41 }], false);
    expect(row).toMatchObject({
      key: 'notes/refunds.md#20',
      label: 'Refund window',
      description: 'refunds.md · lines 21–41 · 0.50',
      line: 20,
    });
  });

  it('carries the why of a section to its tooltip, as a search or a nearby section', () => {
    const why = { score: 0.5, terms: [{ word: 'refund', share: 0.5, inBoth: true }], rest: 0, restTerms: 0 };
    const m = { ...hit('notes/refunds.md', 0.5), title: 'Refund window', start: 20, end: 41, why };
    expect(sectionEntries([m], false)[0]).toMatchObject({ why, whyKind: 'searchSection' });
    expect(sectionEntries([m], false, 'nearby')[0]).toMatchObject({ why, whyKind: 'nearbySection' });
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
