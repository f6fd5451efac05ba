/**
 * `undertone export` and `undertone import-factors` end to end on the ADI collection
 * (test/fixtures/corpora/adi, 82 abstracts written out as files). Reference library: scipy
 * (Debian's python3-scipy) reads the export with scipy.io.mmread and decomposes it with ARPACK
 * (scipy.sparse.linalg.svds); its factors, imported back, must reproduce our search results.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseMatrixMarket } from '../../src/core/matrix/matrixMarket.js';
import { runCli } from '../helpers/cliRunner.js';
import { loadCollection, referencePython } from '../helpers/shared.js';

const adi = loadCollection('adi');

describe('undertone export / import-factors', () => {
  let dir: string, folder: string, cache: string, out: string;
  const run = (...args: string[]) => runCli(args, ['--cache-dir', cache]);
  const rankings = async (): Promise<Map<string, string[]>> => {
    const r = await run('ask', folder, '--queries', join(dir, 'q.jsonl'), '--json', '--top', '10');
    expect(r.code).toBe(0);
    return new Map(
      r.out.split('\n').map((line) => {
        const o = JSON.parse(line) as { id: string; results: { path: string }[] };
        return [o.id, o.results.map((h) => h.path)];
      }),
    );
  };

  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'undertone-export-'));
    folder = join(dir, 'ws');
    cache = join(dir, 'cache');
    out = join(dir, 'export');
    mkdirSync(folder, { recursive: true });
    for (const d of adi.docs) writeFileSync(join(folder, `${d.id}.txt`), d.text);
    writeFileSync(join(dir, 'q.jsonl'), adi.queries.map((q) => JSON.stringify({ id: q.id, text: q.text })).join('\n'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('writes the weighted matrix (terms × files), terms.txt and files.txt', async () => {
    const r = await run('export', folder, '--format', 'mtx', '--out', out);
    expect(r.code).toBe(0);
    const m = parseMatrixMarket(readFileSync(join(out, 'matrix.mtx'), 'utf8'));
    const terms = readFileSync(join(out, 'terms.txt'), 'utf8').trimEnd().split('\n');
    const files = readFileSync(join(out, 'files.txt'), 'utf8').trimEnd().split('\n');
    expect([m.rows, m.cols]).toEqual([terms.length, files.length]);
    expect(files.length).toBe(adi.docs.length);
    expect(new Set(terms).size).toBe(terms.length);
    // Each file's column is unit length (documents are L2-normalised after weighting).
    if (m.format !== 'coordinate') throw new Error('expected coordinate format');
    const norms = new Float64Array(m.cols);
    m.values.forEach((v, t) => (norms[m.colIndex[t]] += v * v));
    for (const n of norms) expect(n === 0 || Math.abs(n - 1) < 1e-12).toBe(true);
    expect((await run('export', folder, '--format', 'csv', '--out', out)).code).toBe(1);
    expect((await run('export', folder)).code).toBe(1);
  });

  it('round-trips through scipy, whose ARPACK factors reproduce our search results', async () => {
    const python = referencePython();
    const before = await rankings();
    const k = Number(/k=(\d+)/.exec((await run('index', folder)).err)![1]);
    const script = `
import sys, json, numpy as np, scipy.io
from scipy.sparse.linalg import svds
d = sys.argv[1]; k = int(sys.argv[2])
a = scipy.io.mmread(d + '/matrix.mtx').tocsr()
u, s, vt = svds(a, k=k, random_state=0)
scipy.io.mmwrite(d + '/U.mtx', u); scipy.io.mmwrite(d + '/V.mtx', vt.T)
np.savetxt(d + '/S.txt', s)
ours = np.loadtxt(d + '/singular-values.txt')
exact = np.sort(s)[::-1]
rel = np.abs(exact - ours[:k]) / exact
print(json.dumps({'shape': list(a.shape), 'nnz': int(a.nnz), 'sumsq': float(a.multiply(a).sum()), 'maxrel': float(rel.max()), 'maxrelHalf': float(rel[:k // 2].max())}))
`;
    const py = spawnSync(python, ['-c', script, out, String(k)], { encoding: 'utf8' });
    expect(py.status, py.stderr).toBe(0);
    const info = JSON.parse(py.stdout) as { shape: number[]; nnz: number; sumsq: number; maxrel: number; maxrelHalf: number };
    const ours = parseMatrixMarket(readFileSync(join(out, 'matrix.mtx'), 'utf8'));
    expect(info.shape).toEqual([ours.rows, ours.cols]);
    if (ours.format !== 'coordinate') throw new Error('expected coordinate format');
    expect(info.nnz).toBe(ours.values.length);
    expect(Math.abs(info.sumsq - ours.values.reduce((s, v) => s + v * v, 0))).toBeLessThan(1e-9);
    // Our randomized SVD (default options) against ARPACK on the same matrix: every one of the k
    // values within the project's 1% target, the leading half far inside it.
    expect(info.maxrelHalf).toBeLessThan(0.001);
    expect(info.maxrel).toBeLessThan(0.01);

    const imported = await run('import-factors', folder, '--u', join(out, 'U.mtx'), '--s', join(out, 'S.txt'), '--v', join(out, 'V.mtx'));
    expect(imported.code, imported.err).toBe(0);
    expect(imported.err).toMatch(new RegExp(`imported k=${k} factors`));
    const after = await rankings();
    // Nearly always the same best file, and nearly the same top 10 (our tolerance for two solvers).
    let overlap = 0;
    let sameTop = 0;
    for (const [id, list] of before) {
      const other = after.get(id)!;
      if (other[0] === list[0]) sameTop++;
      overlap += list.filter((p) => other.includes(p)).length / list.length;
    }
    console.log(
      `ARPACK factors vs ours on ADI (k=${k}): same top file for ${sameTop}/${before.size} queries, mean top-10 overlap ${(overlap / before.size).toFixed(3)}, worst σ error ${(info.maxrel * 100).toFixed(2)}%`,
    );
    expect(sameTop / before.size).toBeGreaterThan(0.9);
    expect(overlap / before.size).toBeGreaterThan(0.9);
  });

  it('refuses factors for a file list that no longer matches the index', async () => {
    const files = join(out, 'files.txt');
    const lines = readFileSync(files, 'utf8').trimEnd().split('\n');
    writeFileSync(join(out, 'files-changed.txt'), [...lines.slice(1), lines[0]].join('\n'));
    const r = await run(
      'import-factors',
      folder,
      '--u',
      join(out, 'U.mtx'),
      '--s',
      join(out, 'S.txt'),
      '--v',
      join(out, 'V.mtx'),
      '--files',
      join(out, 'files-changed.txt'),
    );
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/does not match the saved index's files/);
    expect((await run('import-factors', folder, '--u', join(out, 'U.mtx'))).code).toBe(1);
  });
});
