/**
 * Scans and indexes every folder of a workspace into one index (keys from RootMap): the editor
 * worker's adapter over indexPipeline.ts, as folderIndexer.ts is the command line's for one
 * folder. Nothing is saved or swapped here; the caller does that once the build has finished, so
 * a cancelled or failed build leaves the current index as it was.
 */
import { resolveSettings } from '../../core/index/model/settings.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { runIndexPipeline, tallySkipped, type PipelineOptions, type SkipCounts, type SourceFile } from '../indexPipeline.js';
import { ensureFolder } from '../persist.js';
import { gitignoreHint, scanFolder } from '../scan.js';
import { openSpillBeside } from '../sectionCodeFile.js';
import type { Progress, WorkerConfig } from './workerProtocol.js';
import type { RootMap } from './rootMap.js';

/** A file of the workspace: its index key and where it is. */
export type WorkspaceFile = SourceFile;

export interface WorkspaceScan {
  readonly files: readonly WorkspaceFile[];
  /** Files left out by the scan, by why. */
  readonly skipped: SkipCounts;
  /** Files and folders that .gitignore files left out (ScanResult.gitIgnored, summed over the folders). */
  readonly gitIgnored: number;
}

/** Lists the indexable files of every folder. */
export async function scanWorkspace(roots: RootMap, config: WorkerConfig, signal?: AbortSignal): Promise<WorkspaceScan> {
  const files: WorkspaceFile[] = [];
  const skipped: SkipCounts = { binary: 0, tooLarge: 0, unreadable: 0, other: 0 };
  let gitIgnored = 0;
  for (const root of roots.roots) {
    const scan = await scanFolder(
      root.fsPath,
      {
        include: config.include,
        exclude: [...config.exclude, ...root.exclude],
        maxFileBytes: config.maxFileBytes,
        honourGitignore: config.honourGitignore,
        // Links may reach the other workspace folders; beyond them only when the setting allows.
        followLinksOutside: config.followLinksOutside ?? false,
        linkRoots: roots.roots.map((r) => r.fsPath),
      },
      signal,
    );
    const prefix = roots.prefixOf(root);
    for (const f of scan.files) files.push({ key: prefix + f.path, absPath: f.absPath, size: f.size, mtimeMs: f.mtimeMs });
    const t = tallySkipped(scan.skipped);
    skipped.tooLarge += t.tooLarge;
    skipped.unreadable += t.unreadable;
    skipped.other += t.other;
    gitIgnored += scan.gitIgnored;
  }
  return { files, skipped, gitIgnored };
}

export interface WorkspaceBuild {
  readonly index: LsiIndex;
  readonly read: number;
  readonly reused: number;
  /** Files left out as too large, unreadable or binary. */
  readonly skipped: number;
  readonly seconds: number;
}

export interface WorkspaceBuildOptions {
  /** The index in use, whose unchanged files need not be read again. */
  readonly previous?: LsiIndex;
  readonly signal?: AbortSignal;
  /** Also polled during the synchronous SVD (see workerProtocol.ts, cancelFlag). */
  readonly isCancelled?: () => boolean;
  readonly onProgress?: (p: Progress) => void;
  /** Threads for tokenizing and the SVD, the worker's own included (false: none). @default all cores */
  readonly threads?: number | false;
  /** Every file's raw counts once counting has ended (indexPipeline.ts, onCounted). */
  readonly onCounted?: PipelineOptions['onCounted'];
  /** Called wherever cancellation is checked, the synchronous SVD included (indexPipeline.ts, poll). */
  readonly poll?: () => void;
  /**
   * A folder for a large build's scratch files (the index file's: the same disk); the section
   * counts wait there during the SVD and the section vectors stay there (indexPipeline.ts, scratch).
   * Made when missing (the editor's storage folder does not exist before the first save); where it
   * cannot be made, the scratch stays in memory.
   */
  readonly scratchFolder?: string;
}

export async function buildWorkspaceIndex(
  roots: RootMap,
  config: WorkerConfig,
  options: WorkspaceBuildOptions = {},
): Promise<WorkspaceBuild> {
  const { threads } = options;
  const folder = options.scratchFolder;
  let gitIgnored = 0;
  const scratch =
    folder === undefined
      ? undefined
      : await ensureFolder(folder).then(
          () => openSpillBeside(folder, "the build's scratch file"),
          () => undefined,
        );
  const result = await runIndexPipeline({
    settings: resolveSettings(config.settings),
    scan: async () => {
      const scan = await scanWorkspace(roots, config, options.signal);
      gitIgnored = scan.gitIgnored;
      return scan;
    },
    maxFileBytes: config.maxFileBytes,
    previous: options.previous,
    emptyMessage: () =>
      `Nothing to index: no text files remain after the exclude settings.${gitignoreHint(gitIgnored, 'turning off the setting undertone.useGitignore')}`,
    signal: options.signal,
    isCancelled: options.isCancelled,
    onProgress: options.onProgress,
    threads: threads === false ? false : threads === undefined ? {} : { threads },
    onCounted: options.onCounted,
    poll: options.poll,
    scratch,
  });
  const s = result.skipped;
  const seconds = Object.values(result.seconds).reduce((a, b) => a + b, 0);
  return { index: result.index, read: result.read, reused: result.reused, skipped: s.binary + s.tooLarge + s.unreadable, seconds };
}
