/**
 * Runs inside the editor (see ../runTest.ts). A small sequential runner on node:assert, so the
 * suite needs no test framework: each check waits on the extension's state events, never sleeps.
 */
import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import type { UndertoneApi } from '../../../src/extension/extension.js';
import type { IndexState } from '../../../src/extension/indexState.js';

const checks: [string, (api: UndertoneApi) => Promise<void>][] = [];
const check = (name: string, fn: (api: UndertoneApi) => Promise<void>) => checks.push([name, fn]);

function until(api: UndertoneApi, test: (s: IndexState) => boolean, what: string, timeoutMs = 120_000): Promise<IndexState> {
  if (test(api.state())) return Promise.resolve(api.state());
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      sub.dispose();
      reject(new Error(`timed out waiting for ${what}; state is ${JSON.stringify(api.state())}`));
    }, timeoutMs);
    const sub = api.onDidChangeState((s) => {
      if (!test(s)) return;
      clearTimeout(timer);
      sub.dispose();
      resolve(s);
    });
  });
}

check('registers every command of the manifest', async () => {
  const all = new Set(await vscode.commands.getCommands(true));
  const manifest = vscode.extensions.getExtension('undertone-dev.undertone')!.packageJSON as {
    contributes: { commands: { command: string }[] };
  };
  for (const { command } of manifest.contributes.commands) assert.ok(all.has(command), `${command} is not registered`);
});

check('builds the index of the opened folder and reports files and k', async (api) => {
  const s = await until(api, (x) => x.kind === 'ready', 'the index to be ready');
  assert.ok(s.kind === 'ready' && s.summary.files > 50, `too few files: ${JSON.stringify(s)}`);
});

check('deletes the saved index on command, then builds it again', async (api) => {
  await vscode.commands.executeCommand('undertone.deleteIndex');
  assert.equal(api.state().kind, 'none');
  await vscode.commands.executeCommand('undertone.rebuildIndex');
  await until(api, (x) => x.kind === 'ready', 'the rebuilt index');
});

check('shows the nearby files of an opened file without an error', async () => {
  const [file] = await vscode.workspace.findFiles('src/ticketing/fareCalculator.ts');
  assert.ok(file, 'demo file missing');
  await vscode.window.showTextDocument(file);
  await vscode.commands.executeCommand('undertone.showNearby', file);
});

export async function run(): Promise<void> {
  const ext = vscode.extensions.getExtension<UndertoneApi>('undertone-dev.undertone');
  assert.ok(ext, 'the extension is not installed');
  const api = await ext.activate();
  let failed = 0;
  for (const [name, fn] of checks) {
    try {
      await fn(api);
      console.log(`  ✓ ${name}`);
    } catch (err) {
      failed++;
      console.error(`  ✗ ${name}\n    ${err instanceof Error ? err.message : String(err)}`);
    }
  }
  if (failed > 0) throw new Error(`${failed} of ${checks.length} in-editor checks failed`);
}
