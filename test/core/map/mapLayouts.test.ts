import { describe, expect, it } from 'vitest';
import { computeMapLayouts } from '../../../src/core/map/mapLayouts.js';
import { procrustesDisparity, swissRoll } from './helpers.js';

describe('computeMapLayouts', () => {
  const roll = swissRoll(300, 6, 2);
  it('turns the faithful layout toward the quick one without changing its shape', () => {
    const aligned = computeMapLayouts(roll.data, roll.n, roll.dim, { faithful: { landmarks: 40 } });
    const plain = computeMapLayouts(roll.data, roll.n, roll.dim, { faithful: { landmarks: 40 }, align: false });
    const fit = (fx: Float32Array, fy: Float32Array) => {
      let s = 0;
      for (let i = 0; i < roll.n; i++) s += (fx[i] - aligned.quick.x[i]) ** 2 + (fy[i] - aligned.quick.y[i]) ** 2;
      return s;
    };
    expect(fit(aligned.faithful.x, aligned.faithful.y)).toBeLessThanOrEqual(fit(plain.faithful.x, plain.faithful.y) + 1e-6);
    expect(procrustesDisparity(aligned.faithful.x, aligned.faithful.y, plain.faithful.x, plain.faithful.y)).toBeLessThan(1e-10);
  });

  it('uses full Isomap below fullIsomapMaxN', () => {
    const r = computeMapLayouts(roll.data, roll.n, roll.dim, { fullIsomapMaxN: 1000 });
    expect(r.faithful.method).toBe('isomap');
  });
});
