import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { coordinateChunks } from '../../../src/core/matrix/matrixMarket.js';
import { csrFromDense, transposeCsr } from '../../../src/core/matrix/sparse.js';
import { serialExecutor } from '../../../src/core/matrix/executor.js';
import { createRandom } from '../../../src/core/random.js';
import {
  bigSideBlockWidth,
  dropSmallSide,
  finishSvd,
  randomizedSvd,
  randomizedSvdSmallSide,
  type SvdResult,
} from '../../../src/core/svd/randomizedSvd.js';
import { fixturePath, loadCollection, referencePython } from '../../helpers/shared.js';
import { memorySpill } from '../../helpers/memorySpill.js';
import { weightedCorpus } from '../../helpers/weightedCorpus.js';

function maxOrthoError(a: Float64Array, rows: number, k: number): number {
  let worst = 0;
  for (let p = 0; p < k; p++)
    for (let q = p; q < k; q++) {
      let dot = 0;
      for (let i = 0; i < rows; i++) dot += a[i * k + p] * a[i * k + q];
      worst = Math.max(worst, Math.abs(dot - (p === q ? 1 : 0)));
    }
  return worst;
}

function lowRank(rows: number, cols: number, rank: number, seed: number): Float64Array {
  const r = createRandom(seed);
  const a = Array.from({ length: rows * rank }, () => r.normal());
  const b = Array.from({ length: rank * cols }, () => r.normal());
  const m = new Float64Array(rows * cols);
  for (let i = 0; i < rows; i++)
    for (let t = 0; t < rank; t++) for (let j = 0; j < cols; j++) m[i * cols + j] += a[i * rank + t] * b[t * cols + j];
  return m;
}

function reconstruct(res: SvdResult): Float64Array {
  const out = new Float64Array(res.rows * res.cols);
  for (let i = 0; i < res.rows; i++)
    for (let j = 0; j < res.cols; j++) {
      let s = 0;
      for (let c = 0; c < res.k; c++) s += res.u[i * res.k + c] * res.s[c] * res.v[j * res.k + c];
      out[i * res.cols + j] = s;
    }
  return out;
}

describe('randomizedSvd', () => {
  // Published check: Deerwester, Dumais, Furnas, Landauer & Harshman (1990), JASIS 41(6), the
  // 12-term × 9-document example, with singular values printed to 2 decimals in the paper.
  it('matches the published singular values of Deerwester et al. 1990', () => {
    const check = JSON.parse(readFileSync(fixturePath('checks/deerwester1990.json'), 'utf8'));
    const a: number[][] = check.matrix_terms_x_docs;
    const rows = a.length;
    const cols = a[0].length;
    const res = randomizedSvd(csrFromDense(rows, cols, a.flat()), { k: 9 });
    const published: number[] = check.singular_values_published;
    published.forEach((v, i) => expect(res.s[i]).toBeCloseTo(v, 2));
    // The two leading term (row) and document (column) vectors, up to sign.
    for (const [key, names, mat, n] of [
      ['published_T0_first2', check.terms as string[], res.u, rows],
      ['published_D0_first2', check.docs as string[], res.v, cols],
    ] as const) {
      const published2: number[][] = names.map((name) => check[key][name]);
      for (let c = 0; c < 2; c++) {
        const ours = Array.from({ length: n }, (_, i) => mat[i * 9 + c]);
        const theirs = published2.map((row) => row[c]);
        const sign = Math.sign(ours.reduce((s, v, i) => s + v * theirs[i], 0));
        ours.forEach((v, i) => expect(Math.abs(sign * v - theirs[i])).toBeLessThanOrEqual(0.0051));
      }
    }
  });

  it('recovers a random low-rank matrix (rank ≤ k + oversampling) to 1e-6 (reference: exact reconstruction)', () => {
    const rows = 120,
      cols = 80,
      rank = 12;
    const dense = lowRank(rows, cols, rank, 7);
    const res = randomizedSvd(csrFromDense(rows, cols, dense), { k: 12 });
    const rec = reconstruct(res);
    let num = 0,
      den = 0;
    for (let i = 0; i < dense.length; i++) {
      num += (rec[i] - dense[i]) ** 2;
      den += dense[i] ** 2;
    }
    expect(Math.sqrt(num / den)).toBeLessThan(1e-6);
    expect(maxOrthoError(res.u, rows, res.k)).toBeLessThan(1e-8);
    expect(maxOrthoError(res.v, cols, res.k)).toBeLessThan(1e-8);
  });

  it('agrees with ml-matrix dense SVD on the leading singular values (reference library)', () => {
    const rows = 90,
      cols = 60,
      rank = 8;
    const dense = lowRank(rows, cols, rank, 3);
    const res = randomizedSvd(csrFromDense(rows, cols, dense), { k: 8 });
    const ref = new SingularValueDecomposition(
      new Matrix(Array.from({ length: rows }, (_, i) => Array.from(dense.subarray(i * cols, (i + 1) * cols)))),
    );
    for (let i = 0; i < 8; i++) expect(Math.abs(res.s[i] - ref.diagonal[i]) / ref.diagonal[i]).toBeLessThan(1e-6);
  });

  it('handles a matrix whose rank is below the sketch width (rank-deficient range)', () => {
    const rows = 40,
      cols = 30;
    const dense = lowRank(rows, cols, 3, 11);
    const res = randomizedSvd(csrFromDense(rows, cols, dense), { k: 10 });
    expect(res.k).toBe(10);
    expect(maxOrthoError(res.u, rows, res.k)).toBeLessThan(1e-8);
    expect(maxOrthoError(res.v, cols, res.k)).toBeLessThan(1e-8);
    for (let i = 3; i < 10; i++) expect(res.s[i]).toBeLessThan(1e-8 * res.s[0]);
  });

  it("with factors: 'f32' returns the f64 factors rounded once to f32, and the same singular values", () => {
    const rows = 60,
      cols = 90;
    const r = createRandom(8);
    const dense = Float64Array.from({ length: rows * cols }, () => (r.next() < 0.15 ? r.next() : 0));
    const m = csrFromDense(rows, cols, dense);
    const wide = randomizedSvd(m, { k: 12 });
    const narrow = randomizedSvd(m, { k: 12, factors: 'f32' });
    expect(narrow.u).toBeInstanceOf(Float32Array);
    expect(narrow.v).toBeInstanceOf(Float32Array);
    expect(Array.from(narrow.s)).toEqual(Array.from(wide.s));
    expect(Array.from(narrow.u)).toEqual(Array.from(wide.u, Math.fround));
    expect(Array.from(narrow.v)).toEqual(Array.from(wide.v, Math.fround));
  });

  it('is bit-for-bit deterministic for a seed, and seed-independent in its singular values', () => {
    const rows = 70,
      cols = 50;
    const r = createRandom(5);
    const dense = Float64Array.from({ length: rows * cols }, () => (r.next() < 0.1 ? r.next() : 0));
    const m = csrFromDense(rows, cols, dense);
    const a = randomizedSvd(m, { k: 6, seed: 1 });
    const b = randomizedSvd(m, { k: 6, seed: 1 });
    const c = randomizedSvd(m, { k: 6, seed: 2 });
    expect(Buffer.from(a.u.buffer).equals(Buffer.from(b.u.buffer))).toBe(true);
    expect(Buffer.from(a.v.buffer).equals(Buffer.from(b.v.buffer))).toBe(true);
    expect(Array.from(a.s)).toEqual(Array.from(b.s));
    for (let i = 0; i < 6; i++) expect(Math.abs(a.s[i] - c.s[i]) / a.s[i]).toBeLessThan(0.01);
  });

  // Real text: the first 300 CRAN abstracts (test/fixtures/corpora/cran), log-entropy weighted.
  const cran = loadCollection('cran');
  it("converges to within 1% of ml-matrix's dense SVD on the leading 30 singular values of a real term-document matrix", () => {
    const { matrix, terms: m } = weightedCorpus(cran.docs.slice(0, 300).map((d) => d.text));
    // This spectrum is flat (σ₃₀/σ₃₁ ≈ 1.005), the hard case for subspace iteration: ten power
    // iterations and oversampling of k are needed here for 1%.
    const res = randomizedSvd(matrix, { k: 30, powerIterations: 10, oversampling: 30 });
    const dense = Array.from({ length: matrix.rows }, () => new Array<number>(m).fill(0));
    for (let i = 0; i < matrix.rows; i++)
      for (let p = matrix.indptr[i]; p < matrix.indptr[i + 1]; p++) dense[i][matrix.indices[p]] = matrix.values[p];
    const ref = new SingularValueDecomposition(new Matrix(dense), {
      computeLeftSingularVectors: false,
      computeRightSingularVectors: false,
      autoTranspose: true,
    });
    let worst = 0;
    for (let i = 0; i < 30; i++) worst = Math.max(worst, Math.abs(res.s[i] - ref.diagonal[i]) / ref.diagonal[i]);
    console.log(`CRAN[0:300] ${matrix.rows}x${m}: worst relative error of the leading 30 singular values ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(0.01);
    expect(maxOrthoError(res.u, matrix.rows, 30)).toBeLessThan(1e-8);
    expect(maxOrthoError(res.v, m, 30)).toBeLessThan(1e-8);
  });
  it('gives the same results when the big side is worked on in column blocks (reference: ml-matrix dense SVD)', () => {
    const { matrix } = weightedCorpus(cran.docs.slice(0, 200).map((d) => d.text));
    const l = 40;
    // A budget the size of the S × l basis: blocks of about S/B of the columns.
    const [S, B] = [Math.min(matrix.rows, matrix.cols), Math.max(matrix.rows, matrix.cols)];
    const bigBlockBytes = S * l * 8;
    const width = bigSideBlockWidth(B, l, bigBlockBytes);
    expect(width).toBeLessThan(l);
    const whole = randomizedSvd(matrix, { k: 20, oversampling: 20, powerIterations: 8 });
    const blocked = randomizedSvd(matrix, { k: 20, oversampling: 20, powerIterations: 8, bigBlockBytes });
    const again = randomizedSvd(matrix, { k: 20, oversampling: 20, powerIterations: 8, bigBlockBytes });
    expect(Buffer.from(blocked.v.buffer).equals(Buffer.from(again.v.buffer))).toBe(true);
    // Z's block (B × width) holds QW (S × k) with room to spare, so QW is put there: the same bits
    // on an executor that gives memory back by scopes (the default) and on one that does not.
    expect(B * width).toBeGreaterThanOrEqual(S * 20 + 20);
    const plain = randomizedSvd(matrix, { k: 20, oversampling: 20, powerIterations: 8, bigBlockBytes, executor: serialExecutor });
    expect(Buffer.from(plain.v.buffer).equals(Buffer.from(blocked.v.buffer))).toBe(true);
    expect(Buffer.from(plain.u.buffer).equals(Buffer.from(blocked.u.buffer))).toBe(true);
    const dense = Array.from({ length: matrix.rows }, () => new Array<number>(matrix.cols).fill(0));
    for (let i = 0; i < matrix.rows; i++)
      for (let p = matrix.indptr[i]; p < matrix.indptr[i + 1]; p++) dense[i][matrix.indices[p]] = matrix.values[p];
    const ref = new SingularValueDecomposition(new Matrix(dense), {
      computeLeftSingularVectors: false,
      computeRightSingularVectors: false,
      autoTranspose: true,
    });
    for (const res of [whole, blocked]) {
      for (let i = 0; i < 20; i++) expect(Math.abs(res.s[i] - ref.diagonal[i]) / ref.diagonal[i]).toBeLessThan(0.01);
      expect(maxOrthoError(res.u, matrix.rows, 20)).toBeLessThan(1e-8);
      expect(maxOrthoError(res.v, matrix.cols, 20)).toBeLessThan(1e-8);
    }
    // The leading directions agree between the two (the random starts differ, so not to the last bit).
    for (let c = 0; c < 5; c++) {
      let dot = 0;
      for (let i = 0; i < matrix.cols; i++) dot += whole.v[i * 20 + c] * blocked.v[i * 20 + c];
      expect(Math.abs(dot)).toBeGreaterThan(1 - 1e-4);
    }
  });

  it('gives the same bits in two parts, the big side on another executor (the whole run is checked against ml-matrix and ARPACK above and below)', () => {
    const { matrix } = weightedCorpus(cran.docs.slice(0, 150).map((d) => d.text));
    const options = { k: 15, powerIterations: 5 };
    const whole = randomizedSvd(matrix, { ...options, factors: 'f32' });
    // The first part on WebAssembly (the default), the second on plain loops, and the reverse.
    for (const [first, second] of [
      [undefined, serialExecutor],
      [serialExecutor, undefined],
    ] as const) {
      const part = randomizedSvdSmallSide(matrix, { ...options, executor: first });
      const split = finishSvd(matrix, part, { executor: second, factors: 'f32' });
      expect(Array.from(split.s)).toEqual(Array.from(whole.s));
      expect(Buffer.from(split.u.buffer).equals(Buffer.from(whole.u.buffer))).toBe(true);
      expect(Buffer.from(split.v.buffer).equals(Buffer.from(whole.v.buffer))).toBe(true);
    }
  });

  it('gives the same bits with QW parked in a spill and Aᵀ formed a few rows at a time (the whole run is checked against ml-matrix and ARPACK above and below)', () => {
    const { matrix } = weightedCorpus(cran.docs.slice(0, 150).map((d) => d.text));
    const options = { k: 15, powerIterations: 5, factors: 'f32' as const };
    // Both orientations (documents the smaller side, then terms), QW formed in one piece and
    // block by block (a small column budget), blocks of Aᵀ of about 37 entries.
    for (const m of [matrix, transposeCsr(matrix)]) {
      for (const bigBlockBytes of [undefined, 8 * Math.max(m.rows, m.cols) * 4]) {
        const whole = randomizedSvd(m, { ...options, bigBlockBytes });
        for (const executor of [undefined, serialExecutor]) {
          const spill = memorySpill();
          const split = randomizedSvd(m, {
            ...options,
            bigBlockBytes,
            executor,
            spill: spill.open,
            spillFromBytes: 0,
            bigSideEntryBytes: 8 * 37,
          });
          expect(Array.from(split.s)).toEqual(Array.from(whole.s));
          expect(Buffer.from(split.u.buffer).equals(Buffer.from(whole.u.buffer))).toBe(true);
          expect(Buffer.from(split.v.buffer).equals(Buffer.from(whole.v.buffer))).toBe(true);
          // QW went to the spill and the spill was given back.
          expect([spill.opened(), spill.closes()]).toEqual([1, 1]);
        }
      }
    }
    // Below the threshold QW stays in memory; a small side that is never finished gives its spill back.
    const kept = memorySpill();
    randomizedSvd(matrix, { ...options, spill: kept.open });
    expect(kept.opened()).toBe(0);
    const spill = memorySpill();
    const part = randomizedSvdSmallSide(matrix, { ...options, spill: spill.open, spillFromBytes: 0 });
    expect(part.small.length).toBe(0);
    dropSmallSide(part);
    expect([spill.opened(), spill.closes()]).toEqual([1, 1]);
  });

  it('splits l into the fewest nearly equal column blocks that fit the budget', () => {
    expect(bigSideBlockWidth(1000, 300)).toBe(300); // 2.4 MB fits 16 MiB
    // 51,651 × 300 × 8 bytes = 124 MB against 16 MiB: 40 columns fit, so 8 blocks of 38 (the last 34).
    expect(bigSideBlockWidth(51651, 300)).toBe(38);
    // The budget does not grow with the basis: 100,000 terms, l = 434 (the whole linux-source-6.1
    // tree's k = 289): 20 columns fit, 22 blocks of 20 (the last 14).
    expect(bigSideBlockWidth(100000, 434)).toBe(20);
    expect(bigSideBlockWidth(1000, 7, 8 * 1000 * 3)).toBe(3); // 3 + 3 + 1 columns
  });
});

// The shipped defaults against an exact solver on a whole real collection: CISI (1,460 abstracts,
// test/fixtures/corpora/cisi), log-entropy weighted, k = 200, against scipy's ARPACK (svds) on the
// same matrix written in Matrix Market form. The 1% bound on every one of the k values is the
// project's accuracy target for the SVD.
const cisi = loadCollection('cisi');
/** ARPACK's k largest singular values of a matrix (scipy's svds), descending. */
function arpackValues(matrix: Parameters<typeof coordinateChunks>[0], k: number): number[] {
  const python = referencePython();
  const dir = mkdtempSync(join(tmpdir(), 'undertone-svd-'));
  try {
    writeFileSync(join(dir, 'a.mtx'), Array.from(coordinateChunks(matrix)).join(''));
    const script =
      'import sys, json, numpy as np, scipy.io\nfrom scipy.sparse.linalg import svds\n' +
      'a = scipy.io.mmread(sys.argv[1]).tocsr()\n' +
      's = np.sort(svds(a, k=int(sys.argv[2]), random_state=0, return_singular_vectors=False))[::-1]\n' +
      'print(json.dumps([float(x) for x in s]))';
    const py = spawnSync(python, ['-c', script, join(dir, 'a.mtx'), String(k)], { encoding: 'utf8', maxBuffer: 1 << 24 });
    expect(py.status, py.stderr).toBe(0);
    return JSON.parse(py.stdout) as number[];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function worstRelative(ours: Float64Array, exact: readonly number[]): number {
  let worst = 0;
  for (let i = 0; i < exact.length; i++) worst = Math.max(worst, Math.abs(ours[i] - exact[i]) / exact[i]);
  return worst;
}

describe('randomizedSvd with its default options', () => {
  // CISI (test/fixtures, the public collection) weighted as the index weights it; ARPACK through
  // the reference Python's scipy.
  const { matrix } = weightedCorpus(cisi.docs.map((d) => d.text));
  const k = 200;
  let exact: number[] = [];

  it('keeps all 200 leading singular values of CISI within 1% of ARPACK', () => {
    exact = arpackValues(matrix, k);
    const worst = worstRelative(randomizedSvd(matrix, { k }).s, exact);
    console.log(`CISI ${matrix.rows}x${matrix.cols}, k=${k}: worst relative error against ARPACK ${(worst * 100).toFixed(3)}%`);
    expect(worst).toBeLessThan(0.01);
  }, 120_000);

  it('with dynamic shifts, lands closer to ARPACK than without in as many power iterations (Feng et al. 2024)', () => {
    if (exact.length === 0) exact = arpackValues(matrix, k);
    const shifted = worstRelative(randomizedSvd(matrix, { k, powerIterations: 4 }).s, exact);
    const plain = worstRelative(randomizedSvd(matrix, { k, powerIterations: 4, dynamicShifts: false }).s, exact);
    const plainMore = worstRelative(randomizedSvd(matrix, { k, powerIterations: 5, dynamicShifts: false }).s, exact);
    console.log(
      `CISI k=${k}, worst against ARPACK: 4 shifted ${(shifted * 100).toFixed(3)}%, 4 plain ${(plain * 100).toFixed(3)}%, 5 plain ${(plainMore * 100).toFixed(3)}%`,
    );
    expect(shifted).toBeLessThan(plain);
    // The default's four shifted iterations do at least as well as five plain ones (the default before).
    expect(shifted).toBeLessThan(plainMore);
  }, 120_000);
});
