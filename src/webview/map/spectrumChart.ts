/// <reference lib="dom" />
/**
 * The spectrum tab: singular values as bars (left axis), the cumulative share of the matrix's
 * energy Σσ²/‖A‖²_F as a line (right axis, percent), and the chosen k marked; hovering a bar
 * shows its numbers. Series from core spectrum.ts.
 */
import { spectrumSeries, type SpectrumSeries } from '../../core/map/spectrum.js';
import type { MapTheme } from './theme.js';

const M = { left: 64, right: 64, top: 28, bottom: 64 };

export class SpectrumChart {
  private readonly ctx: CanvasRenderingContext2D;
  private readonly series: SpectrumSeries;
  private hover: number | null = null;
  private width = 1;

  constructor(
    private readonly canvas: HTMLCanvasElement,
    singularValues: readonly number[],
    totalEnergy: number,
    k: number,
    private theme: MapTheme,
  ) {
    this.ctx = canvas.getContext('2d', { alpha: false }) as CanvasRenderingContext2D;
    this.series = spectrumSeries(singularValues, totalEnergy, k);
    new ResizeObserver(() => this.draw()).observe(canvas);
    canvas.addEventListener('pointermove', (e) => {
      const r = canvas.getBoundingClientRect();
      const i = this.barAt(e.clientX - r.left);
      if (i !== this.hover) {
        this.hover = i;
        this.draw();
      }
    });
    canvas.addEventListener('pointerleave', () => {
      this.hover = null;
      this.draw();
    });
  }

  setTheme(theme: MapTheme): void {
    this.theme = theme;
    this.draw();
  }

  /** Share of the energy the chosen k factors keep. */
  get keptShare(): number {
    const { cumulative, k } = this.series;
    return k > 0 ? cumulative[Math.min(k, cumulative.length) - 1] : 0;
  }

  private barAt(px: number): number | null {
    const n = this.series.values.length;
    const w = (this.width - M.left - M.right) / Math.max(1, n);
    const i = Math.floor((px - M.left) / w);
    return i >= 0 && i < n ? i : null;
  }

  draw(): void {
    const rect = this.canvas.getBoundingClientRect();
    if (rect.width < 2) return;
    const dpr = window.devicePixelRatio || 1;
    this.width = rect.width;
    this.canvas.width = Math.round(rect.width * dpr);
    this.canvas.height = Math.round(rect.height * dpr);
    const c = this.ctx;
    const t = this.theme;
    c.setTransform(dpr, 0, 0, dpr, 0, 0);
    c.fillStyle = t.bg;
    c.fillRect(0, 0, rect.width, rect.height);
    const { values, cumulative, k } = this.series;
    const n = values.length;
    const plotW = rect.width - M.left - M.right;
    const plotH = rect.height - M.top - M.bottom;
    if (n === 0 || plotW < 20 || plotH < 20) return;
    const top = niceCeil(Math.max(...values));
    const bw = plotW / n;
    const xOf = (i: number) => M.left + i * bw;
    const yVal = (v: number) => M.top + plotH * (1 - v / top);
    const yShare = (s: number) => M.top + plotH * (1 - s);
    c.font = '11px system-ui, sans-serif';
    // Grid and axes.
    c.strokeStyle = t.border;
    c.fillStyle = t.muted;
    c.lineWidth = 1;
    for (let g = 0; g <= 4; g++) {
      const yy = Math.round(M.top + (plotH * g) / 4) + 0.5;
      c.beginPath();
      c.moveTo(M.left, yy);
      c.lineTo(M.left + plotW, yy);
      c.stroke();
      c.textAlign = 'right';
      c.fillText(formatValue(top * (1 - g / 4)), M.left - 8, yy + 4);
      c.textAlign = 'left';
      c.fillText(`${Math.round(100 * (1 - g / 4))}%`, M.left + plotW + 8, yy + 4);
    }
    // Bars: kept factors in the accent colour, the rest muted.
    for (let i = 0; i < n; i++) {
      c.fillStyle = i < k ? t.accent : t.muted;
      c.globalAlpha = i === this.hover ? 1 : i < k ? 0.75 : 0.35;
      const gap = bw > 4 ? 1 : 0;
      c.fillRect(xOf(i) + gap / 2, yVal(values[i]), Math.max(0.5, bw - gap), M.top + plotH - yVal(values[i]));
    }
    c.globalAlpha = 1;
    // Cumulative share line.
    c.strokeStyle = t.fg;
    c.lineWidth = 2;
    c.beginPath();
    for (let i = 0; i < n; i++) {
      const px = xOf(i) + bw / 2;
      if (i === 0) c.moveTo(px, yShare(cumulative[i]));
      else c.lineTo(px, yShare(cumulative[i]));
    }
    c.stroke();
    // Chosen k.
    if (k > 0 && k <= n) {
      const kx = Math.round(xOf(k)) + 0.5;
      c.setLineDash([4, 4]);
      c.strokeStyle = t.fg;
      c.lineWidth = 1;
      c.beginPath();
      c.moveTo(kx, M.top);
      c.lineTo(kx, M.top + plotH);
      c.stroke();
      c.setLineDash([]);
      c.fillStyle = t.fg;
      c.textAlign = kx > M.left + plotW - 160 ? 'right' : 'left';
      c.fillText(
        `k = ${k} keeps ${(100 * cumulative[k - 1]).toFixed(1)}% of the energy`,
        kx + (c.textAlign === 'right' ? -6 : 6),
        M.top + 12,
      );
    }
    // Axis titles and x ticks.
    c.fillStyle = t.muted;
    c.textAlign = 'center';
    const tickEvery = niceCeil(n / 8);
    for (let i = tickEvery; i <= n; i += tickEvery) c.fillText(String(i), xOf(i - 1) + bw / 2, M.top + plotH + 16);
    c.fillText('factor', M.left + plotW / 2, M.top + plotH + 34);
    c.save();
    c.translate(18, M.top + plotH / 2);
    c.rotate(-Math.PI / 2);
    c.fillText('singular value σ', 0, 0);
    c.restore();
    c.save();
    c.translate(rect.width - 16, M.top + plotH / 2);
    c.rotate(Math.PI / 2);
    c.fillText('cumulative share of ‖A‖²', 0, 0);
    c.restore();
    if (this.hover !== null) {
      const i = this.hover;
      c.fillStyle = t.fg;
      c.textAlign = 'left';
      c.fillText(`σ${i + 1} = ${formatValue(values[i])} · cumulative ${(100 * cumulative[i]).toFixed(1)}%`, M.left, M.top - 10);
    }
  }
}

function niceCeil(v: number): number {
  if (!(v > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(v));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * p >= v) return m * p;
  return 10 * p;
}

function formatValue(v: number): string {
  const text = v >= 100 ? v.toFixed(0) : v >= 10 ? v.toFixed(1) : v.toFixed(2);
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}
