import { describe, expect, it } from 'vitest';
import { alignFrame, applyFrame, applyFrameAll, fitFrame } from '../../../src/core/map/layoutFrame.js';
import { createRandom } from '../../../src/core/random.js';

describe('layout frames', () => {
  const rng = createRandom(6);
  const n = 50;
  const rawX = Float64Array.from({ length: n }, () => 3 + 2 * rng.normal());
  const rawY = Float64Array.from({ length: n }, () => -1 + rng.normal());

  it('centres on the mean and scales to unit RMS radius', () => {
    const { x, y } = applyFrameAll(fitFrame(rawX, rawY), rawX, rawY);
    expect(x.reduce((s, v) => s + v, 0) / n).toBeCloseTo(0, 6);
    expect(Math.sqrt(x.reduce((s, v, i) => s + v * v + y[i] * y[i], 0) / n)).toBeCloseTo(1, 6);
  });

  for (const [label, m] of [
    ['a rotation', [Math.cos(1.1), -Math.sin(1.1), Math.sin(1.1), Math.cos(1.1)]],
    ['a reflection', [Math.cos(0.4), Math.sin(0.4), Math.sin(0.4), -Math.cos(0.4)]],
  ] as const) {
    it(`recovers ${label} between two copies of a layout (orthogonal Procrustes, Schönemann 1966)`, () => {
      const f = fitFrame(rawX, rawY);
      const ref = applyFrameAll(f, rawX, rawY);
      const refX = new Float32Array(n);
      const refY = new Float32Array(n);
      for (let i = 0; i < n; i++) {
        refX[i] = m[0] * ref.x[i] + m[1] * ref.y[i];
        refY[i] = m[2] * ref.x[i] + m[3] * ref.y[i];
      }
      const aligned = alignFrame(f, rawX, rawY, refX, refY);
      for (let i = 0; i < n; i++) {
        const p = applyFrame(aligned, rawX[i], rawY[i]);
        expect(p.x).toBeCloseTo(refX[i], 5);
        expect(p.y).toBeCloseTo(refY[i], 5);
      }
    });
  }
});
