/**
 * Shared set-up for the browser tests: Debian's Chromium driven by playwright-core (never a
 * downloaded browser), a fresh profile per run, and recorders for network requests, console
 * errors and page errors. Tests skip with a message naming /usr/bin/chromium when it is missing.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, it } from 'vitest';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';
export const HAVE_CHROMIUM = existsSync(CHROMIUM);

/**
 * `describe` when Chromium is installed; otherwise a skipped suite whose title names what is
 * missing, so the run says why these checks did not happen.
 */
export function browserSuite(what: string): typeof describe | typeof describe.skip {
  if (!HAVE_CHROMIUM) {
    describe(`${what} (skipped: ${CHROMIUM} is missing; install Debian's chromium package)`, () => {
      it.skip(`needs ${CHROMIUM}`, () => undefined);
    });
    return describe.skip;
  }
  return describe;
}
export const REPO = fileURLToPath(new URL('../..', import.meta.url));
export const OUTPUT = path.join(REPO, 'test-output/browser');

export interface Session {
  readonly browser: Browser;
  readonly context: BrowserContext;
  close(): Promise<void>;
}

export async function launch(): Promise<Session> {
  const profile = mkdtempSync(path.join(tmpdir(), 'undertone-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  const browser = context.browser() as Browser;
  return {
    browser,
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export interface PageLog {
  readonly requests: string[];
  readonly errors: string[];
}

export function record(page: Page): PageLog {
  const log: PageLog = { requests: [], errors: [] };
  page.on('request', (r) => log.requests.push(r.url()));
  page.on('console', (m) => {
    if (m.type() === 'error') log.errors.push(m.text());
  });
  page.on('pageerror', (e) => log.errors.push(e.message));
  return log;
}

/** Builds media/map/map.js with the real build script and returns the script and stylesheet. */
export function builtPage(): { script: string; styles: string } {
  execFileSync(process.execPath, [path.join(REPO, 'scripts/build-map-page.mjs')], { cwd: REPO, stdio: 'pipe' });
  return {
    script: readFileSync(path.join(REPO, 'media/map/map.js'), 'utf8'),
    styles: readFileSync(path.join(REPO, 'media/map/map.css'), 'utf8'),
  };
}

export function outputDir(): string {
  mkdirSync(OUTPUT, { recursive: true });
  return OUTPUT;
}

/**
 * A point (CSS pixels, page coordinates) at the centre of a drawn dot inside the left part of
 * the map canvas: the non-background pixel with the most non-background neighbours.
 */
export async function findDot(page: Page): Promise<{ x: number; y: number }> {
  return page.evaluate(() => {
    const canvas = document.querySelector('.um-map-canvas') as HTMLCanvasElement;
    const ctx = canvas.getContext('2d') as CanvasRenderingContext2D;
    const { width, height } = canvas;
    const img = ctx.getImageData(0, 0, width, height).data;
    const bg = [img[0], img[1], img[2]];
    const off = (x: number, y: number) => {
      const o = 4 * (y * width + x);
      return Math.abs(img[o] - bg[0]) + Math.abs(img[o + 1] - bg[1]) + Math.abs(img[o + 2] - bg[2]) > 60;
    };
    let best = { x: -1, y: -1, score: -1 };
    const limitX = Math.floor(width * 0.6);
    for (let y = 3; y < height * 0.85; y += 2) {
      for (let x = 3; x < limitX; x += 2) {
        if (!off(x, y)) continue;
        let score = 0;
        for (let dy = -3; dy <= 3; dy++) for (let dx = -3; dx <= 3; dx++) if (off(x + dx, y + dy)) score++;
        if (score > best.score) best = { x, y, score };
      }
    }
    const r = canvas.getBoundingClientRect();
    const scale = width / r.width;
    return { x: r.left + best.x / scale, y: r.top + best.y / scale };
  });
}

/** Share of canvas pixels that differ clearly from the top-left (background) pixel. */
export async function inkShare(page: Page, selector: string): Promise<number> {
  return page.evaluate((sel) => {
    const canvas = document.querySelector(sel) as HTMLCanvasElement;
    const img = (canvas.getContext('2d') as CanvasRenderingContext2D).getImageData(0, 0, canvas.width, canvas.height).data;
    let ink = 0;
    for (let o = 0; o < img.length; o += 4) {
      if (Math.abs(img[o] - img[0]) + Math.abs(img[o + 1] - img[1]) + Math.abs(img[o + 2] - img[2]) > 60) ink++;
    }
    return ink / (img.length / 4);
  }, selector);
}
