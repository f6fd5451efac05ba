import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { quickLayout } from '../../../src/core/map/quickLayout.js';
import { projectQuick } from '../../../src/core/map/quickProjection.js';
import { EmptyCorpusError } from '../../../src/core/errors.js';
import { clusters } from './helpers.js';

describe('quickLayout', () => {
  const p = clusters(25, 6, 16, 0.3, 12);
  const q = quickLayout(p.data, p.n, p.dim);

  it('projects on the top two principal axes: same as the SVD of the centred data (ml-matrix SVD as reference)', () => {
    const rows = Array.from({ length: p.n }, (_, i) => Array.from(p.data.subarray(i * p.dim, (i + 1) * p.dim)));
    const x = new Matrix(rows);
    const centred = x.subRowVector(x.mean('column'));
    const svd = new SingularValueDecomposition(centred, { autoTranspose: true });
    const scores = centred.mmul(svd.rightSingularVectors.subMatrix(0, p.dim - 1, 0, 1));
    // Compare up to the display frame (a uniform scale) and each axis's sign.
    const corr = (a: ArrayLike<number>, b: number[]) => {
      let ab = 0;
      let aa = 0;
      let bb = 0;
      for (let i = 0; i < b.length; i++) {
        ab += a[i] * b[i];
        aa += a[i] * a[i];
        bb += b[i] * b[i];
      }
      return ab / Math.sqrt(aa * bb);
    };
    expect(Math.abs(corr(q.x, scores.getColumn(0)))).toBeGreaterThan(1 - 1e-6);
    expect(Math.abs(corr(q.y, scores.getColumn(1)))).toBeGreaterThan(1 - 1e-6);
    const total = svd.diagonal.reduce((s, v) => s + v * v, 0);
    expect(q.varianceShare).toBeCloseTo((svd.diagonal[0] ** 2 + svd.diagonal[1] ** 2) / total, 6);
  });

  it('places a file’s own vector exactly on that file', () => {
    for (const i of [0, 17, p.n - 1]) {
      const pos = projectQuick(q, p.data.subarray(i * p.dim, (i + 1) * p.dim));
      expect(pos.x).toBeCloseTo(q.x[i], 5);
      expect(pos.y).toBeCloseTo(q.y[i], 5);
    }
  });

  it('ignores a query vector’s length (cosine geometry)', () => {
    const v = Array.from(p.data.subarray(0, p.dim), (x) => 7 * x);
    const pos = projectQuick(q, v);
    expect(pos.x).toBeCloseTo(q.x[0], 5);
  });

  it('removes the shared mass direction: the map is centred', () => {
    const mx = q.x.reduce((s, v) => s + v, 0) / p.n;
    const my = q.y.reduce((s, v) => s + v, 0) / p.n;
    expect(Math.abs(mx) + Math.abs(my)).toBeLessThan(1e-5);
  });

  it('refuses an empty input', () => {
    expect(() => quickLayout(new Float32Array(0), 0, 4)).toThrow(EmptyCorpusError);
  });
});
