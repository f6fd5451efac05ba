// Small process and polling helpers for the end-to-end harness (scripts/e2e/editor.ts).
import { execFile } from 'node:child_process';
import { appendFileSync } from 'node:fs';
import { createServer } from 'node:net';

/** A loopback port that was free a moment ago (the OS picks it). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => (port ? resolve(port) : reject(new Error('no port assigned'))));
    });
  });
}

/** True when an HTTP GET on url gets any response below 500. */
export async function isAnswering(url: string): Promise<boolean> {
  try {
    const response = await fetch(url, { signal: AbortSignal.timeout(2_000) });
    await response.body?.cancel();
    return response.status < 500;
  } catch {
    return false;
  }
}

/**
 * Polls check() until it returns a truthy value and returns that value, or
 * throws after timeoutMs naming what was awaited. Errors thrown by check() end the wait.
 */
export async function waitFor<T>(
  check: () => Promise<T | false | undefined | null> | T | false | undefined | null,
  timeoutMs: number,
  what: string,
  intervalMs = 200,
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`Timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, intervalMs));
  }
}

/** Runs a code-server CLI action (e.g. --install-extension) and fails with its output. */
export function runCodeServerCli(node: string, args: string[], env: NodeJS.ProcessEnv, timeoutMs: number): Promise<string> {
  return new Promise((resolve, reject) => {
    execFile(node, args, { env, timeout: timeoutMs, maxBuffer: 16 * 1024 * 1024 }, (error, stdout, stderr) => {
      if (error) reject(new Error(`code-server ${args.slice(-2).join(' ')} failed: ${error.message}\n${stdout}\n${stderr}`));
      else resolve(`${stdout}${stderr}`);
    });
  });
}

export function appendBrowserLog(file: string, line: string): void {
  appendFileSync(file, `${new Date().toISOString()} ${line}\n`);
}
