import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { FileAdmission } from '../../../src/node/worker/fileAdmission.js';
import { scanFolder } from '../../../src/node/scan.js';

// Reference: git itself. `git check-ignore` says which paths git ignores under the same
// .gitignore files (gitignore(5)); the per-file decision must agree with it, and with a full scan.
let hasGit = true;
try {
  execFileSync('git', ['--version'], { stdio: 'ignore' });
} catch {
  hasGit = false;
}

const root = mkdtempSync(join(tmpdir(), 'undertone-admit-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

const files = [
  'README.md',
  'notes/a.md',
  'notes/draft.tmp',
  'notes/keep.tmp',
  'logs/run.log',
  'logs/important.log',
  'src/app.ts',
  'src/gen/out.ts',
  'src/gen/hand.ts',
  'docs/build/page.md',
  'vendor/lib/x.ts',
  'deep/a/b/c.md',
];
const write = (rel: string, text: string) => {
  mkdirSync(dirname(join(root, rel)), { recursive: true });
  writeFileSync(join(root, rel), text);
};

describe.skipIf(!hasGit)('FileAdmission (skipped when git is not installed)', () => {
  execFileSync('git', ['init', '-q', root]);
  for (const f of files) write(f, `text of ${f}\n`);
  write('.gitignore', '*.tmp\n!keep.tmp\nlogs/*\n!logs/important.log\nvendor/\n');
  write('src/.gitignore', 'gen/*\n!gen/hand.ts\n');
  write('deep/a/.gitignore', 'b/\n');

  it('agrees with git check-ignore on every file', async () => {
    const admission = new FileAdmission(root, { include: [], exclude: [], honourGitignore: true });
    // docs/build/ is left out by our default exclude list (build output), which git knows nothing of.
    const judged = files.filter((f) => !f.startsWith('docs/build/'));
    const ignoredByGit = new Set(
      execFileSync('git', ['-C', root, 'check-ignore', '--no-index', ...judged], { encoding: 'utf8' })
        .split('\n')
        .filter(Boolean),
    );
    expect(ignoredByGit.size).toBeGreaterThan(3);
    for (const f of judged) expect([f, await admission.admits(f)]).toEqual([f, !ignoredByGit.has(f)]);
  });

  it('agrees with a full scan, including user patterns and the default excludes', async () => {
    write('node_modules/pkg/index.js', 'x');
    const opts = { include: [], exclude: ['docs/'], honourGitignore: true };
    const admission = new FileAdmission(root, opts);
    const scanned = new Set((await scanFolder(root, opts)).files.map((f) => f.path));
    for (const f of [...files, 'node_modules/pkg/index.js', '.gitignore']) {
      expect([f, await admission.admits(f)]).toEqual([f, scanned.has(f)]);
    }
  });

  it('applies include patterns and can ignore .gitignore files altogether', async () => {
    const admission = new FileAdmission(root, { include: ['*.md'], exclude: [], honourGitignore: false });
    expect(await admission.admits('deep/a/b/c.md')).toBe(true);
    expect(await admission.admits('src/app.ts')).toBe(false);
  });

  it('reads a changed .gitignore again after forget()', async () => {
    const admission = new FileAdmission(root, { include: [], exclude: [], honourGitignore: true });
    expect(await admission.admits('src/app.ts')).toBe(true);
    write('src/.gitignore', 'gen/*\n!gen/hand.ts\napp.ts\n');
    expect(await admission.admits('src/app.ts')).toBe(true);
    admission.forget();
    expect(await admission.admits('src/app.ts')).toBe(false);
    write('src/.gitignore', 'gen/*\n!gen/hand.ts\n');
  });
});
