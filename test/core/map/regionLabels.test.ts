import { describe, expect, it } from 'vitest';
import { labelsToDraw, regionAnchors } from '../../../src/core/map/regionLabels.js';

describe('region labels', () => {
  it('anchors each topic at the median of its files, largest first, and skips tiny topics', () => {
    // Topic 0: four files around (0, 0) and one far away (the median ignores it, a mean would not).
    const x = [0, 1, -1, 0, 100, 10, 11, 12, 50];
    const y = [0, 0, 0, 1, 100, 10, 10, 10, 50];
    const t = [0, 0, 0, 0, 0, 1, 1, 1, 2];
    expect(regionAnchors(x, y, t, 3)).toEqual([
      { topic: 0, count: 5, x: 0, y: 0 },
      { topic: 1, count: 3, x: 11, y: 10 },
    ]);
  });

  it('keeps the first of two overlapping labels', () => {
    const boxes = [
      { topic: 0, left: 0, top: 0, width: 50, height: 12 },
      { topic: 1, left: 40, top: 5, width: 50, height: 12 },
      { topic: 2, left: 0, top: 30, width: 50, height: 12 },
    ];
    expect(labelsToDraw(boxes).map((b) => b.topic)).toEqual([0, 2]);
  });
});
