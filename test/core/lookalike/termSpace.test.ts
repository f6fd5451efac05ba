/**
 * The full term space against scikit-learn 1.2.1 (Debian python3-sklearn):
 * TfidfVectorizer(sublinear_tf=True, smooth_idf=True, norm='l2', token_pattern=r'\S+') on the four
 * texts below, cosines = X·Xᵀ (values printed by that run, pasted here). The words are chosen so
 * that stemming and stop words change nothing.
 */
import { describe, expect, it } from 'vitest';
import { buildTermSpace, rowCosine, termNeighbours, termSpaceFromCounts } from '../../../src/core/lookalike/termSpace.js';

const docs = ['ferry ferry tide berth', 'tide window berth slip slip slip', 'refund voucher fare', 'ferry refund'];
const SKLEARN = [
  [1, 0.2772292012, 0, 0.5427006132],
  [0.2772292012, 1, 0, 0],
  [0, 0, 1, 0.3443145201],
  [0.5427006132, 0, 0.3443145201, 1],
];

describe('buildTermSpace', () => {
  it('gives the cosines of scikit-learn’s sublinear TF-IDF', () => {
    const s = buildTermSpace(docs);
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) expect(rowCosine(s, i, j)).toBeCloseTo(SKLEARN[i][j], 6);
  });

  it('gives the same cosines from stored counts (any id space, zero counts left out)', () => {
    // The four texts as raw counts over ids 10 ferry, 20 tide, 30 berth, 40 window, 50 slip,
    // 60 refund, 70 voucher, 80 fare; a zero count (a boilerplate line subtracted) is no term.
    const rows = [
      { termIds: [10, 20, 30, 70], counts: [2, 1, 1, 0] },
      { termIds: [20, 30, 40, 50], counts: [1, 1, 1, 3] },
      { termIds: [60, 70, 80], counts: [1, 1, 1] },
      { termIds: [10, 60], counts: [1, 1] },
    ];
    const s = termSpaceFromCounts(rows);
    for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) expect(rowCosine(s, i, j)).toBeCloseTo(SKLEARN[i][j], 6);
    expect(s.df[70]).toBe(1);
  });

  it('finds each row’s neighbours in cosine order, the same with or without frequent terms left out of gathering', () => {
    const s = buildTermSpace(docs);
    const all = termNeighbours(s, { k: 3, candidates: 10, maxDf: 10 });
    expect(Array.from(all.index.subarray(0, 3))).toEqual([3, 1, -1]); // doc 2 shares no term with doc 0
    expect(all.cosine[0]).toBeCloseTo(0.5427006132, 6);
    expect(Array.from(all.index.subarray(9, 12))).toEqual([0, 2, -1]);
    // Terms in two files (ferry, tide, berth, refund) left out of gathering: only rarer ones link files.
    const rare = termNeighbours(s, { k: 3, candidates: 10, maxDf: 1 });
    expect(Array.from(rare.index)).toEqual(new Array(12).fill(-1));
  });
});
