/**
 * In-editor test suite for machines that can download a desktop editor (`npm run test:desktop`):
 * @vscode/test-electron downloads the editor, starts it with this repository as the extension
 * under development on a copy of the demo workspace, and runs out/desktop/suite/index.js inside
 * it. Not part of CI here: these machines reach no editor download (see test/e2e for the
 * end-to-end test that runs here instead).
 */
import { cpSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runTests } from '@vscode/test-electron';

async function main(): Promise<void> {
  const repo = resolve(__dirname, '..', '..');
  const tmp = mkdtempSync(join(tmpdir(), 'undertone-desktop-'));
  const workspace = join(tmp, 'ferry-cooperative');
  cpSync(join(repo, 'demo', 'workspace'), workspace, { recursive: true });
  try {
    await runTests({
      extensionDevelopmentPath: repo,
      extensionTestsPath: join(repo, 'out', 'desktop', 'suite', 'index.js'),
      launchArgs: [workspace, '--disable-extensions', '--disable-workspace-trust', '--user-data-dir', join(tmp, 'user-data')],
    });
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
