/** Helpers shared by `npm run bench` and `npm run bench:compare` (bundled into dist/bench.js). */
import { spawnSync } from 'node:child_process';
import { loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import type { ChildResult } from './benchChild.js';

export const REPO = resolve(__dirname, '..');
export const CORPORA = {
  demo: join(REPO, 'demo', 'workspace'),
  docs: join(REPO, '.cache', 'bench', 'linux-source-6.1', 'Documentation'),
  tree: join(REPO, '.cache', 'bench', 'linux-source-6.1'),
} as const;
export type CorpusName = keyof typeof CORPORA;

/** Runs one measured build in a child process (this same bundle with --child). */
/**
 * The full kernel tree is read without .gitignore rules: Debian's linux-source tarball carries a
 * top-level .gitignore that ignores everything but debian/ (its packaging repository's view).
 */
export function honoursGitignore(name: CorpusName): boolean {
  return name !== 'tree';
}

export function measureInChild(folder: string, k: number | 'auto', exportDir?: string, honourGitignore = true): ChildResult {
  const args = ['--expose-gc', __filename, '--child', folder, String(k), exportDir ?? '-', honourGitignore ? 'gitignore' : 'no-gitignore'];
  const r = spawnSync(process.execPath, args, { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`measuring ${folder} failed:\n${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').pop()!) as ChildResult;
}

export function flag(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

export function loadLine(): string {
  const [a, b, c] = loadavg();
  return `load average ${a.toFixed(2)} ${b.toFixed(2)} ${c.toFixed(2)} on this machine`;
}
