/// <reference lib="dom" />
/**
 * Writes each topic's words over its region of the map (core regionLabels.ts picks the anchors
 * and drops labels that would overlap a larger topic's). Drawn after the dots with a halo of the
 * background colour so the words stay legible over dense areas; a topic out of focus fades.
 */
import { labelsToDraw, regionAnchors, type RegionAnchor } from '../../core/map/regionLabels.js';
import type { MapTheme } from './theme.js';
import type { Viewport } from './viewport.js';

/** Longest label written on the map, in characters (the legend has the full words). */
const MAX_CHARS = 32;

export class RegionLabelLayer {
  private anchors: RegionAnchor[] = [];
  private forX: Float32Array | null = null;
  /** Topics whose labels the last draw wrote (for tests and assistive tech). */
  shown: number[] = [];

  constructor(
    private readonly texts: readonly string[],
    private readonly font: string,
    private readonly onShown: (labels: string[]) => void = () => undefined,
  ) {}

  draw(
    ctx: CanvasRenderingContext2D,
    vp: Viewport,
    scene: { x: Float32Array; y: Float32Array; topicIds: Int32Array; focusTopic: number | null },
    theme: MapTheme,
  ): void {
    if (scene.x !== this.forX) {
      this.anchors = regionAnchors(scene.x, scene.y, scene.topicIds, this.texts.length);
      this.forX = scene.x;
    }
    ctx.save();
    ctx.font = this.font;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    const height = 16;
    const boxes = this.anchors
      .map((a) => {
        const text = label(this.texts[a.topic] ?? '');
        const width = ctx.measureText(text).width + 8;
        return { topic: a.topic, text, left: vp.sx(a.x) - width / 2, top: vp.sy(a.y) - height / 2, width, height };
      })
      .filter((b) => b.text && b.left + b.width > 0 && b.top + b.height > 0 && b.left < vp.width && b.top < vp.height);
    const kept = new Set(labelsToDraw(boxes).map((b) => b.topic));
    this.shown = [];
    for (const b of boxes) {
      if (!kept.has(b.topic)) continue;
      this.shown.push(b.topic);
      const cx = b.left + b.width / 2;
      const cy = b.top + b.height / 2;
      ctx.globalAlpha = scene.focusTopic !== null && scene.focusTopic !== b.topic ? 0.3 : 1;
      ctx.lineJoin = 'round';
      ctx.lineWidth = 4;
      ctx.strokeStyle = theme.bg;
      ctx.strokeText(b.text, cx, cy);
      ctx.fillStyle = theme.fg;
      ctx.fillText(b.text, cx, cy);
    }
    ctx.restore();
    this.onShown(boxes.filter((b) => kept.has(b.topic)).map((b) => b.text));
  }
}

function label(text: string): string {
  return text.length <= MAX_CHARS ? text : `${text.slice(0, MAX_CHARS - 1).trimEnd()}…`;
}
