/**
 * Index keys for the files of one or more workspace folders. With one folder a key is the
 * folder-relative path ('/'-separated); with several it is prefixed by the folder's name
 * ("api/src/main.ts"), so one index can hold every folder. A file inside nested folders belongs
 * to the innermost one.
 */
import { isAbsolute, join, relative, sep } from 'node:path';
import type { FileRef, WorkspaceRoot } from './workerProtocol.js';

export class RootMap {
  readonly roots: readonly WorkspaceRoot[];
  private readonly _byName = new Map<string, WorkspaceRoot>();

  constructor(roots: readonly WorkspaceRoot[]) {
    this.roots = roots;
    for (const r of roots) this._byName.set(r.name, r);
  }

  get multi(): boolean {
    return this.roots.length > 1;
  }

  /** Key prefix of a root ('' with a single folder). */
  prefixOf(root: WorkspaceRoot): string {
    return this.multi ? `${root.name}/` : '';
  }

  /** The folder holding an absolute path and the '/'-separated path inside it, if any. */
  locate(fsPath: string): { root: WorkspaceRoot; rel: string } | undefined {
    let best: { root: WorkspaceRoot; rel: string } | undefined;
    for (const root of this.roots) {
      const rel = relative(root.path, fsPath);
      if (rel.startsWith('..') || isAbsolute(rel)) continue;
      const slashed = sep === '/' ? rel : rel.split(sep).join('/');
      if (!best || slashed.length < best.rel.length) best = { root, rel: slashed };
    }
    return best;
  }

  /** Index key of an absolute path, or undefined when it lies outside every folder (or is a folder itself). */
  keyOf(fsPath: string): string | undefined {
    const at = this.locate(fsPath);
    return at && at.rel !== '' ? this.prefixOf(at.root) + at.rel : undefined;
  }

  /** Everything the editor needs about a key. */
  refOf(key: string): FileRef {
    let root = this.roots[0];
    let rel = key;
    if (this.multi) {
      const slash = key.indexOf('/');
      root = this._byName.get(key.slice(0, slash)) ?? root;
      rel = key.slice(slash + 1);
    }
    return { key, fsPath: join(root.path, ...rel.split('/')), folder: root.name, relPath: rel };
  }
}

/**
 * Folder names made unique and usable as a key prefix: '/' and '\' become '_', and a repeated
 * name gets " (2)", " (3)"… in folder order.
 */
export function uniqueRootNames(names: readonly string[]): string[] {
  const used = new Set<string>();
  return names.map((raw) => {
    const base = raw.replace(/[/\\]/g, '_') || 'folder';
    let name = base;
    for (let n = 2; used.has(name); n++) name = `${base} (${n})`;
    used.add(name);
    return name;
  });
}
