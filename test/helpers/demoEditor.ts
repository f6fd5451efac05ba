/**
 * For the real-editor tests: a fresh copy of the demo workspace, opened in code-server with the
 * packaged extension installed (run "npm run package" first; npm run test:e2e does).
 */
import { cpSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { startEditor, type RunningEditor } from '../../scripts/e2e/editor.js';

const REPO = path.resolve(import.meta.dirname, '../..');
export const VSIX = path.join(REPO, 'undertone.vsix');
const DEMO = path.join(REPO, 'demo', 'workspace');

export interface DemoEditor {
  /** Holds the workspace, the extensions and the editor's user data; remove it when done. */
  readonly root: string;
  readonly workspace: string;
  readonly editor: RunningEditor;
}

/** The extensions and user-data folders of an editor started in root (to open it again later). */
export function editorDirs(root: string): { extensionsDir: string; userDataDir: string } {
  return { extensionsDir: path.join(root, 'extensions'), userDataDir: path.join(root, 'user-data') };
}

export async function startOnDemoCopy(name: string, settings: Record<string, unknown>): Promise<DemoEditor> {
  if (!existsSync(VSIX)) throw new Error(`${VSIX} is missing: run "npm run package" first (npm run test:e2e does).`);
  const root = mkdtempSync(path.join(tmpdir(), `undertone-${name}-`));
  const workspace = path.join(root, 'ferry-cooperative');
  cpSync(DEMO, workspace, { recursive: true });
  try {
    const editor = await startEditor({ workspaceFolder: workspace, ...editorDirs(root), vsixPath: VSIX, settings, name });
    return { root, workspace, editor };
  } catch (error) {
    rmSync(root, { recursive: true, force: true });
    throw error;
  }
}
