/**
 * Topic colours for the map, made for whatever background the editor theme has. Hues step by the
 * golden angle (≈137.5°, so neighbouring topic ids never get neighbouring hues) at fixed OKLCH
 * chroma (Ottosson, "A perceptual color space for image processing", 2020), so every topic looks
 * equally strong; each colour's lightness is then moved away from the background until it reaches
 * the WCAG 2.1 non-text contrast minimum of 3:1 (success criterion 1.4.11) against it.
 */

export type Rgb = readonly [number, number, number];

export interface PaletteOptions {
  /** WCAG 2.1 SC 1.4.11 minimum for graphical objects. @default 3 */
  readonly minContrast: number;
  /** OKLCH chroma. @default 0.13 (vivid yet inside sRGB for most hues; common practice) */
  readonly chroma: number;
  /** Hue of topic 0 in degrees. @default 28 */
  readonly firstHue: number;
}

export const DEFAULT_PALETTE_OPTIONS: PaletteOptions = { minContrast: 3, chroma: 0.13, firstHue: 28 };

/** Golden angle in degrees, 360·(1 − 1/φ). */
const GOLDEN_ANGLE = 137.50776405;

/** Parse #rgb, #rrggbb, #rrggbbaa, rgb(…) or rgba(…); null for anything else. */
export function parseCssColour(text: string): Rgb | null {
  const t = text.trim().toLowerCase();
  let m = /^#([0-9a-f]{3})$/.exec(t);
  if (m) return [0, 1, 2].map((i) => parseInt(m![1][i] + m![1][i], 16)) as unknown as Rgb;
  m = /^#([0-9a-f]{6})([0-9a-f]{2})?$/.exec(t);
  if (m) return [0, 2, 4].map((i) => parseInt(m![1].slice(i, i + 2), 16)) as unknown as Rgb;
  m = /^rgba?\(\s*([\d.]+)[\s,]+([\d.]+)[\s,]+([\d.]+)/.exec(t);
  if (m) return [m[1], m[2], m[3]].map((v) => Math.max(0, Math.min(255, Math.round(Number(v))))) as unknown as Rgb;
  return null;
}

export function toHex(c: Rgb): string {
  return `#${c.map((v) => v.toString(16).padStart(2, '0')).join('')}`;
}

/** WCAG 2.x relative luminance of an sRGB colour. */
export function relativeLuminance(c: Rgb): number {
  const lin = c.map((v) => {
    const s = v / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2];
}

/** WCAG 2.x contrast ratio, from 1 (same) to 21 (black on white). */
export function contrastRatio(a: Rgb, b: Rgb): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}

/** OKLCH (L in [0, 1], C, h in degrees) to 8-bit sRGB, or null when outside the sRGB gamut. */
export function oklchToRgb(l: number, c: number, hueDegrees: number): Rgb | null {
  const h = (hueDegrees * Math.PI) / 180;
  const a = c * Math.cos(h);
  const b = c * Math.sin(h);
  // OKLab → LMS′ → LMS → linear sRGB (Ottosson 2020; matrices from the published reference code).
  const l1 = (l + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m1 = (l - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s1 = (l - 0.0894841775 * a - 1.291485548 * b) ** 3;
  const lin = [
    4.0767416621 * l1 - 3.3077115913 * m1 + 0.2309699292 * s1,
    -1.2684380046 * l1 + 2.6097574011 * m1 - 0.3413193965 * s1,
    -0.0041960863 * l1 - 0.7034186147 * m1 + 1.707614701 * s1,
  ];
  if (lin.some((v) => v < -1e-4 || v > 1 + 1e-4)) return null;
  return lin.map((v) => {
    const x = Math.max(0, Math.min(1, v));
    const s = x <= 0.0031308 ? 12.92 * x : 1.055 * x ** (1 / 2.4) - 0.055;
    return Math.round(s * 255);
  }) as unknown as Rgb;
}

/** One colour of the given hue with at least minContrast against the background. */
export function contrastingColour(hue: number, background: Rgb, options: Partial<PaletteOptions> = {}): Rgb {
  const opts = { ...DEFAULT_PALETTE_OPTIONS, ...options };
  const darkBackground = relativeLuminance(background) < 0.18;
  const step = darkBackground ? 0.01 : -0.01;
  for (let l = darkBackground ? 0.72 : 0.6; l >= 0.05 && l <= 0.99; l += step) {
    for (let c = opts.chroma; c >= 0; c -= 0.01) {
      const rgb = oklchToRgb(l, c, hue);
      if (rgb === null) continue;
      if (contrastRatio(rgb, background) >= opts.minContrast) return rgb;
      break;
    }
  }
  return darkBackground ? [255, 255, 255] : [0, 0, 0];
}

/** Colours for topics 0..count−1 against the given background. */
export function topicPalette(count: number, background: Rgb, options: Partial<PaletteOptions> = {}): Rgb[] {
  const opts = { ...DEFAULT_PALETTE_OPTIONS, ...options };
  const out: Rgb[] = [];
  for (let i = 0; i < count; i++) out.push(contrastingColour((opts.firstHue + i * GOLDEN_ANGLE) % 360, background, opts));
  return out;
}

/** Colour for files without a topic: a neutral grey that still meets the contrast minimum. */
export function unassignedColour(background: Rgb, options: Partial<PaletteOptions> = {}): Rgb {
  return contrastingColour(0, background, { ...options, chroma: 0 });
}
