// Packages an extension folder into a .vsix with the repo's @vscode/vsce, for
// startEditor({ vsixPath }). Runs non-interactively (CI has no stdin).
import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';

const REPO_ROOT = path.resolve(import.meta.dirname, '../..');
const VSCE = path.join(REPO_ROOT, 'node_modules', '@vscode', 'vsce', 'vsce');

export interface PackageOptions {
  /** Skip npm dependency detection (for fixtures without node_modules). Default false. */
  noDependencies?: boolean;
}

/** Runs `vsce package` in extensionDir and returns the absolute path of outFile. */
export function packageExtension(extensionDir: string, outFile: string, options: PackageOptions = {}): Promise<string> {
  const out = path.resolve(outFile);
  const args = [VSCE, 'package', '--out', out, '--allow-missing-repository', '--skip-license'];
  if (options.noDependencies) args.push('--no-dependencies');
  return new Promise((resolve, reject) => {
    const child = execFile(
      process.execPath,
      args,
      { cwd: extensionDir, timeout: 300_000, maxBuffer: 16 * 1024 * 1024 },
      (error, stdout, stderr) => {
        if (error || !existsSync(out))
          reject(new Error(`vsce package failed in ${extensionDir}: ${error?.message ?? 'no output file'}\n${stdout}\n${stderr}`));
        else resolve(out);
      },
    );
    child.stdin?.end(); // a prompt answers "no" instead of waiting
  });
}
