import { beforeAll, describe, expect, it } from 'vitest';
import { fullIsomap } from '../../../src/core/map/fullIsomap.js';
import { landmarkIsomap, type FaithfulLayout } from '../../../src/core/map/landmarkIsomap.js';
import { quickLayout, type QuickLayout } from '../../../src/core/map/quickLayout.js';
import { InvalidInputError } from '../../../src/core/errors.js';
import { clusters, knnOverlap, procrustesDisparity, swissRoll, trustworthiness } from './helpers.js';

// Measured on this data when the tests were written (seeded, so reproducible):
//   Swiss roll n=800: trustworthiness@10 quick 0.957, faithful 0.9995; kNN overlap@10 0.41 vs 0.88.
//   12 clusters n=720: trustworthiness@10 quick 0.912, faithful 0.950 (11 parts joined by 21 bridges).
//   Landmark (m=100) vs full Isomap on the roll: Procrustes disparity 2.8e-5.
// The thresholds below sit between the two methods, so a faithful layout that stopped
// preserving neighbourhoods better than the linear one would fail.

describe('landmarkIsomap on a Swiss roll (Tenenbaum, de Silva & Langford 2000)', () => {
  const roll = swissRoll(800, 10, 5);
  let quick: QuickLayout;
  let faithful: FaithfulLayout;
  beforeAll(() => {
    quick = quickLayout(roll.data, roll.n, roll.dim);
    faithful = landmarkIsomap(roll.data, roll.n, roll.dim, { landmarks: 100 });
  });

  it('keeps neighbourhoods better than the linear projection (trustworthiness, Venna & Kaski 2001)', () => {
    const tq = trustworthiness(roll, quick.x, quick.y, 10);
    const tf = trustworthiness(roll, faithful.x, faithful.y, 10);
    expect(tf).toBeGreaterThan(0.99);
    expect(tq).toBeLessThan(0.98);
    expect(tf - tq).toBeGreaterThan(0.02);
  });

  it('shares more of each point’s 10 nearest neighbours than the linear projection', () => {
    expect(knnOverlap(roll, faithful.x, faithful.y, 10)).toBeGreaterThan(knnOverlap(roll, quick.x, quick.y, 10) + 0.3);
  });

  it('unrolls the sheet: the first map axis follows the roll parameter t monotonically', () => {
    // Isomap's published result: the leading coordinate tracks position along the roll.
    const order = Array.from({ length: roll.n }, (_, i) => i).sort((a, b) => roll.t[a] - roll.t[b]);
    const rankT = new Float64Array(roll.n);
    const rankX = new Float64Array(roll.n);
    order.forEach((i, r) => (rankT[i] = r));
    Array.from({ length: roll.n }, (_, i) => i)
      .sort((a, b) => faithful.x[a] - faithful.x[b])
      .forEach((i, r) => (rankX[i] = r));
    const n = roll.n;
    let d2 = 0;
    for (let i = 0; i < n; i++) d2 += (rankT[i] - rankX[i]) ** 2;
    const spearman = 1 - (6 * d2) / (n * (n * n - 1));
    expect(Math.abs(spearman)).toBeGreaterThan(0.98);
  });

  it('agrees with full Isomap up to rotation and scale (Procrustes disparity, as scipy defines it)', () => {
    const full = fullIsomap(roll.data, roll.n, roll.dim);
    expect(procrustesDisparity(faithful.x, faithful.y, full.x, full.y)).toBeLessThan(1e-3);
  });

  it('reports the graph it walked: exact neighbours, one part, landmarks in MaxMin order', () => {
    expect(faithful.neighbourMethod).toBe('exact');
    expect(faithful.componentCount).toBe(1);
    expect(faithful.landmarks.length).toBe(100);
    expect(new Set(faithful.landmarks).size).toBe(100);
  });
});

describe('landmarkIsomap on well-separated clusters', () => {
  const data = clusters(60, 12, 30, 0.08, 9);
  it('keeps neighbourhoods better than the linear projection and bridges the separate parts', () => {
    const quick = quickLayout(data.data, data.n, data.dim);
    const faithful = landmarkIsomap(data.data, data.n, data.dim, { landmarks: 100 });
    expect(faithful.componentCount).toBeGreaterThan(1);
    expect(faithful.bridgeCount).toBeGreaterThanOrEqual(faithful.componentCount - 1);
    expect(trustworthiness(data, faithful.x, faithful.y, 10)).toBeGreaterThan(trustworthiness(data, quick.x, quick.y, 10) + 0.03);
  });
});

describe('landmarkIsomap determinism and input checks', () => {
  const data = clusters(30, 5, 12, 0.2, 4);
  it('gives identical coordinates for the same seed', () => {
    const a = landmarkIsomap(data.data, data.n, data.dim, { landmarks: 40, seed: 17 });
    const b = landmarkIsomap(data.data, data.n, data.dim, { landmarks: 40, seed: 17 });
    expect(Array.from(b.x)).toEqual(Array.from(a.x));
    expect(Array.from(b.y)).toEqual(Array.from(a.y));
    expect(Array.from(b.landmarks)).toEqual(Array.from(a.landmarks));
  });

  it('starts MaxMin from another file for another seed', () => {
    const a = landmarkIsomap(data.data, data.n, data.dim, { landmarks: 40, seed: 17 });
    const b = landmarkIsomap(data.data, data.n, data.dim, { landmarks: 40, seed: 18 });
    expect(b.landmarks[0]).not.toBe(a.landmarks[0]);
  });

  it('centres the map and scales it to unit RMS radius', () => {
    const f = landmarkIsomap(data.data, data.n, data.dim, { landmarks: 40 });
    const mx = f.x.reduce((s, v) => s + v, 0) / data.n;
    const rms = Math.sqrt(f.x.reduce((s, v, i) => s + v * v + f.y[i] * f.y[i], 0) / data.n);
    expect(Math.abs(mx)).toBeLessThan(1e-5);
    expect(rms).toBeCloseTo(1, 5);
  });

  it('rejects fewer than four landmarks and mismatched vector lengths', () => {
    expect(() => landmarkIsomap(data.data, data.n, data.dim, { landmarks: 3 })).toThrow(InvalidInputError);
    expect(() => landmarkIsomap(data.data, data.n + 1, data.dim)).toThrow(InvalidInputError);
  });

  it('lays out inputs smaller than the landmark count', () => {
    const tiny = clusters(2, 2, 6, 0.1, 2);
    const f = landmarkIsomap(tiny.data, tiny.n, tiny.dim);
    expect(f.landmarks.length).toBe(4);
    expect(Array.from(f.x).every(Number.isFinite)).toBe(true);
  });
});
