/**
 * The `undertone.*` settings, read through a getter so this file needs no editor import (and can
 * be tested without the editor), and turned into the worker's configuration. Glob patterns use
 * the editor's conventions (relative to each workspace folder: `*.md` matches at the top only,
 * `**\/*.md` at any depth, `{a,b}` alternatives) and are translated to the gitignore syntax the
 * scanner speaks.
 */
import { isAbsolute, join } from 'node:path';
import type { IndexSettings } from '../core/index/model/settings.js';
import { sharedModelSetting } from '../node/conceptModelFile.js';
import { WEIGHTING_SCHEMES, type WeightingScheme } from '../core/weighting/termWeighting.js';
import type { LanguageSetting } from '../core/text/detectLanguage.js';
import { isLanguage, type Language } from '../core/text/languageCodes.js';
import { DEFAULT_TOKENIZE_OPTIONS } from '../core/text/tokenize.js';
import { DEFAULT_MAX_FILE_BYTES } from '../node/scanTypes.js';
import type { WorkerConfig, WorkspaceRoot } from '../node/worker/workerProtocol.js';

export interface ExtensionSettings {
  readonly include: readonly string[];
  readonly exclude: readonly string[];
  readonly maxFileSizeKB: number;
  /** 'auto' or a number of concept dimensions. */
  readonly dimensions: number | 'auto';
  readonly weighting: WeightingScheme;
  readonly useGitignore: boolean;
  /** Read files that symbolic links reach outside the workspace folders. */
  readonly followLinksOutside: boolean;
  readonly buildOnStartup: boolean;
  readonly nearbyCount: number;
  readonly autoRebuild: boolean;
  /** A shared concept model file to fold the workspace into instead of a local SVD ('' = none). */
  readonly conceptModel: string;
  /** Languages files may be in: 'auto' (detect among all), or a list of codes (src/core/text/languages.ts). */
  readonly languages: LanguageSetting;
}

/** Defaults, identical to the manifest's (the file-size cap is the scanner's). */
export const DEFAULT_EXTENSION_SETTINGS: ExtensionSettings = Object.freeze({
  include: [],
  exclude: [],
  maxFileSizeKB: DEFAULT_MAX_FILE_BYTES / 1024,
  dimensions: 'auto',
  weighting: 'log-entropy',
  useGitignore: true,
  followLinksOutside: false,
  buildOnStartup: true,
  nearbyCount: 10,
  autoRebuild: true,
  conceptModel: '',
  languages: 'auto',
});

/** Reads one setting under `undertone.` (as WorkspaceConfiguration.get does). */
export type SettingGetter = (key: string) => unknown;

export function readSettings(get: SettingGetter): ExtensionSettings {
  const d = DEFAULT_EXTENSION_SETTINGS;
  const strings = (v: unknown, fallback: readonly string[]) =>
    Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string' && x.trim() !== '') : fallback;
  const int = (v: unknown, fallback: number, min: number, max: number) =>
    typeof v === 'number' && Number.isFinite(v) ? Math.min(max, Math.max(min, Math.round(v))) : fallback;
  const bool = (v: unknown, fallback: boolean) => (typeof v === 'boolean' ? v : fallback);
  const weighting = get('weighting');
  return {
    include: strings(get('include'), d.include),
    exclude: strings(get('exclude'), d.exclude),
    maxFileSizeKB: int(get('maxFileSizeKB'), d.maxFileSizeKB, 1, 1024 * 1024),
    dimensions: parseDimensions(get('dimensions')),
    weighting: WEIGHTING_SCHEMES.includes(weighting as WeightingScheme) ? (weighting as WeightingScheme) : d.weighting,
    useGitignore: bool(get('useGitignore'), d.useGitignore),
    followLinksOutside: bool(get('followLinksOutside'), d.followLinksOutside),
    buildOnStartup: bool(get('buildOnStartup'), d.buildOnStartup),
    nearbyCount: int(get('nearbyCount'), d.nearbyCount, 1, 100),
    autoRebuild: bool(get('autoRebuild'), d.autoRebuild),
    conceptModel: typeof get('conceptModel') === 'string' ? (get('conceptModel') as string).trim() : d.conceptModel,
    languages: parseLanguages(get('languages')),
  };
}

/** "auto", or the known language codes of a list (an empty or unknown list is "auto"). */
export function parseLanguages(v: unknown): LanguageSetting {
  const list = Array.isArray(v) ? v.filter((x): x is Language => typeof x === 'string' && isLanguage(x)) : [];
  return list.length > 0 ? [...new Set(list)] : 'auto';
}

/** "auto", or a whole number of dimensions from 2 up (as a number or a string); anything else is "auto". */
export function parseDimensions(v: unknown): number | 'auto' {
  const n = typeof v === 'number' ? v : typeof v === 'string' && /^\s*\d+\s*$/.test(v) ? Number(v) : NaN;
  return Number.isInteger(n) && n >= 2 ? n : 'auto';
}

/** The editor's `files.exclude` object → patterns that are switched on (conditional entries are left out). */
export function enabledPatterns(filesExclude: unknown): string[] {
  if (typeof filesExclude !== 'object' || filesExclude === null) return [];
  return Object.entries(filesExclude as Record<string, unknown>)
    .filter(([, on]) => on === true)
    .map(([p]) => p);
}

/**
 * One editor glob → gitignore patterns. Braces expand into several patterns; a pattern without a
 * '/' is anchored to the folder (the editor matches it against the whole relative path, gitignore
 * would match it at any depth); a leading "./" or "/" is dropped first; '!' is escaped.
 */
export function globToGitignore(glob: string): string[] {
  return expandBraces(glob.trim())
    .map((g) => {
      let p = g.replace(/^\.\//, '').replace(/^\/+/, '');
      if (p.startsWith('!')) p = `\\${p}`;
      const body = p.replace(/\/+$/, '');
      return body.includes('/') ? p : `/${p}`;
    })
    .filter((p) => p !== '/' && p !== '');
}

function expandBraces(glob: string): string[] {
  const open = glob.indexOf('{');
  if (open < 0) return [glob];
  let depth = 0;
  for (let i = open; i < glob.length; i++) {
    if (glob[i] === '{') depth++;
    else if (glob[i] === '}' && --depth === 0) {
      const parts = splitTopLevel(glob.slice(open + 1, i));
      const rest = glob.slice(i + 1);
      return parts.flatMap((part) => expandBraces(glob.slice(0, open) + part + rest));
    }
  }
  return [glob]; // unbalanced: taken literally
}

function splitTopLevel(s: string): string[] {
  const out: string[] = [];
  let depth = 0;
  let start = 0;
  for (let i = 0; i < s.length; i++) {
    if (s[i] === '{') depth++;
    else if (s[i] === '}') depth--;
    else if (s[i] === ',' && depth === 0) {
      out.push(s.slice(start, i));
      start = i + 1;
    }
  }
  out.push(s.slice(start));
  return out;
}

/** A workspace folder as the host knows it: display name, path, and its `files.exclude` value. */
export interface HostFolder {
  readonly name: string;
  readonly fsPath: string;
  readonly filesExclude: unknown;
}

export function toWorkerConfig(
  s: ExtensionSettings,
  folders: readonly (HostFolder & { readonly key: string })[],
  indexFile: string,
): WorkerConfig {
  const roots: WorkspaceRoot[] = folders.map((f) => ({
    name: f.key,
    fsPath: f.fsPath,
    exclude: enabledPatterns(f.filesExclude).flatMap(globToGitignore),
  }));
  const settings: Partial<IndexSettings> = { k: s.dimensions, weighting: s.weighting };
  if (s.languages !== 'auto') settings.tokenize = { ...DEFAULT_TOKENIZE_OPTIONS, languages: s.languages };
  if (s.conceptModel) {
    // Relative paths are taken from the first workspace folder; the key is the file's CRC-32.
    const path = isAbsolute(s.conceptModel) || folders.length === 0 ? s.conceptModel : join(folders[0].fsPath, s.conceptModel);
    settings.sharedModel = sharedModelSetting(path);
  }
  return {
    roots,
    indexFile,
    settings,
    include: s.include.flatMap(globToGitignore),
    exclude: s.exclude.flatMap(globToGitignore),
    maxFileBytes: s.maxFileSizeKB * 1024,
    honourGitignore: s.useGitignore,
    followLinksOutside: s.followLinksOutside,
  };
}
