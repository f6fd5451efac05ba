/**
 * The concept view (conceptView.ts) against a dense SVD computed by ml-matrix (a general-purpose
 * linear-algebra library): the cosine of two files' rows of U_k·Σ_k, on a small term space made
 * from texts. Cosines do not depend on the signs of singular vectors, so they compare directly.
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { conceptView } from '../../../src/core/lookalike/conceptView.js';
import { buildTermSpace } from '../../../src/core/lookalike/termSpace.js';

const texts = [
  'ferry timetable harbour berth tide crossing',
  'ferry crossing harbour ticket fare refund',
  'tide gauge harbour level sensor reading',
  'sensor reading calibration gauge drift',
  'fare refund ticket office desk queue',
  'queue desk office opening hours holiday',
];

function reference(k: number): (a: number, b: number) => number {
  const s = buildTermSpace(texts);
  const dense = Matrix.zeros(s.n, s.df.length);
  for (let i = 0; i < s.n; i++) for (let p = s.rowStart[i]; p < s.rowStart[i + 1]; p++) dense.set(i, s.terms[p], s.weights[p]);
  const svd = new SingularValueDecomposition(dense, { autoTranspose: true });
  const u = svd.leftSingularVectors;
  const sv = svd.diagonal;
  const row = (i: number) => Array.from({ length: k }, (_, j) => u.get(i, j) * sv[j]);
  return (a, b) => {
    const x = row(a);
    const y = row(b);
    const dot = x.reduce((t, v, j) => t + v * y[j], 0);
    return dot / Math.hypot(...x) / Math.hypot(...y);
  };
}

describe('conceptView', () => {
  const space = buildTermSpace(texts);
  it('gives the cosine of the files’ leading-k concept vectors, as a dense SVD does', () => {
    for (const k of [2, 3]) {
      const view = conceptView(space, k);
      const ref = reference(k);
      expect(view.k).toBe(k);
      for (let a = 0; a < texts.length; a++) for (let b = 0; b < texts.length; b++) expect(view.cosine(a, b)).toBeCloseTo(ref(a, b), 6);
    }
  });
  it('with k at the full rank reproduces the term-space cosine', () => {
    const view = conceptView(space, texts.length);
    const full = (a: number, b: number) => {
      let d = 0;
      for (let p = space.rowStart[a]; p < space.rowStart[a + 1]; p++)
        for (let q = space.rowStart[b]; q < space.rowStart[b + 1]; q++)
          if (space.terms[p] === space.terms[q]) d += space.weights[p] * space.weights[q];
      return d;
    };
    expect(view.cosine(0, 1)).toBeCloseTo(full(0, 1), 5);
    expect(view.cosine(2, 3)).toBeCloseTo(full(2, 3), 5);
  });
  it('clamps k to the matrix, is seeded, and answers 0 for an empty space', () => {
    expect(conceptView(space, 1000).k).toBe(texts.length);
    expect(conceptView(space, 2).cosine(0, 4)).toBe(conceptView(space, 2).cosine(0, 4));
    expect(conceptView(buildTermSpace([]), 5).cosine(0, 0)).toBe(0);
  });
});
