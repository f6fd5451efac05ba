/**
 * The host side of one concept map, as plain data: which map the page shows (the worker's
 * token), which file each dot is, and the checks on what the page asks for. The page sits behind
 * a trust boundary, so an "open" is honoured only when its index and path name the same file of
 * this map, and an "openSection" only names a point of the trail this side sent last; the editor's
 * theme kinds are translated into the page's theme names.
 */
import type { MapPageData } from '../core/map/mapData.js';
import type { PageToHostMessage, PageTrail, ThemeKind } from '../core/map/mapMessages.js';
import type { MapDataResult } from '../node/worker/insightProtocol.js';

/** The editor's ColorThemeKind values (Light 1, Dark 2, HighContrast 3, HighContrastLight 4) as the page names them. */
export function themeKindName(kind: number): ThemeKind {
  switch (kind) {
    case 2:
      return 'dark';
    case 3:
      return 'high-contrast';
    case 4:
      return 'high-contrast-light';
    default:
      return 'light';
  }
}

export class MapSession {
  readonly token: number;
  readonly data: MapPageData;
  private readonly _fsPaths: readonly string[];
  private readonly _rowOf = new Map<string, number>();

  constructor(result: MapDataResult) {
    if (result.fsPaths.length !== result.data.files.paths.length) {
      throw new Error(`the map names ${result.data.files.paths.length} files but gives ${result.fsPaths.length} paths`);
    }
    this.token = result.token;
    this.data = result.data;
    this._fsPaths = result.fsPaths;
    result.fsPaths.forEach((p, i) => this._rowOf.set(p, i));
  }

  get count(): number {
    return this._fsPaths.length;
  }

  /** The file an "open" message names, or undefined when index and path disagree or are out of range. */
  fileToOpen(message: Extract<PageToHostMessage, { type: 'open' }>): string | undefined {
    const i = message.index;
    if (!Number.isInteger(i) || i < 0 || i >= this._fsPaths.length) return undefined;
    return this.data.files.paths[i] === message.path ? this._fsPaths[i] : undefined;
  }

  private _trail: { fsPath: string; trail: PageTrail } | null = null;

  /** Remembers the trail sent to the page (the file's absolute path beside it), or forgets it. */
  setTrail(fsPath: string | null, trail: PageTrail | null): void {
    this._trail = fsPath !== null && trail ? { fsPath, trail } : null;
  }

  /** The file and zero-based line an "openSection" message names, or undefined when it names no point of the trail. */
  sectionToOpen(message: Extract<PageToHostMessage, { type: 'openSection' }>): { fsPath: string; line: number } | undefined {
    const point = this._trail?.trail.points[message.point];
    return point && Number.isInteger(message.point) ? { fsPath: this._trail!.fsPath, line: point.start } : undefined;
  }

  /** The dot of a file (absolute path), or null when the map does not show it. */
  rowOf(fsPath: string | undefined): number | null {
    if (fsPath === undefined) return null;
    return this._rowOf.get(fsPath) ?? null;
  }
}
