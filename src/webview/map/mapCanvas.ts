/// <reference lib="dom" />
/**
 * The interactive map canvas: sizing for the device pixel ratio, redraws coalesced to one per
 * animation frame, wheel zoom about the cursor, drag to pan, keyboard zoom/pan, hover and click
 * hit-testing through a spatial grid (core spatialGrid.ts), and an eased transition when the
 * layout changes.
 */
import { SpatialGrid } from '../../core/map/spatialGrid.js';
import { DotRaster } from './dotRaster.js';
import { drawMap, TRAIL_MARK, zoomGrowth, type MapScene } from './mapRenderer.js';
import type { MapTheme } from './theme.js';
import { Viewport } from './viewport.js';

export interface MapCanvasEvents {
  hover(index: number | null, clientX: number, clientY: number): void;
  click(index: number | null): void;
  /** A point of the trail of sections (mapRenderer.ts) under the pointer, or null. */
  hoverTrail?(point: number | null, clientX: number, clientY: number): void;
  clickTrail?(point: number): void;
}

/** Pixels a press may move and still count as a click (common practice). */
const CLICK_SLOP = 4;
/** Extra pick distance around a dot, in CSS pixels. */
const PICK_MARGIN = 4;
const TRANSITION_MS = 450;

export class MapCanvas {
  readonly vp = new Viewport();
  private readonly ctx: CanvasRenderingContext2D;
  private readonly raster = new DotRaster();
  private grid: SpatialGrid;
  private frame = 0;
  private drag: { id: number; x: number; y: number; moved: boolean } | null = null;
  private animating = false;
  /** Set once the person zooms or pans; until then a resize refits the whole map. */
  private moved = false;
  private readonly margin = { left: 24, right: 260, top: 24, bottom: 44 };

  constructor(
    readonly canvas: HTMLCanvasElement,
    readonly scene: MapScene,
    private theme: MapTheme,
    private readonly events: MapCanvasEvents,
  ) {
    this.ctx = canvas.getContext('2d', { alpha: false }) as CanvasRenderingContext2D;
    this.grid = SpatialGrid.build(scene.x, scene.y);
    this.listen();
    new ResizeObserver(() => this.resize()).observe(canvas);
    this.resize();
    this.fit();
  }

  setTheme(theme: MapTheme): void {
    this.theme = theme;
    this.requestDraw();
  }

  fit(): void {
    this.moved = false;
    this.vp.fit(this.scene.x, this.scene.y, this.margin);
    this.requestDraw();
  }

  /** Move every dot to a new layout, easing between the two. */
  showLayout(x: ArrayLike<number>, y: ArrayLike<number>, animate: boolean): void {
    const fromX = this.scene.x.slice();
    const fromY = this.scene.y.slice();
    const toX = Float32Array.from(x);
    const toY = Float32Array.from(y);
    // Frame the destination up front, so the dots glide into a view that fits them.
    if (!this.moved) this.vp.fit(toX, toY, this.margin);
    const finish = () => {
      this.scene.x = toX;
      this.scene.y = toY;
      this.grid = SpatialGrid.build(toX, toY);
      this.animating = false;
      this.requestDraw();
    };
    if (!animate || window.matchMedia('(prefers-reduced-motion: reduce)').matches) return finish();
    this.animating = true;
    const start = performance.now();
    const step = (now: number) => {
      const t = Math.min(1, (now - start) / TRANSITION_MS);
      if (t >= 1) return finish();
      const e = t < 0.5 ? 4 * t * t * t : 1 - (-2 * t + 2) ** 3 / 2;
      const cx = new Float32Array(toX.length);
      const cy = new Float32Array(toY.length);
      for (let i = 0; i < cx.length; i++) {
        cx[i] = fromX[i] + (toX[i] - fromX[i]) * e;
        cy[i] = fromY[i] + (toY[i] - fromY[i]) * e;
      }
      this.scene.x = cx;
      this.scene.y = cy;
      this.draw();
      requestAnimationFrame(step);
    };
    requestAnimationFrame(step);
  }

  requestDraw(): void {
    if (this.frame !== 0) return;
    this.frame = requestAnimationFrame(() => {
      this.frame = 0;
      this.draw();
    });
  }

  /** Centre the view on a file without changing the zoom. */
  reveal(i: number): void {
    this.moved = true;
    this.vp.pan(this.vp.width / 2 - this.vp.sx(this.scene.x[i]), this.vp.height / 2 - this.vp.sy(this.scene.y[i]));
    this.requestDraw();
  }

  /** The file under a point in CSS pixels relative to the canvas, or null. */
  pick(px: number, py: number): number | null {
    if (this.animating) return null;
    const grow = zoomGrowth(this.vp.zoom);
    const reach = (6 * grow + PICK_MARGIN) / this.vp.scale;
    const dx = this.vp.dataX(px);
    const dy = this.vp.dataY(py);
    const focus = this.scene.focusTopic;
    const i = this.grid.nearest(dx, dy, reach, (j) => focus === null || this.scene.topicIds[j] === focus);
    if (i < 0) return null;
    const d = Math.hypot(this.vp.sx(this.scene.x[i]) - px, this.vp.sy(this.scene.y[i]) - py);
    return d <= this.scene.radius[i] * grow + PICK_MARGIN ? i : null;
  }

  /** The trail point under a point in CSS pixels relative to the canvas (the last drawn wins), or null. */
  pickTrail(px: number, py: number): number | null {
    const t = this.scene.trail;
    if (this.animating || !t) return null;
    for (let i = t.x.length - 1; i >= 0; i--) {
      const r = (i === 0 ? TRAIL_MARK + 1.5 : TRAIL_MARK) + PICK_MARGIN;
      if (Math.abs(this.vp.sx(t.x[i]) - px) <= r && Math.abs(this.vp.sy(t.y[i]) - py) <= r) return i;
    }
    return null;
  }

  private draw(): void {
    const dpr = window.devicePixelRatio || 1;
    this.ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    drawMap(this.ctx, this.vp, this.scene, this.theme, this.raster, dpr);
    // Where the trail's last point is drawn (CSS pixels in the canvas): read by the end-to-end test,
    // which cannot see inside the canvas, to point at a section as a person would.
    const t = this.scene.trail;
    const last = t && t.x.length ? t.x.length - 1 : -1;
    if (last >= 0) this.canvas.dataset.trailLast = `${this.vp.sx(t!.x[last]).toFixed(1)},${this.vp.sy(t!.y[last]).toFixed(1)}`;
    else delete this.canvas.dataset.trailLast;
  }

  private resize(): void {
    const rect = this.canvas.getBoundingClientRect();
    const dpr = window.devicePixelRatio || 1;
    this.canvas.width = Math.max(1, Math.round(rect.width * dpr));
    this.canvas.height = Math.max(1, Math.round(rect.height * dpr));
    this.vp.resize(rect.width, rect.height);
    if (!this.moved && rect.width > 1) this.vp.fit(this.scene.x, this.scene.y, this.margin);
    this.draw();
  }

  private local(e: MouseEvent): [number, number] {
    const r = this.canvas.getBoundingClientRect();
    return [e.clientX - r.left, e.clientY - r.top];
  }

  private listen(): void {
    const c = this.canvas;
    c.addEventListener(
      'wheel',
      (e) => {
        e.preventDefault();
        const [px, py] = this.local(e);
        const delta = e.deltaMode === 1 ? e.deltaY * 16 : e.deltaY;
        this.moved = true;
        this.vp.zoomAt(px, py, Math.exp(-delta * 0.0015));
        this.requestDraw();
      },
      { passive: false },
    );
    c.addEventListener('pointerdown', (e) => {
      if (e.button !== 0) return;
      this.drag = { id: e.pointerId, x: e.clientX, y: e.clientY, moved: false };
      c.setPointerCapture(e.pointerId);
    });
    c.addEventListener('pointermove', (e) => {
      const [px, py] = this.local(e);
      if (this.drag && this.drag.id === e.pointerId) {
        const dx = e.clientX - this.drag.x;
        const dy = e.clientY - this.drag.y;
        if (this.drag.moved || Math.hypot(dx, dy) > CLICK_SLOP) {
          this.drag.moved = true;
          this.moved = true;
          c.classList.add('um-dragging');
          this.vp.pan(dx, dy);
          this.drag.x = e.clientX;
          this.drag.y = e.clientY;
          this.events.hover(null, 0, 0);
          this.requestDraw();
        }
        return;
      }
      const t = this.pickTrail(px, py);
      if (t !== null) {
        c.classList.add('um-pointing');
        this.events.hover(null, e.clientX, e.clientY);
        this.events.hoverTrail?.(t, e.clientX, e.clientY);
        return;
      }
      this.events.hoverTrail?.(null, e.clientX, e.clientY);
      const i = this.pick(px, py);
      c.classList.toggle('um-pointing', i !== null);
      this.events.hover(i, e.clientX, e.clientY);
    });
    const release = (e: PointerEvent) => {
      if (!this.drag || this.drag.id !== e.pointerId) return;
      const wasClick = !this.drag.moved;
      this.drag = null;
      c.classList.remove('um-dragging');
      if (wasClick && e.type === 'pointerup') {
        const [px, py] = this.local(e);
        const t = this.pickTrail(px, py);
        if (t !== null && this.events.clickTrail) this.events.clickTrail(t);
        else this.events.click(this.pick(px, py));
      }
    };
    c.addEventListener('pointerup', release);
    c.addEventListener('pointercancel', release);
    c.addEventListener('pointerleave', () => {
      if (this.drag) return;
      this.events.hoverTrail?.(null, 0, 0);
      this.events.hover(null, 0, 0);
    });
    c.addEventListener('keydown', (e) => {
      const step = 60;
      const moves: Record<string, () => void> = {
        '+': () => this.vp.zoomAt(this.vp.width / 2, this.vp.height / 2, 1.25),
        '=': () => this.vp.zoomAt(this.vp.width / 2, this.vp.height / 2, 1.25),
        '-': () => this.vp.zoomAt(this.vp.width / 2, this.vp.height / 2, 0.8),
        '0': () => this.fit(),
        ArrowLeft: () => this.vp.pan(step, 0),
        ArrowRight: () => this.vp.pan(-step, 0),
        ArrowUp: () => this.vp.pan(0, step),
        ArrowDown: () => this.vp.pan(0, -step),
      };
      const move = moves[e.key];
      if (move) {
        e.preventDefault();
        this.moved = e.key !== '0';
        move();
        this.requestDraw();
      }
    });
  }
}
