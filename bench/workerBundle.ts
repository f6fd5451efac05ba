/**
 * Bundles the index worker and, beside it, the thread-pool script it starts for larger builds
 * (the same two files as dist/ holds), for the benches that drive the worker as the editor does.
 */
import { build } from 'esbuild';
import { join } from 'node:path';

/** Writes indexWorker.js and parallelWorker.js into `outDir`; returns the index worker's path. */
export async function bundleWorkerScripts(repo: string, outDir: string): Promise<string> {
  const workerJs = join(outDir, 'indexWorker.js');
  for (const [entry, out] of [
    ['src/node/worker/indexWorker.ts', workerJs],
    ['src/node/parallel/parallelWorker.ts', join(outDir, 'parallelWorker.js')],
  ]) {
    await build({
      entryPoints: [join(repo, entry)],
      outfile: out,
      bundle: true,
      platform: 'node',
      format: 'cjs',
      minify: true,
      logLevel: 'error',
    });
  }
  return workerJs;
}
