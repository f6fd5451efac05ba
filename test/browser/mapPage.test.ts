/**
 * The concept map page in a real browser (Debian's Chromium via playwright-core): the standalone
 * file built from fixture data (synthetic clustered documents, test/browser/mapFixture.ts) and the
 * editor-webview shell with a stand-in host. Checks that it draws, shows a tooltip on hover,
 * reports "open" on click, places a query, switches layouts and tabs, makes no network requests
 * and logs no console errors (CSP violations are console errors). Screenshots go to
 * test-output/browser/ for a person to look at.
 */
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { buildStandaloneHtml } from '../../src/core/map/standaloneHtml.js';
import { buildMapWebviewHtml } from '../../src/core/map/mapHtml.js';
import { placeQueryFaithful } from '../../src/core/map/placeQuery.js';
import { projectQuick } from '../../src/core/map/quickProjection.js';
import { builtPage, findDot, inkShare, launch, outputDir, record, type Session, browserSuite } from './browserHarness.js';
import { buildMapFixture, type MapFixture } from './mapFixture.js';

const suite = browserSuite('map page browser tests');

suite('standalone map file in Chromium', () => {
  let session: Session;
  let fixture: MapFixture;
  let page: Page;
  let log: ReturnType<typeof record>;
  let fileUrl: string;

  beforeAll(async () => {
    fixture = buildMapFixture();
    const { script, styles } = builtPage();
    const out = outputDir();
    const file = path.join(out, 'map-standalone.html');
    writeFileSync(file, buildStandaloneHtml({ script, styles, data: fixture.page }));
    fileUrl = pathToFileURL(file).href;
    session = await launch();
    page = await session.context.newPage();
    log = record(page);
    await page.goto(fileUrl);
    await page.waitForSelector('#undertone-map[data-files]');
  });

  afterAll(async () => {
    await session?.close();
  });

  it('draws the files on the canvas', async () => {
    await page.waitForTimeout(50);
    expect(await inkShare(page, '.um-map-canvas')).toBeGreaterThan(0.001);
    expect(await page.getAttribute('#undertone-map', 'data-layout')).toBe('faithful');
    await page.screenshot({ path: path.join(outputDir(), 'standalone-faithful.png') });
  });

  it('shows the file’s path, topic and terms when hovering a dot', async () => {
    const dot = await findDot(page);
    await page.mouse.move(dot.x, dot.y);
    const tip = page.locator('.um-tooltip');
    await tip.waitFor({ state: 'visible' });
    const pathText = await tip.locator('.um-tooltip-path').textContent();
    expect(fixture.source.paths).toContain(pathText);
    const i = fixture.source.paths.indexOf(pathText as string);
    expect(await tip.locator('.um-chip').first().textContent()).toBe(fixture.source.topTerms[i][0]);
    await page.screenshot({ path: path.join(outputDir(), 'standalone-hover.png') });
  });

  it('records an "open" message and selects the file when a dot is clicked', async () => {
    await page.evaluate(() => {
      const w = window as unknown as { seen: unknown[] };
      w.seen = [];
      window.addEventListener('undertone-map-message', (e) => w.seen.push((e as CustomEvent).detail));
    });
    const dot = await findDot(page);
    await page.mouse.move(dot.x, dot.y);
    const hovered = await page.locator('.um-tooltip-path').textContent();
    await page.mouse.click(dot.x, dot.y);
    const seen = (await page.evaluate(() => (window as unknown as { seen: unknown[] }).seen)) as {
      type: string;
      index: number;
      path: string;
    }[];
    const open = seen.find((m) => m.type === 'open');
    expect(open?.path).toBe(hovered);
    expect(fixture.source.paths[open!.index]).toBe(hovered);
    await expect.poll(() => page.textContent('.um-status-path')).toBe(hovered);
  });

  it('places a query from the search box near files of the cluster whose words it uses', async () => {
    const words = fixture.clusterWords[2].slice(0, 3).join(' ');
    await page.fill('.um-search input', words);
    await page.press('.um-search input', 'Enter');
    await page.waitForSelector('#undertone-map[data-query-placed="true"]');
    const status = (await page.textContent('.um-status-text')) ?? '';
    expect(status).toContain('placed');
    const nearest = fixture.source.paths.find((p) => status.includes(p));
    expect(nearest).toBeDefined();
    expect(fixture.clusterOf[fixture.source.paths.indexOf(nearest as string)]).toBe(2);
    await page.screenshot({ path: path.join(outputDir(), 'standalone-query.png') });
  });

  it('says so when no query word is in the vocabulary', async () => {
    await page.fill('.um-search input', 'qqqq zzzz');
    await page.press('.um-search input', 'Enter');
    await expect.poll(() => page.textContent('.um-status-text')).toContain('None of the words');
    expect(await page.getAttribute('#undertone-map', 'data-query-placed')).toBe('false');
  });

  it('switches to the quick layout and keeps the query on it', async () => {
    await page.fill('.um-search input', fixture.clusterWords[5].slice(0, 2).join(' '));
    await page.press('.um-search input', 'Enter');
    await page.waitForSelector('#undertone-map[data-query-placed="true"]');
    await page.click('.um-segment button:has-text("Quick")');
    await page.waitForSelector('#undertone-map[data-layout="quick"]');
    await page.waitForTimeout(600);
    expect(await page.getAttribute('#undertone-map', 'data-query-placed')).toBe('true');
    expect(await inkShare(page, '.um-map-canvas')).toBeGreaterThan(0.001);
    await page.screenshot({ path: path.join(outputDir(), 'standalone-quick.png') });
  });

  it('draws the singular-value spectrum with the chosen k on the second tab', async () => {
    await page.click('.um-tabs button:has-text("Spectrum")');
    await page.waitForSelector('#undertone-map[data-tab="spectrum"]');
    expect(await inkShare(page, '.um-spectrum-panel canvas')).toBeGreaterThan(0.01);
    expect(await page.textContent('.um-spectrum-caption')).toContain(`k = ${fixture.source.k}`);
    await page.screenshot({ path: path.join(outputDir(), 'standalone-spectrum.png') });
    await page.click('.um-tabs button:has-text("Map")');
  });

  it('follows a dark system colour scheme', async () => {
    await page.emulateMedia({ colorScheme: 'dark' });
    await page.waitForTimeout(100);
    const bg = await page.evaluate(() => getComputedStyle(document.body).backgroundColor);
    const [r, g, b] = (bg.match(/\d+/g) ?? []).map(Number);
    expect(0.2126 * r + 0.7152 * g + 0.0722 * b).toBeLessThan(60);
    await page.screenshot({ path: path.join(outputDir(), 'standalone-dark.png') });
    await page.emulateMedia({ colorScheme: 'light' });
  });

  it('made no network request beyond its own file and logged no console error', () => {
    expect(log.requests.filter((u) => u !== fileUrl)).toEqual([]);
    expect(log.errors).toEqual([]);
  });
});

suite('map page in an editor-style webview with a stand-in host', () => {
  let session: Session;
  let fixture: MapFixture;
  let page: Page;
  let log: ReturnType<typeof record>;

  beforeAll(async () => {
    fixture = buildMapFixture(6, 50, 10, 9);
    builtPage();
    const out = outputDir();
    const repoMedia = pathToFileURL(path.resolve(out, '../../media/map')).href;
    const html = buildMapWebviewHtml({
      nonce: 'dGVzdG5vbmNlMTIzNDU2Nzg5MA',
      cspSource: 'file:',
      scriptUri: `${repoMedia}/map.js`,
      styleUri: `${repoMedia}/map.css`,
    });
    const file = path.join(out, 'map-webview.html');
    writeFileSync(file, html);
    session = await launch();
    page = await session.context.newPage();
    log = record(page);
    // The stand-in host: the editor's webview API and a dark editor theme's variables.
    await page.addInitScript(() => {
      const w = window as unknown as { posted: unknown[]; acquireVsCodeApi: () => unknown };
      w.posted = [];
      w.acquireVsCodeApi = () => ({ postMessage: (m: unknown) => w.posted.push(m), getState: () => null, setState: () => undefined });
      document.addEventListener('DOMContentLoaded', () => {
        document.body.classList.add('vscode-dark');
        const s = document.documentElement.style;
        s.setProperty('--vscode-editor-background', '#1e1e1e');
        s.setProperty('--vscode-foreground', '#cccccc');
        s.setProperty('--vscode-focusBorder', '#007fd4');
        s.setProperty('--vscode-editorWidget-background', '#252526');
        s.setProperty('--vscode-widget-border', '#454545');
      });
    });
    await page.goto(pathToFileURL(file).href);
    await page.waitForFunction(() => (window as unknown as { posted: { type: string }[] }).posted.some((m) => m.type === 'ready'));
    await page.evaluate((data) => window.postMessage({ type: 'init', data }, '*'), fixture.page);
    await page.waitForSelector('#undertone-map[data-files]');
  });

  afterAll(async () => {
    await session?.close();
  });

  const posted = () => page.evaluate(() => (window as unknown as { posted: { type: string; [k: string]: unknown }[] }).posted);

  it('draws in the editor’s dark theme colours', async () => {
    await page.waitForTimeout(50);
    expect(await inkShare(page, '.um-map-canvas')).toBeGreaterThan(0.001);
    const corner = await page.evaluate(() => {
      const c = document.querySelector('.um-map-canvas') as HTMLCanvasElement;
      return Array.from((c.getContext('2d') as CanvasRenderingContext2D).getImageData(2, 2, 1, 1).data.slice(0, 3));
    });
    expect(corner).toEqual([0x1e, 0x1e, 0x1e]);
    await page.screenshot({ path: path.join(outputDir(), 'webview-dark.png') });
  });

  it('posts "open" with the clicked file to the host', async () => {
    const dot = await findDot(page);
    await page.mouse.move(dot.x, dot.y);
    const hovered = await page.locator('.um-tooltip-path').textContent();
    await page.mouse.click(dot.x, dot.y);
    const open = (await posted()).find((m) => m.type === 'open');
    expect(open?.path).toBe(hovered);
  });

  it('posts "query", then draws the host’s answer placed by the core', async () => {
    const text = fixture.clusterWords[1].slice(0, 3).join(' ');
    await page.fill('.um-search input', text);
    await page.press('.um-search input', 'Enter');
    await expect.poll(async () => (await posted()).some((m) => m.type === 'query')).toBe(true);
    const q = (await posted()).find((m) => m.type === 'query') as unknown as { requestId: number; text: string };
    expect(q.text).toBe(text);
    const vector = fixture.fold(q.text);
    const faithful = placeQueryFaithful(fixture.layouts.faithful, vector);
    const quick = projectQuick(fixture.layouts.quick, vector);
    const reply = {
      type: 'queryResult',
      requestId: q.requestId,
      text: q.text,
      positions: { quick, faithful: faithful && { x: faithful.x, y: faithful.y } },
      neighbours: Array.from(faithful?.neighbours ?? []),
      similarities: Array.from(faithful?.similarities ?? []),
    };
    await page.evaluate((m) => window.postMessage(m, '*'), reply);
    await page.waitForSelector('#undertone-map[data-query-placed="true"]');
    await page.screenshot({ path: path.join(outputDir(), 'webview-query.png') });
  });

  it('posts "layoutChanged" when the layout is switched', async () => {
    await page.click('.um-segment button:has-text("Quick")');
    await expect.poll(async () => (await posted()).find((m) => m.type === 'layoutChanged')?.layout).toBe('quick');
  });

  it('ignores malformed host messages and logs no console error', async () => {
    await page.evaluate(() => window.postMessage({ type: 'queryResult', requestId: 'x' }, '*'));
    await page.waitForTimeout(50);
    expect(log.errors).toEqual([]);
  });

  it('shows high-contrast colours with outlined dots', async () => {
    await page.evaluate(() => {
      document.body.classList.remove('vscode-dark');
      document.body.classList.add('vscode-high-contrast');
      const s = document.documentElement.style;
      s.setProperty('--vscode-editor-background', '#000000');
      s.setProperty('--vscode-foreground', '#ffffff');
      s.setProperty('--vscode-focusBorder', '#f38518');
    });
    await page.waitForTimeout(150);
    const corner = await page.evaluate(() => {
      const c = document.querySelector('.um-map-canvas') as HTMLCanvasElement;
      return Array.from((c.getContext('2d') as CanvasRenderingContext2D).getImageData(2, 2, 1, 1).data.slice(0, 3));
    });
    expect(corner).toEqual([0, 0, 0]);
    await page.screenshot({ path: path.join(outputDir(), 'webview-high-contrast.png') });
  });
});
