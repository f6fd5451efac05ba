/**
 * Name terms chosen as a co-occurring set (coherentNames.ts), on a small file × term matrix built
 * by hand (our example): NPMI values follow Bouma 2009's definition as coherence.ts computes them.
 */
import { describe, expect, it } from 'vitest';
import { csrFromDense } from '../../../src/core/matrix/sparse.js';
import { TermFiles } from '../../../src/core/topics/coherentNames.js';

// 6 files × 4 terms: term 0 and term 2 occur in the same files; term 1 never with term 0; term 3 in every file.
const a = csrFromDense(6, 4, [1, 0, 1, 1, 1, 0, 1, 1, 1, 0, 1, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1]);

describe('co-occurring name terms', () => {
  it('keeps the most distinctive term and adds the one that occurs with it, in the pool order', () => {
    const files = new TermFiles(a);
    // Pool order = distinctiveness: 0 first, then 1 (never with 0), 3 (independent), 2 (always with 0).
    expect(files.choose([0, 1, 3, 2], 2)).toEqual([0, 2]);
    expect(files.choose([0, 1, 3, 2], 3)).toEqual([0, 3, 2]);
  });

  it('does not take a single shared file as evidence (the joint count is discounted by one)', () => {
    // 6 files × 3 terms. Term 0 in files 0–2; term 1 only in file 0; term 2 in files 0, 1, 3, 4.
    // Undiscounted, NPMI(0, 1) = ln 2 / ln 6 ≈ 0.39 beats NPMI(0, 2) = 0; with one file taken off
    // the joint counts, (0, 1) never co-occurs (−1) and (0, 2) scores −ln 2 / ln 6 ≈ −0.39.
    const b = csrFromDense(6, 3, [1, 1, 1, 1, 0, 1, 1, 0, 0, 0, 0, 1, 0, 0, 1, 0, 0, 0]);
    expect(new TermFiles(b).choose([0, 1, 2], 2)).toEqual([0, 2]);
  });

  it('returns the pool itself when it holds no more terms than wanted', () => {
    expect(new TermFiles(a).choose([1, 0], 2)).toEqual([1, 0]);
  });
});
