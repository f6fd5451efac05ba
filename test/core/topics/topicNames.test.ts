/**
 * topicNames: the informative score p_T·ln(p_T/p_S) (Carpineto et al. 2001) and the mean
 * contrast, checked against values worked out by hand on a 4-file matrix (our example).
 */
import { describe, expect, it } from 'vitest';
import type { CsrMatrix } from '../../../src/core/matrix/sparse.js';
import { isMarkupWord, isUnnameable, NameScratch, namesAgainstParent, realWordsFirst } from '../../../src/core/topics/topicNames.js';

// Rows (files) × columns (terms): tide, ferry, 2024, rst
// f0: tide .8, ferry .6 ; f1: tide .6, 2024 .8 ; f2: ferry 1 ; f3: ferry .6, rst .8
const a: CsrMatrix = {
  rows: 4,
  cols: 4,
  indptr: Int32Array.from([0, 2, 4, 5, 7]),
  indices: Int32Array.from([0, 1, 0, 2, 1, 1, 3]),
  values: Float64Array.from([0.8, 0.6, 0.6, 0.8, 1, 0.6, 0.8]),
};
const terms = ['tide', 'ferry', '2024', 'rst'];

describe('namesAgainstParent', () => {
  it('scores terms frequent in the topic and rare in its siblings', () => {
    const scratch = new NameScratch(4);
    const [t, s] = namesAgainstParent(
      a,
      [0, 1, 2, 3],
      [
        [0, 1],
        [2, 3],
      ],
      10,
      'informative',
      scratch,
      (c) => terms[c],
    );
    // Topic {f0,f1}: tide in 2 of 2, siblings 0 of 2 → p_S = 0.5/3; score = 1·ln(1/(1/6)) = ln 6.
    // ferry: mean .3 inside vs .8 outside → not a name. 2024 is a number → never a name.
    expect(t).toHaveLength(1);
    expect(t[0].col).toBe(0);
    expect(t[0].score).toBeCloseTo(Math.log(6), 12);
    // Topic {f2,f3}: ferry 2 of 2 vs 1 of 2 → p_S = 1.5/3; score = ln 2. rst 1 of 2 vs 0 → 0.5·ln(0.5/(0.5/3)) = 0.5·ln 3.
    expect(s.map((x) => terms[x.col])).toEqual(['ferry', 'rst']);
    expect(s[0].score).toBeCloseTo(Math.log(2), 12);
    expect(s[1].score).toBeCloseTo(0.5 * Math.log(3), 12);
    // The scratch is clean afterwards: the same call gives the same answer.
    expect(
      namesAgainstParent(
        a,
        [0, 1, 2, 3],
        [
          [0, 1],
          [2, 3],
        ],
        10,
        'informative',
        scratch,
        (c) => terms[c],
      ),
    ).toEqual([t, s]);
  });

  it('contrast is the difference of mean weights', () => {
    const [, s] = namesAgainstParent(
      a,
      [0, 1, 2, 3],
      [
        [0, 1],
        [2, 3],
      ],
      10,
      'contrast',
      new NameScratch(4),
      (c) => terms[c],
    );
    expect(s[0].col).toBe(1);
    expect(s[0].score).toBeCloseTo(0.8 - 0.3, 12);
  });

  it('numbers, codes and single letters never name a topic; markup words go last', () => {
    expect(['2024', '0x1f', 'x', '12ab', '']).toSatisfy((xs: string[]) => xs.every(isUnnameable));
    expect(['x86', 'ext4', 'ferry', 'tide']).toSatisfy((xs: string[]) => xs.every((x) => !isUnnameable(x)));
    expect(isMarkupWord('rst')).toBe(true);
    expect(isMarkupWord('ferry')).toBe(false);
    expect(realWordsFirst(['rst', 'ferry', 'html', 'tide'], (x) => x)).toEqual(['ferry', 'tide', 'rst', 'html']);
  });
});
