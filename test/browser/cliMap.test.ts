/**
 * The map file `undertone map` writes for the demo workspace, opened in Debian's Chromium via
 * playwright-core: it draws, its search box places a planted question (demo/expectations.json,
 * the answer key) among the files of the planted topic it is about, and it fetches nothing.
 * Lives here rather than in test/cli because its page code needs the DOM types of this folder's
 * project (src/webview/tsconfig.json). Screenshot in test-output/browser/.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { main } from '../../src/cli/main.js';
import type { Io } from '../../src/cli/output.js';
import { builtPage, inkShare, launch, outputDir, record, REPO, type Session, browserSuite } from './browserHarness.js';

const demoRoot = path.join(REPO, 'demo', 'workspace');
const key = JSON.parse(readFileSync(path.join(REPO, 'demo', 'expectations.json'), 'utf8')) as {
  topics: { name: string; files: string[] }[];
  queries: { text: string; expectTop3: string[] }[];
};

const suite = browserSuite('command-line map in a browser');

suite('the demo map written by the command line, in Chromium', () => {
  let work: string;
  let session: Session;
  let page: Page;
  let log: ReturnType<typeof record>;
  let fileUrl: string;

  beforeAll(async () => {
    builtPage();
    work = mkdtempSync(path.join(tmpdir(), 'undertone-cli-map-'));
    const file = path.join(outputDir(), 'cli-demo-map.html');
    const lines: string[] = [];
    const io: Io = { out: (l) => lines.push(l), err: (l) => lines.push(l), errRaw: () => undefined, interactive: false };
    const code = await main(['map', demoRoot, '--out', file, '--cache-dir', path.join(work, 'cache'), '--quiet'], io);
    expect(code, lines.join('\n')).toBe(0);
    fileUrl = pathToFileURL(file).href;
    session = await launch();
    page = await session.context.newPage();
    log = record(page);
    await page.goto(fileUrl);
    await page.waitForSelector('#undertone-map[data-files]');
  });

  afterAll(async () => {
    await session?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('draws every demo file on a non-blank canvas', async () => {
    await page.waitForTimeout(50);
    expect(await inkShare(page, '.um-map-canvas')).toBeGreaterThan(0.001);
    const files = Number(await page.getAttribute('#undertone-map', 'data-files'));
    expect(files).toBeGreaterThanOrEqual(100);
  });

  it('places a planted question as a marker next to the files of its planted topic', async () => {
    const q = key.queries[0];
    const topic = key.topics.find((t) => q.expectTop3.every((f) => t.files.includes(f)))!;
    expect(topic).toBeDefined();
    await page.fill('.um-search input', q.text);
    await page.press('.um-search input', 'Enter');
    await page.waitForSelector('#undertone-map[data-query-placed="true"]');
    const status = (await page.textContent('.um-status-text')) ?? '';
    expect(status).toContain('placed');
    const nearest = topic.files.find((f) => status.includes(f));
    expect(nearest, `status: ${status}`).toBeDefined();
    expect(await inkShare(page, '.um-map-canvas')).toBeGreaterThan(0.001);
    await page.screenshot({ path: path.join(outputDir(), 'cli-demo-query.png') });
  });

  it('made no network request beyond its own file and logged no console error', () => {
    expect(log.requests.filter((u) => u !== fileUrl)).toEqual([]);
    expect(log.errors).toEqual([]);
  });
});
