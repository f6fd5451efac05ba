import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createRandom } from '../../src/core/random.js';
import { scanFolder } from '../../src/node/scan.js';
import {
  createExcludeMatcher,
  createExcludeTest,
  DEFAULT_EXCLUDE_NAMES,
  DEFAULT_EXCLUDE_PATTERNS,
  escapePattern,
} from '../../src/node/scanRules.js';

// Reference for every .gitignore check below: git itself (`git ls-files --others
// --exclude-standard` lists exactly the untracked files git does not ignore, gitignore(5)).
let hasGit = true;
try {
  execFileSync('git', ['--version'], { stdio: 'ignore' });
} catch {
  hasGit = false;
}
const gitEnv = { ...process.env, GIT_CONFIG_GLOBAL: '/dev/null', GIT_CONFIG_NOSYSTEM: '1' };

const base = mkdtempSync(join(tmpdir(), 'undertone-rules-'));
afterAll(() => rmSync(base, { recursive: true, force: true }));
let caseNo = 0;

function tree(files: Record<string, string>): string {
  const root = join(base, `t${caseNo++}`);
  mkdirSync(root);
  for (const [rel, text] of Object.entries(files)) {
    mkdirSync(dirname(join(root, rel)), { recursive: true });
    writeFileSync(join(root, rel), text);
  }
  return root;
}

function gitKeeps(root: string): string[] {
  execFileSync('git', ['init', '-q', root], { env: gitEnv });
  const out = execFileSync('git', ['-c', 'core.excludesFile=/dev/null', 'ls-files', '--others', '--exclude-standard', '-z'], {
    cwd: root,
    env: gitEnv,
    encoding: 'utf8',
  });
  return out.split('\0').filter(Boolean).sort();
}

async function scanKeeps(root: string): Promise<string[]> {
  // Defaults off (git knows nothing of them) except .git/ itself, which git never lists.
  const r = await scanFolder(root, { useDefaultExcludes: false, exclude: ['.git/'], followSymlinks: false });
  return r.files.map((f) => f.path);
}

describe.skipIf(!hasGit)('.gitignore layering agrees with git (skipped when git is not installed)', () => {
  it('applies nested files, negations and a deeper file overriding a shallower one', async () => {
    const root = tree({
      '.gitignore': '*.log\n!keep.log\nbuild/\ntmp/*\n!tmp/wanted.md\n/only-root.txt\n',
      'a.log': '',
      'keep.log': '',
      'only-root.txt': '',
      'tmp/x.md': '',
      'tmp/wanted.md': '',
      'src/.gitignore': '!*.log\nsecret.txt\n',
      'src/trace.log': '',
      'src/secret.txt': '',
      'src/only-root.txt': '',
      'src/ok.ts': '',
      'src/deep/.gitignore': 'secret.txt\n!*.txt\n',
      'src/deep/secret.txt': '',
      'src/deep/more.log': '',
      'build/out.js': '',
    });
    const keeps = gitKeeps(root);
    expect(keeps).toContain('src/deep/secret.txt'); // the reference does exercise the override
    expect(await scanKeeps(root)).toEqual(keeps);
  });

  it('walks into a folder a shallower .gitignore excludes but a deeper one re-includes', async () => {
    const root = tree({
      '.gitignore': 'build/\n*.tmp\nb*[x]/\n',
      'sub/.gitignore': '!build/\n!b*[x]/\n',
      'sub/build/page.md': '',
      'sub/build/scratch.tmp': '',
      'sub/build/inner/more.md': '',
      'sub/b*[x]/odd.md': '',
      'sub/bx/plain.md': '',
      'build/gone.md': '',
    });
    const keeps = gitKeeps(root);
    expect(keeps).toContain('sub/build/page.md');
    expect(keeps).toContain('sub/b*[x]/odd.md');
    expect(await scanKeeps(root)).toEqual(keeps);
  });

  it('honours .git/info/exclude below every .gitignore', async () => {
    const root = tree({ '.gitignore': '!keep.bak\n', 'a.bak': '', 'keep.bak': '', 'c.md': '' });
    execFileSync('git', ['init', '-q', root], { env: gitEnv });
    writeFileSync(join(root, '.git', 'info', 'exclude'), '*.bak\n');
    const keeps = gitKeeps(root);
    expect(keeps).toEqual(['.gitignore', 'c.md', 'keep.bak']);
    expect(await scanKeeps(root)).toEqual(keeps);
  });

  it.skipIf(process.platform === 'win32')('does not read a .gitignore that is a symbolic link, as git does not', async () => {
    const root = tree({ rules: '*.log\n', 'a.log': '', 'b.md': '' });
    symlinkSync('rules', join(root, '.gitignore'));
    const keeps = gitKeeps(root);
    expect(keeps).toContain('a.log');
    // git lists the link itself as an entry; a scan that does not follow links leaves it out.
    expect(await scanKeeps(root)).toEqual(keeps.filter((p) => p !== '.gitignore'));
  });

  it('matches git on 60 random trees with random nested .gitignore files (seeded)', async () => {
    const rnd = createRandom(7);
    const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd.next() * xs.length)];
    const segs = ['a', 'b', 'build', 'src', 'logs', 'x y', 'k[1]', 'déjà', 'k1'];
    const names = [
      'a.txt',
      'b.log',
      'keep.log',
      'c.md',
      'x.TXT',
      '.hidden',
      'doc1.txt',
      '#hash',
      '!bang.txt',
      'sp ace.md',
      'ü.md',
      'ab.txt',
    ];
    const patterns = [
      '*.log',
      '!keep.log',
      '*.txt',
      '!a.txt',
      'build/',
      '!build/',
      '/a',
      'a/',
      'b/**',
      '**/logs',
      'logs/*',
      '!logs/keep.log',
      'src/*',
      '!src/c.md',
      'x y/',
      '*.md',
      '!*.md',
      'k\\[1\\]/',
      'k[1]/',
      '*',
      '!*/',
      'doc?.txt',
      '[ab].txt',
      '\\#hash',
      '\\!bang.txt',
      'déjà/',
      '/build',
      '**/b/*.txt',
      'a/**/c.md',
      '*.TXT',
      '.*',
      '!.gitignore',
    ];
    let compared = 0;
    for (let c = 0; c < 60; c++) {
      const root = join(base, `r${c}`);
      mkdirSync(root);
      const dirs = [''];
      for (let i = 0; i < 6; i++) {
        const depth = 1 + Math.floor(rnd.next() * 3);
        dirs.push(Array.from({ length: depth }, () => pick(segs)).join('/'));
      }
      for (let i = 0; i < 30; i++) {
        const rel = [pick(dirs), pick(names)].filter(Boolean).join('/');
        try {
          mkdirSync(dirname(join(root, rel)), { recursive: true });
          if (!existsSync(join(root, rel))) writeFileSync(join(root, rel), 'x');
        } catch {
          // a file already sits where a folder is wanted (or the reverse): skip this one
        }
      }
      for (const d of [pick(dirs), pick(dirs), '']) {
        const at = join(root, d);
        if (!existsSync(at) || !statSync(at).isDirectory()) continue;
        const lines = Array.from({ length: 1 + Math.floor(rnd.next() * 5) }, () => pick(patterns));
        writeFileSync(join(at, '.gitignore'), `${lines.join('\n')}\n`);
      }
      const keeps = gitKeeps(root);
      expect([c, await scanKeeps(root)]).toEqual([c, keeps]);
      compared += keeps.length;
    }
    expect(compared).toBeGreaterThan(200); // the trees were not all ignored away
  });
});

describe('createExcludeTest', () => {
  // Reference: the same patterns in one `ignore` matcher (createExcludeMatcher), which applies
  // gitignore(5) rules; the set-lookup form must give the same answer for every entry.
  const folderNames = [...DEFAULT_EXCLUDE_NAMES.folders, 'Node_Modules', 'src', 'builds', 'x.png', 'yarn.lock', 'lib'];
  const fileNames = [
    ...DEFAULT_EXCLUDE_NAMES.files,
    'app.min.js',
    'APP.MIN.JS',
    'min.js',
    'a.js',
    'photo.PNG',
    '.png',
    'png',
    'a.map.md',
    'archive.tar.gz',
    'Cargo.lock',
    'cargo.lock.md',
    'readme.md',
    'x.o',
    'x.os',
    '.DS_Store',
    'node_modules',
    'dist',
    'lib',
    'secrets.txt',
  ];
  const extras: string[][] = [[], ['*.md'], ['docs/', 'lib'], ['!build/'], ['!*.map', 'secret*']];
  for (const useDefaults of [true, false]) {
    for (const extra of extras) {
      it(`agrees with the single-matcher reference (defaults ${useDefaults}, extra ${JSON.stringify(extra)})`, () => {
        const reference = createExcludeMatcher(useDefaults, extra);
        const fast = createExcludeTest(useDefaults, extra);
        let excludedSome = false;
        for (const parent of ['', 'docs/', 'a/b/']) {
          for (const name of folderNames) {
            const rel = parent + name;
            expect([rel, fast.folder(rel, name)]).toEqual([rel, reference.ignores(`${rel}/`)]);
          }
          for (const name of fileNames) {
            if (parent === 'docs/' && extra.includes('docs/')) continue; // parent itself excluded: never asked
            const rel = parent + name;
            const want = reference.ignores(rel);
            excludedSome ||= want;
            expect([rel, fast.file(rel, name)]).toEqual([rel, want]);
          }
        }
        expect(excludedSome).toBe(useDefaults || extra.some((p) => !p.startsWith('!')));
      });
    }
  }

  it('writes every default name as a valid pattern', () => {
    expect(DEFAULT_EXCLUDE_PATTERNS).toHaveLength(
      DEFAULT_EXCLUDE_NAMES.folders.length + DEFAULT_EXCLUDE_NAMES.files.length + DEFAULT_EXCLUDE_NAMES.suffixes.length,
    );
    for (const p of DEFAULT_EXCLUDE_PATTERNS) expect(p).not.toMatch(/[\\?[\]!#]/);
  });
});

describe.skipIf(!hasGit)('escapePattern (skipped when git is not installed)', () => {
  it('makes a literal name that git matches exactly, not its look-alikes', () => {
    const literal = 'b*[x]?\\z';
    const root = tree({ [`${literal}/f.md`]: '', 'bQx]Wz/f.md': '', 'bx/f.md': '', 'b*x?z/f.md': '' });
    writeFileSync(join(root, '.gitignore'), `/${escapePattern(literal)}/\n`);
    expect(gitKeeps(root)).toEqual(['.gitignore', 'b*x?z/f.md', 'bQx]Wz/f.md', 'bx/f.md']);
  });
});
