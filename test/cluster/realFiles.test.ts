/**
 * The cluster job (cluster/undertone_cluster) on a few thousand real files, on a local Dask cluster
 * with two worker processes (Debian's python3-dask and python3-distributed 2022.12). The public
 * test collections of clusterJob.test.ts are abstracts; this check runs the same job over real
 * documentation files of two kinds, written out with their own relative paths:
 *   - the CMake 3.25 reference manual as Debian's cmake-doc package ships it (1,906 pages, text
 *     extracted; test/fixtures/cmake-doc/README.md has the provenance);
 *   - 1,695 real files (one of them binary to the index) of ten Debian packages' manuals and info pages (coreutils, gettext,
 *     diffutils, findutils, grep, sed, util-linux, procps, gawk, manpages; the planted edited
 *     copies of that fixture are left out; test/fixtures/lookalike-retellings/README.md).
 * What is compared, as in clusterJob.test.ts: the merged, pruned, weighted matrix against the
 * local build's export (entry by entry, bit for bit, the same terms and files in the same order),
 * and the k singular values against the local index's (each within 1%; both sides are randomized
 * subspace iterations with the default 5 power steps from different random starts, Halko et al.
 * 2011). The 1% bound is the issue's target.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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
import { REPO_ROOT } from '../helpers/shared.js';

const K = '40';

interface Doc {
  path: string;
  text: string;
}

function realFiles(): Doc[] {
  const fixtures = join(REPO_ROOT, 'test', 'fixtures');
  const cmake = gunzipSync(readFileSync(join(fixtures, 'cmake-doc', 'docs.jsonl.gz')))
    .toString('utf8')
    .split('\n')
    .filter((l) => l.trim() !== '')
    .map((l) => JSON.parse(l) as { id: string; text: string })
    .map((d) => ({ path: `cmake/${d.id.replace(/\.html$/, '.txt')}`, text: d.text }));
  const corpus = JSON.parse(gunzipSync(readFileSync(join(fixtures, 'lookalike-retellings', 'corpus.json.gz'))).toString('utf8')) as {
    files: { id: string; source: string; text: string }[];
  };
  const debian = corpus.files
    .filter((f) => f.source !== 'planted')
    .map((f) => ({ path: `debian/${f.id.endsWith('.txt') ? f.id : `${f.id}.txt`}`, text: f.text }));
  return [...cmake, ...debian];
}

describe('cluster job on a few thousand real documentation files', () => {
  let dir: string, ws: string;
  let report: { files: number; skipped: number; workers: number; k: number; singularValues: number[] };
  const docs = realFiles();

  beforeAll(async () => {
    requireDask();
    dir = mkdtempSync(join(tmpdir(), 'undertone-cluster-real-'));
    ws = join(dir, 'ws');
    for (const d of docs) {
      const file = join(ws, d.path);
      mkdirSync(dirname(file), { recursive: true });
      writeFileSync(file, d.text);
    }
    await bundleCli(join(dir, 'cli.js'));
    const { code, stderr } = await runClusterJob([
      ...localJobArgs(ws, dir),
      '--shard-files',
      '1000',
      '--k',
      K,
      '--dump-matrix',
      join(dir, 'dump'),
      '--report',
      join(dir, 'report.json'),
    ]);
    expect(code, stderr.slice(-3000)).toBe(0);
    report = JSON.parse(readFileSync(join(dir, 'report.json'), 'utf8')) as typeof report;
    const local = await runCli(
      ['export', ws, '--format', 'mtx', '--out', join(dir, 'export'), '--cache-dir', join(dir, 'cache'), '--k', K],
      [],
    );
    expect(local.code, local.err).toBe(0);
  }, 900_000);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('counts every file on two workers', () => {
    expect(docs.length).toBeGreaterThan(3000);
    expect(report.workers).toBe(2);
    // Files with a NUL byte in their first 8,000 bytes are binary to the index (git's rule) and
    // are skipped by the job and the local build alike: one info index page of findutils here.
    const binary = docs.filter((d) => Buffer.from(d.text).subarray(0, 8000).includes(0)).length;
    expect(binary).toBe(1);
    expect(report.skipped).toBe(binary);
    expect(report.files).toBe(docs.length - binary);
  });

  it('merges, prunes and weights to exactly the local build’s matrix', () => {
    const read = (d: string, f: string) => readFileSync(join(dir, d, f), 'utf8');
    expect(read('dump', 'terms.txt')).toBe(read('export', 'terms.txt'));
    expect(read('dump', 'files.txt')).toBe(read('export', 'files.txt'));
    expect(read('export', 'files.txt').trim().split('\n').length).toBe(report.files);
    const ours = matrixEntries(join(dir, 'export', 'matrix.mtx'));
    const theirs = matrixEntries(join(dir, 'dump', 'matrix.mtx'));
    expect([theirs.rows, theirs.cols]).toEqual([ours.rows, ours.cols]);
    expect(theirs.map.size).toBe(ours.map.size);
    expect(differingEntries(ours.map, theirs.map)).toBe(0);
  });

  it('finds all k singular values within 1% of the index’s', () => {
    const local = readSingularValues(join(dir, 'export', 'singular-values.txt'));
    expect(report.k).toBe(Number(K));
    expect(report.singularValues.length).toBe(local.length);
    expect(worstRelativeDifference(local, report.singularValues)).toBeLessThan(0.01);
  });
});
