import { describe, expect, it } from 'vitest';
import { classicalMds, triangulate } from '../../../src/core/map/classicalMds.js';
import { InvalidInputError } from '../../../src/core/errors.js';
import { procrustesDisparity } from './helpers.js';

// Textbook check (Torgerson 1952; Gower 1966; Borg & Groenen, Modern Multidimensional Scaling,
// 2nd ed., ch. 12): for exactly Euclidean distances, classical MDS recovers the configuration up
// to rotation, reflection and translation, and B's eigenvalues equal those of the centred
// scatter matrix XᵀX.
function squaredDistances(pts: number[][]): Float64Array {
  const n = pts.length;
  const d = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) d[i * n + j] = (pts[i][0] - pts[j][0]) ** 2 + (pts[i][1] - pts[j][1]) ** 2;
  return d;
}

/** Residual of the best rotation/reflection (no scaling) mapping a onto b, both centred. */
function rigidResidual(a: number[][], b: number[][]): number {
  const centre = (p: number[][]) => {
    const mx = p.reduce((s, q) => s + q[0], 0) / p.length;
    const my = p.reduce((s, q) => s + q[1], 0) / p.length;
    return p.map((q) => [q[0] - mx, q[1] - my]);
  };
  const ca = centre(a);
  const cb = centre(b);
  let best = Infinity;
  for (const reflect of [1, -1]) {
    let c0 = 0;
    let c1 = 0;
    for (let i = 0; i < ca.length; i++) {
      const ax = ca[i][0];
      const ay = reflect * ca[i][1];
      c0 += ax * cb[i][0] + ay * cb[i][1];
      c1 += ax * cb[i][1] - ay * cb[i][0];
    }
    const t = Math.atan2(c1, c0);
    let r = 0;
    for (let i = 0; i < ca.length; i++) {
      const ax = ca[i][0];
      const ay = reflect * ca[i][1];
      r += (Math.cos(t) * ax - Math.sin(t) * ay - cb[i][0]) ** 2 + (Math.sin(t) * ax + Math.cos(t) * ay - cb[i][1]) ** 2;
    }
    best = Math.min(best, r);
  }
  return Math.sqrt(best);
}

const SMALL = [
  [0, 0],
  [3, 0],
  [3, 4],
  [0, 4],
  [1.5, 2],
  [-2, 1],
  [5, 5.5],
];

function grid(): number[][] {
  const pts: number[][] = [];
  for (let i = 0; i < 10; i++) for (let j = 0; j < 9; j++) pts.push([i * 0.7 + 0.1 * j * j, j * 1.3 - 0.05 * i * i]);
  return pts;
}

describe('classicalMds (Torgerson–Gower)', () => {
  for (const [label, pts, opts] of [
    ['a 7-point configuration, dense eigen-solver', SMALL, {}],
    ['a 90-point configuration, Lanczos eigen-solver', grid(), { eigen: { tolerance: 1e-12, denseMaxN: 10, seed: 1 } }],
  ] as const) {
    it(`recovers ${label} exactly up to rotation and reflection`, () => {
      const n = pts.length;
      const mds = classicalMds(squaredDistances(pts as number[][]), n, opts);
      const got = Array.from({ length: n }, (_, i) => [mds.coords[2 * i], mds.coords[2 * i + 1]]);
      expect(rigidResidual(got, pts as number[][])).toBeLessThan(1e-8);
      // Eigenvalues of B = eigenvalues of the centred scatter matrix (2×2, closed form).
      const mx = pts.reduce((s, p) => s + p[0], 0) / n;
      const my = pts.reduce((s, p) => s + p[1], 0) / n;
      let sxx = 0;
      let syy = 0;
      let sxy = 0;
      for (const p of pts) {
        sxx += (p[0] - mx) ** 2;
        syy += (p[1] - my) ** 2;
        sxy += (p[0] - mx) * (p[1] - my);
      }
      const mean = (sxx + syy) / 2;
      const half = Math.sqrt(((sxx - syy) / 2) ** 2 + sxy * sxy);
      expect(mds.eigenvalues[0]).toBeCloseTo(mean + half, 8);
      expect(mds.eigenvalues[1]).toBeCloseTo(mean - half, 8);
    });
  }

  it('places an extra point exactly by distance-based triangulation (Gower 1968 adding a point)', () => {
    const mds = classicalMds(squaredDistances(SMALL), SMALL.length);
    const extra = [2.2, -1.3];
    const sq = SMALL.map((p) => (p[0] - extra[0]) ** 2 + (p[1] - extra[1]) ** 2);
    const placed = triangulate(mds, sq, new Float64Array(2));
    const landmarks = Array.from({ length: SMALL.length }, (_, i) => [mds.coords[2 * i], mds.coords[2 * i + 1]]);
    // Same rigid motion must carry both the landmarks and the new point.
    expect(
      procrustesDisparity(
        [...landmarks.map((p) => p[0]), placed[0]],
        [...landmarks.map((p) => p[1]), placed[1]],
        [...SMALL.map((p) => p[0]), extra[0]],
        [...SMALL.map((p) => p[1]), extra[1]],
      ),
    ).toBeLessThan(1e-12);
  });

  it('gives zero coordinates on an axis whose eigenvalue is not positive (collinear points)', () => {
    const line = [
      [0, 0],
      [1, 0],
      [2, 0],
      [4, 0],
    ];
    const mds = classicalMds(squaredDistances(line), 4);
    expect(mds.eigenvalues[1]).toBeLessThan(1e-9);
    for (let i = 0; i < 4; i++) expect(mds.coords[2 * i + 1]).toBe(0);
  });

  it('rejects a matrix of the wrong size or with non-finite entries', () => {
    expect(() => classicalMds(new Float64Array(5), 2)).toThrow(InvalidInputError);
    expect(() => classicalMds(Float64Array.from([0, Infinity, Infinity, 0]), 2)).toThrow(InvalidInputError);
  });
});
