/** folderShares: checked against counts worked out by hand on small path lists (our examples). */
import { describe, expect, it } from 'vitest';
import { folderOf, folderShares } from '../../../src/core/topics/folderShares.js';

describe('folderShares', () => {
  it('skips a wrapper folder for the sub-folder that holds nearly all of it', () => {
    const paths = [...Array.from({ length: 9 }, (_, i) => `docs/admin/a${i}.md`), 'docs/dev/b.md'];
    // docs holds 10, docs/admin 9 (90% ≥ 80%: docs is a wrapper); docs/admin and docs/dev remain,
    // docs/dev holds 1 of 10 = 10%, exactly the minimum share.
    expect(folderShares(paths)).toEqual([
      { folder: 'docs/admin', files: 9, share: 0.9 },
      { folder: 'docs/dev', files: 1, share: 0.1 },
    ]);
  });

  it('keeps a folder whose files are spread over its sub-folders, and never lists one inside another', () => {
    const paths = ['net/a/1.md', 'net/a/2.md', 'net/b/3.md', 'net/c/4.md', 'fs/5.md'];
    const got = folderShares(paths);
    expect(got[0]).toEqual({ folder: 'net', files: 4, share: 0.8 });
    expect(got.map((g) => g.folder)).toEqual(['net', 'fs']); // net/a (40%) lies inside net
  });

  it('counts files at the top of the workspace for the folder "" and no folder for "everywhere"', () => {
    expect(folderShares(['a.md', 'b.md', 'x/c.md'])).toEqual([
      { folder: '', files: 2, share: 2 / 3 },
      { folder: 'x', files: 1, share: 1 / 3 },
    ]);
    expect(folderShares([])).toEqual([]);
    expect(folderOf('a/b/c.md')).toBe('a/b');
    expect(folderOf('c.md')).toBe('');
  });

  it('lists at most maxFolders folders, each holding at least minShare', () => {
    const paths = ['a/1', 'b/1', 'c/1', 'd/1', 'e/1'];
    expect(folderShares(paths, { maxFolders: 2 })).toHaveLength(2);
    expect(folderShares(paths, { minShare: 0.3 })).toEqual([]);
  });
});
