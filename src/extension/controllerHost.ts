/**
 * What the index controller (indexController.ts) needs from the editor, and the change events it
 * reports: an interface, so the controller runs under unit tests with a fake host.
 */
import type { HostFolder, SettingGetter } from './settings.js';
import type { StartedWorker } from './workerHost.js';

export interface ControllerHost {
  startWorker(onExit: (code: number) => void): StartedWorker;
  /** `undertone.*` settings. */
  readonly setting: SettingGetter;
  /** Workspace folders on the local disk, and the names of those that are not. */
  folders(): { readonly local: readonly HostFolder[]; readonly elsewhere: readonly string[] };
  /** The index file in the extension's workspace storage (undefined without a workspace). */
  readonly indexFile: string | undefined;
  /** Runs a task with a cancellable progress notification. */
  withProgress<T>(title: string, task: (report: (percent: number) => void, signal: AbortSignal) => Promise<T>): Promise<T>;
  showError(message: string): void;
  log(line: string): void;
}

/** What changed in the index: keys folded in and removed, or `all` after a build or a reload. */
export interface IndexChange {
  readonly folded: readonly string[];
  readonly removed: readonly string[];
  readonly all: boolean;
}

export type BuildKind = 'initial' | 'user' | 'background';
