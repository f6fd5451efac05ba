import { describe, expect, it } from 'vitest';
import {
  contrastRatio,
  oklchToRgb,
  parseCssColour,
  relativeLuminance,
  toHex,
  topicPalette,
  unassignedColour,
  type Rgb,
} from '../../../src/core/map/palette.js';

// Typical editor backgrounds (from memory of the default light, dark and high-contrast themes).
const BACKGROUNDS: Rgb[] = [
  [255, 255, 255],
  [30, 30, 30],
  [0, 0, 0],
  [37, 37, 38],
  [245, 245, 245],
];

describe('topic palette', () => {
  it('meets the WCAG 2.1 non-text contrast minimum of 3:1 (SC 1.4.11) on every background', () => {
    for (const bg of BACKGROUNDS) {
      for (const c of topicPalette(24, bg)) expect(contrastRatio(c, bg)).toBeGreaterThanOrEqual(3);
      expect(contrastRatio(unassignedColour(bg), bg)).toBeGreaterThanOrEqual(3);
    }
  });

  it('gives distinct colours to the first twelve topics', () => {
    const p = topicPalette(12, [255, 255, 255]).map(toHex);
    expect(new Set(p).size).toBe(12);
  });

  it('computes WCAG contrast: black on white is 21:1, and mid grey #767676 on white is 4.54:1', () => {
    // Both values as published around WCAG 2.x (the second is the usual "lightest AA grey" example).
    expect(contrastRatio([0, 0, 0], [255, 255, 255])).toBeCloseTo(21, 6);
    expect(contrastRatio([0x76, 0x76, 0x76], [255, 255, 255])).toBeCloseTo(4.54, 2);
    expect(relativeLuminance([255, 255, 255])).toBeCloseTo(1, 12);
  });

  it('converts OKLCH to sRGB: white, black, and Ottosson’s published sRGB red (L 0.628, C 0.258, h 29.2°)', () => {
    expect(oklchToRgb(1, 0, 0)).toEqual([255, 255, 255]);
    expect(oklchToRgb(0, 0, 0)).toEqual([0, 0, 0]);
    // sRGB red is OKLab (0.62796, 0.22486, 0.12585) (from memory of the OKLab post), i.e. C ≈ 0.2577, h ≈ 29.23°.
    expect(oklchToRgb(0.62796, 0.25768, 29.234)).toEqual([255, 0, 0]);
    expect(oklchToRgb(0.5, 0.4, 140)).toBeNull();
  });

  it('parses the colour forms editor themes use', () => {
    expect(parseCssColour('#1e1e1e')).toEqual([30, 30, 30]);
    expect(parseCssColour('#fff')).toEqual([255, 255, 255]);
    expect(parseCssColour('#1e1e1e80')).toEqual([30, 30, 30]);
    expect(parseCssColour('rgb(10, 20, 30)')).toEqual([10, 20, 30]);
    expect(parseCssColour('rgba(10 20 30 / 50%)')).toEqual([10, 20, 30]);
    expect(parseCssColour('tomato')).toBeNull();
  });
});
