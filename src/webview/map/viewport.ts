/// <reference lib="dom" />
/**
 * The map's view transform: data coordinates (y up) to CSS pixels, with zoom about a point
 * (the point under the cursor stays put) and pan. Scale is kept between a quarter of the fitted
 * scale and 500 times it.
 */

export class Viewport {
  scale = 1;
  tx = 0;
  ty = 0;
  width = 1;
  height = 1;
  private fitScale = 1;

  resize(width: number, height: number): void {
    this.width = Math.max(1, width);
    this.height = Math.max(1, height);
  }

  /** Frame the points with a margin in pixels (right margin leaves room for the legend). */
  fit(x: ArrayLike<number>, y: ArrayLike<number>, margin: { left: number; right: number; top: number; bottom: number }): void {
    let minX = Infinity;
    let maxX = -Infinity;
    let minY = Infinity;
    let maxY = -Infinity;
    for (let i = 0; i < x.length; i++) {
      minX = Math.min(minX, x[i]);
      maxX = Math.max(maxX, x[i]);
      minY = Math.min(minY, y[i]);
      maxY = Math.max(maxY, y[i]);
    }
    if (!Number.isFinite(minX)) [minX, maxX, minY, maxY] = [-1, 1, -1, 1];
    const w = Math.max(maxX - minX, 1e-6);
    const h = Math.max(maxY - minY, 1e-6);
    const availW = Math.max(40, this.width - margin.left - margin.right);
    const availH = Math.max(40, this.height - margin.top - margin.bottom);
    this.scale = Math.min(availW / w, availH / h);
    this.fitScale = this.scale;
    this.tx = margin.left + (availW - w * this.scale) / 2 - minX * this.scale;
    this.ty = margin.top + (availH - h * this.scale) / 2 + maxY * this.scale;
  }

  /** How far the view is zoomed in relative to the fitted view. */
  get zoom(): number {
    return this.scale / this.fitScale;
  }

  sx(x: number): number {
    return x * this.scale + this.tx;
  }

  sy(y: number): number {
    return -y * this.scale + this.ty;
  }

  dataX(sx: number): number {
    return (sx - this.tx) / this.scale;
  }

  dataY(sy: number): number {
    return -(sy - this.ty) / this.scale;
  }

  zoomAt(sx: number, sy: number, factor: number): void {
    const next = Math.min(this.fitScale * 500, Math.max(this.fitScale / 4, this.scale * factor));
    const dx = this.dataX(sx);
    const dy = this.dataY(sy);
    this.scale = next;
    this.tx = sx - dx * next;
    this.ty = sy + dy * next;
  }

  pan(dx: number, dy: number): void {
    this.tx += dx;
    this.ty += dy;
  }
}
