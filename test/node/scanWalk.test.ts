import { execFileSync } from 'node:child_process';
import { chmodSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { scanFolder } from '../../src/node/scan.js';

// Symbolic links need no privilege on Linux and macOS; Windows needs developer mode, so skip there.
const canLink = process.platform !== 'win32';
// Permission bits do not stop root, so an unreadable folder can only be made as another user.
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
let hasMkfifo = canLink;
try {
  if (hasMkfifo) execFileSync('sh', ['-c', 'command -v mkfifo'], { stdio: 'ignore' });
} catch {
  hasMkfifo = false;
}

const base = mkdtempSync(join(tmpdir(), 'undertone-walk-'));
afterAll(() => rmSync(base, { recursive: true, force: true }));

describe.skipIf(!canLink)('scanFolder and symbolic links (skipped on Windows)', () => {
  // links/
  //   elsewhere/e.txt
  //   root/real/f.txt, real/loop -> .. (the root), real/self -> .
  //   root/alias -> real, outside -> ../elsewhere, up -> .. (links/), linkfile.txt -> real/f.txt,
  //   root/broken -> missing, root/chain -> chain
  const links = join(base, 'links');
  const root = join(links, 'root');
  mkdirSync(join(root, 'real'), { recursive: true });
  mkdirSync(join(links, 'elsewhere'));
  writeFileSync(join(root, 'real', 'f.txt'), 'f');
  writeFileSync(join(links, 'elsewhere', 'e.txt'), 'e');
  symlinkSync('..', join(root, 'real', 'loop'));
  symlinkSync('.', join(root, 'real', 'self'));
  symlinkSync('real', join(root, 'alias'));
  symlinkSync(join(links, 'elsewhere'), join(root, 'outside'));
  symlinkSync(links, join(root, 'up'));
  symlinkSync(join('real', 'f.txt'), join(root, 'linkfile.txt'));
  symlinkSync('missing', join(root, 'broken'));
  symlinkSync('chain', join(root, 'chain'));

  it('by default reads nothing whose real path is outside the folder, and says so', async () => {
    const r = await scanFolder(root);
    expect(r.files.map((f) => f.path)).toEqual(['linkfile.txt', 'real/f.txt']);
    expect(r.skipped.map((s) => [s.path, s.reason])).toEqual([
      ['alias', 'symlink-duplicate'],
      ['broken', 'broken-symlink'],
      ['chain', 'symlink-loop'],
      ['outside', 'outside-folder'],
      ['real/loop', 'symlink-loop'],
      ['real/self', 'symlink-loop'],
      ['up', 'outside-folder'],
    ]);
    expect(r.skipped.find((s) => s.path === 'outside')!.detail).toMatch(/elsewhere, outside the indexed folder \(--follow-links/);
    // Another folder given as a link root (the other folders of a workspace) may be reached.
    const wide = await scanFolder(root, { linkRoots: [join(links, 'elsewhere')] });
    expect(wide.files.map((f) => f.path)).toEqual(['linkfile.txt', 'outside/e.txt', 'real/f.txt']);
  });

  it('finishes on loops, walks each folder once and says why each link was not walked (links outside followed on request)', async () => {
    const r = await scanFolder(root, { followLinksOutside: true });
    expect(r.files.map((f) => f.path)).toEqual(['linkfile.txt', 'outside/e.txt', 'real/f.txt']);
    expect(r.skipped.map((s) => [s.path, s.reason])).toEqual([
      ['alias', 'symlink-duplicate'], // the real folder wins although 'alias' sorts first
      ['broken', 'broken-symlink'],
      ['chain', 'symlink-loop'], // a link to itself (ELOOP)
      ['real/loop', 'symlink-loop'], // a folder linked to its parent
      ['real/self', 'symlink-loop'],
      ['up/elsewhere', 'symlink-duplicate'], // already walked as 'outside', which sorts first
      ['up/root', 'symlink-loop'], // the root, reached again through links/
    ]);
    expect(r.skipped[0].detail).toContain('"real"');
  });

  it('gives the file size of a linked file from its target', async () => {
    const r = await scanFolder(root);
    expect(r.files.find((f) => f.path === 'linkfile.txt')?.size).toBe(1);
  });

  it('leaves every link alone when told not to follow them', async () => {
    const r = await scanFolder(root, { followSymlinks: false });
    expect(r.files.map((f) => f.path)).toEqual(['real/f.txt']);
    expect(r.skipped).toEqual([]);
  });

  it('does not report a broken link that .gitignore ignores', async () => {
    const other = join(base, 'ignored-link');
    mkdirSync(join(other, '.git'), { recursive: true }); // .gitignore files count inside a git working tree
    writeFileSync(join(other, '.gitignore'), 'dangling\n');
    symlinkSync('nowhere', join(other, 'dangling'));
    const r = await scanFolder(other);
    expect(r.skipped).toEqual([]);
    expect(r.files.map((f) => f.path)).toEqual(['.gitignore']);
  });
});

describe('scanFolder and special files', () => {
  it.skipIf(!hasMkfifo)('skips a FIFO without blocking (skipped without mkfifo)', async () => {
    const dir = join(base, 'fifo');
    mkdirSync(dir);
    writeFileSync(join(dir, 'a.md'), 'a');
    execFileSync('mkfifo', [join(dir, 'pipe.md')]);
    const r = await scanFolder(dir);
    expect(r.files.map((f) => f.path)).toEqual(['a.md']);
  });

  it.skipIf(isRoot || process.platform === 'win32')('reports a folder it may not read as unreadable (skipped as root)', async () => {
    const dir = join(base, 'locked');
    mkdirSync(join(dir, 'closed'), { recursive: true });
    writeFileSync(join(dir, 'closed', 'x.md'), 'x');
    writeFileSync(join(dir, 'open.md'), 'o');
    chmodSync(join(dir, 'closed'), 0o000);
    try {
      const r = await scanFolder(dir);
      expect(r.files.map((f) => f.path)).toEqual(['open.md']);
      expect(r.skipped.map((s) => [s.path, s.reason])).toEqual([['closed', 'unreadable']]);
    } finally {
      chmodSync(join(dir, 'closed'), 0o755);
    }
  });
});
