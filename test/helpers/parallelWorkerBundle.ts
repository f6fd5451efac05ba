/**
 * Tests that run the tokenizing threads need the thread script as a file: this bundles
 * src/node/parallel/parallelWorker.ts into `dir` and points UNDERTONE_PARALLEL_WORKER at it;
 * the returned function puts the variable back as it was.
 */
import { join } from 'node:path';
import { build } from 'esbuild';
import { REPO_ROOT } from './shared.js';

export async function useBundledParallelWorker(dir: string): Promise<() => void> {
  const script = join(dir, 'parallelWorker.js');
  await build({
    entryPoints: ['src/node/parallel/parallelWorker.ts'],
    outfile: script,
    bundle: true,
    platform: 'node',
    format: 'cjs',
    absWorkingDir: REPO_ROOT,
    logLevel: 'error',
  });
  const saved = process.env.UNDERTONE_PARALLEL_WORKER;
  process.env.UNDERTONE_PARALLEL_WORKER = script;
  return () => {
    if (saved === undefined) delete process.env.UNDERTONE_PARALLEL_WORKER;
    else process.env.UNDERTONE_PARALLEL_WORKER = saved;
  };
}
