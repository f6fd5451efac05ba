/**
 * The cluster job (cluster/undertone_cluster) end to end on a local Dask cluster with two worker
 * processes (Debian's python3-dask and python3-distributed 2022.12), against the local index of
 * the same files. Material: two public test collections of test/fixtures/corpora (ADI and CISI:
 * 1,542 abstracts written out as files in two folders; the job's steps do not depend on the size,
 * so the smallest collection that has dev queries and several shards proves the same as the four
 * collections did, in a fraction of the time), the first 40 CISI queries as dev queries and 20
 * CISI files as Nearby probes. k = 60 concepts (fixed, so the run stays short).
 * During counting the job's drill kills one worker process that holds counted shards: the
 * scheduler must count them again and the result must not lose a file.
 * What is compared:
 *   - the merged, pruned, weighted matrix against the local build's (`undertone export`): entry by
 *     entry, bit for bit, with the same terms and files in the same order;
 *   - the k singular values against the local index's: each within 1%;
 *   - rankings. Both sides run randomized subspace iteration (Halko et al. 2011) from different
 *     random starts; after 5 power steps the top-k subspace is still moving (the trailing
 *     directions differ from run to run, and so do near-tied rankings: two local builds with
 *     different seeds share only about 0.7 of their top-10 positions). So the cluster job runs
 *     with --tolerance 1e-3: power steps until the top-k subspace moves by less than 1e-3 (sine
 *     of the largest principal angle between two steps), and the local index is built with as
 *     many power steps (--power-iterations, the number the job reports). Then both hold the same
 *     rank-k subspace, and search (40 dev queries) and Nearby (20 files) after `import-model`
 *     must agree with the local index on at least 9 of 10 top-10 positions on average (the
 *     issue's target), as must a local build with another seed (the index's own run-to-run
 *     spread at that setting);
 *   - a model file damaged in a byte is refused by import-model, which keeps the saved index.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { indexFileFor } from '../../src/node/cacheDir.js';
import { loadIndex } from '../../src/node/persist.js';
import { runCli } from '../helpers/cliRunner.js';
import {
  bundleCli,
  differingEntries,
  localJobArgs,
  matrixEntries,
  readSingularValues,
  requireDask,
  runClusterJob,
  worstRelativeDifference,
} from '../helpers/clusterHarness.js';
import { loadCollection, REPO_ROOT } from '../helpers/shared.js';

const names = ['adi', 'cisi'] as const;
const K = '60';
const collections = names.map((n) => loadCollection(n));

interface Report {
  files: number;
  skipped: number;
  terms: number;
  k: number;
  workers: number;
  killedWorker: boolean;
  powerIterations: number;
  subspaceMoves: number[];
  countAttempts: number;
  shares: number;
  singularValues: number[];
  seconds: Record<string, number>;
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
  let dir: string, ws: string, cache: string, report: Report, jobLog: string, localSettings: string[];
  const queries = collections[1].queries.slice(0, 40);
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
    for (let i = 0; i < 20; i++) probes.push(`cisi/${collections[1].docs[i * 70].id}.txt`);
    writeFileSync(join(dir, 'q.jsonl'), queries.map((q) => JSON.stringify({ id: q.id, text: q.text })).join('\n'));
    // The command line the workers run, bundled as scripts/build.mjs bundles it.
    await bundleCli(join(dir, 'cli.js'));
    const { code, stderr } = await runClusterJob([
      ...localJobArgs(ws, dir),
      '--shard-files',
      '600',
      '--k',
      K,
      '--tolerance',
      '1e-3',
      '--dump-matrix',
      join(dir, 'dump'),
      '--report',
      join(dir, 'report.json'),
      '--drill-kill-worker-after',
      '1',
    ]);
    expect(code, stderr.slice(-3000)).toBe(0);
    jobLog = stderr;
    report = JSON.parse(readFileSync(join(dir, 'report.json'), 'utf8')) as Report;
    // The local build with the same k and as many power steps as the job needed.
    localSettings = ['--k', K, '--power-iterations', String(report.powerIterations)];
    const local = await runCli(['export', ws, '--format', 'mtx', '--out', join(dir, 'export'), '--cache-dir', cache, ...localSettings], []);
    expect(local.code, local.err).toBe(0);
  }, 600_000);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('counts every file on two workers, recounting the shards of a killed worker', () => {
    expect(report.workers).toBe(2);
    expect(report.files).toBe(collections[0].docs.length + collections[1].docs.length);
    expect(report.skipped).toBe(0);
    expect(report.killedWorker).toBe(true);
    expect(report.countAttempts).toBeGreaterThan(report.shares);
    // The recount is reported, not silent.
    expect(jobLog).toMatch(/counted again after a worker was lost/);
  });

  it('merges, prunes and weights to exactly the local build’s matrix', () => {
    const read = (d: string, f: string) => readFileSync(join(dir, d, f), 'utf8');
    expect(read('dump', 'terms.txt')).toBe(read('export', 'terms.txt'));
    expect(read('dump', 'files.txt')).toBe(read('export', 'files.txt'));
    const ours = matrixEntries(join(dir, 'export', 'matrix.mtx'));
    const theirs = matrixEntries(join(dir, 'dump', 'matrix.mtx'));
    expect([theirs.rows, theirs.cols]).toEqual([ours.rows, ours.cols]);
    expect(theirs.map.size).toBe(ours.map.size);
    expect(differingEntries(ours.map, theirs.map)).toBe(0);
  });

  it('goes on with power steps until the top-k subspace settles', () => {
    expect(report.k).toBe(Number(K));
    expect(report.subspaceMoves.at(-1)).toBeLessThan(1e-3);
    expect(report.subspaceMoves.length).toBe(report.powerIterations);
  });

  it('finds all k singular values within 1% of the index’s', () => {
    const local = readSingularValues(join(dir, 'export', 'singular-values.txt'));
    expect(report.singularValues.length).toBe(local.length);
    expect(worstRelativeDifference(local, report.singularValues)).toBeLessThan(0.01);
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
    const seeded = await ask(other, ['--seed', '7', ...localSettings]);
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
    const figures = JSON.stringify({ powerIterations: report.powerIterations, search, searchSpread, near, nearSpread });
    // The target: 9 of 10 top-10 positions, for the cluster model and for another seed.
    expect(search.positional, figures).toBeGreaterThanOrEqual(0.9);
    expect(near.positional, figures).toBeGreaterThanOrEqual(0.9);
    expect(searchSpread.positional, figures).toBeGreaterThanOrEqual(0.9);
    expect(nearSpread.positional, figures).toBeGreaterThanOrEqual(0.9);
    mkdirSync(join(REPO_ROOT, 'test-output'), { recursive: true });
    writeFileSync(join(REPO_ROOT, 'test-output', 'cluster-agreement.json'), `${figures}\n`);
  }, 300_000);
});
