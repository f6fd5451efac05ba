/**
 * Exclusion rules for the workspace scanner: the default exclude names, user include/exclude
 * patterns, and a stack of .gitignore files applied with git's precedence.
 *
 * Pattern matching is done by the `ignore` package (gitignore syntax, see gitignore(5)). What this
 * file adds is the layering git uses between files (gitignore(5), "PATTERN FORMAT"): patterns in
 * a .gitignore are relative to its own folder, a deeper file outranks a shallower one, and
 * `$GIT_DIR/info/exclude` ranks below every .gitignore. A folder that is excluded is never
 * entered, so nothing under it can be re-included — which is also git's rule.
 *
 * One wrinkle: `ignore` also tests the parent folders of a path. When a shallow .gitignore
 * excludes `build/` but a deeper one re-includes it (`!build/`), git walks into that folder and
 * judges each file by the file's own matches; asking the shallow layer about `x/build/f` would
 * instead answer "ignored" through the parent. So when a folder is entered against a shallower
 * layer's wish, that layer is replaced, for the folder's subtree, by a copy with one extra rule
 * re-including exactly that folder (`!/x/build/`). Checked against `git ls-files` in the tests.
 *
 * .gitignore files only mean something inside a git working tree: git reads them there and
 * nowhere else (gitignore(5): "each .gitignore file" of the working tree). A folder that is not
 * in one — an unpacked source tarball, say — is scanned without them (insideGitWorkTree). This
 * matters: Debian's linux-source-6.1 tarball carries the top-level .gitignore of its packaging
 * repository, which ends with `/*` and `!/debian/` and so hides every file of the kernel.
 */

import ignore, { type Ignore } from 'ignore';
import { lstatSync } from 'node:fs';
import { dirname, join } from 'node:path';

/** Names excluded at any depth, compared without regard to case. */
export interface ExcludeNames {
  /** Folder names never entered, at any depth. */
  readonly folders: readonly string[];
  /** File names skipped, at any depth. */
  readonly files: readonly string[];
  /** File-name endings skipped, each starting with '.' (e.g. '.min.js'). */
  readonly suffixes: readonly string[];
}

/**
 * Skipped by default. Sources: version-control metadata folders, package-manager and build
 * output folders and lock files as named in each tool's documentation (npm, Yarn, pnpm, Cargo,
 * Poetry, Pipenv, Composer, Bundler, Go, Nix), minified bundles and source maps, and common
 * binary formats (common practice: the selection is ours). Kept as literal names so that the walk
 * can test them with set lookups (see createExcludeTest); DEFAULT_EXCLUDE_PATTERNS is the same
 * list in gitignore syntax.
 */
export const DEFAULT_EXCLUDE_NAMES: ExcludeNames = Object.freeze({
  folders: Object.freeze([
    // version control
    '.git',
    '.hg',
    '.svn',
    '.bzr',
    '_darcs',
    'cvs',
    '.jj',
    // dependencies and environments
    'node_modules',
    'bower_components',
    'jspm_packages',
    '.pnpm-store',
    '.yarn',
    '.venv',
    '.tox',
    '.nox',
    '__pycache__',
    '.eggs',
    // build output and caches
    'dist',
    'out',
    'build',
    'target',
    'coverage',
    '.nyc_output',
    '.next',
    '.nuxt',
    '.svelte-kit',
    '.angular',
    '.turbo',
    '.parcel-cache',
    '.cache',
    '.gradle',
    '.mypy_cache',
    '.pytest_cache',
    '.ruff_cache',
    '.terraform',
    '.vscode-test',
  ]),
  files: Object.freeze([
    // lock files
    'package-lock.json',
    'npm-shrinkwrap.json',
    'yarn.lock',
    'pnpm-lock.yaml',
    'bun.lockb',
    'cargo.lock',
    'poetry.lock',
    'pipfile.lock',
    'uv.lock',
    'composer.lock',
    'gemfile.lock',
    'go.sum',
    'flake.lock',
    'packages.lock.json',
    // desktop metadata
    '.ds_store',
    'thumbs.db',
  ]),
  suffixes: Object.freeze([
    // minified bundles and source maps
    '.min.js',
    '.min.css',
    '.map',
    // images, audio, video
    '.png',
    '.jpg',
    '.jpeg',
    '.gif',
    '.bmp',
    '.ico',
    '.icns',
    '.webp',
    '.avif',
    '.heic',
    '.tif',
    '.tiff',
    '.psd',
    '.mp3',
    '.wav',
    '.ogg',
    '.flac',
    '.m4a',
    '.mp4',
    '.m4v',
    '.mov',
    '.avi',
    '.mkv',
    '.webm',
    // archives, compiled code, fonts, office documents, databases
    '.zip',
    '.tar',
    '.gz',
    '.tgz',
    '.bz2',
    '.xz',
    '.zst',
    '.7z',
    '.rar',
    '.jar',
    '.war',
    '.whl',
    '.exe',
    '.dll',
    '.so',
    '.dylib',
    '.o',
    '.obj',
    '.a',
    '.lib',
    '.class',
    '.pyc',
    '.pyo',
    '.pyd',
    '.wasm',
    '.node',
    '.woff',
    '.woff2',
    '.ttf',
    '.otf',
    '.eot',
    '.pdf',
    '.doc',
    '.docx',
    '.xls',
    '.xlsx',
    '.ppt',
    '.pptx',
    '.odt',
    '.sqlite',
    '.sqlite3',
    '.db',
  ]),
});

/** DEFAULT_EXCLUDE_NAMES written as gitignore patterns (none of the names holds a glob character). */
export const DEFAULT_EXCLUDE_PATTERNS: readonly string[] = Object.freeze([
  ...DEFAULT_EXCLUDE_NAMES.folders.map((n) => `${n}/`),
  ...DEFAULT_EXCLUDE_NAMES.files,
  ...DEFAULT_EXCLUDE_NAMES.suffixes.map((s) => `*${s}`),
]);

/**
 * The default patterns (optional) followed by the caller's, in one case-insensitive matcher,
 * so a caller's `!build/` can undo a default. This is the reference; `createExcludeTest` is the
 * fast form the walk uses.
 */
export function createExcludeMatcher(useDefaults: boolean, extra: readonly string[]): Ignore {
  return ignore({ ignorecase: true })
    .add(useDefaults ? DEFAULT_EXCLUDE_PATTERNS : [])
    .add(extra);
}

/** Matcher for caller patterns (include or exclude), case-insensitive; undefined when there are none. */
export function createPatternMatcher(patterns: readonly string[]): Ignore | undefined {
  return patterns.length === 0 ? undefined : ignore({ ignorecase: true }).add(patterns);
}

/** Set-lookup test of a single path segment against ExcludeNames, ignoring case. */
export interface NameFilter {
  /** A folder named so is skipped. As in gitignore(5), file names and suffixes match folders too. */
  folder(name: string): boolean;
  file(name: string): boolean;
}

export function createNameFilter(names: ExcludeNames): NameFilter {
  const lower = (list: readonly string[]): Set<string> => new Set(list.map((n) => n.toLowerCase()));
  const folders = lower(names.folders);
  const files = lower(names.files);
  const suffixes = lower(names.suffixes);
  const fileName = (n: string): boolean => {
    if (files.has(n)) return true;
    for (let i = n.indexOf('.'); i >= 0; i = n.indexOf('.', i + 1)) if (suffixes.has(n.slice(i))) return true;
    return false;
  };
  return {
    folder: (name) => {
      const n = name.toLowerCase();
      return folders.has(n) || fileName(n);
    },
    file: (name) => fileName(name.toLowerCase()),
  };
}

/** Exclusion test for one entry of a walk whose parent folders were all kept. */
export interface ExcludeTest {
  folder(rel: string, name: string): boolean;
  file(rel: string, name: string): boolean;
}

const NO_NAMES: ExcludeNames = { folders: [], files: [], suffixes: [] };

/**
 * Same answers as `createExcludeMatcher(useDefaults, extra)` for a path whose parent folders are
 * kept, but the defaults cost a few set lookups instead of ~130 regular expressions per file:
 * every default pattern is a bare name, `name/` or `*.suffix`, so it only looks at the last
 * path segment. When the caller's patterns hold a negation (which may undo a default), the
 * reference matcher is used as is. Checked against the reference in the tests.
 */
export function createExcludeTest(useDefaults: boolean, extra: readonly string[]): ExcludeTest {
  if (extra.some((p) => p.trimStart().startsWith('!'))) {
    const all = createExcludeMatcher(useDefaults, extra);
    return { folder: (rel) => all.ignores(`${rel}/`), file: (rel) => all.ignores(rel) };
  }
  const names = createNameFilter(useDefaults ? DEFAULT_EXCLUDE_NAMES : NO_NAMES);
  const user = createPatternMatcher(extra);
  return {
    folder: (rel, name) => names.folder(name) || user?.ignores(`${rel}/`) === true,
    file: (rel, name) => names.file(name) || user?.ignores(rel) === true,
  };
}

/** One .gitignore (or info/exclude) file: its folder relative to the root, and its rules. */
export interface IgnoreLayer {
  /** Folder of the file, root-relative with a trailing '/', or '' for the root. */
  readonly base: string;
  readonly matcher: Ignore;
}

/** git's own default: core.ignorecase is true on the case-insensitive file systems of macOS and Windows. */
const GITIGNORE_CASE_INSENSITIVE = process.platform === 'darwin' || process.platform === 'win32';

/** Builds a layer from the text of a .gitignore file found in folder `base`. */
export function createIgnoreLayer(base: string, text: string): IgnoreLayer {
  return { base, matcher: ignore({ ignorecase: GITIGNORE_CASE_INSENSITIVE }).add(text) };
}

/** Whether a root-relative path is excluded by the layers (deepest layer last in the array). */
export function isGitIgnored(layers: readonly IgnoreLayer[], path: string, isDir: boolean): boolean {
  return verdict(layers, path, isDir).ignored;
}

/**
 * Decides a folder found in a walk: `undefined` when the layers exclude it, else the layers its
 * contents are judged by (the same array unless a shallower layer had to be patched, see above).
 */
export function enterFolder(layers: readonly IgnoreLayer[], path: string): readonly IgnoreLayer[] | undefined {
  const v = verdict(layers, path, true);
  if (v.ignored) return undefined;
  if (v.layer <= 0) return layers; // nothing matched, or the shallowest layer decided
  let patched: IgnoreLayer[] | undefined;
  for (let i = v.layer - 1; i >= 0; i--) {
    const layer = layers[i];
    const local = path.slice(layer.base.length);
    if (!layer.matcher.test(`${local}/`).ignored) continue;
    patched ??= [...layers];
    const matcher = ignore({ ignorecase: GITIGNORE_CASE_INSENSITIVE })
      .add(layer.matcher)
      .add({ pattern: `!/${escapePattern(local)}/` });
    patched[i] = { base: layer.base, matcher };
  }
  return patched ?? layers;
}

function verdict(layers: readonly IgnoreLayer[], path: string, isDir: boolean): { ignored: boolean; layer: number } {
  for (let i = layers.length - 1; i >= 0; i--) {
    const layer = layers[i];
    const local = path.slice(layer.base.length);
    const r = layer.matcher.test(isDir ? `${local}/` : local);
    if (r.ignored) return { ignored: true, layer: i };
    if (r.unignored) return { ignored: false, layer: i };
  }
  return { ignored: false, layer: -1 };
}

/** Escapes glob characters so a literal path can be written as a gitignore pattern (gitignore(5): backslash escapes). */
export function escapePattern(literal: string): string {
  return literal.replace(/[\\*?[\]]/g, '\\$&');
}

/**
 * Whether a folder lies in a git working tree: it or one of its parents holds a `.git` entry (a
 * folder, or the file that linked worktrees and submodules use), as git's own discovery looks
 * for (git-rev-parse(1), "--show-toplevel"; GIT_DIR and GIT_WORK_TREE are not consulted).
 */
export function insideGitWorkTree(folderAbs: string): boolean {
  for (let dir = folderAbs; ;) {
    const st = lstatSync(join(dir, '.git'), { throwIfNoEntry: false });
    if (st && (st.isDirectory() || st.isFile())) return true;
    const up = dirname(dir);
    if (up === dir) return false;
    dir = up;
  }
}
