/** Runs the command line in-process with captured output (tests call main() with a fake Io). */
import { main } from '../../src/cli/main.js';
import type { Io } from '../../src/cli/output.js';

export function captureIo(): Io & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { stdout, stderr, out: (l) => stdout.push(l), err: (l) => stderr.push(l), errRaw: () => undefined, interactive: false };
}

/** Runs `undertone <args…> <extra…>` and returns its exit code and joined stdout/stderr. */
export async function runCli(args: string[], extra: string[]): Promise<{ code: number; out: string; err: string }> {
  const io = captureIo();
  const code = await main([...args, ...extra], io);
  return { code, out: io.stdout.join('\n'), err: io.stderr.join('\n') };
}
