/**
 * A uniform grid over 2-D points for hit-testing on the map (Bentley & Friedman 1979 survey of
 * cell methods): points are bucketed into cells sized for about `perCell` points each (common
 * practice: 2–4), stored CSR-style; a nearest-point query scans rings of cells outward and stops
 * once the ring is farther than the best hit. Build O(n), query O(points in nearby cells).
 */

export class SpatialGrid {
  private constructor(
    private readonly x: ArrayLike<number>,
    private readonly y: ArrayLike<number>,
    private readonly minX: number,
    private readonly minY: number,
    private readonly cell: number,
    private readonly cols: number,
    private readonly rows: number,
    private readonly start: Int32Array,
    private readonly items: Int32Array,
  ) {}

  static build(x: ArrayLike<number>, y: ArrayLike<number>, perCell = 3): SpatialGrid {
    const n = x.length;
    let minX = Infinity;
    let minY = Infinity;
    let maxX = -Infinity;
    let maxY = -Infinity;
    for (let i = 0; i < n; i++) {
      minX = Math.min(minX, x[i]);
      maxX = Math.max(maxX, x[i]);
      minY = Math.min(minY, y[i]);
      maxY = Math.max(maxY, y[i]);
    }
    if (n === 0) [minX, minY, maxX, maxY] = [0, 0, 1, 1];
    const w = Math.max(maxX - minX, 1e-9);
    const h = Math.max(maxY - minY, 1e-9);
    const cells = Math.max(1, Math.ceil(n / perCell));
    const cell = Math.max(Math.sqrt((w * h) / cells), Math.max(w, h) / 4096);
    const cols = Math.min(4096, Math.floor(w / cell) + 1);
    const rows = Math.min(4096, Math.floor(h / cell) + 1);
    const start = new Int32Array(cols * rows + 1);
    const cellOf = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const cx = Math.min(cols - 1, Math.floor((x[i] - minX) / cell));
      const cy = Math.min(rows - 1, Math.floor((y[i] - minY) / cell));
      cellOf[i] = cy * cols + cx;
      start[cellOf[i] + 1]++;
    }
    for (let c = 0; c < cols * rows; c++) start[c + 1] += start[c];
    const fill = start.slice(0, cols * rows);
    const items = new Int32Array(n);
    for (let i = 0; i < n; i++) items[fill[cellOf[i]]++] = i;
    return new SpatialGrid(x, y, minX, minY, cell, cols, rows, start, items);
  }

  /** Index of the point nearest (px, py) within maxDistance that passes accept, or -1. */
  nearest(px: number, py: number, maxDistance: number, accept: (i: number) => boolean = () => true): number {
    const cx = Math.floor((px - this.minX) / this.cell);
    const cy = Math.floor((py - this.minY) / this.cell);
    let best = -1;
    let bestD = maxDistance * maxDistance;
    const reach = this.cols + this.rows + Math.abs(cx) + Math.abs(cy);
    const maxRing = Math.min(reach, Math.ceil(maxDistance / this.cell) + 1);
    for (let ring = 0; ring <= maxRing; ring++) {
      // Every point in this ring is at least (ring − 1)·cell away.
      const gap = (ring - 1) * this.cell;
      if (ring > 0 && gap > 0 && gap * gap > bestD) break;
      for (let gy = cy - ring; gy <= cy + ring; gy++) {
        if (gy < 0 || gy >= this.rows) continue;
        const edgeRow = gy === cy - ring || gy === cy + ring;
        for (let gx = cx - ring; gx <= cx + ring; gx += edgeRow ? 1 : 2 * ring) {
          if (gx >= 0 && gx < this.cols) {
            const c = gy * this.cols + gx;
            for (let p = this.start[c]; p < this.start[c + 1]; p++) {
              const i = this.items[p];
              const d = (this.x[i] - px) ** 2 + (this.y[i] - py) ** 2;
              if (d <= bestD && (d < bestD || best < 0 || i < best) && accept(i)) {
                bestD = d;
                best = i;
              }
            }
          }
          if (ring === 0) break;
        }
      }
    }
    return best;
  }
}
