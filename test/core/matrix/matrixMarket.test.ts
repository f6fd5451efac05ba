import { describe, expect, it } from 'vitest';
import { arrayChunks, coordinateChunks, MatrixMarketParser, parseMatrixMarket, toDense } from '../../../src/core/matrix/matrixMarket.js';
import { csrFromDense } from '../../../src/core/matrix/sparse.js';

// The example of Boisvert, Pozo & Remington, "The Matrix Market Exchange Formats: Initial Design"
// (NIST IR 5935, 1996), §3: a 5×5 real general coordinate matrix with 8 entries. Reproduced from
// memory of the report; its values are what the test checks the parser against.
const NIST_EXAMPLE = `%%MatrixMarket matrix coordinate real general
%=================================================================================
%
% This ASCII file represents a sparse MxN matrix with L
% nonzeros in the following Matrix Market format:
%
%=================================================================================
  5  5  8
    1     1   1.000e+00
    2     2   1.050e+01
    3     3   1.500e-02
    1     4   6.000e+00
    4     2   2.505e+02
    4     4  -2.800e+02
    4     5   3.332e+01
    5     5   1.200e+01
`;

const collect = (chunks: Iterable<string>): string => Array.from(chunks).join('');

describe('Matrix Market', () => {
  it('reads the example of the format report (NIST IR 5935)', () => {
    const m = parseMatrixMarket(NIST_EXAMPLE);
    expect(m.format).toBe('coordinate');
    const d = toDense(m);
    expect(m.rows).toBe(5);
    expect(d[0 * 5 + 0]).toBe(1);
    expect(d[0 * 5 + 3]).toBe(6);
    expect(d[3 * 5 + 1]).toBe(250.5);
    expect(d[3 * 5 + 3]).toBe(-280);
    expect(d[4 * 5 + 4]).toBe(12);
    expect(d.filter((v) => v !== 0).length).toBe(8);
  });

  it('round-trips a sparse matrix and its transpose exactly, in chunks of any size', () => {
    const dense = [0, 1 / 3, 0, Math.PI, 0, -2e-300, 7, 0, 0, 1e300, 0, -0.1];
    const csr = csrFromDense(3, 4, dense);
    const text = collect(coordinateChunks(csr, { comments: ['a comment'] }));
    expect(text.split('\n')[1]).toBe('% a comment');
    const p = new MatrixMarketParser();
    for (let i = 0; i < text.length; i += 7) p.push(text.slice(i, i + 7));
    expect(Array.from(toDense(p.end()))).toEqual(dense);
    const t = parseMatrixMarket(collect(coordinateChunks(csr, { transpose: true })));
    expect([t.rows, t.cols]).toEqual([4, 3]);
    const td = toDense(t);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 4; j++) expect(td[j * 3 + i]).toBe(dense[i * 4 + j]);
  });

  it('writes and reads dense arrays column by column', () => {
    const data = Float64Array.from([1, 2, 3, 4, 5, 6]); // 2×3 row-major
    const text = collect(arrayChunks(2, 3, data));
    expect(text.split('\n').slice(1, 4)).toEqual(['2 3', '1', '4']);
    const m = parseMatrixMarket(text);
    expect(m.format).toBe('array');
    expect(Array.from(toDense(m))).toEqual([1, 2, 3, 4, 5, 6]);
  });

  it('expands symmetric and skew-symmetric storage', () => {
    const sym = toDense(parseMatrixMarket('%%MatrixMarket matrix coordinate real symmetric\n3 3 2\n1 1 2\n3 1 5\n'));
    expect(Array.from(sym)).toEqual([2, 0, 5, 0, 0, 0, 5, 0, 0]);
    const skew = toDense(parseMatrixMarket('%%MatrixMarket matrix array real skew-symmetric\n3 3\n1\n2\n3\n'));
    expect(Array.from(skew)).toEqual([0, -1, -2, 1, 0, -3, 2, 3, 0]);
    const pattern = toDense(parseMatrixMarket('%%MatrixMarket matrix coordinate pattern general\n2 2 1\n2 1\n'));
    expect(Array.from(pattern)).toEqual([0, 0, 1, 0]);
  });

  it('refuses broken or unsupported files with a clear message', () => {
    expect(() => parseMatrixMarket('hello\n1 1 1\n')).toThrow(/banner/);
    expect(() => parseMatrixMarket('%%MatrixMarket matrix coordinate complex general\n1 1 1\n1 1 1 0\n')).toThrow(/complex/);
    expect(() => parseMatrixMarket('%%MatrixMarket matrix coordinate real general\n2 2 2\n1 1 1\n')).toThrow(
      /declares 2 entries but holds 1/,
    );
    expect(() => parseMatrixMarket('%%MatrixMarket matrix coordinate real general\n2 2 1\n3 1 1\n')).toThrow(/out of range/);
    expect(() => parseMatrixMarket('%%MatrixMarket matrix coordinate real general\n2 2 1\n1 1 nan\n')).toThrow(/finite/);
  });
});
