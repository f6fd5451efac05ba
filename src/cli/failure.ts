/**
 * How the command line ends when something goes wrong: the exit codes, a one-line message for a
 * file-system error (naming the path and the reason), and for a genuine internal fault a one-line
 * message plus the full trace written to a file (never a stack trace on the terminal).
 */
import { writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { UndertoneError } from '../core/errors.js';

/** Exit codes (README "Exit codes" and --help). 70 is EX_SOFTWARE of sysexits.h. */
export const EXIT = Object.freeze({ ok: 0, input: 1, usage: 2, internal: 70 });

export const EXIT_CODE_HELP = `exit codes:
  0   success
  1   bad input or nothing found (a message on stderr names the file or value and the reason)
  2   usage error (unknown command or option, missing argument)
  70  internal fault: a one-line message names the file holding the full trace`;

const REASONS: Record<string, string> = {
  ENOENT: 'no such file or folder',
  EACCES: 'permission denied',
  EPERM: 'operation not permitted',
  EISDIR: 'it is a folder',
  ENOTDIR: 'a part of the path is not a folder',
  EEXIST: 'something of that name is already there',
  EROFS: 'the file system is read-only',
  ENOSPC: 'no space left on the device',
  EDQUOT: 'disk quota exceeded',
  EMFILE: 'too many open files',
  ENAMETOOLONG: 'the name is too long',
  ELOOP: 'too many symbolic links',
  EINVAL: 'invalid for this file',
  EIO: 'input/output error',
  EAGAIN: 'not ready (a FIFO or device)',
};

/** A Node file-system error (it carries a code and usually a path). */
export function isFsError(err: unknown): err is NodeJS.ErrnoException {
  return (
    err instanceof Error &&
    typeof (err as NodeJS.ErrnoException).code === 'string' &&
    typeof (err as NodeJS.ErrnoException).syscall === 'string'
  );
}

const WRITES = new Set([
  'write',
  'mkdir',
  'rename',
  'unlink',
  'rmdir',
  'copyfile',
  'symlink',
  'link',
  'fsync',
  'ftruncate',
  'utime',
  'chmod',
]);

/** "cannot read <path>: permission denied (EACCES)". */
export function fsErrorMessage(err: NodeJS.ErrnoException): string {
  const code = err.code ?? '';
  const verb = WRITES.has(err.syscall ?? '') ? 'cannot write' : err.syscall === 'scandir' ? 'cannot list' : 'cannot read';
  const reason = REASONS[code] ?? err.message.replace(/^[A-Z]+: /, '').replace(/, \w+ '.*'$/, '');
  return `${verb} ${err.path ?? (err as { dest?: string }).dest ?? '(unknown path)'}: ${reason} (${code})`;
}

/**
 * The message and exit code for an error a command threw: UndertoneError and file-system errors
 * are the user's to fix (1); anything else is a fault of ours (70), whose trace goes to a file.
 */
export function describeFailure(command: string, err: unknown): { code: number; message: string } {
  if (err instanceof UndertoneError) return { code: EXIT.input, message: `undertone ${command}: ${err.message}` };
  if (isFsError(err)) return { code: EXIT.input, message: `undertone ${command}: ${fsErrorMessage(err)}` };
  const where = writeTrace(err);
  const first = err instanceof Error ? `${err.name}: ${err.message}` : String(err);
  return {
    code: EXIT.internal,
    message: `undertone ${command}: internal error (${first.split('\n')[0].slice(0, 200)}). This is a fault in Undertone; ${where ? `the full trace is in ${where}` : 'its trace could not be written'}.`,
  };
}

/** Writes the error's trace to a new file in the temporary folder; returns its path (undefined if that failed). */
export function writeTrace(err: unknown, dir = tmpdir()): string | undefined {
  const file = join(dir, `undertone-fault-${new Date().toISOString().replace(/[:.]/g, '-')}-${process.pid}.txt`);
  const text = [
    `undertone ${process.argv
      .slice(2)
      .map((a) => JSON.stringify(a))
      .join(' ')}`,
    `node ${process.version} on ${process.platform}-${process.arch}`,
    '',
    err instanceof Error ? (err.stack ?? err.message) : String(err),
    '',
  ].join('\n');
  try {
    writeFileSync(file, text, { flag: 'wx', mode: 0o600 });
    return file;
  } catch {
    return undefined;
  }
}

/**
 * Ends the process quietly when a reader of stdout goes away (`undertone ask … | head -1`):
 * writing to a closed pipe is not an error the user needs to see.
 */
export function quietOnClosedPipe(stream: NodeJS.WriteStream = process.stdout): void {
  stream.on('error', (err: NodeJS.ErrnoException) => {
    if (err.code === 'EPIPE') process.exit(EXIT.ok);
    throw err;
  });
}
