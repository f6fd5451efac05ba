/**
 * What the cluster tests (test/cluster/*.test.ts) share: the engine check, the command line the
 * workers run (bundled as scripts/build.mjs bundles it), one run of the cluster job
 * (cluster/undertone_cluster) and a Matrix Market file read into a map of its entries.
 */
import { spawn, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { build } from 'esbuild';
import { parseMatrixMarket } from '../../src/core/matrix/matrixMarket.js';
import { REPO_ROOT } from './shared.js';

/** Debian's interpreter, which python3-dask and python3-distributed install into. */
export const PYTHON = '/usr/bin/python3';

/** The engine must be there: a check that cannot run is a failure, not a skip (.ci/run installs it). */
export function requireDask(): void {
  const r = spawnSync(PYTHON, ['-c', 'import dask.array, distributed, scipy.sparse'], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`Dask is missing (${PYTHON}): apt-get install python3-dask python3-distributed python3-scipy`);
}

/** Bundles the command line into `outfile`, as the workers of a real cluster would run it. */
export async function bundleCli(outfile: string): Promise<void> {
  await build({
    entryPoints: [join(REPO_ROOT, 'src/cli/bin.ts')],
    outfile,
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    logLevel: 'warning',
  });
}

/**
 * The arguments every test run starts with: the folder, the model file DIR/org.model, the command
 * line bundled at DIR/cli.js (bundleCli) and a local cluster of two worker processes.
 */
export function localJobArgs(ws: string, dir: string): string[] {
  return [ws, '--out', join(dir, 'org.model'), '--undertone', `${process.execPath} ${join(dir, 'cli.js')}`, '--local-workers', '2'];
}

/** Runs `python3 -m undertone_cluster ARGS` from cluster/ and returns its exit code and stderr. */
export async function runClusterJob(
  args: string[],
  env: NodeJS.ProcessEnv = process.env,
): Promise<{ code: number | null; stderr: string }> {
  const job = spawn(PYTHON, ['-m', 'undertone_cluster', ...args], {
    cwd: join(REPO_ROOT, 'cluster'),
    stdio: ['ignore', 'ignore', 'pipe'],
    env,
  });
  let stderr = '';
  job.stderr.on('data', (b: Buffer) => (stderr += b.toString()));
  const code = await new Promise<number | null>((res) => job.on('close', res));
  return { code, stderr };
}

/** A coordinate Matrix Market file as a map from row * cols + col to the entry's value. */
export function matrixEntries(path: string): { rows: number; cols: number; map: Map<number, number> } {
  const m = parseMatrixMarket(readFileSync(path, 'utf8'));
  if (m.format !== 'coordinate') throw new Error('expected a coordinate matrix');
  const map = new Map<number, number>();
  for (let t = 0; t < m.values.length; t++) map.set(m.rowIndex[t] * m.cols + m.colIndex[t], m.values[t]);
  return { rows: m.rows, cols: m.cols, map };
}

/** How many entries of `a` differ from `b`'s (a missing entry counts as different). */
export function differingEntries(a: Map<number, number>, b: Map<number, number>): number {
  let differ = 0;
  for (const [key, v] of a) if (b.get(key) !== v) differ++;
  return differ;
}

/** The singular values a run wrote, one per line (`undertone export`'s singular-values.txt). */
export function readSingularValues(path: string): number[] {
  return readFileSync(path, 'utf8').trim().split('\n').map(Number);
}

/** The largest relative difference between two lists of singular values of the same length. */
export function worstRelativeDifference(reference: number[], other: number[]): number {
  return Math.max(...reference.map((s, i) => Math.abs(other[i] - s) / s));
}
