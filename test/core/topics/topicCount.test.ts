/**
 * Automatic topic count. References: the silhouette as Rousseeuw (1987) defines it, written out
 * here point by point from the coordinates (a(i), b(i), s(i) = (b − a)/max(a, b), 0 for
 * singletons); planted clusters whose number is known.
 */
import { describe, expect, it } from 'vitest';
import { chooseTopicCount, meanSilhouette } from '../../../src/core/topics/topicCount.js';
import { plantedClusters } from './fixtures.js';

function bruteSilhouette(points: Float64Array, dims: number, labels: number[]): number {
  const n = labels.length;
  const d = (i: number, j: number) => {
    let s = 0;
    for (let t = 0; t < dims; t++) s += points[i * dims + t] * points[j * dims + t];
    return Math.max(0, 1 - s);
  };
  let total = 0;
  for (let i = 0; i < n; i++) {
    const mine = labels.map((l, j) => (l === labels[i] && j !== i ? j : -1)).filter((j) => j >= 0);
    if (mine.length === 0) continue;
    const a = mine.reduce((s, j) => s + d(i, j), 0) / mine.length;
    let b = Infinity;
    for (const other of new Set(labels)) {
      if (other === labels[i]) continue;
      const js = labels.map((l, j) => (l === other ? j : -1)).filter((j) => j >= 0);
      b = Math.min(b, js.reduce((s, j) => s + d(i, j), 0) / js.length);
    }
    total += (b - a) / Math.max(a, b);
  }
  return total / n;
}

describe('automatic topic count', () => {
  it('computes the silhouette as Rousseeuw defines it', () => {
    const { points, dims } = plantedClusters(3, 8, 5, 0.6, 4);
    const labels = Array.from({ length: 24 }, (_, i) => (i * 7) % 4); // an arbitrary labelling, one of 4 groups
    labels[0] = 3;
    labels[1] = 3; // group sizes vary
    const n = 24;
    const dist = new Float64Array(n * n);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let t = 0; t < dims; t++) s += points[i * dims + t] * points[j * dims + t];
        dist[i * n + j] = i === j ? 0 : Math.max(0, 1 - s);
      }
    expect(meanSilhouette(dist, n, Int32Array.from(labels), 4)).toBeCloseTo(bruteSilhouette(points, dims, labels), 12);
  });

  for (const groups of [3, 5, 7]) {
    it(`finds ${groups} planted groups`, () => {
      const { points, dims } = plantedClusters(groups, 25, 30, 0.25, groups);
      const choice = chooseTopicCount(points, groups * 25, dims, { seed: 3 });
      expect(choice.topics).toBe(groups);
      expect(choice.scores.length).toBeGreaterThan(1);
    });
  }

  it('samples at most sampleSize points and still finds the groups', () => {
    const { points, dims } = plantedClusters(4, 300, 20, 0.25, 9);
    const choice = chooseTopicCount(points, 1200, dims, { seed: 1, sampleSize: 200 });
    expect(choice.sampled).toBe(200);
    expect(choice.topics).toBe(4);
  });

  it('answers 1 for fewer than 3 points or for points that all coincide', () => {
    const same = new Float64Array(50 * 3);
    for (let i = 0; i < 50; i++) same.set([0, 1, 0], i * 3);
    expect(chooseTopicCount(same, 50, 3).topics).toBe(1);
    expect(chooseTopicCount(same, 2, 3).topics).toBe(1);
    expect(chooseTopicCount(same, 0, 3).topics).toBe(0);
  });

  it('is deterministic for a fixed seed', () => {
    const { points, dims } = plantedClusters(5, 20, 10, 0.5, 2);
    const a = chooseTopicCount(points, 100, dims, { seed: 4 });
    const b = chooseTopicCount(points, 100, dims, { seed: 4 });
    expect(b).toEqual(a);
  });

  it("with several draws, averages each candidate's silhouettes over them; the first draw is the single-draw run", () => {
    const { points, dims } = plantedClusters(4, 200, 20, 0.5, 11);
    const n = 800;
    const one = chooseTopicCount(points, n, dims, { seed: 5, maxTopics: 8 });
    const three = chooseTopicCount(points, n, dims, { seed: 5, maxTopics: 8, draws: 3 });
    expect(three.scores.map((x) => x.topics)).toEqual(one.scores.map((x) => x.topics));
    // The mean of three draws, the first of which is the single draw: the others are recovered as
    // 3·mean − first and must be silhouettes themselves (within [−1, 1]) and not all equal to the first.
    const others = three.scores.map((x, i) => 3 * x.silhouette - one.scores[i].silhouette);
    for (const o of others) expect(Math.abs(o)).toBeLessThanOrEqual(2);
    expect(three.scores.some((x, i) => Math.abs(x.silhouette - one.scores[i].silhouette) > 1e-12)).toBe(true);
    const best = three.scores.reduce((a, b) => (b.silhouette > a.silhouette + 1e-12 ? b : a));
    expect(three.topics).toBe(best.topics);
    expect(three.topics).toBe(4); // planted
  });
});
