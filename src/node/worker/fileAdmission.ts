/**
 * Decides for one changed file whether the folder scan would keep it, without walking the folder:
 * the same default exclude names, user patterns and .gitignore layering as scanFolder (scanRules.ts),
 * applied along the file's own chain of parent folders. The .gitignore files met on the way are
 * read once and remembered until `forget()` (call it when a .gitignore changes).
 */
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Ignore } from 'ignore';
import {
  createIgnoreLayer,
  createNameFilter,
  createPatternMatcher,
  DEFAULT_EXCLUDE_NAMES,
  enterFolder,
  insideGitWorkTree,
  isGitIgnored,
  type IgnoreLayer,
  type NameFilter,
} from '../scanRules.js';

export interface AdmissionOptions {
  readonly include: readonly string[];
  readonly exclude: readonly string[];
  readonly honourGitignore: boolean;
}

export class FileAdmission {
  private readonly _names: NameFilter;
  private readonly _exclude: Ignore | undefined;
  private readonly _include: Ignore | undefined;
  private readonly _gitignores = new Map<string, string | null>();
  private _inGitTree: boolean | undefined;

  constructor(
    private readonly _rootPath: string,
    private readonly _options: AdmissionOptions,
  ) {
    this._names = createNameFilter(DEFAULT_EXCLUDE_NAMES);
    this._exclude = createPatternMatcher(_options.exclude);
    this._include = createPatternMatcher(_options.include);
  }

  /** Whether a root-relative, '/'-separated file path would be kept by a scan of the root. */
  async admits(rel: string): Promise<boolean> {
    const parts = rel.split('/');
    // git reads .gitignore files only inside a working tree (scanRules.ts), as the scan does.
    const honour = this._options.honourGitignore && (this._inGitTree ??= insideGitWorkTree(this._rootPath));
    let layers: readonly IgnoreLayer[] = honour ? await this.layerAt('', join('.git', 'info', 'exclude')) : [];
    for (let depth = 0; depth < parts.length; depth++) {
      const dir = parts.slice(0, depth).join('/');
      if (dir !== '') {
        if (this._names.folder(parts[depth - 1]) || this._exclude?.ignores(`${dir}/`)) return false;
        if (honour) {
          const inner = enterFolder(layers, dir);
          if (!inner) return false;
          layers = inner;
        }
      }
      if (honour) {
        const prefix = dir === '' ? '' : `${dir}/`;
        layers = [...layers, ...(await this.layerAt(prefix, `${prefix}.gitignore`))];
      }
    }
    if (this._names.file(parts[parts.length - 1]) || this._exclude?.ignores(rel) || (honour && isGitIgnored(layers, rel, false)))
      return false;
    return !this._include || this._include.ignores(rel);
  }

  /** Drops the remembered .gitignore files. */
  forget(): void {
    this._gitignores.clear();
    this._inGitTree = undefined;
  }

  private async layerAt(base: string, relFile: string): Promise<IgnoreLayer[]> {
    let text = this._gitignores.get(relFile);
    if (text === undefined) {
      text = await readFile(join(this._rootPath, ...relFile.split('/')), 'utf8').catch(() => null);
      this._gitignores.set(relFile, text);
    }
    return text === null ? [] : [createIgnoreLayer(base, text)];
  }
}
