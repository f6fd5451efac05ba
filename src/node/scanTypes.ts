/**
 * The scanner's option and result types (scan.ts walks, scanWalk.ts visits folders), apart from
 * both so neither file imports the other.
 */

/**
 * Files larger than this are not indexed (1 MiB; common practice: larger text files are mostly
 * generated or data). The one source of this default for the scanner, the readers, the command
 * line and the editor setting (package.json's undertone.maxFileSizeKB, checked by a test).
 */
export const DEFAULT_MAX_FILE_BYTES = 1_048_576;

/** Options for `scanFolder`. Patterns use gitignore syntax (gitignore(5)). */
export interface ScanOptions {
  /**
   * Only files matching one of these (root-relative) are kept; empty keeps every file. Matched
   * without regard to case. `*.md` matches at any depth, `docs/` keeps everything under docs.
   * @default []
   */
  readonly include: readonly string[];
  /**
   * Extra paths to skip, matched without regard to case after the defaults, so a negation such
   * as `!build/` keeps folders the defaults would skip. @default []
   */
  readonly exclude: readonly string[];
  /**
   * Skip DEFAULT_EXCLUDE_PATTERNS: VCS folders, dependencies, build output, lock files, minified
   * bundles and source maps, binary formats. @default true
   */
  readonly useDefaultExcludes: boolean;
  /** Files larger than this many bytes are skipped as `too-large`. @default 1048576 (1 MiB) */
  readonly maxFileBytes: number;
  /** Honour .gitignore files in the folder and its subfolders, and .git/info/exclude. @default true */
  readonly honourGitignore: boolean;
  /** Follow symbolic links to files and folders (each folder is still visited once). @default true */
  readonly followSymlinks: boolean;
  /**
   * Also follow links whose real path lies outside the scanned folder (and outside linkRoots).
   * Off by default: a link must not carry files from elsewhere (/etc, a secret) into the index.
   * @default false
   */
  readonly followLinksOutside: boolean;
  /** Further folders whose files links may reach without followLinksOutside (the other folders of a workspace). @default [] */
  readonly linkRoots?: readonly string[];
}

/** One file kept by the scan. */
export interface ScannedFile {
  /** Relative to the scanned root, '/'-separated. */
  readonly path: string;
  readonly absPath: string;
  /** Size in bytes (of the link's target for a followed link). */
  readonly size: number;
  readonly mtimeMs: number;
}

/** Why a path worth mentioning was left out. Excluded and ignored paths are not listed. */
export type SkipReason =
  | 'too-large'
  | 'unreadable'
  | 'symlink-loop'
  | 'symlink-duplicate'
  | 'broken-symlink'
  /** A link whose real path is outside the folder (followLinksOutside is off). */
  | 'outside-folder'
  /** A device, FIFO, socket or pseudo-file (never read). */
  | 'not-a-file'
  /** A name that is not valid UTF-8 (its bytes are escaped in `path`). */
  | 'bad-name';

export interface SkippedPath {
  /** Relative to the scanned root, '/'-separated ('.' for the root itself). */
  readonly path: string;
  readonly reason: SkipReason;
  /** A sentence for people, e.g. the size and the cap, or the error code. */
  readonly detail: string;
}

export interface ScanResult {
  /** The root as an absolute path. */
  readonly root: string;
  /** Sorted by `path` (UTF-16 code-unit order), so the same tree always gives the same list. */
  readonly files: readonly ScannedFile[];
  /** Sorted by `path`. */
  readonly skipped: readonly SkippedPath[];
  /**
   * Files and folders (a folder counts once, whatever it holds) that .gitignore files or
   * .git/info/exclude left out; 0 when they are not read (honourGitignore off, or no git work tree).
   */
  readonly gitIgnored: number;
}
