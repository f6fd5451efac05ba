// Real pages: test/fixtures/gnome-help (Debian gnome-user-docs 43.0-2, CC-BY-SA 3.0): five pages, each in
// six languages. The expected groups are the pages themselves (their file names), which the package states.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  areTranslations,
  chooseShown,
  collapseTranslations,
  groupTranslations,
  isOriginalPath,
  type TranslationDoc,
} from '../../../src/core/translations/groupTranslations.js';
import { languageOf } from '../../../src/core/translations/language.js';
import { structureSignature } from '../../../src/core/translations/structure.js';

const FIX = path.resolve(import.meta.dirname, '../../fixtures/gnome-help');
const doc = (rel: string, as = rel): TranslationDoc => {
  const text = readFileSync(path.join(FIX, rel), 'utf8');
  return { key: as, path: as, signature: structureSignature(text), language: () => languageOf(text) };
};
const all = readdirSync(FIX)
  .filter((l) => !l.endsWith('.md'))
  .flatMap((l) => readdirSync(path.join(FIX, l, 'gnome-help')).map((p) => `${l}/gnome-help/${p}`));

describe('translation groups', () => {
  it('groups each page with its translations, and nothing else', () => {
    const groups = groupTranslations(all.map((p) => doc(p)));
    const byPage = groups.map((g) => [...new Set(g.map((k) => path.basename(k)))]);
    expect(groups).toHaveLength(5);
    for (const names of byPage) expect(names).toHaveLength(1);
    expect(groups.map((g) => g.length)).toEqual([6, 6, 6, 6, 6]);
  });

  it('does not pair two files of one language whose paths name no language, nor different pages', () => {
    expect(
      areTranslations(
        doc('C/gnome-help/power-suspend.page', 'a/power-suspend.page'),
        doc('C/gnome-help/power-suspend.page', 'b/translations/power-suspend.page'),
      ),
    ).toBe(false);
    expect(
      areTranslations(doc('C/gnome-help/power-suspend.page'), doc('de/gnome-help/files-delete.page', 'de/gnome-help/power-suspend.page')),
    ).toBe(false);
    expect(areTranslations(doc('C/gnome-help/power-suspend.page'), doc('de/gnome-help/power-suspend.page'))).toBe(true);
  });

  it('shows the member that fits the reader, then the original, then the best ranked', () => {
    expect(
      chooseShown([
        { fit: 0.2, rank: 0, original: false },
        { fit: 0.8, rank: 5, original: true },
      ]),
    ).toBe(1);
    expect(
      chooseShown([
        { fit: 0.5, rank: 0, original: false },
        { fit: 0.5, rank: Infinity, original: true },
      ]),
    ).toBe(1);
    expect(
      chooseShown([
        { fit: 0.5, rank: 3, original: false },
        { fit: 0.5, rank: 1, original: false },
      ]),
    ).toBe(1);
    expect(isOriginalPath('C/gnome-help/a.page')).toBe(true);
    expect(isOriginalPath('Documentation/translations/zh_CN/a.rst')).toBe(false);
  });
});

describe('collapseTranslations', () => {
  // Paths in the gettext-style layout of the GNOME help tree (test/fixtures/gnome-help): C is the original.
  const hits = [
    { path: 'help/de/printing.page', score: 0.9 },
    { path: 'help/C/printing.page', score: 0.8 },
    { path: 'help/C/mouse.page', score: 0.7 },
    { path: 'help/C/wifi.page', score: 0.6 },
  ];
  const groups = new Map([
    ['help/de/printing.page', ['help/C/printing.page', 'help/de/printing.page']],
    ['help/C/printing.page', ['help/C/printing.page', 'help/de/printing.page']],
  ]);

  it('makes a page and its translations one row, shown in the member that fits best, others kept', () => {
    const rows = collapseTranslations(hits, groups, () => 0, 10);
    expect(rows.map((r) => r.key)).toEqual(['help/C/printing.page', 'help/C/mouse.page', 'help/C/wifi.page']);
    expect(rows[0].others).toEqual(['help/de/printing.page']);
    expect(rows[0].hit.path).toBe('help/de/printing.page');
    const german = collapseTranslations(hits, groups, (k) => (k.includes('/de/') ? 1 : 0), 10);
    expect(german[0].key).toBe('help/de/printing.page');
  });

  it('leaves out skipped keys with their groups, and stops at top rows', () => {
    expect(collapseTranslations(hits, groups, () => 0, 10, ['help/C/printing.page', 'help/de/printing.page']).map((r) => r.key)).toEqual([
      'help/C/mouse.page',
      'help/C/wifi.page',
    ]);
    expect(collapseTranslations(hits, groups, () => 0, 2)).toHaveLength(2);
  });
});
