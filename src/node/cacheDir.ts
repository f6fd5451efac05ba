/**
 * Where the command line keeps saved indexes: outside the indexed folder, in the user's cache
 * folder (XDG_CACHE_HOME or ~/.cache on Linux, ~/Library/Caches on macOS, %LOCALAPPDATA% on
 * Windows), one sub-folder per indexed folder named by a hash of its absolute path. The
 * UNDERTONE_CACHE_DIR environment variable or --cache-dir overrides the base folder.
 */
import { createHash } from 'node:crypto';
import { homedir, platform } from 'node:os';
import { basename, join, resolve } from 'node:path';

export function defaultCacheBase(env: NodeJS.ProcessEnv = process.env): string {
  if (env.UNDERTONE_CACHE_DIR) return resolve(env.UNDERTONE_CACHE_DIR);
  if (platform() === 'win32') return join(env.LOCALAPPDATA ?? join(homedir(), 'AppData', 'Local'), 'undertone');
  if (platform() === 'darwin') return join(homedir(), 'Library', 'Caches', 'undertone');
  return join(env.XDG_CACHE_HOME ?? join(homedir(), '.cache'), 'undertone');
}

/** The index file for a folder under a cache base. */
export function indexFileFor(folder: string, cacheBase: string = defaultCacheBase()): string {
  const abs = resolve(folder);
  const tag = createHash('sha256').update(abs).digest('hex').slice(0, 16);
  const name =
    basename(abs)
      .replace(/[^A-Za-z0-9._-]/g, '_')
      .slice(0, 40) || 'root';
  return join(cacheBase, `${name}-${tag}`, 'index.undertone');
}
