/**
 * The parallel thread pool with real worker threads (the bundled parallelWorker entry): threaded
 * products and tokenizing must give exactly what the single-threaded code gives. References: the
 * serial executor and the plain tokenize + countTerms pipeline.
 */
import { build } from 'esbuild';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { modelMatrix } from '../../../src/core/index/model/conceptModel.js';
import { countTerms, Vocabulary } from '../../../src/core/counting/termCounts.js';
import { serialExecutor } from '../../../src/core/matrix/executor.js';
import { SectionLists } from '../../../src/core/sections/sectionLists.js';
import { randomizedSvd } from '../../../src/core/svd/randomizedSvd.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { countFilesInParallel } from '../../../src/node/parallel/parallelCount.js';
import { countFilesSorted } from '../../../src/node/parallel/sortedCount.js';
import { WorkerPool } from '../../../src/node/parallel/workerPool.js';
import { loadCollection, REPO_ROOT } from '../../helpers/shared.js';

const cisi = loadCollection('cisi');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-pool-'));
const workerScript = join(tmp, 'parallelWorker.js');
let pool: WorkerPool | undefined;

beforeAll(async () => {
  await build({
    bundle: true,
    platform: 'node',
    format: 'cjs',
    absWorkingDir: REPO_ROOT,
    logLevel: 'error',
    entryPoints: ['src/node/parallel/parallelWorker.ts'],
    outfile: workerScript,
  });
  pool = WorkerPool.start({ threads: 2, workerScript });
});

afterAll(async () => {
  await pool?.close();
  rmSync(tmp, { recursive: true, force: true });
});

const bagOf = (vocab: Vocabulary, ids: Int32Array, counts: Float32Array): Map<string, number> =>
  new Map(Array.from(ids, (id, i) => [vocab.termOf(id), counts[i]]));

/** The first `docs` CISI documents built serially at rank k, and their weighted matrix. */
function cisiMatrix(docs: number, k: number) {
  const builder = new IndexBuilder({ k });
  for (const d of cisi.docs.slice(0, docs)) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = builder.build({ executor: serialExecutor });
  const m = modelMatrix(
    index.model,
    index.slots().map((s) => s!.terms),
  );
  return { builder, index, m };
}

describe('worker pool', () => {
  it('bounds each worker’s young generation below V8’s default (48 MB on 64-bit systems, from memory)', () => {
    const p = WorkerPool.start({ threads: 2, workerScript })!;
    try {
      for (const w of p.workers) expect(w.resourceLimits?.maxYoungGenerationSizeMb).toBeLessThan(48);
    } finally {
      void p.close();
    }
  });

  it('starts no threads when one thread is asked for', () => {
    expect(WorkerPool.start({ threads: 1, workerScript })).toBeUndefined();
  });

  it('computes the SVD on two threads with the same bits as on one', () => {
    const { builder, index, m } = cisiMatrix(800, 60);
    const one = randomizedSvd(m, { k: 60, executor: serialExecutor });
    const ex = pool!.executor();
    expect(ex.threads).toBe(2);
    const two = randomizedSvd(m, { k: 60, executor: ex });
    expect(Buffer.from(two.u.buffer).equals(Buffer.from(one.u.buffer))).toBe(true);
    expect(Buffer.from(two.v.buffer).equals(Buffer.from(one.v.buffer))).toBe(true);
    expect(Array.from(two.s)).toEqual(Array.from(one.s));
    // A whole build through the threads gives the same document vectors as the serial build.
    const threaded = builder.build({ executor: ex });
    expect(
      Buffer.from(threaded.vectors().buffer, threaded.vectors().byteOffset, threaded.vectors().byteLength).equals(
        Buffer.from(index.vectors().buffer, index.vectors().byteOffset, index.vectors().byteLength),
      ),
    ).toBe(true);
  });

  it('forms a Gram product of many reduction blocks a few blocks per job, with the same bits as on one thread', () => {
    // 20,000 rows: 20 blocks of REDUCTION_BLOCK_ROWS, more than one job's worth on two threads.
    const rows = 20_000;
    const l = 9;
    const ex = pool!.executor();
    const a = ex.float64(rows * l);
    const b = ex.float64(rows * l);
    serialExecutor.gaussian(a, rows, l, 7);
    serialExecutor.gaussian(b, rows, l, 8);
    for (const [x, y] of [
      [a, a],
      [a, b],
    ]) {
      const xs = Float64Array.from(x);
      const one = serialExecutor.cross(xs, x === y ? xs : Float64Array.from(y), rows, l);
      const two = ex.cross(x, y, rows, l);
      expect(Buffer.from(two.buffer).equals(Buffer.from(one.buffer))).toBe(true);
    }
  });

  it('multiplies by an f32 block where it lies (spmm_x32, the sections fold) with the same bits as on one thread', () => {
    // CISI's weighted matrix (documents × terms) times a seeded f32 block over its terms.
    const { m } = cisiMatrix(400, 20);
    const l = 13;
    const ex = pool!.executor();
    const x = ex.float32(m.cols * l);
    const g = new Float64Array(m.cols * l);
    serialExecutor.gaussian(g, m.cols, l, 3);
    x.set(g);
    const one = new Float64Array(m.rows * l);
    serialExecutor.spmm(m, Float32Array.from(x), l, one, true);
    const mt = { ...m, indptr: ex.int32(m.indptr.length), indices: ex.int32(m.indices.length), values: ex.float64(m.values.length) };
    mt.indptr.set(m.indptr);
    mt.indices.set(m.indices);
    mt.values.set(m.values);
    const two = ex.float64(m.rows * l);
    ex.spmm(mt, x, l, two, true);
    expect(Buffer.from(two.buffer, two.byteOffset, two.byteLength).equals(Buffer.from(one.buffer))).toBe(true);
    expect(one.some((v) => v !== 0)).toBe(true);
  });

  it('multiplies in single precision (spmm_single, the power iterations) with the same bits as on one thread', () => {
    const { m } = cisiMatrix(400, 20);
    const l = 11;
    const ex = pool!.executor();
    const g = new Float64Array(m.cols * l);
    serialExecutor.gaussian(g, m.cols, l, 4);
    const x = Float32Array.from(g);
    const one = new Float32Array(m.rows * l);
    serialExecutor.spmmSingle(m, x, l, one);
    const two = ex.float32(m.rows * l);
    ex.spmmSingle(m, x, l, two);
    expect(Buffer.from(two.buffer, two.byteOffset, two.byteLength).equals(Buffer.from(one.buffer))).toBe(true);
    expect(one.some((v) => v !== 0)).toBe(true);
  });

  it('scales and normalises many rows (unit_rows, the folds) with the same bits as on one thread', () => {
    // 2,049 rows × 200: above the size from which the rows are shared out, an odd row count.
    const [rows, k] = [2049, 200];
    const ex = pool!.executor();
    const y = ex.float64(rows * k);
    serialExecutor.gaussian(y, rows, k, 6);
    const s = Float64Array.from({ length: k }, (_, c) => 1 / (1 + c));
    const one = new Float32Array(rows * k);
    serialExecutor.unitRows(y, rows, k, s, one);
    const two = ex.float32(rows * k);
    ex.unitRows(y, rows, k, s, two);
    expect(Buffer.from(two.buffer, two.byteOffset, two.byteLength).equals(Buffer.from(one.buffer))).toBe(true);
    expect(one.some((v) => v !== 0)).toBe(true);
  });

  it('files many rows under a two-level quantizer (file_rows, the save) with the same lists as on one thread', () => {
    // 5,003 rows × 48 (above the size from which the rows are shared out; an odd row count), and
    // lists trained on them as the section lists train (SectionLists.train, 71 lists in 9 groups).
    const [n, k] = [5003, 48];
    const ex = pool!.executor();
    const rows = new Float64Array(n * k);
    serialExecutor.gaussian(rows, n, k, 8);
    const f32 = new Float32Array(n * k);
    for (let r = 0; r < n; r++) {
      const norm = Math.hypot(...rows.subarray(r * k, (r + 1) * k));
      for (let c = 0; c < k; c++) f32[r * k + c] = rows[r * k + c] / norm;
    }
    const lists = SectionLists.train(k, { n, row: (j) => ({ block: f32, at: j * k }) });
    const one = new Int32Array(n);
    lists.fileRows(f32, 0, n, one, 0);
    const two = new Int32Array(n).fill(-1);
    lists.fileRowsOn(ex, f32, 0, n, two, 0);
    expect(Array.from(two)).toEqual(Array.from(one));
    expect(new Set(one).size).toBeGreaterThan(lists.lists / 2);
  });

  it('shares a large column copy out by rows (f64, and cast either way) with the same numbers as a plain loop', () => {
    // 30,001 rows × 5 columns: above the size from which a copy is shared out, an odd row count.
    const rows = 30_001;
    const ex = pool!.executor();
    const src64 = ex.float64(rows * 9);
    serialExecutor.gaussian(src64, rows, 9, 5);
    const src32 = ex.float32(rows * 9);
    src32.set(src64);
    for (const [src, dst] of [
      [src64, ex.float64(rows * 6)],
      [src64, ex.float32(rows * 6)],
      [src32, ex.float64(rows * 6)],
    ] as const) {
      const run = { src, srcStride: 9, srcAt: 3, dst, dstStride: 6, dstAt: 1, w: 5, rows };
      expect(ex.copyColumns!(run)).toBe(true);
      // What typed arrays store for each number (f64 into f32 rounds to nearest; f32 into f64 is exact).
      const want = dst instanceof Float32Array ? new Float32Array(rows * 6) : new Float64Array(rows * 6);
      for (let i = 0; i < rows; i++) for (let j = 0; j < 5; j++) want[i * 6 + 1 + j] = src[i * 9 + 3 + j];
      for (let i = 0; i < rows; i++) {
        want[i * 6] = dst[i * 6];
      }
      expect(Buffer.from(dst.buffer, dst.byteOffset, dst.byteLength).equals(Buffer.from(want.buffer))).toBe(true);
    }
  });

  it('a pool for products starts only the workers its executor uses, with the same bits as on one thread', async () => {
    const products = WorkerPool.start({ threads: 2, workerScript }, true)!;
    try {
      expect(products.workers.length).toBe(1);
      const builder = new IndexBuilder({ k: 20 });
      for (const d of cisi.docs.slice(0, 300)) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
      const index = builder.build({ executor: serialExecutor });
      const m = modelMatrix(
        index.model,
        index.slots().map((s) => s!.terms),
      );
      const ex = products.executor();
      expect(ex.threads).toBe(2);
      const one = randomizedSvd(m, { k: 20, executor: serialExecutor });
      const two = randomizedSvd(m, { k: 20, executor: ex });
      expect(Buffer.from(two.v.buffer).equals(Buffer.from(one.v.buffer))).toBe(true);
    } finally {
      await products.close();
    }
  });

  it('reads and counts files on threads exactly as tokenize + countTerms do, and reports odd files', async () => {
    const dir = join(tmp, 'files');
    mkdirSync(dir, { recursive: true });
    const docs = cisi.docs.slice(0, 300);
    const jobs = docs.map((d, i) => {
      const p = join(dir, `${i}.txt`);
      writeFileSync(p, i % 7 === 0 ? `Ünïcödé ${d.text} naïve café` : d.text);
      return { absPath: p, size: d.text.length };
    });
    writeFileSync(join(dir, 'bin.dat'), Buffer.from([1, 0, 2, 3]));
    writeFileSync(join(dir, 'big.txt'), 'x'.repeat(5000));
    const odd = [
      { absPath: join(dir, 'bin.dat'), size: 4 },
      { absPath: join(dir, 'big.txt'), size: 5000 },
      { absPath: join(dir, 'missing.txt'), size: 1 },
    ];
    const all = [...jobs, ...odd];
    const options = { tokenize: {}, maxFileBytes: 4096 };
    const want = (i: number) => {
      const vocab = new Vocabulary();
      const text = i % 7 === 0 ? `Ünïcödé ${docs[i].text} naïve café` : docs[i].text;
      const t = countTerms(tokenize(text), vocab, true);
      return bagOf(vocab, t.termIds, t.counts);
    };
    const vocab = new Vocabulary();
    const seen = new Map<number, string>();
    await countFilesInParallel(pool!, all, vocab, options, (i, o) => {
      seen.set(i, o.kind);
      if (o.kind === 'text') expect(bagOf(vocab, o.terms.termIds, o.terms.counts)).toEqual(want(i));
    });
    expect(seen.size).toBe(all.length);
    expect([seen.get(300), seen.get(301), seen.get(302)]).toEqual(['binary', 'too-large', 'unreadable']);
    const sorted = await countFilesSorted(pool!, all, options);
    const terms = sorted.vocab.terms;
    for (let i = 1; i < terms.length; i++) expect(terms[i - 1] < terms[i]).toBe(true);
    sorted.outcomes.forEach((o, i) => {
      if (o.kind === 'text') expect(bagOf(sorted.vocab, o.terms.termIds, o.terms.counts)).toEqual(want(i));
    });
    expect(sorted.outcomes.slice(300).map((o) => o.kind)).toEqual(['binary', 'too-large', 'unreadable']);
    // Each file's ids ascend (IndexBuilder's order), and a second run on the same threads (whose
    // kept counts were handed over) gives the same ids and counts.
    const again = await countFilesSorted(pool!, all, options);
    sorted.outcomes.forEach((o, i) => {
      const b = again.outcomes[i];
      if (o.kind !== 'text' || b.kind !== 'text') return expect(b.kind).toBe(o.kind);
      for (let j = 1; j < o.terms.termIds.length; j++) expect(o.terms.termIds[j]).toBeGreaterThan(o.terms.termIds[j - 1]);
      expect(Array.from(b.terms.termIds)).toEqual(Array.from(o.terms.termIds));
      expect(Array.from(b.terms.counts)).toEqual(Array.from(o.terms.counts));
    });
  });

  it('gives a file without terms arrays of its own, not an empty view holding the counts of its thread', async () => {
    const dir = join(tmp, 'empty-files');
    mkdirSync(dir, { recursive: true });
    // CISI abstracts beside files with nothing to count (blank, punctuation only, digits only).
    const texts = [...cisi.docs.slice(0, 40).map((d) => d.text), '', '  \n\n ... !! --\n', '12 345 6789\n'];
    const jobs = texts.map((t, i) => {
      const p = join(dir, `${i}.txt`);
      writeFileSync(p, t);
      return { absPath: p, size: t.length };
    });
    const sorted = await countFilesSorted(pool!, jobs, { tokenize: {}, maxFileBytes: 1 << 20 });
    const empty = sorted.outcomes.flatMap((o) => (o.kind === 'text' && o.terms.termIds.length === 0 ? [o.terms] : []));
    expect(empty.length).toBeGreaterThanOrEqual(2);
    for (const t of empty) {
      expect(t.termIds.buffer.byteLength).toBe(0);
      expect(t.counts.buffer.byteLength).toBe(0);
    }
    // The others still view their thread's arrays, with their own counts.
    const full = sorted.outcomes.slice(0, 40).map((o) => (o.kind === 'text' ? o.terms : undefined));
    full.forEach((t, i) => {
      const vocab = new Vocabulary();
      const c = countTerms(tokenize(texts[i]), vocab, true);
      expect(bagOf(sorted.vocab, t!.termIds, t!.counts)).toEqual(bagOf(vocab, c.termIds, c.counts));
    });
  });
});
