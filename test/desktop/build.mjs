// Bundles the in-editor test suite (test/desktop) into out/desktop for @vscode/test-electron.
import { build } from 'esbuild';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const common = {
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  absWorkingDir: root,
  logLevel: 'warning',
  external: ['vscode', '@vscode/test-electron'],
};
await build({ ...common, entryPoints: ['test/desktop/runTest.ts'], outfile: 'out/desktop/runTest.js' });
await build({ ...common, entryPoints: ['test/desktop/suite/index.ts'], outfile: 'out/desktop/suite/index.js' });
