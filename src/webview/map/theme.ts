/// <reference lib="dom" />
/**
 * Reads the page colours from the stylesheet's variables (which follow the editor theme, or the
 * standalone fallbacks) by letting the browser resolve them on a probe element, then builds the
 * topic palette for that background (core distinctPalette.ts: colours told apart under
 * simulated colour-vision deficiencies, at WCAG 3:1 non-text contrast; shapes past its size).
 */
import { topicStyles } from '../../core/map/distinctPalette.js';
import { parseCssColour, toHex, unassignedColour, type Rgb } from '../../core/map/palette.js';

export interface MapTheme {
  readonly bg: string;
  readonly fg: string;
  readonly muted: string;
  readonly accent: string;
  readonly border: string;
  readonly dark: boolean;
  readonly highContrast: boolean;
  readonly topics: string[];
  /** Dot shape of each topic (0 circle, 1 square, 2 triangle): the second cue past the palette's size. */
  readonly shapes: number[];
  readonly unassigned: string;
  /** The same colours as RGB triples, for the software rasteriser. */
  readonly rgb: { readonly bg: Rgb; readonly topics: Rgb[]; readonly unassigned: Rgb };
}

export function readTheme(root: HTMLElement, topicCount: number): MapTheme {
  const probe = document.createElement('span');
  root.append(probe);
  const resolve = (name: string, fallback: Rgb): Rgb => {
    probe.style.color = '';
    probe.style.color = `var(${name})`;
    return parseCssColour(getComputedStyle(probe).color) ?? fallback;
  };
  const bg = resolve('--um-bg', [255, 255, 255]);
  const fg = resolve('--um-fg', [31, 35, 40]);
  const muted = resolve('--um-muted', [89, 99, 110]);
  const accent = resolve('--um-accent', [11, 102, 214]);
  const border = resolve('--um-border', [209, 217, 224]);
  probe.remove();
  const cls = document.body.classList;
  const luminance = (0.2126 * bg[0] + 0.7152 * bg[1] + 0.0722 * bg[2]) / 255;
  const styles = topicStyles(topicCount, bg);
  const topics = styles.colours;
  const unassigned = unassignedColour(bg);
  return {
    bg: toHex(bg),
    fg: toHex(fg),
    muted: toHex(muted),
    accent: toHex(accent),
    border: toHex(border),
    dark: luminance < 0.5,
    highContrast: cls.contains('vscode-high-contrast') || cls.contains('vscode-high-contrast-light'),
    topics: topics.map(toHex),
    shapes: styles.shapes,
    unassigned: toHex(unassigned),
    rgb: { bg, topics, unassigned },
  };
}

/** Calls back when the editor theme (body class) or the system colour scheme changes. */
export function watchTheme(onChange: () => void): void {
  new MutationObserver(onChange).observe(document.body, { attributes: true, attributeFilter: ['class'] });
  window.matchMedia('(prefers-color-scheme: dark)').addEventListener('change', onChange);
}
