// Checks against general-purpose colour libraries from Debian (test/fixtures/checks/palette-reference.json,
// made by scripts/fixtures/palette-reference.py): colorspacious 1.1.2 for the Machado et al. 2009
// colour-vision-deficiency simulation and CIELab, colormath 3.0.0 for CIEDE2000.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  ciede2000,
  distinctColours,
  leastDifference,
  simulate,
  srgbToLab,
  topicStyles,
  VISIONS,
} from '../../../src/core/map/distinctPalette.js';
import { contrastRatio, topicPalette, type Rgb } from '../../../src/core/map/palette.js';

interface Reference {
  colours: Rgb[];
  simulated: Record<'protan' | 'deutan' | 'tritan', number[][]>;
  lab: number[][];
  pairs: [number, number][];
  ciede2000: number[];
}
const ref = JSON.parse(
  readFileSync(path.resolve(import.meta.dirname, '../../fixtures/checks/palette-reference.json'), 'utf8'),
) as Reference;

const minPairwise = (cs: readonly Rgb[]) => {
  let least = Infinity;
  for (let i = 0; i < cs.length; i++) for (let j = i + 1; j < cs.length; j++) least = Math.min(least, leastDifference(cs[i], cs[j]));
  return least;
};
const LIGHT: Rgb = [255, 255, 255];
const DARK: Rgb = [30, 30, 30];

describe('colour science against reference libraries', () => {
  it('simulates protanopia, deuteranopia and tritanopia as colorspacious does (Machado 2009, severity 100)', () => {
    for (const kind of ['protan', 'deutan', 'tritan'] as const) {
      ref.colours.forEach((c, i) => {
        const got = simulate(c, kind);
        for (let ch = 0; ch < 3; ch++) expect(Math.abs(got[ch] - ref.simulated[kind][i][ch]), `${kind} ${c} channel ${ch}`).toBeLessThan(1);
      });
    }
  });

  it('computes CIELab as colorspacious and CIEDE2000 as colormath', () => {
    ref.colours.forEach((c, i) => srgbToLab(c).forEach((v, k) => expect(Math.abs(v - ref.lab[i][k])).toBeLessThan(0.05)));
    ref.pairs.forEach(([i, j], n) =>
      expect(
        Math.abs(
          ciede2000(ref.lab[i] as unknown as [number, number, number], ref.lab[j] as unknown as [number, number, number]) -
            ref.ciede2000[n],
        ),
      ).toBeLessThan(1e-3),
    );
  });
});

describe('topic palette', () => {
  it('keeps 3:1 contrast and a clear least difference under every simulated deficiency, on light and dark backgrounds', () => {
    for (const bg of [LIGHT, DARK]) {
      const cs = distinctColours(bg);
      expect(cs).toHaveLength(8);
      for (const c of cs) expect(contrastRatio(c, bg)).toBeGreaterThanOrEqual(3);
      const least = minPairwise(cs);
      // The previous palette (golden-angle hues) had pairs such as rgb(194,94,83) and rgb(193,92,102).
      const before = minPairwise(topicPalette(8, bg));
      console.log(
        `background ${bg}: least CIEDE2000 over ${VISIONS.join('/')} = ${least.toFixed(1)} (golden-angle palette: ${before.toFixed(1)})`,
      );
      expect(least).toBeGreaterThan(before);
      expect(least).toBeGreaterThanOrEqual(10);
    }
    expect(leastDifference([194, 94, 83], [193, 92, 102])).toBeLessThan(10);
  });

  it('gives topics past the palette size another shape', () => {
    const s = topicStyles(20, LIGHT);
    expect(s.shapes.slice(0, 8)).toEqual(Array(8).fill(0));
    expect(s.shapes.slice(8, 16)).toEqual(Array(8).fill(1));
    expect(s.shapes[16]).toBe(2);
    expect(s.colours[8]).toEqual(s.colours[0]);
  });
});
