/**
 * The cluster job (cluster/undertone_cluster) end to end on a local Dask cluster with two worker
 * processes (Debian's python3-dask and python3-distributed 2022.12), against the local index of
 * the same files. Material: the four public test collections of test/fixtures/corpora (ADI, CACM,
 * CISI, Cranfield: 6,146 abstracts written out as files in four folders), the CISI queries as dev
 * queries. During counting the job's drill kills one worker process that holds counted shards:
 * the scheduler must count them again and the result must not lose a file.
 * Checks:
 *   - the merged, pruned, weighted matrix equals the local build's (`undertone export`) entry by
 *     entry, bit for bit, with the same terms and files in the same order;
 *   - every one of the k singular values of Dask's svd_compressed is within 1% of the index's;
 *   - search and Nearby after `import-model` against the local index: for search the mean share
 *     of top-10 files in common is at least 0.9; for both, the share in common and the share of
 *     equal positions are no worse than those of the local index with another seed (the
 *     randomized SVD's own run-to-run spread) minus 0.1;
 *   - a model file damaged in a byte is refused by import-model, which keeps the saved index.
 */
import { spawn, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseMatrixMarket } from '../../src/core/matrix/matrixMarket.js';
import { indexFileFor } from '../../src/node/cacheDir.js';
import { loadIndex } from '../../src/node/persist.js';
import { runCli } from '../helpers/cliRunner.js';
import { loadCollection, REPO_ROOT } from '../helpers/shared.js';

const PYTHON = '/usr/bin/python3';
const names = ['adi', 'cacm', 'cisi', 'cran'] as const;
const collections = names.map((n) => loadCollection(n));

/** The engine must be there: a check that cannot run is a failure, not a skip (.ci/run installs it). */
function requireDask(): void {
  const r = spawnSync(PYTHON, ['-c', 'import dask.array, distributed, scipy.sparse'], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`Dask is missing (${PYTHON}): apt-get install python3-dask python3-distributed python3-scipy`);
}

interface Report {
  files: number;
  skipped: number;
  terms: number;
  k: number;
  workers: number;
  killedWorker: boolean;
  countAttempts: number;
  shares: number;
  singularValues: number[];
  seconds: Record<string, number>;
}

function entries(path: string): { rows: number; cols: number; map: Map<number, number> } {
  const m = parseMatrixMarket(readFileSync(path, 'utf8'));
  if (m.format !== 'coordinate') throw new Error('expected a coordinate matrix');
  const map = new Map<number, number>();
  for (let t = 0; t < m.values.length; t++) map.set(m.rowIndex[t] * m.cols + m.colIndex[t], m.values[t]);
  return { rows: m.rows, cols: m.cols, map };
}

function agreement(a: Map<string, string[]>, b: Map<string, string[]>): { positional: number; overlap: number } {
  let same = 0,
    common = 0,
    total = 0;
  for (const [id, x] of a) {
    const y = b.get(id) ?? [];
    for (let i = 0; i < x.length; i++) if (x[i] === y[i]) same++;
    common += x.filter((p) => y.includes(p)).length;
    total += x.length;
  }
  return { positional: same / total, overlap: common / total };
}

describe('cluster job on a local Dask cluster', () => {
  let dir: string, ws: string, cache: string, report: Report;
  const queries = collections[2].queries.slice(0, 40);
  const probes: string[] = [];
  const ask = async (cacheDir: string, extra: string[] = []): Promise<Map<string, string[]>> => {
    const r = await runCli(
      ['ask', ws, '--queries', join(dir, 'q.jsonl'), '--json', '--top', '10', '--quiet', '--cache-dir', cacheDir, ...extra],
      [],
    );
    expect(r.code, r.err).toBe(0);
    return new Map(
      r.out.split('\n').map((line) => {
        const o = JSON.parse(line) as { id: string; results: { path: string }[] };
        return [o.id, o.results.map((h) => h.path)];
      }),
    );
  };
  // Nearby from the saved index the commands above brought up to date (one load, not one per file).
  const nearby = async (cacheDir: string): Promise<Map<string, string[]>> => {
    const loaded = await loadIndex(indexFileFor(ws, cacheDir));
    if (loaded.status !== 'ok') throw new Error(`no saved index in ${cacheDir}`);
    return new Map(probes.map((p) => [p, loaded.index.nearby(p, { top: 10 }).map((h) => h.path)]));
  };

  beforeAll(async () => {
    requireDask();
    dir = mkdtempSync(join(tmpdir(), 'undertone-cluster-'));
    ws = join(dir, 'ws');
    cache = join(dir, 'cache');
    names.forEach((name, i) => {
      mkdirSync(join(ws, name), { recursive: true });
      for (const d of collections[i].docs) writeFileSync(join(ws, name, `${d.id}.txt`), d.text);
    });
    for (let i = 0; i < 20; i++) probes.push(`cisi/${collections[2].docs[i * 70].id}.txt`);
    writeFileSync(join(dir, 'q.jsonl'), queries.map((q) => JSON.stringify({ id: q.id, text: q.text })).join('\n'));
    // The command line the workers run, bundled as scripts/build.mjs bundles it.
    await build({
      entryPoints: [join(REPO_ROOT, 'src/cli/bin.ts')],
      outfile: join(dir, 'cli.js'),
      bundle: true,
      platform: 'node',
      target: 'node20',
      format: 'cjs',
      logLevel: 'warning',
    });
    const local = await runCli(['export', ws, '--format', 'mtx', '--out', join(dir, 'export'), '--cache-dir', cache], []);
    expect(local.code, local.err).toBe(0);
    const job = spawn(
      PYTHON,
      [
        '-m',
        'undertone_cluster',
        ws,
        '--out',
        join(dir, 'org.model'),
        '--undertone',
        `${process.execPath} ${join(dir, 'cli.js')}`,
        '--local-workers',
        '2',
        '--shard-files',
        '900',
        '--dump-matrix',
        join(dir, 'dump'),
        '--report',
        join(dir, 'report.json'),
        '--drill-kill-worker-after',
        '2',
      ],
      { cwd: join(REPO_ROOT, 'cluster'), stdio: ['ignore', 'ignore', 'pipe'] },
    );
    let stderr = '';
    job.stderr.on('data', (b: Buffer) => (stderr += b.toString()));
    const code = await new Promise<number | null>((res) => job.on('close', res));
    expect(code, stderr.slice(-3000)).toBe(0);
    report = JSON.parse(readFileSync(join(dir, 'report.json'), 'utf8')) as Report;
  }, 600_000);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('counts every file on two workers, recounting the shards of a killed worker', () => {
    expect(report.workers).toBe(2);
    expect(report.files).toBe(6146);
    expect(report.skipped).toBe(0);
    expect(report.killedWorker).toBe(true);
    expect(report.countAttempts).toBeGreaterThan(report.shares);
  });

  it('merges, prunes and weights to exactly the local build’s matrix', () => {
    const read = (d: string, f: string) => readFileSync(join(dir, d, f), 'utf8');
    expect(read('dump', 'terms.txt')).toBe(read('export', 'terms.txt'));
    expect(read('dump', 'files.txt')).toBe(read('export', 'files.txt'));
    const ours = entries(join(dir, 'export', 'matrix.mtx'));
    const theirs = entries(join(dir, 'dump', 'matrix.mtx'));
    expect([theirs.rows, theirs.cols]).toEqual([ours.rows, ours.cols]);
    expect(theirs.map.size).toBe(ours.map.size);
    let differ = 0;
    for (const [key, v] of ours.map) if (theirs.map.get(key) !== v) differ++;
    expect(differ).toBe(0);
  });

  it('finds all k singular values within 1% of the index’s', () => {
    const local = readFileSync(join(dir, 'export', 'singular-values.txt'), 'utf8')
      .trim()
      .split('\n')
      .map(Number);
    expect(report.singularValues.length).toBe(local.length);
    const worst = Math.max(...local.map((s, i) => Math.abs(report.singularValues[i] - s) / s));
    expect(worst).toBeLessThan(0.01);
  });

  it('refuses a damaged model file and keeps the saved index', async () => {
    const bytes = readFileSync(join(dir, 'org.model'));
    const damaged = Buffer.from(bytes);
    damaged[Math.floor(bytes.length / 3)] ^= 0x10;
    writeFileSync(join(dir, 'damaged.model'), damaged);
    const r = await runCli(['import-model', ws, '--model', join(dir, 'damaged.model'), '--cache-dir', cache], []);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/checksum mismatch/);
    const still = await runCli(['index', ws, '--cache-dir', cache, '--json'], []);
    expect(JSON.parse(still.out).outcome).toBe('unchanged');
  });

  it('search and Nearby in the shared model agree with the local index', async () => {
    const before = await ask(cache);
    const nearBefore = await nearby(cache);
    // The index's own spread: the same files with another seed of the randomized SVD.
    const other = join(dir, 'cache-seed');
    const seeded = await ask(other, ['--seed', '7']);
    const nearSeeded = await nearby(other);
    const imp = await runCli(['import-model', ws, '--model', join(dir, 'org.model'), '--cache-dir', cache, '--json'], []);
    expect(imp.code, imp.err).toBe(0);
    expect(JSON.parse(imp.out).k).toBe(report.k);
    const after = await ask(cache);
    const nearAfter = await nearby(cache);
    const search = agreement(before, after);
    const near = agreement(nearBefore, nearAfter);
    const searchSpread = agreement(before, seeded);
    const nearSpread = agreement(nearBefore, nearSeeded);
    const figures = JSON.stringify({ search, searchSpread, near, nearSpread });
    expect(search.overlap, figures).toBeGreaterThanOrEqual(0.9);
    // Nearby is pure LSI, so it moves with the SVD's run-to-run spread; the margin (0.1) is our
    // choice (20 probe files: one file more or less in common moves the share by 0.005).
    expect(near.overlap, figures).toBeGreaterThanOrEqual(nearSpread.overlap - 0.1);
    expect(search.positional, figures).toBeGreaterThanOrEqual(searchSpread.positional - 0.1);
    expect(near.positional, figures).toBeGreaterThanOrEqual(nearSpread.positional - 0.1);
    mkdirSync(join(REPO_ROOT, 'test-output'), { recursive: true });
    writeFileSync(join(REPO_ROOT, 'test-output', 'cluster-agreement.json'), `${figures}\n`);
  }, 300_000);
});
