/// <reference lib="dom" />
/**
 * Software rasteriser for crowded maps: every dot is blended straight into one ImageData buffer
 * from a precomputed anti-aliased coverage stamp (coverage = clamp(r + ½ − distance, 0, 1) per
 * pixel, one stamp per quarter-pixel radius), then the buffer is put on the canvas once. For tens
 * of thousands of small dots this is several times faster than building canvas paths, because it
 * skips the path rasteriser entirely (it matters most where canvas drawing runs on the CPU).
 */
import type { Rgb } from '../../core/map/palette.js';
import type { Viewport } from './viewport.js';

interface Stamp {
  readonly half: number;
  readonly side: number;
  readonly coverage: Float32Array;
}

export interface RasterGroup {
  readonly members: Int32Array;
  readonly colour: Rgb;
  readonly alpha: number;
  /** 0 circle, 1 square, 2 triangle (distinctPalette.ts: the second cue past the palette's size). */
  readonly shape?: number;
}

export class DotRaster {
  private readonly stamps = new Map<number, Stamp>();
  private image: ImageData | null = null;

  draw(
    ctx: CanvasRenderingContext2D,
    vp: Viewport,
    dpr: number,
    x: Float32Array,
    y: Float32Array,
    radius: Float32Array,
    grow: number,
    groups: readonly RasterGroup[],
    background: Rgb,
  ): void {
    const w = ctx.canvas.width;
    const h = ctx.canvas.height;
    if (!this.image || this.image.width !== w || this.image.height !== h) this.image = ctx.createImageData(w, h);
    const px = this.image.data;
    // One 32-bit fill; RGBA bytes in memory order are little-endian ABGR words (every target platform).
    const packed = ((255 << 24) | (background[2] << 16) | (background[1] << 8) | background[0]) >>> 0;
    new Uint32Array(px.buffer, px.byteOffset, px.length / 4).fill(packed);
    for (const g of groups) {
      const [cr, cg, cb] = g.colour;
      for (let t = 0; t < g.members.length; t++) {
        const i = g.members[t];
        const r = radius[i] * grow * dpr;
        const cx = Math.round(vp.sx(x[i]) * dpr);
        const cy = Math.round(vp.sy(y[i]) * dpr);
        const s = this.stamp(r, g.shape ?? 0);
        const x0 = cx - s.half;
        const y0 = cy - s.half;
        if (x0 >= w || y0 >= h || x0 + s.side <= 0 || y0 + s.side <= 0) continue;
        for (let sy = 0; sy < s.side; sy++) {
          const yy = y0 + sy;
          if (yy < 0 || yy >= h) continue;
          for (let sx = 0; sx < s.side; sx++) {
            const xx = x0 + sx;
            if (xx < 0 || xx >= w) continue;
            const a = s.coverage[sy * s.side + sx] * g.alpha;
            if (a <= 0) continue;
            const o = 4 * (yy * w + xx);
            px[o] += (cr - px[o]) * a;
            px[o + 1] += (cg - px[o + 1]) * a;
            px[o + 2] += (cb - px[o + 2]) * a;
          }
        }
      }
    }
    ctx.putImageData(this.image, 0, 0);
  }

  private stamp(r: number, shape: number): Stamp {
    const q = Math.max(1, Math.round(r * 4));
    let s = this.stamps.get(q * 4 + shape);
    if (!s) {
      const radius = q / 4;
      const half = Math.ceil(radius * (shape === 2 ? 1.4 : 1) + 0.5);
      const side = 2 * half + 1;
      const coverage = new Float32Array(side * side);
      for (let yy = 0; yy < side; yy++) {
        for (let xx = 0; xx < side; xx++) {
          const dx = xx - half;
          const dy = yy - half;
          // Signed distance outside the shape: circle, square (same half-width), triangle pointing up.
          const d =
            shape === 1
              ? Math.max(Math.abs(dx), Math.abs(dy))
              : shape === 2
                ? radius + Math.max(dy - 0.675 * radius, 0.866 * Math.abs(dx) - 0.5 * dy - 0.675 * radius)
                : Math.hypot(dx, dy);
          coverage[yy * side + xx] = Math.max(0, Math.min(1, radius + 0.5 - d));
        }
      }
      s = { half, side, coverage };
      this.stamps.set(q * 4 + shape, s);
    }
    return s;
  }
}
