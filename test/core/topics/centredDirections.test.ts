/**
 * The first level's centred space (centredDirections.ts): worked by hand on two-dimensional rows.
 */
import { describe, expect, it } from 'vitest';
import { centredDirections } from '../../../src/core/topics/centredDirections.js';

describe('centredDirections', () => {
  it('takes out the mean and re-normalises each row (worked by hand)', () => {
    // (1, 0), (−1, 0), (0, 1): mean (0, ⅓); centred (1, −⅓), (−1, −⅓), (0, ⅔); unit (3, −1)/√10, (−3, −1)/√10, (0, 1).
    const out = centredDirections(Float64Array.from([1, 0, -1, 0, 0, 1]), 3, 2);
    const r = Math.sqrt(10);
    const expected = [3 / r, -1 / r, -3 / r, -1 / r, 0, 1];
    expected.forEach((v, i) => expect(out[i]).toBeCloseTo(v, 12));
  });

  it('two rows become opposite directions; rows that all equal the mean become zero rows', () => {
    const two = centredDirections(Float64Array.from([1, 0, 0, 1]), 2, 2);
    expect(two[0]).toBeCloseTo(Math.SQRT1_2, 12);
    expect(two[1]).toBeCloseTo(-Math.SQRT1_2, 12);
    expect(two[2]).toBeCloseTo(-Math.SQRT1_2, 12);
    expect(two[3]).toBeCloseTo(Math.SQRT1_2, 12);
    const same = centredDirections(Float64Array.from([0.6, 0.8, 0.6, 0.8, 0.6, 0.8]), 3, 2);
    expect(Array.from(same)).toEqual([0, 0, 0, 0, 0, 0]);
  });

  it('leaves its input unchanged', () => {
    const points = Float64Array.from([1, 0, 0, 1]);
    centredDirections(points, 2, 2);
    expect(Array.from(points)).toEqual([1, 0, 0, 1]);
  });
});
