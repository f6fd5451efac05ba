/**
 * Sharing a level's sub-topics among its topics. References: Fox (1966, "Discrete optimization via
 * marginal analysis", Management Science 13:210–216): giving each unit to the largest marginal gain
 * is optimal when the curves are convex and decreasing, checked here against an exhaustive search;
 * D'Hondt's highest-averages rule (each further seat to the party whose votes per seat would be
 * highest), worked out by hand on a four-party example; planted clusters whose number is known.
 */
import { describe, expect, it } from 'vitest';
import { allocateClusters, dispersionCurve, sizeCurve } from '../../../src/core/topics/childAllocation.js';
import { createRandom } from '../../../src/core/random.js';
import { plantedClusters } from './fixtures.js';

/** The smallest total loss over every allocation of at most `total` clusters (each topic 1…its curve's length). */
function bestByExhaustion(curves: Float64Array[], total: number): number {
  let best = Infinity;
  const walk = (t: number, left: number, loss: number) => {
    if (t === curves.length) {
      best = Math.min(best, loss);
      return;
    }
    for (let k = 1; k <= curves[t].length && k <= left - (curves.length - t - 1); k++) walk(t + 1, left - k, loss + curves[t][k - 1]);
  };
  walk(0, total, 0);
  return best;
}

describe('sharing sub-topics among the topics of a level', () => {
  it('gives each further cluster where the loss falls most, which is optimal for convex curves (Fox 1966)', () => {
    const r = createRandom(11);
    for (let trial = 0; trial < 20; trial++) {
      const curves = Array.from({ length: 4 }, () => {
        // A convex decreasing curve: falls that shrink.
        const len = 1 + Math.floor(r.next() * 5);
        const out = new Float64Array(len);
        out[0] = 10 + 50 * r.next();
        let fall = out[0] * (0.2 + 0.6 * r.next());
        for (let k = 1; k < len; k++) {
          out[k] = out[k - 1] - fall;
          fall *= 0.2 + 0.7 * r.next();
        }
        return out;
      });
      const total = 4 + Math.floor(r.next() * 10);
      const k = allocateClusters(curves, total);
      const sum = k.reduce((s, x) => s + x, 0);
      expect(sum).toBeLessThanOrEqual(total);
      k.forEach((x, t) => {
        expect(x).toBeGreaterThanOrEqual(1);
        expect(x).toBeLessThanOrEqual(curves[t].length);
      });
      const loss = curves.reduce((s, c, t) => s + c[k[t] - 1], 0);
      expect(loss).toBeCloseTo(bestByExhaustion(curves, total), 9);
    }
  });

  it("by size: each further cluster to the topic whose clusters would be largest on average (D'Hondt's rule, worked by hand)", () => {
    // Topics of 100, 80, 30 and 20 files, 12 clusters: one each, then the 8 largest of the quotients
    // m/2, m/3, …: 50, 40, 33.3, 26.7, 25, 20, 20, 16.7 go to 100, 80, 100, 80, 100, 100, 80, 100.
    const sizes = [100, 80, 30, 20];
    expect(Array.from(allocateClusters(sizes.map((m) => sizeCurve(m, 8)), 12))).toEqual([6, 4, 1, 1]);
    // A topic's ceiling holds: with 100 files capped at 3 clusters, the quotients 50, 40, 33.3, 26.7,
    // 20, 16, 15, 13.3 go to 100, 80, 100, 80, 80, 80, 30, 80.
    expect(Array.from(allocateClusters([sizeCurve(100, 3), sizeCurve(80, 8), sizeCurve(30, 8), sizeCurve(20, 8)], 12))).toEqual([3, 6, 2, 1]);
  });

  it('dispersion: the loss of one cluster exactly, non-increasing after, and a sharp fall at the planted count', () => {
    const { points, dims } = plantedClusters(3, 40, 12, 0.05, 5);
    const idx = Int32Array.from({ length: 120 }, (_, i) => i);
    const curve = dispersionCurve(points, idx, dims, 6, { seed: 1 });
    const sum = new Float64Array(dims);
    for (let i = 0; i < 120; i++) for (let d = 0; d < dims; d++) sum[d] += points[i * dims + d];
    expect(curve[0]).toBeCloseTo(120 - Math.hypot(...sum), 9);
    for (let k = 1; k < curve.length; k++) expect(curve[k]).toBeLessThanOrEqual(curve[k - 1]);
    // Three tight groups: most of the loss is gone at three clusters, little more after.
    expect(curve[2]).toBeLessThan(0.2 * curve[0]);
    expect(curve[1] - curve[2]).toBeGreaterThan(5 * (curve[2] - curve[3]));
  });
});
