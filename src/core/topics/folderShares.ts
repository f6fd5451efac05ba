/**
 * Where a topic lives: the folders that hold most of its files, with their shares.
 *
 * Every member counts for each folder above it. A folder is a candidate when it holds at least
 * minShare of the topic's files and is not a mere wrapper (no single sub-folder holds wrapShare
 * or more of its count), so "docs/" is skipped in favour of "docs/admin" when nearly all of it is
 * there. The top of the workspace counts only the files directly in it. Candidates are taken by share, largest first, skipping any folder inside or above one
 * already taken, up to maxFolders.
 * Defaults (our choice): minShare 0.1, wrapShare 0.8, maxFolders 3.
 */

export interface FolderSharesOptions {
  /** @default 0.1 */
  minShare: number;
  /** @default 0.8 */
  wrapShare: number;
  /** @default 3 */
  maxFolders: number;
}

export const DEFAULT_FOLDER_SHARES_OPTIONS: Readonly<FolderSharesOptions> = Object.freeze({ minShare: 0.1, wrapShare: 0.8, maxFolders: 3 });

export interface FolderShare {
  /** '/'-separated folder path relative to the workspace ('' for its top). */
  readonly folder: string;
  readonly files: number;
  /** files / the topic's size. */
  readonly share: number;
}

/** The folder part of a '/'-separated path ('' at the top). */
export function folderOf(path: string): string {
  const i = path.lastIndexOf('/');
  return i < 0 ? '' : path.slice(0, i);
}

export function folderShares(paths: readonly string[], options: Partial<FolderSharesOptions> = {}): FolderShare[] {
  const o = { ...DEFAULT_FOLDER_SHARES_OPTIONS, ...options };
  const n = paths.length;
  if (n === 0) return [];
  const count = new Map<string, number>();
  const largestChild = new Map<string, number>();
  for (const p of paths) {
    // The top counts only the files directly in it ("everywhere" is no place).
    for (let f = folderOf(p); ; f = folderOf(f)) {
      if (f === '') {
        if (folderOf(p) === '') count.set('', (count.get('') ?? 0) + 1);
        break;
      }
      count.set(f, (count.get(f) ?? 0) + 1);
    }
  }
  for (const [f, c] of count) {
    if (f === '') continue;
    const up = folderOf(f);
    largestChild.set(up, Math.max(largestChild.get(up) ?? 0, c));
  }
  const candidates = [...count]
    .filter(([f, c]) => c >= o.minShare * n && (f === '' || (largestChild.get(f) ?? 0) < o.wrapShare * c))
    .sort((x, y) => y[1] - x[1] || depth(y[0]) - depth(x[0]) || (x[0] < y[0] ? -1 : 1));
  const taken: FolderShare[] = [];
  for (const [f, c] of candidates) {
    if (taken.length >= o.maxFolders) break;
    if (taken.some((t) => within(f, t.folder) || within(t.folder, f))) continue;
    taken.push({ folder: f, files: c, share: c / n });
  }
  return taken;
}

function depth(f: string): number {
  return f === '' ? 0 : f.split('/').length;
}

/** True when folder a is b or inside b. */
function within(a: string, b: string): boolean {
  return a === b || (b !== '' && a.startsWith(`${b}/`));
}
