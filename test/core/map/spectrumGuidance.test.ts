// A slowly decaying spectrum, as term–document matrices have, and a sharply decaying one.
// Expected shares are worked out by hand from the formula (Σσ² over the first k, divided by ‖A‖²F).
import { describe, expect, it } from 'vitest';
import { spectrumGuidance } from '../../../src/core/map/spectrumGuidance.js';

describe('spectrum guidance', () => {
  it('says what k keeps, and that more concepts would add little when the tail is flat', () => {
    // σ_i = 1/i for i = 1..100, k = 50, total energy 4 (the matrix has more energy than the computed values).
    const s = Array.from({ length: 100 }, (_, i) => 1 / (i + 1));
    const kept50 = s.slice(0, 50).reduce((a, v) => a + v * v, 0) / 4;
    const g = spectrumGuidance(s, 4, 50);
    expect(g.kept).toBeCloseTo(kept50, 12);
    expect(g.summary).toContain(`k = 50 concepts, which keep ${(100 * kept50).toFixed(1)}%`);
    expect(g.tailPoints).toBeLessThan(2);
    expect(g.advice).toMatch(/^k looks large enough/);
    expect(g.advice).toContain('The next 50 concepts computed would add');
  });

  it('suggests more concepts while the last kept ones still add a lot', () => {
    const s = Array.from({ length: 20 }, () => 1);
    const g = spectrumGuidance(s, 40, 20);
    expect(g.kept).toBeCloseTo(0.5, 12);
    expect(g.tailPoints).toBeCloseTo(5, 9);
    expect(g.advice).toMatch(/^More concepts could still tell finer topics apart/);
    expect(g.advice).toContain('undertone.dimensions (for example 30)');
  });
});
