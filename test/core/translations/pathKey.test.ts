// Path layouts of real translation trees: the GNOME help (Debian gnome-user-docs: <lang>/gnome-help/x.page,
// C/ for the original) and the Linux kernel documentation's translations/<lang>/ layout (layout only;
// no file of it is used here), plus file-name suffixes as in README.fr.md.
import { describe, expect, it } from 'vitest';
import { localeOf, translationPath } from '../../../src/core/translations/pathKey.js';

describe('translation keys of paths', () => {
  it('removes language folders, translations/ folders and language suffixes', () => {
    expect(translationPath('de/gnome-help/power-suspend.page')).toEqual({ key: 'gnome-help/power-suspend.page', locale: 'de' });
    expect(translationPath('C/gnome-help/power-suspend.page')).toEqual({ key: 'gnome-help/power-suspend.page', locale: 'C' });
    expect(translationPath('sr@latin/gnome-help/a.page').locale).toBe('sr@latin');
    expect(translationPath('Documentation/translations/zh_CN/admin-guide/index.rst')).toEqual({
      key: 'Documentation/admin-guide/index.rst',
      locale: 'zh_CN',
    });
    expect(translationPath('Documentation/admin-guide/index.rst')).toEqual({
      key: 'Documentation/admin-guide/index.rst',
      locale: undefined,
    });
    expect(translationPath('docs/README.pt-BR.md')).toEqual({ key: 'docs/README.md', locale: 'pt-BR' });
    expect(translationPath('guide_ja.md')).toEqual({ key: 'guide.md', locale: 'ja' });
  });

  it('leaves ordinary names alone', () => {
    expect(translationPath('src/lib/index.ts')).toEqual({ key: 'src/lib/index.ts', locale: undefined });
    expect(translationPath('notes/go-live.md').key).toBe('notes/go-live.md'); // "go" is no ISO 639-1 code
    expect(localeOf('src')).toBeUndefined();
    expect(localeOf('zh_CN')).toBe('zh_CN');
    expect(localeOf('xx')).toBeUndefined();
  });
});
