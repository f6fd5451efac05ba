import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { fullIsomap } from '../../../src/core/map/fullIsomap.js';
import { InvalidInputError } from '../../../src/core/errors.js';
import { clusters, procrustesDisparity } from './helpers.js';

describe('fullIsomap', () => {
  it('reduces to classical MDS of the chord distances when every pair is joined (ml-matrix dense EVD as reference)', () => {
    // With a complete graph, each shortest path is the direct edge (the chord is a metric), so
    // Isomap's geodesics are the input distances (Tenenbaum et al. 2000).
    const p = clusters(8, 5, 6, 0.4, 2);
    const f = fullIsomap(p.data, p.n, p.dim, { graph: { neighbours: p.n - 1 } });
    const n = p.n;
    const d2 = new Matrix(n, n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let c = 0; c < p.dim; c++) s += (p.data[i * p.dim + c] - p.data[j * p.dim + c]) ** 2;
        d2.set(i, j, s);
      }
    }
    const j = Matrix.eye(n).sub(new Matrix(n, n).fill(1 / n));
    const b = j.mmul(d2).mmul(j).mul(-0.5);
    const evd = new EigenvalueDecomposition(b, { assumeSymmetric: true });
    const order = evd.realEigenvalues.map((v, i) => [v, i]).sort((a, c) => c[0] - a[0]);
    const ref = [0, 1].map((r) => evd.eigenvectorMatrix.getColumn(order[r][1]).map((v) => v * Math.sqrt(order[r][0])));
    expect(procrustesDisparity(f.x, f.y, ref[0], ref[1])).toBeLessThan(1e-9);
    expect(f.method).toBe('isomap');
  });

  it('refuses inputs above maxN', () => {
    const p = clusters(5, 2, 4, 0.1, 1);
    expect(() => fullIsomap(p.data, p.n, p.dim, { maxN: 5 })).toThrow(InvalidInputError);
  });
});
