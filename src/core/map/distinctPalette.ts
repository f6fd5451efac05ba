/**
 * Topic colours that people can tell apart, including people with colour-vision deficiencies.
 *
 * Candidates are OKLCH colours (Ottosson 2020; palette.ts converts) on a grid of lightness,
 * chroma and hue that lie in sRGB and keep the WCAG 2.1 non-text contrast of 3:1 against the
 * background. Colours are picked greedily, farthest first (Gonzalez 1985, "Clustering to minimize
 * the maximum intercluster distance"): each next colour is the candidate whose smallest colour
 * difference to those already picked is largest, where a difference is the least CIEDE2000 ΔE
 * (Sharma, Wu & Dalal 2005, "The CIEDE2000 color-difference formula: implementation notes") over
 * four ways of seeing: typical vision and simulated protanopia, deuteranopia and tritanopia
 * (Machado, Oliveira & Fernandes 2009, "A physiologically-based model for simulation of color
 * vision deficiency", severity 1.0 matrices applied to linear sRGB).
 * Past `size` colours the differences get too small to trust, so topics beyond it reuse the
 * colours with another dot shape (the map's second cue; region labels are the third).
 */
import { contrastRatio, oklchToRgb, type Rgb } from './palette.js';

export type Vision = 'typical' | 'protan' | 'deutan' | 'tritan';
export const VISIONS: readonly Vision[] = ['typical', 'protan', 'deutan', 'tritan'];

/** Machado et al. 2009, severity 1.0, for linear sRGB (rows: R′, G′, B′). Values as published (here from memory, checked against colorspacious in the tests). */
const MACHADO: Record<Exclude<Vision, 'typical'>, readonly number[]> = {
  protan: [0.152286, 1.052583, -0.204868, 0.114503, 0.786281, 0.099216, -0.003882, -0.048116, 1.051998],
  deutan: [0.367322, 0.860646, -0.227968, 0.280085, 0.672501, 0.047413, -0.01182, 0.04294, 0.968881],
  tritan: [1.255528, -0.076749, -0.178779, -0.078411, 0.930809, 0.147602, 0.004733, 0.691367, 0.3039],
};

export type Lab = readonly [number, number, number];

function toLinear(v: number): number {
  const s = v / 255;
  return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
}

function fromLinear(x: number): number {
  const c = Math.max(0, Math.min(1, x));
  return 255 * (c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055);
}

/** An sRGB colour as a person with the given deficiency sees it (Machado 2009, full severity). */
export function simulate(c: Rgb, vision: Vision): [number, number, number] {
  if (vision === 'typical') return [c[0], c[1], c[2]];
  const m = MACHADO[vision];
  const [r, g, b] = [toLinear(c[0]), toLinear(c[1]), toLinear(c[2])];
  return [0, 1, 2].map((i) => fromLinear(m[3 * i] * r + m[3 * i + 1] * g + m[3 * i + 2] * b)) as [number, number, number];
}

/** CIE L*a*b* (D65 white) of an sRGB colour (channels 0–255, fractions allowed). */
export function srgbToLab(c: readonly [number, number, number]): Lab {
  const [r, g, b] = [toLinear(c[0]), toLinear(c[1]), toLinear(c[2])];
  const x = (0.4124564 * r + 0.3575761 * g + 0.1804375 * b) / 0.95047;
  const y = 0.2126729 * r + 0.7151522 * g + 0.072175 * b;
  const z = (0.0193339 * r + 0.119192 * g + 0.9503041 * b) / 1.08883;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  const [fx, fy, fz] = [f(x), f(y), f(z)];
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** CIEDE2000 colour difference (kL = kC = kH = 1), per Sharma, Wu & Dalal 2005. */
export function ciede2000(p: Lab, q: Lab): number {
  const [L1, a1, b1] = p;
  const [L2, a2, b2] = q;
  const rad = Math.PI / 180;
  const C1 = Math.hypot(a1, b1);
  const C2 = Math.hypot(a2, b2);
  const Cbar7 = ((C1 + C2) / 2) ** 7;
  const G = 0.5 * (1 - Math.sqrt(Cbar7 / (Cbar7 + 25 ** 7)));
  const a1p = (1 + G) * a1;
  const a2p = (1 + G) * a2;
  const C1p = Math.hypot(a1p, b1);
  const C2p = Math.hypot(a2p, b2);
  const hue = (b: number, a: number) => (b === 0 && a === 0 ? 0 : (Math.atan2(b, a) / rad + 360) % 360);
  const h1p = hue(b1, a1p);
  const h2p = hue(b2, a2p);
  const dLp = L2 - L1;
  const dCp = C2p - C1p;
  let dhp = 0;
  if (C1p * C2p !== 0) {
    dhp = h2p - h1p;
    if (dhp > 180) dhp -= 360;
    else if (dhp < -180) dhp += 360;
  }
  const dHp = 2 * Math.sqrt(C1p * C2p) * Math.sin((dhp / 2) * rad);
  const Lbp = (L1 + L2) / 2;
  const Cbp = (C1p + C2p) / 2;
  let hbp = h1p + h2p;
  if (C1p * C2p !== 0) {
    if (Math.abs(h1p - h2p) <= 180) hbp = (h1p + h2p) / 2;
    else hbp = h1p + h2p < 360 ? (h1p + h2p + 360) / 2 : (h1p + h2p - 360) / 2;
  }
  const T =
    1 -
    0.17 * Math.cos((hbp - 30) * rad) +
    0.24 * Math.cos(2 * hbp * rad) +
    0.32 * Math.cos((3 * hbp + 6) * rad) -
    0.2 * Math.cos((4 * hbp - 63) * rad);
  const dTheta = 30 * Math.exp(-(((hbp - 275) / 25) ** 2));
  const Cbp7 = Cbp ** 7;
  const Rc = 2 * Math.sqrt(Cbp7 / (Cbp7 + 25 ** 7));
  const Sl = 1 + (0.015 * (Lbp - 50) ** 2) / Math.sqrt(20 + (Lbp - 50) ** 2);
  const Sc = 1 + 0.045 * Cbp;
  const Sh = 1 + 0.015 * Cbp * T;
  const Rt = -Math.sin(2 * dTheta * rad) * Rc;
  return Math.sqrt((dLp / Sl) ** 2 + (dCp / Sc) ** 2 + (dHp / Sh) ** 2 + Rt * (dCp / Sc) * (dHp / Sh));
}

/** The least CIEDE2000 difference of two colours over the four ways of seeing. */
export function leastDifference(a: Rgb, b: Rgb, visions: readonly Vision[] = VISIONS): number {
  let least = Infinity;
  for (const v of visions) least = Math.min(least, ciede2000(srgbToLab(simulate(a, v)), srgbToLab(simulate(b, v))));
  return least;
}

export interface DistinctPaletteOptions {
  /** Colours before shapes take over as the second cue. @default 8 */
  readonly size: number;
  /** WCAG 2.1 SC 1.4.11 minimum against the background. @default 3 */
  readonly minContrast: number;
}

export const DEFAULT_DISTINCT_PALETTE_OPTIONS: DistinctPaletteOptions = { size: 8, minContrast: 3 };

/** Up to `size` colours, picked farthest first for all four ways of seeing, against the background. */
export function distinctColours(background: Rgb, options: Partial<DistinctPaletteOptions> = {}): Rgb[] {
  const o = { ...DEFAULT_DISTINCT_PALETTE_OPTIONS, ...options };
  const cands: { rgb: Rgb; labs: Lab[]; chroma: number }[] = [];
  for (let l = 0.4; l <= 0.9001; l += 0.05) {
    for (const c of [0.09, 0.13, 0.17, 0.21]) {
      for (let h = 0; h < 360; h += 10) {
        const rgb = oklchToRgb(l, c, h);
        if (!rgb || contrastRatio(rgb, background) < o.minContrast) continue;
        cands.push({ rgb, labs: VISIONS.map((v) => srgbToLab(simulate(rgb, v))), chroma: c });
      }
    }
  }
  if (cands.length === 0) return [];
  // Start from the most colourful candidate that is farthest from the background's grey.
  const bgLabs = VISIONS.map((v) => srgbToLab(simulate(background, v)));
  const least = (x: Lab[], y: Lab[]) => Math.min(...x.map((lab, i) => ciede2000(lab, y[i])));
  let first = 0;
  for (let i = 1; i < cands.length; i++) {
    const a = cands[i];
    const b = cands[first];
    if (a.chroma > b.chroma || (a.chroma === b.chroma && least(a.labs, bgLabs) > least(b.labs, bgLabs))) first = i;
  }
  const picked = [first];
  const gap = cands.map((c) => least(c.labs, cands[first].labs));
  while (picked.length < Math.min(o.size, cands.length)) {
    let next = -1;
    for (let i = 0; i < cands.length; i++) if (gap[i] > 0 && (next < 0 || gap[i] > gap[next])) next = i;
    if (next < 0) break;
    picked.push(next);
    for (let i = 0; i < cands.length; i++) gap[i] = Math.min(gap[i], least(cands[i].labs, cands[next].labs));
  }
  return picked.map((i) => cands[i].rgb);
}

/** Colour and dot shape (0 circle, 1 square, 2 triangle, …) of each of `count` topics. */
export function topicStyles(
  count: number,
  background: Rgb,
  options: Partial<DistinctPaletteOptions> = {},
): { colours: Rgb[]; shapes: number[] } {
  const base = distinctColours(background, options);
  const n = Math.max(1, base.length);
  return {
    colours: Array.from({ length: count }, (_, i) => base[i % n] ?? [128, 128, 128]),
    shapes: Array.from({ length: count }, (_, i) => Math.floor(i / n) % SHAPES),
  };
}

/** Number of dot shapes the map draws. */
export const SHAPES = 3;
