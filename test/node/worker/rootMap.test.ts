import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { RootMap, uniqueRootNames } from '../../../src/node/worker/rootMap.js';

const root = (name: string, fsPath: string) => ({ name, fsPath, exclude: [] });

describe('RootMap', () => {
  it('uses folder-relative keys with a single folder', () => {
    const map = new RootMap([root('shop', join('/w', 'shop'))]);
    expect(map.keyOf(join('/w', 'shop', 'src', 'a.ts'))).toBe('src/a.ts');
    expect(map.refOf('src/a.ts')).toEqual({
      key: 'src/a.ts',
      fsPath: join('/w', 'shop', 'src', 'a.ts'),
      folder: 'shop',
      relPath: 'src/a.ts',
    });
  });

  it('prefixes keys with the folder name when there are several, and maps them back', () => {
    const map = new RootMap([root('api', join('/w', 'api')), root('web', join('/w', 'web'))]);
    const key = map.keyOf(join('/w', 'web', 'docs', 'x.md'))!;
    expect(key).toBe('web/docs/x.md');
    expect(map.refOf(key)).toMatchObject({ folder: 'web', relPath: 'docs/x.md', fsPath: join('/w', 'web', 'docs', 'x.md') });
  });

  it('gives a file in nested folders to the innermost one', () => {
    const map = new RootMap([root('outer', join('/w')), root('inner', join('/w', 'inner'))]);
    expect(map.keyOf(join('/w', 'inner', 'a.md'))).toBe('inner/a.md');
    expect(map.locate(join('/w', 'inner', 'a.md'))!.root.name).toBe('inner');
  });

  it('has no key for paths outside every folder, for a sibling with a common prefix, or for a folder itself', () => {
    const map = new RootMap([root('shop', join('/w', 'shop'))]);
    expect(map.keyOf(join('/w', 'other', 'a.ts'))).toBeUndefined();
    expect(map.keyOf(join('/w', 'shop-old', 'a.ts'))).toBeUndefined();
    expect(map.keyOf(join('/w', 'shop'))).toBeUndefined();
  });
});

describe('uniqueRootNames', () => {
  it('numbers repeated names and replaces path separators', () => {
    expect(uniqueRootNames(['app', 'app', 'lib', 'app', 'a/b', ''])).toEqual(['app', 'app (2)', 'lib', 'app (3)', 'a_b', 'folder']);
  });
});
