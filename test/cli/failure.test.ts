import { existsSync, readFileSync, rmSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../src/core/errors.js';
import { describeFailure, EXIT, EXIT_CODE_HELP, fsErrorMessage, isFsError } from '../../src/cli/failure.js';
import { USAGE } from '../../src/cli/main.js';

describe('describeFailure', () => {
  it('gives 1 and the message for our own errors and for file-system errors (path and reason, no trace)', async () => {
    expect(describeFailure('ask', new InvalidInputError('--top needs a positive whole number'))).toEqual({
      code: EXIT.input,
      message: 'undertone ask: --top needs a positive whole number',
    });
    const err = await readFile('/nonexistent/undertone/q.jsonl').catch((e: unknown) => e);
    expect(isFsError(err)).toBe(true);
    const d = describeFailure('eval', err);
    expect(d).toEqual({ code: 1, message: 'undertone eval: cannot read /nonexistent/undertone/q.jsonl: no such file or folder (ENOENT)' });
    expect(fsErrorMessage(Object.assign(new Error('x'), { code: 'EACCES', syscall: 'mkdir', path: '/srv/cache' }))).toBe(
      'cannot write /srv/cache: permission denied (EACCES)',
    );
  });

  it('gives 70 for a fault of ours: one line naming the file that holds the full trace', () => {
    let fault: unknown;
    try {
      void (undefined as unknown as { x: number }).x;
    } catch (e) {
      fault = e;
    }
    const d = describeFailure('nearby', fault);
    expect(d.code).toBe(70);
    expect(d.message.split('\n')).toHaveLength(1);
    const file = /the full trace is in (\S+)\.$/.exec(d.message)?.[1];
    expect(file).toBeDefined();
    expect(existsSync(file!)).toBe(true);
    const trace = readFileSync(file!, 'utf8');
    expect(trace).toContain('TypeError');
    expect(trace).toMatch(/\n\s+at /);
    rmSync(file!);
  });

  it('lists the exit codes in --help', () => {
    expect(USAGE).toContain(EXIT_CODE_HELP);
    for (const code of ['0', '1', '2', '70']) expect(EXIT_CODE_HELP).toMatch(new RegExp(`^  ${code} `, 'm'));
  });
});
