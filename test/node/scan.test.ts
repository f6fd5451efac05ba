import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { CancelledError, InvalidInputError, UndertoneError } from '../../src/core/errors.js';
import { DEFAULT_SCAN_OPTIONS, FolderNotFoundError, readIndexableText, scanFolder } from '../../src/node/scan.js';

const base = mkdtempSync(join(tmpdir(), 'undertone-scan-'));
afterAll(() => rmSync(base, { recursive: true, force: true }));
let caseNo = 0;

function tree(files: Record<string, string | Uint8Array>): string {
  const root = join(base, `t${caseNo++}`);
  mkdirSync(root);
  for (const [rel, body] of Object.entries(files)) {
    mkdirSync(dirname(join(root, rel)), { recursive: true });
    writeFileSync(join(root, rel), body);
  }
  return root;
}

const hasGit = ((): boolean => {
  try {
    execFileSync('git', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
})();

const paths = async (root: string, opts = {}): Promise<string[]> => (await scanFolder(root, opts)).files.map((f) => f.path);

describe('DEFAULT_SCAN_OPTIONS', () => {
  it('has the documented defaults', () => {
    expect(DEFAULT_SCAN_OPTIONS).toEqual({
      include: [],
      exclude: [],
      useDefaultExcludes: true,
      maxFileBytes: 1_048_576,
      honourGitignore: true,
      followSymlinks: true,
      followLinksOutside: false,
      linkRoots: [],
    });
  });
});

describe('scanFolder', () => {
  it('lists files with POSIX relative paths, absolute paths, sizes and mtimes as the file system reports them', async () => {
    const root = tree({ 'a.md': 'hello', 'sub/deeper/b.ts': 'export {}\n', 'empty.txt': '' });
    const r = await scanFolder(root);
    expect(r.root).toBe(root);
    expect(r.files.map((f) => f.path)).toEqual(['a.md', 'empty.txt', 'sub/deeper/b.ts']);
    for (const f of r.files) {
      // Reference: a direct fs.statSync of the same file.
      const st = statSync(join(root, ...f.path.split('/')));
      expect(f.absPath).toBe(join(root, ...f.path.split('/')));
      expect([f.size, f.mtimeMs]).toEqual([st.size, st.mtimeMs]);
    }
    expect(r.skipped).toEqual([]);
  });

  it('skips version-control folders, dependencies, build output, lock files, bundles and binary formats by default', async () => {
    const root = tree({
      'keep.ts': '',
      'dist.md': '',
      'docs/build-notes.md': '',
      'src/app.js': '',
      '.git/config': '',
      '.hg/store': '',
      '.svn/entries': '',
      'node_modules/pkg/index.js': '',
      'dist/app.js': '',
      'out/x.js': '',
      'build/y.js': '',
      'target/debug/z': '',
      'coverage/lcov.info': '',
      '.next/cache.json': '',
      'pkg/__pycache__/m.pyc': '',
      '.cache/blob': '',
      'src/deep/node_modules/q.js': '',
      'package-lock.json': '',
      'yarn.lock': '',
      'pnpm-lock.yaml': '',
      'Cargo.lock': '',
      'poetry.lock': '',
      'app.min.js': '',
      'style.min.css': '',
      'app.js.map': '',
      'logo.PNG': '',
      'font.woff2': '',
      'lib.so': '',
    });
    expect(await paths(root)).toEqual(['dist.md', 'docs/build-notes.md', 'keep.ts', 'src/app.js']);
  });

  it('keeps default-excluded paths when defaults are off or a negation re-includes them', async () => {
    const root = tree({ 'a.ts': '', 'build/gen.ts': '', 'yarn.lock': '', 'node_modules/x.js': '' });
    expect(await paths(root, { useDefaultExcludes: false })).toEqual(['a.ts', 'build/gen.ts', 'node_modules/x.js', 'yarn.lock']);
    expect(await paths(root, { exclude: ['!build/'] })).toEqual(['a.ts', 'build/gen.ts']);
  });

  it('applies include and exclude patterns in gitignore syntax, ignoring case', async () => {
    const root = tree({ 'README.MD': '', 'docs/guide.md': '', 'docs/img.svg': '', 'src/a.ts': '', 'src/a.test.ts': '' });
    expect(await paths(root, { include: ['*.md'] })).toEqual(['README.MD', 'docs/guide.md']);
    expect(await paths(root, { include: ['docs/'] })).toEqual(['docs/guide.md', 'docs/img.svg']);
    expect(await paths(root, { exclude: ['*.test.ts', 'DOCS/'] })).toEqual(['README.MD', 'src/a.ts']);
  });

  it('reports files over the size cap as too-large and keeps one exactly at the cap', async () => {
    const root = tree({ 'small.txt': 'x'.repeat(10), 'edge.txt': 'x'.repeat(64), 'big.txt': 'x'.repeat(65) });
    const r = await scanFolder(root, { maxFileBytes: 64 });
    expect(r.files.map((f) => f.path)).toEqual(['edge.txt', 'small.txt']);
    expect(r.skipped).toEqual([{ path: 'big.txt', reason: 'too-large', detail: '65 bytes, over the limit of 64 bytes.' }]);
  });

  it('does not report excluded or ignored files as skipped', async () => {
    const root = tree({
      '.git/HEAD': '',
      '.gitignore': 'huge.txt\n',
      'huge.txt': 'x'.repeat(100),
      'node_modules/big.js': 'x'.repeat(100),
      'a.md': '',
    });
    const r = await scanFolder(root, { maxFileBytes: 10 });
    expect(r.files.map((f) => f.path)).toEqual(['.gitignore', 'a.md']);
    expect(r.skipped).toEqual([]);
  });

  it('ignores .gitignore files when told to', async () => {
    const root = tree({ '.git/HEAD': '', '.gitignore': '*.log\n', 'a.log': '', 'sub/.gitignore': '*\n', 'sub/b.md': '' });
    expect(await paths(root)).toEqual(['.gitignore']);
    expect(await paths(root, { honourGitignore: false })).toEqual(['.gitignore', 'a.log', 'sub/.gitignore', 'sub/b.md']);
  });

  it('counts the files and folders .gitignore files left out, a folder once (reference: gitignore(5))', async () => {
    const root = tree({
      '.git/HEAD': '',
      '.gitignore': '*.log\ndrafts/\n',
      'a.log': '',
      'b.log': '',
      'drafts/x.md': '',
      'drafts/y.md': '',
      'node_modules/z.log': '',
      'c.md': '',
    });
    const r = await scanFolder(root);
    expect(r.files.map((f) => f.path)).toEqual(['.gitignore', 'c.md']);
    // a.log, b.log and drafts/; node_modules/ goes by the built-in names first, so it is not counted.
    expect(r.gitIgnored).toBe(3);
    expect((await scanFolder(root, { honourGitignore: false })).gitIgnored).toBe(0);
    // Outside a working tree .gitignore files are not read, so nothing is counted.
    expect((await scanFolder(tree({ '.gitignore': '*.log\n', 'a.log': '' }))).gitIgnored).toBe(0);
  });

  // git reads .gitignore files only inside a working tree (gitignore(5)). The case is Debian's
  // linux-source-6.1 tarball: its top-level .gitignore (lines copied from it: `.*`, `/*`,
  // `!/debian/`) comes from the packaging repository and hides every kernel file from git.
  const kernelLike = {
    '.gitignore': '.*\n*.o\n/vmlinux\n/*\n!/debian/\n',
    Makefile: '',
    'Documentation/index.rst': '',
    'kernel/fork.c': '',
    'kernel/fork.o': '',
    'debian/rules': '',
    '.mailmap': '',
  };
  it('reads .gitignore files only inside a git working tree, as git does', async () => {
    expect(await paths(tree(kernelLike))).toEqual([
      '.gitignore',
      '.mailmap',
      'Documentation/index.rst',
      'Makefile',
      'debian/rules',
      'kernel/fork.c',
    ]);
    // A subfolder of an unpacked tarball is no different.
    const sub = tree({ 'docs/.gitignore': '*\n', 'docs/a.rst': '' });
    expect(await paths(join(sub, 'docs'))).toEqual(['.gitignore', 'a.rst']);
  });

  it.skipIf(!hasGit)('inside a working tree, keeps what `git ls-files --others --exclude-standard` lists (reference: git)', async () => {
    const root = tree(kernelLike);
    execFileSync('git', ['init', '-q', root]);
    const byGit = execFileSync('git', ['-C', root, 'ls-files', '--others', '--exclude-standard'], { encoding: 'utf8' })
      .split('\n')
      .filter((p) => p !== '')
      .sort();
    expect(byGit).toEqual(['debian/rules']);
    expect(await paths(root)).toEqual(byGit);
    // Below the top of the working tree (a nested folder opened on its own) the same rule holds.
    const nested = tree({ '.git/HEAD': '', 'docs/.gitignore': '*.tmp\n', 'docs/a.rst': '', 'docs/b.tmp': '' });
    expect(await paths(join(nested, 'docs'))).toEqual(['.gitignore', 'a.rst']);
  });

  it('lists unicode, spaced and odd file names, sorted by UTF-16 code units', async () => {
    const names = [
      'zeta.md',
      'Äpfel.md',
      'ångström.txt',
      '日本語.md',
      'emoji-😀.md',
      'with space.md',
      '#hash.md',
      '[x].md',
      'a\\b.md',
      'Zed.md',
    ];
    const root = tree(Object.fromEntries(names.map((n) => [n, n])));
    // Reference: ECMAScript's default Array#sort order, which compares UTF-16 code units.
    expect(await paths(root)).toEqual([...names].sort());
  });

  it('gives the same list whatever order the files were created in', async () => {
    const rels = Array.from({ length: 120 }, (_, i) => `d${i % 7}/s${i % 3}/f${(i * 37) % 120}.md`);
    const a = tree(Object.fromEntries(rels.map((r) => [r, r])));
    const b = tree(Object.fromEntries([...rels].reverse().map((r) => [r, r])));
    const first = await paths(a);
    expect(first).toHaveLength(120);
    expect(await paths(b)).toEqual(first);
    expect(await paths(a)).toEqual(first);
  });

  it('finds every file of a wide, deep tree, as a plain recursive listing does', async () => {
    const files: Record<string, string> = {};
    for (let i = 0; i < 300; i++) files[`l1-${i % 13}/l2-${i % 11}/l3-${i % 5}/f${i}.txt`] = String(i);
    const root = tree(files);
    // Reference: Node's own recursive readdir, filtered to files.
    const all = readdirSync(root, { recursive: true, withFileTypes: true })
      .filter((d) => d.isFile())
      .map((d) =>
        join(d.parentPath, d.name)
          .slice(root.length + 1)
          .split('\\')
          .join('/'),
      )
      .sort();
    expect(await paths(root)).toEqual(all);
  });

  it('leaves content checks to readIndexableText: a binary file is listed, then read as binary', async () => {
    const root = tree({ 'blob.dat': Buffer.from([1, 2, 0, 3]), 'bom.md': Buffer.from([0xef, 0xbb, 0xbf, 0x68, 0x69]) });
    const r = await scanFolder(root);
    expect(r.files.map((f) => f.path)).toEqual(['blob.dat', 'bom.md']);
    expect(await readIndexableText(r.files[0].absPath, DEFAULT_SCAN_OPTIONS.maxFileBytes)).toEqual({ kind: 'binary' });
    expect(await readIndexableText(r.files[1].absPath, DEFAULT_SCAN_OPTIONS.maxFileBytes)).toEqual({ kind: 'text', text: 'hi' });
  });

  it('throws FolderNotFoundError for a missing root or a file given as root', async () => {
    const missing = join(base, 'no-such-folder');
    const err = await scanFolder(missing).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(FolderNotFoundError);
    expect(err).toBeInstanceOf(UndertoneError);
    expect((err as Error).message).toContain(missing);
    const root = tree({ 'f.txt': '' });
    await expect(scanFolder(join(root, 'f.txt'))).rejects.toThrow(/is a file, not a folder/);
  });

  it('treats an option given as undefined as its default', async () => {
    const root = tree({ 'a.md': 'aaaa', 'node_modules/x.js': '' });
    const r = await scanFolder(root, { include: undefined, exclude: undefined, maxFileBytes: undefined, useDefaultExcludes: undefined });
    expect(r.files.map((f) => f.path)).toEqual(['a.md']);
  });

  it('rejects a size cap that is not a positive whole number', async () => {
    const root = tree({ 'f.txt': '' });
    await expect(scanFolder(root, { maxFileBytes: -1 })).rejects.toBeInstanceOf(InvalidInputError);
    await expect(scanFolder(root, { maxFileBytes: Number.NaN })).rejects.toBeInstanceOf(InvalidInputError);
  });

  it('throws CancelledError when the signal is aborted, before or during the walk', async () => {
    const files: Record<string, string> = {};
    for (let i = 0; i < 200; i++) files[`d${i}/f.txt`] = '';
    const root = tree(files);
    await expect(scanFolder(root, {}, AbortSignal.abort())).rejects.toBeInstanceOf(CancelledError);
    const ctl = new AbortController();
    const running = scanFolder(root, {}, ctl.signal);
    ctl.abort();
    await expect(running).rejects.toBeInstanceOf(CancelledError);
  });
});
