/**
 * How a file crosses the worker boundary in results (workerProtocol.ts, insightProtocol.ts): its
 * index key plus what the editor needs to show and open it.
 */

/** A file in results: its index key plus what the editor needs to show and open it. */
export interface FileRef {
  /** Index key: the folder-relative path, prefixed by the folder name when there are several. */
  readonly key: string;
  readonly fsPath: string;
  /** Name of its workspace folder. */
  readonly folder: string;
  /** Path relative to its folder, '/'-separated. */
  readonly relPath: string;
}
