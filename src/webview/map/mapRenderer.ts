/// <reference lib="dom" />
/**
 * Draws the map in one pass per topic colour: each colour's dots go into one path and are filled
 * once, dots outside the view are skipped. Crowded maps (over RASTER_MIN files) go through the
 * software rasteriser instead (dotRaster.ts), which blends all dots into one image. Overlays
 * (query links and rings, selection, hover) are drawn on top with the canvas API.
 */
import type { DotRaster } from './dotRaster.js';
import type { MapTheme } from './theme.js';
import type { Viewport } from './viewport.js';

export interface MapScene {
  x: Float32Array;
  y: Float32Array;
  /** Base dot radius in CSS pixels, by file length. */
  readonly radius: Float32Array;
  readonly topicIds: Int32Array;
  /** File indices per topic; the last group holds files without a topic. */
  readonly groups: readonly Int32Array[];
  selected: number | null;
  hovered: number | null;
  focusTopic: number | null;
  query: { x: number; y: number; neighbours: readonly number[] } | null;
  /** The active file's sections in reading order, on the layout shown (data coordinates), or null. */
  trail?: { readonly x: Float32Array; readonly y: Float32Array } | null;
  /** The trail point under the pointer. */
  trailHovered?: number | null;
  /** Writes the topics' words over their regions (regionLabelLayer.ts), when the page has topics. */
  labels?: { draw(ctx: CanvasRenderingContext2D, vp: Viewport, scene: MapScene, theme: MapTheme): void };
}

/** Dot radius from token count: grows with log length, a little smaller on crowded maps. */
export function baseRadius(tokens: number, fileCount: number): number {
  const crowd = fileCount > 20000 ? 0.72 : fileCount > 5000 ? 0.85 : fileCount > 1000 ? 1 : 1.35;
  return crowd * (1.6 + 1.3 * Math.log10(1 + Math.max(0, tokens) / 80));
}

export function zoomGrowth(zoom: number): number {
  return Math.min(2.6, Math.max(1, zoom ** 0.35));
}

/** File count above which dots are rasterised in software (common practice: a few thousand). */
export const RASTER_MIN = 4000;

export function drawMap(
  ctx: CanvasRenderingContext2D,
  vp: Viewport,
  scene: MapScene,
  theme: MapTheme,
  raster: DotRaster,
  dpr: number,
): void {
  const { x, y, radius, groups } = scene;
  const grow = zoomGrowth(vp.zoom);
  if (x.length > RASTER_MIN) {
    const last = groups.length - 1;
    const rasterGroups = groups.map((members, g) => {
      const dimmed = scene.focusTopic !== null && (g === last || g !== scene.focusTopic);
      const colour = g === last ? theme.rgb.unassigned : theme.rgb.topics[g % Math.max(1, theme.rgb.topics.length)];
      return { members, colour, alpha: dimmed ? 0.14 : 0.8, shape: g === last ? 0 : (theme.shapes[g] ?? 0) };
    });
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    raster.draw(ctx, vp, dpr, x, y, radius, grow, rasterGroups, theme.rgb.bg);
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  } else {
    drawDotPaths(ctx, vp, scene, theme, grow);
  }
  ctx.globalAlpha = 1;
  scene.labels?.draw(ctx, vp, scene, theme);
  drawTrail(ctx, vp, scene, theme);
  drawQuery(ctx, vp, scene, theme, grow);
  if (scene.selected !== null) ring(ctx, vp, scene, scene.selected, theme.fg, 2, 4 * grow, grow);
  if (scene.hovered !== null && scene.hovered !== scene.selected) ring(ctx, vp, scene, scene.hovered, theme.fg, 1.5, 3, grow);
}

function drawDotPaths(ctx: CanvasRenderingContext2D, vp: Viewport, scene: MapScene, theme: MapTheme, grow: number): void {
  const { x, y, radius, groups } = scene;
  ctx.fillStyle = theme.bg;
  ctx.fillRect(0, 0, vp.width, vp.height);
  const crowded = x.length > 2000;
  for (let g = 0; g < groups.length; g++) {
    const isUnassigned = g === groups.length - 1;
    const dimmed = scene.focusTopic !== null && (isUnassigned || g !== scene.focusTopic);
    const alpha = dimmed ? 0.14 : crowded ? 0.78 : 0.92;
    ctx.beginPath();
    const members = groups[g];
    const shape = isUnassigned ? 0 : (theme.shapes[g] ?? 0);
    for (let t = 0; t < members.length; t++) {
      const i = members[t];
      const sx = vp.sx(x[i]);
      const sy = vp.sy(y[i]);
      const r = radius[i] * grow;
      if (sx < -r || sy < -r || sx > vp.width + r || sy > vp.height + r) continue;
      if (r < 1.2 || shape === 1) {
        ctx.rect(sx - r, sy - r, 2 * r, 2 * r);
      } else if (shape === 2) {
        // A triangle of about the circle's area, point up.
        const s = r * 1.35;
        ctx.moveTo(sx, sy - s);
        ctx.lineTo(sx + s * 0.866, sy + s * 0.5);
        ctx.lineTo(sx - s * 0.866, sy + s * 0.5);
        ctx.closePath();
      } else {
        ctx.moveTo(sx + r, sy);
        ctx.arc(sx, sy, r, 0, 2 * Math.PI);
      }
    }
    // A background-coloured edge under the group's fill separates it from groups drawn before;
    // inside the group the fills cover the edges, so dense areas stay solid.
    if (!dimmed && (theme.highContrast || !crowded)) {
      ctx.globalAlpha = 1;
      ctx.lineWidth = theme.highContrast ? 2 : 1.2;
      ctx.strokeStyle = theme.bg;
      ctx.stroke();
    }
    ctx.globalAlpha = alpha;
    ctx.fillStyle = isUnassigned ? theme.unassigned : theme.topics[g % Math.max(1, theme.topics.length)];
    ctx.fill();
  }
}

function ring(
  ctx: CanvasRenderingContext2D,
  vp: Viewport,
  scene: MapScene,
  i: number,
  colour: string,
  width: number,
  gap: number,
  grow: number,
): void {
  ctx.beginPath();
  ctx.arc(vp.sx(scene.x[i]), vp.sy(scene.y[i]), scene.radius[i] * grow + gap, 0, 2 * Math.PI);
  ctx.lineWidth = width;
  ctx.strokeStyle = colour;
  ctx.stroke();
}

/** Radius of a trail point's marker in CSS pixels (the first, where the file starts, is larger). */
export const TRAIL_MARK = 3.5;

/**
 * The trail: a line through the sections in reading order, then a small square per section with a
 * background-coloured edge (so it reads over dense areas); the first section's square is larger.
 */
function drawTrail(ctx: CanvasRenderingContext2D, vp: Viewport, scene: MapScene, theme: MapTheme): void {
  const t = scene.trail;
  if (!t || t.x.length === 0) return;
  ctx.save();
  ctx.globalAlpha = 0.85;
  ctx.strokeStyle = theme.accent;
  ctx.lineWidth = 1.5;
  ctx.lineJoin = 'round';
  ctx.beginPath();
  for (let i = 0; i < t.x.length; i++) {
    const sx = vp.sx(t.x[i]);
    const sy = vp.sy(t.y[i]);
    if (i === 0) ctx.moveTo(sx, sy);
    else ctx.lineTo(sx, sy);
  }
  ctx.stroke();
  ctx.globalAlpha = 1;
  for (let i = 0; i < t.x.length; i++) {
    const r = i === 0 ? TRAIL_MARK + 1.5 : TRAIL_MARK;
    const sx = vp.sx(t.x[i]);
    const sy = vp.sy(t.y[i]);
    ctx.beginPath();
    ctx.rect(sx - r, sy - r, 2 * r, 2 * r);
    ctx.lineWidth = 2.5;
    ctx.strokeStyle = theme.bg;
    ctx.stroke();
    ctx.fillStyle = theme.accent;
    ctx.fill();
    ctx.lineWidth = 1;
    ctx.strokeStyle = theme.fg;
    ctx.stroke();
    if (scene.trailHovered === i) {
      ctx.beginPath();
      ctx.rect(sx - r - 3, sy - r - 3, 2 * r + 6, 2 * r + 6);
      ctx.lineWidth = 1.5;
      ctx.strokeStyle = theme.fg;
      ctx.stroke();
    }
  }
  ctx.restore();
}

function drawQuery(ctx: CanvasRenderingContext2D, vp: Viewport, scene: MapScene, theme: MapTheme, grow: number): void {
  const q = scene.query;
  if (q === null) return;
  const qx = vp.sx(q.x);
  const qy = vp.sy(q.y);
  ctx.save();
  ctx.globalAlpha = 0.55;
  ctx.strokeStyle = theme.accent;
  ctx.lineWidth = 1;
  ctx.setLineDash([3, 3]);
  ctx.beginPath();
  for (const i of q.neighbours) {
    ctx.moveTo(qx, qy);
    ctx.lineTo(vp.sx(scene.x[i]), vp.sy(scene.y[i]));
  }
  ctx.stroke();
  ctx.restore();
  for (const i of q.neighbours) ring(ctx, vp, scene, i, theme.accent, 2, 3, grow);
  // Query marker: a diamond with a background-coloured halo so it reads on top of dense areas.
  const s = 8;
  ctx.beginPath();
  ctx.moveTo(qx, qy - s);
  ctx.lineTo(qx + s, qy);
  ctx.lineTo(qx, qy + s);
  ctx.lineTo(qx - s, qy);
  ctx.closePath();
  ctx.lineWidth = 4;
  ctx.strokeStyle = theme.bg;
  ctx.stroke();
  ctx.fillStyle = theme.accent;
  ctx.fill();
  ctx.lineWidth = 1.5;
  ctx.strokeStyle = theme.fg;
  ctx.stroke();
}
