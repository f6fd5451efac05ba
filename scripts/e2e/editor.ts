// Starts a real editor (code-server, installed by scripts/e2e/setup.sh) and a
// real browser (Debian's Chromium driven by playwright-core) for end-to-end
// tests.
// startEditor() returns a Workbench (UI helpers) plus stop(), which closes the
// browser and kills code-server's process group; a failed start cleans up too.
import { spawn, type ChildProcess } from 'node:child_process';
import { closeSync, cpSync, existsSync, mkdirSync, mkdtempSync, openSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { appendBrowserLog, freePort, isAnswering, runCodeServerCli, waitFor } from './process.js';
import { Workbench } from './workbench.js';

const REPO_ROOT = path.resolve(import.meta.dirname, '../..');
/** Screenshots and logs land here (git-ignored). */
export const OUTPUT_DIR = path.join(REPO_ROOT, 'test-output', 'e2e');
const ENV_FILE = path.join(REPO_ROOT, '.cache', 'e2e', 'env.json');

/** Chromium flags verified on these machines (no GPU, no sandbox as root, no outside network). */
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** Paths written by scripts/e2e/setup.sh. */
export interface EditorInstall {
  node: string;
  codeServerEntry: string;
  codeServerVersion: string;
  chromium: string;
}

export interface StartEditorOptions {
  workspaceFolder: string;
  /**
   * Port to serve on (default: a free one). The web workbench keys workspace storage by the
   * folder's URI, which includes host and port: reuse a port to reopen a folder with its storage.
   */
  port?: number;
  extensionsDir: string;
  userDataDir: string;
  /** A packaged extension to install before start. */
  vsixPath?: string;
  /** Extra user settings, merged over the harness defaults. */
  settings?: Record<string, unknown>;
  /** Prefix for log files and screenshots in test-output/e2e (default "editor"). */
  name?: string;
  /** Time allowed for code-server, the workbench and the extension host to come up (default 90 s). */
  startTimeoutMs?: number;
  /** Wait until the extension host has activated startup extensions (default true). */
  waitForExtensionHost?: boolean;
}

export interface RunningEditor extends Workbench {
  readonly url: string;
  readonly port: number;
  /** code-server's stdout/stderr. */
  readonly logPath: string;
  /** Closes the browser, kills code-server's process group, copies editor logs. Safe to call twice. */
  stop(): Promise<void>;
}

export const DEFAULT_SETTINGS: Record<string, unknown> = {
  'security.workspace.trust.enabled': false,
  'workbench.startupEditor': 'none',
  // Keep the chat side bar closed so screenshots show the editor and views.
  'workbench.secondarySideBar.defaultVisibility': 'hidden',
  'chat.disableAIFeatures': true,
};

export function readInstall(): EditorInstall {
  if (!existsSync(ENV_FILE)) {
    throw new Error(`Editor not installed: ${path.relative(process.cwd(), ENV_FILE)} is missing. Run: bash scripts/e2e/setup.sh`);
  }
  return JSON.parse(readFileSync(ENV_FILE, 'utf8')) as EditorInstall;
}

/**
 * Environment for code-server: no inherited editor hooks, config and logs kept
 * out of $HOME, and its sockets in a short private TMPDIR (removed on stop).
 */
function editorEnv(install: EditorInstall, stateDir: string, tempDir: string): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {};
  for (const [k, v] of Object.entries(process.env)) {
    // VSCODE_* (e.g. VSCODE_IPC_HOOK_CLI) would hand the CLI to an outer editor.
    if (!k.startsWith('VSCODE_') && k !== 'NODE_OPTIONS' && k !== 'ELECTRON_RUN_AS_NODE') env[k] = v;
  }
  env.PATH = `${path.dirname(install.node)}${path.delimiter}${process.env.PATH ?? ''}`;
  env.XDG_CONFIG_HOME = path.join(stateDir, 'xdg-config');
  env.XDG_DATA_HOME = path.join(stateDir, 'xdg-data');
  env.XDG_CACHE_HOME = path.join(stateDir, 'xdg-cache');
  env.TMPDIR = tempDir;
  return env;
}

export async function startEditor(options: StartEditorOptions): Promise<RunningEditor> {
  const install = readInstall();
  const name = options.name ?? 'editor';
  const timeout = options.startTimeoutMs ?? 90_000;
  const workspace = path.resolve(options.workspaceFolder);
  const userDataDir = path.resolve(options.userDataDir);
  const extensionsDir = path.resolve(options.extensionsDir);
  for (const dir of [OUTPUT_DIR, userDataDir, extensionsDir, path.join(userDataDir, 'User')]) mkdirSync(dir, { recursive: true });
  const configFile = path.join(userDataDir, 'code-server-config.yaml');
  writeFileSync(configFile, '');
  // Short path: Unix socket paths are limited to about 100 characters.
  const tempDir = mkdtempSync(path.join(tmpdir(), 'ute-'));
  const env = editorEnv(install, userDataDir, tempDir);
  const baseArgs = [install.codeServerEntry, '--config', configFile, '--user-data-dir', userDataDir, '--extensions-dir', extensionsDir];

  if (options.vsixPath) {
    try {
      await installExtension(install, baseArgs, env, path.resolve(options.vsixPath));
    } catch (error) {
      rmSync(tempDir, { recursive: true, force: true });
      throw error;
    }
  }
  const settings = { ...DEFAULT_SETTINGS, ...options.settings };
  writeFileSync(path.join(userDataDir, 'User', 'settings.json'), JSON.stringify(settings, null, 2));

  const port = options.port ?? (await freePort());
  const url = `http://127.0.0.1:${port}`;
  const logPath = path.join(OUTPUT_DIR, `${name}.code-server.log`);
  const browserLogPath = path.join(OUTPUT_DIR, `${name}.browser.log`);
  writeFileSync(browserLogPath, '');
  const logFd = openSync(logPath, 'w');
  let server: ChildProcess | undefined;
  let browser: Browser | undefined;
  let exited = false;
  // The group may outlive its leader (e.g. an extension host), so signal it even after exit.
  const killGroup = (signal: NodeJS.Signals) => {
    if (server?.pid !== undefined) {
      try {
        process.kill(-server.pid, signal);
      } catch {
        /* already gone */
      }
    }
  };
  const onExit = () => killGroup('SIGKILL');
  process.once('exit', onExit);

  let stopped = false;
  const stop = async () => {
    if (stopped) return;
    stopped = true;
    try {
      await browser?.close();
    } catch {
      /* the browser may already be gone */
    }
    if (server && !exited) {
      const gone = new Promise<void>((resolve) => server!.once('exit', () => resolve()));
      killGroup('SIGTERM');
      const timer = setTimeout(() => killGroup('SIGKILL'), 5_000);
      await gone;
      clearTimeout(timer);
    }
    killGroup('SIGKILL');
    process.removeListener('exit', onExit);
    rmSync(tempDir, { recursive: true, force: true });
    const logsDir = path.join(userDataDir, 'logs');
    const copy = path.join(OUTPUT_DIR, `${name}.editor-logs`);
    rmSync(copy, { recursive: true, force: true });
    if (existsSync(logsDir)) cpSync(logsDir, copy, { recursive: true });
  };

  const logsBefore = new Set(listDir(path.join(userDataDir, 'logs')));
  try {
    server = spawn(
      install.node,
      [...baseArgs, '--bind-addr', `127.0.0.1:${port}`, '--auth', 'none', '--disable-telemetry', '--disable-update-check', workspace],
      { env, detached: true, stdio: ['ignore', logFd, logFd] },
    );
    server.once('exit', () => {
      exited = true;
    });
    closeSync(logFd);
    const logTail = () => readFileSync(logPath, 'utf8').split('\n').slice(-20).join('\n');
    await waitFor(
      async () => {
        if (exited) throw new Error(`code-server exited during start-up:\n${logTail()}`);
        return isAnswering(`${url}/healthz`);
      },
      timeout,
      `code-server to answer on ${url} (log: ${logPath})`,
    );

    // Chromium's own state (crash reports, caches) goes to the private temp folder, not $HOME.
    const browserEnv = {
      ...process.env,
      XDG_CONFIG_HOME: path.join(tempDir, 'browser-config'),
      XDG_CACHE_HOME: path.join(tempDir, 'browser-cache'),
    };
    browser = await chromium.launch({ executablePath: install.chromium, args: CHROMIUM_ARGS, headless: true, env: browserEnv });
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') appendBrowserLog(browserLogPath, `${m.type()}: ${m.text()}`);
    });
    page.on('pageerror', (e) => appendBrowserLog(browserLogPath, `pageerror: ${e.message}`));
    await page.goto(`${url}/?folder=${encodeURIComponent(workspace)}`);
    await page.locator('.monaco-workbench').waitFor({ state: 'visible', timeout });
    if (options.waitForExtensionHost ?? true) {
      await waitFor(
        () => extensionHostReady(userDataDir, logsBefore),
        timeout,
        `the extension host to activate startup extensions (logs in ${path.join(userDataDir, 'logs')})`,
      );
    }
    const workbench = new Workbench(page, OUTPUT_DIR);
    return Object.assign(workbench, { url, port, logPath, stop });
  } catch (error) {
    await stop();
    throw error;
  }
}

async function installExtension(install: EditorInstall, baseArgs: string[], env: NodeJS.ProcessEnv, vsix: string): Promise<void> {
  const out = await runCodeServerCli(install.node, [...baseArgs, '--install-extension', vsix], env, 120_000);
  // A failed install exits non-zero (checked with a corrupt file); the output check is a second guard.
  if (!/successfully installed|already installed/i.test(out)) throw new Error(`Installing ${vsix} did not report success:\n${out}`);
}

function listDir(dir: string): string[] {
  return existsSync(dir) ? readdirSync(dir) : [];
}

/**
 * True once a log folder of this run holds an extension-host log that reports
 * startup extensions activated. Commands contributed by installed extensions
 * reach the palette only after that, so tests that start earlier can miss them.
 */
function extensionHostReady(userDataDir: string, logsBefore: Set<string>): boolean {
  const logs = path.join(userDataDir, 'logs');
  for (const run of listDir(logs).filter((d) => !logsBefore.has(d))) {
    for (const host of listDir(path.join(logs, run)).filter((d) => d.startsWith('exthost'))) {
      const file = path.join(logs, run, host, 'remoteexthost.log');
      if (existsSync(file) && readFileSync(file, 'utf8').includes('Eager extensions activated')) return true;
    }
  }
  return false;
}
