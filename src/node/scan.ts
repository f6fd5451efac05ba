/**
 * Workspace scanner: lists the files of one folder that are worth indexing.
 *
 * Walks the folder with readdir's file types (no stat for folders' children until a file is
 * kept), skipping what the default exclude list, the caller's patterns and the .gitignore files
 * rule out (see scanRules.ts), and stats each kept file exactly once for size and mtime.
 * Symbolic links are followed by default; each folder is entered at most once, identified by
 * device and inode, so a link to a parent folder ends as a reported `symlink-loop`. File content
 * is not read here: `readIndexableText` (scanRead.ts) reads and sniffs one file when indexing.
 *
 * fast-glob is not used for the walk: it takes one fixed ignore list, so the .gitignore files
 * found on the way cannot be layered with git's precedence, and deciding which path a folder
 * reached twice through links is listed under needs the identity check done here.
 */

import { opendir, stat } from 'node:fs/promises';
import { resolve } from 'node:path';
import { UndertoneError } from '../core/errors.js';
import { checkByteCap, describeFsError } from './scanRead.js';
import { walkFolder } from './scanWalk.js';
import { DEFAULT_MAX_FILE_BYTES, type ScanOptions, type ScanResult } from './scanTypes.js';

export { readIndexableText, type IndexableText } from './scanRead.js';
export { DEFAULT_EXCLUDE_NAMES, DEFAULT_EXCLUDE_PATTERNS, type ExcludeNames } from './scanRules.js';
export type { ScannedFile, ScanOptions, ScanResult, SkippedPath, SkipReason } from './scanTypes.js';
export { DEFAULT_MAX_FILE_BYTES } from './scanTypes.js';

/** Defaults. */
export const DEFAULT_SCAN_OPTIONS: ScanOptions = Object.freeze({
  include: [],
  exclude: [],
  useDefaultExcludes: true,
  maxFileBytes: DEFAULT_MAX_FILE_BYTES,
  honourGitignore: true,
  followSymlinks: true,
  followLinksOutside: false,
  linkRoots: [],
});

/** The folder to scan does not exist or is not a folder. */
export class FolderNotFoundError extends UndertoneError {
  constructor(
    public readonly folder: string,
    why = 'does not exist',
  ) {
    super(`Cannot scan "${folder}": it ${why}.`);
  }
}

/**
 * Lists the indexable files under `root`.
 * @throws FolderNotFoundError when root is missing or not a folder.
 * @throws CancelledError when `signal` is aborted (checked before each folder and file batch).
 * @throws InvalidInputError for a bad maxFileBytes.
 */
export async function scanFolder(root: string, options: Partial<ScanOptions> = {}, signal?: AbortSignal): Promise<ScanResult> {
  const opts = withDefaults(options);
  checkByteCap(opts.maxFileBytes);
  const abs = resolve(root);
  let rootStat;
  try {
    rootStat = await stat(abs, { bigint: true });
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new FolderNotFoundError(abs, code === 'ENOENT' || code === 'ENOTDIR' ? 'does not exist' : `cannot be read (${code})`);
  }
  if (!rootStat.isDirectory()) throw new FolderNotFoundError(abs, 'is a file, not a folder');
  try {
    await (await opendir(abs)).close();
  } catch (err) {
    throw new FolderNotFoundError(abs, `cannot be read (${(err as NodeJS.ErrnoException).code ?? describeFsError(err)})`);
  }
  const { files, skipped, gitIgnored } = await walkFolder(abs, `${rootStat.dev}:${rootStat.ino}`, opts, signal);
  files.sort((a, b) => compareCodeUnits(a.path, b.path));
  skipped.sort((a, b) => compareCodeUnits(a.path, b.path));
  return { root: abs, files, skipped, gitIgnored };
}

/**
 * The sentence an empty index's message ends with when .gitignore files left files or folders out
 * (a folder git ignores may still be the one a person asked for), or '' when they did not.
 * `howToInclude` names the switch that reads them anyway.
 */
export function gitignoreHint(gitIgnored: number, howToInclude: string): string {
  if (gitIgnored <= 0) return '';
  const what = gitIgnored === 1 ? '1 file or folder' : `${gitIgnored} files and folders`;
  return ` .gitignore files left out ${what}; ${howToInclude} indexes them.`;
}

/** Options over the defaults; a field given as undefined keeps its default. */
function withDefaults(options: Partial<ScanOptions>): ScanOptions {
  const d = DEFAULT_SCAN_OPTIONS;
  return {
    include: options.include ?? d.include,
    exclude: options.exclude ?? d.exclude,
    useDefaultExcludes: options.useDefaultExcludes ?? d.useDefaultExcludes,
    maxFileBytes: options.maxFileBytes ?? d.maxFileBytes,
    honourGitignore: options.honourGitignore ?? d.honourGitignore,
    followSymlinks: options.followSymlinks ?? d.followSymlinks,
    followLinksOutside: options.followLinksOutside ?? d.followLinksOutside,
    linkRoots: options.linkRoots ?? d.linkRoots,
  };
}

function compareCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
