// The Overlaps and Topics views, the "why" tooltips and the concept map of the packaged
// extension, in a real editor (code-server) and browser (Chromium), driven through the UI as a
// person would. Expectations come from demo/expectations.json, the answer key written with the
// demo workspace (its planted exact copies and topics), not from the code under test.
// Run by `npm run test:e2e` (which installs the editor, builds and packages first).
import { readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { FrameLocator, Locator } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { RunningEditor } from '../../scripts/e2e/editor.js';
import { waitFor } from '../../scripts/e2e/process.js';
import type { ListRow } from '../../scripts/e2e/workbench.js';
import { startOnDemoCopy } from '../helpers/demoEditor.js';

const REPO = path.resolve(import.meta.dirname, '../..');
const EXPECT = path.join(REPO, 'demo', 'expectations.json');

interface Expectations {
  topics: { name: string; keywords: string[]; files: string[] }[];
  exactCopies: string[][];
  neighbours: { file: string; expectAmongTop5: string[] }[];
}

const base = (p: string) => p.slice(p.lastIndexOf('/') + 1);
const labels = (rows: ListRow[]) => rows.map((r) => r.label);
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** The part of a list row read in the browser (this project's types have no DOM). */
interface PageRow {
  getAttribute(name: string): string | null;
  querySelector(selector: string): { textContent: string | null } | null;
}

/** The part of a page canvas read in the browser (this project's types have no DOM). */
interface PageCanvas {
  readonly width: number;
  readonly height: number;
  getContext(kind: '2d'): { getImageData(x: number, y: number, w: number, h: number): { data: ArrayLike<number> } } | null;
  getBoundingClientRect(): { width: number };
}

describe('Undertone insights in a real editor', () => {
  let root: string;
  let workspace: string;
  let editor: RunningEditor | undefined;
  let expectations: Expectations;
  let files = 0;
  const t0 = Date.now();

  const status = (): Locator =>
    editor!.page
      .locator('.statusbar-item')
      .filter({ hasText: /Undertone/ })
      .first();

  /** Reads a view's rows until `accept` holds (views update asynchronously). */
  const waitForRows = async (view: string, accept: (rows: ListRow[]) => boolean, what: string, timeoutMs = 60_000): Promise<ListRow[]> => {
    let last: ListRow[] = [];
    try {
      return await waitFor(
        async () => {
          last = await snapshot(view);
          return accept(last) ? last : false;
        },
        timeoutMs,
        what,
      );
    } catch (err) {
      throw new Error(`${(err as Error).message}; last rows of ${view}: ${JSON.stringify(last)}`);
    }
  };

  /**
   * The rendered rows of a view read in one step inside the page (the view re-renders as results
   * arrive, and a row read piece by piece could vanish half-way). Expands the pane first.
   */
  const snapshot = async (view: string): Promise<ListRow[]> => {
    const pane = editor!.pane(view);
    await pane.waitFor({ state: 'visible', timeout: 30_000 });
    const header = pane.locator('.pane-header').first();
    if ((await header.getAttribute('aria-expanded')) === 'false') await header.click();
    return pane.locator('.pane-body .monaco-list-row').evaluateAll((rows: PageRow[]) =>
      rows.map((r) => {
        const level = r.getAttribute('aria-level');
        const expanded = r.getAttribute('aria-expanded');
        return {
          label: (r.querySelector('.monaco-icon-label .label-name')?.textContent ?? '').trim(),
          description: (r.querySelector('.monaco-icon-label .label-description')?.textContent ?? '').trim(),
          level: level ? Number(level) : undefined,
          expanded: expanded === null ? undefined : expanded === 'true',
        };
      }),
    );
  };

  /** The row of a view whose label is exactly `label`. */
  const row = (view: string, label: string): Locator =>
    editor!
      .pane(view)
      .locator('.pane-body .monaco-list-row')
      .filter({ has: editor!.page.locator('.label-name').getByText(label, { exact: true }) })
      .first();

  /** Clicks an inline action (by its title) of a tree row; the actions show on hover. */
  const inlineAction = async (rowLocator: Locator, title: string): Promise<void> => {
    await rowLocator.hover();
    const action = rowLocator.locator(`.actions .action-label[aria-label="${title}"]`).first();
    await action.waitFor({ state: 'visible', timeout: 10_000 });
    await action.click();
  };

  /** Collapses a view of the side bar (so the others get the room in screenshots). */
  const collapse = async (view: string): Promise<void> => {
    const header = editor!.pane(view).locator('.pane-header').first();
    if ((await header.getAttribute('aria-expanded')) === 'true') await header.click();
    await waitFor(async () => (await header.getAttribute('aria-expanded')) === 'false', 10_000, `${view} to collapse`);
  };

  /** Waits until an element and everything around it is fully opaque (hovers fade in). */
  const opaque = (target: Locator, timeoutMs = 10_000) =>
    waitFor(
      async () =>
        (await target.evaluate(
          (e) => {
            type Styled = { parentElement: Styled | null };
            const style = globalThis as unknown as { getComputedStyle(x: Styled): { opacity: string } };
            let alpha = 1;
            for (let n: Styled | null = e as unknown as Styled; n; n = n.parentElement) alpha *= Number(style.getComputedStyle(n).opacity);
            return alpha;
          },
          undefined,
          { timeout: timeoutMs },
        )) === 1,
      timeoutMs,
      'the hover to fade in',
    );

  /** The active editor tab whose title starts with `title`. */
  const activeTab = (title: string | RegExp): Locator =>
    editor!.page
      .locator('.tabs-container .tab.active')
      .filter({ hasText: typeof title === 'string' ? new RegExp(`^\\s*${escape(title)}`) : title });

  beforeAll(async () => {
    expectations = JSON.parse(readFileSync(EXPECT, 'utf8')) as Expectations;
    ({ root, workspace, editor } = await startOnDemoCopy('insights', { 'files.autoSave': 'off', 'workbench.hover.delay': 300 }));
    await status()
      .filter({ hasText: /Undertone: [\d,]+ files, k=\d+/ })
      .waitFor({ state: 'visible', timeout: 120_000 });
    files = Number(/([\d,]+) files/.exec((await status().textContent()) ?? '')![1].replace(/,/g, ''));
  });

  afterEach(async (ctx) => {
    if (ctx.task.result?.state === 'fail')
      await editor?.screenshot(`insights-failed-${ctx.task.name.slice(0, 40).replace(/\W+/g, '-')}`).catch(() => undefined);
  });

  afterAll(async () => {
    await editor?.stop();
    console.log(`insights e2e: ${((Date.now() - t0) / 1000).toFixed(1)} s in all`);
    if (root) rmSync(root, { recursive: true, force: true });
  });

  it('lists each planted exact copy in the Overlaps view', async () => {
    await editor!.runCommand('Undertone: Focus on Overlaps View');
    await collapse('Nearby');
    await collapse('Search Results');
    // A pair is labelled by the path endings that tell its files apart, each an ending of one planted path.
    const isPair = (r: ListRow, [a, b]: string[]) => {
      const [x, y] = r.label.split(' ↔ ');
      return y !== undefined && ((a.endsWith(x) && b.endsWith(y)) || (a.endsWith(y) && b.endsWith(x)));
    };
    const rows = await waitForRows(
      'Overlaps',
      (r) => expectations.exactCopies.every((pair) => r.some((x) => isPair(x, pair))),
      'the planted exact copies',
    );
    expect(labels(rows)).toEqual(expect.arrayContaining(['Exact copies', 'Near-copies']));
    for (const pair of expectations.exactCopies) {
      const found = rows.find((r) => isPair(r, pair))!;
      expect(found.description).toMatch(/^identical · \d+ of \d+ (lines?|words?) shared$/);
    }
    await editor!.screenshot('insights-1-lookalikes');
  });

  it('opens the diff editor for a pair with its "Compare" action', async () => {
    const rows = await snapshot('Overlaps');
    const [a] = expectations.exactCopies[0];
    const label = rows.find((r) => r.label.includes(' ↔ ') && a.endsWith(r.label.split(' ↔ ')[0]))!.label;
    await inlineAction(row('Overlaps', label), 'Compare');
    const diff = editor!.page.locator('.editor-instance .monaco-diff-editor').first();
    await diff.waitFor({ state: 'visible', timeout: 30_000 });
    await activeTab(label).waitFor({ state: 'visible', timeout: 30_000 });
    // Both sides show the file's text (its first line, from the file on disk).
    const firstLine = readFileSync(path.join(workspace, a), 'utf8').split('\n')[0].trim().slice(0, 30);
    for (const side of ['.editor.original', '.editor.modified'])
      await diff.locator(`${side} .view-line`).filter({ hasText: firstLine }).first().waitFor({ state: 'visible', timeout: 30_000 });
    await editor!.screenshot('insights-2-compare');
  });

  it('hides a dismissed pair, and shows it again on request', async () => {
    const rows = await snapshot('Overlaps');
    const label = rows.filter((r) => r.label.includes(' ↔ '))[0].label;
    await inlineAction(row('Overlaps', label), 'Dismiss This Pair');
    await waitForRows('Overlaps', (r) => !labels(r).includes(label), `${label} to be hidden`);
    await editor!.runCommand('Undertone: Show Dismissed Pairs Again');
    await waitForRows('Overlaps', (r) => labels(r).includes(label), `${label} to be shown again`);
  });

  it('shows the topics with their words, and opens a topic’s file', async () => {
    await editor!.runCommand('Undertone: Focus on Topics View');
    await collapse('Overlaps');
    const isTopic = (x: { label: string; description: string; level?: number }) =>
      x.level === 1 && /^\d+ files?\b/.test(x.description) && x.label !== 'Fits no topic well';
    const rows = await waitForRows('Topics', (r) => r.filter(isTopic).length >= 3, 'at least three topics');
    const topics = rows.filter(isTopic);
    // Topics are named by their words (the label), never "Topic N".
    expect(rows.some((x) => /^Topic \d/.test(x.label))).toBe(false);
    // Each planted topic's keywords (answer key) should name some topic: count those whose words show.
    const named = expectations.topics.filter((t) =>
      topics.some((x) => t.keywords.some((k) => x.label.toLowerCase().includes(k.toLowerCase().slice(0, 5)))),
    );
    expect(named.length).toBeGreaterThanOrEqual(Math.ceil(expectations.topics.length / 2));
    await editor!.screenshot('insights-3-topics');
    await row('Topics', topics[0].label).click();
    const expanded = await waitForRows('Topics', (r) => r.some((x) => x.level === 2), 'the first topic’s files');
    const file = expanded.find((x) => x.level === 2)!;
    await row('Topics', file.label).click();
    await activeTab(file.label).waitFor({ state: 'visible', timeout: 30_000 });
    await editor!.screenshot('insights-4-topic-file');
  });

  it('explains a Nearby result in its tooltip', async () => {
    const n = expectations.neighbours[0];
    await editor!.runCommand('Undertone: Focus on Nearby View');
    await editor!.page.keyboard.press('Control+P');
    await editor!.quickInput.type(n.file);
    await editor!.quickInput.pick(base(n.file), { description: path.posix.dirname(n.file) });
    await activeTab(base(n.file)).waitFor({ state: 'visible', timeout: 30_000 });
    // The view's title names the file whose neighbours it lists: wait for the file just opened.
    await editor!
      .pane('Nearby')
      .locator('.pane-header')
      .filter({ hasText: base(n.file) })
      .waitFor({ state: 'visible', timeout: 30_000 });
    await waitForRows('Nearby', (r) => r.length > 0 && /^\d\.\d\d/.test(r[0].description), 'neighbours of the active file');
    const hover = editor!.page.locator('.monaco-hover, .workbench-hover').filter({ hasText: 'Why it is near' }).first();
    let tooltip = '';
    // The view may re-render under a resting pointer, which then shows no hover: move away and back, as a person would.
    await waitFor(
      async () => {
        await editor!.page.mouse.move(700, 450);
        const [first] = await snapshot('Nearby');
        if (
          !first ||
          !(await row('Nearby', first.label)
            .hover({ timeout: 5_000 })
            .then(
              () => true,
              () => false,
            ))
        )
          return false;
        if (
          !(await hover.waitFor({ state: 'visible', timeout: 5_000 }).then(
            () => true,
            () => false,
          ))
        )
          return false;
        // Another view of the side bar (Unlinked Neighbours) may fill in meanwhile and move the
        // panes, which closes the hover: then hover again.
        tooltip = (await hover.textContent({ timeout: 2_000 }).catch(() => null)) ?? '';
        return opaque(hover, 3_000).then(
          () => true,
          () => false,
        );
      },
      60_000,
      'the tooltip of the first Nearby result',
    );
    expect(tooltip).toMatch(/Score/);
    await editor!.screenshot('insights-5-nearby-tooltip');
  });

  it('opens the concept map, opens the file of a clicked dot, and places a query', async () => {
    await editor!.runCommand('Undertone: Open Concept Map');
    const frame: FrameLocator = editor!.webview(0);
    const mapRoot = frame.locator('#undertone-map[data-files]');
    await mapRoot.waitFor({ state: 'attached', timeout: 120_000 });
    expect(Number(await mapRoot.getAttribute('data-files'))).toBe(files);
    const canvas = frame.locator('.um-map-canvas');
    const findDot = () =>
      canvas.evaluate((c: PageCanvas) => {
        // The drawn dot with the most drawn pixels around it (CSS pixels inside the canvas).
        const ctx = c.getContext('2d')!;
        const img = ctx.getImageData(0, 0, c.width, c.height).data;
        const bg = [img[0], img[1], img[2]];
        const off = (x: number, y: number) => {
          const o = 4 * (y * c.width + x);
          return Math.abs(img[o] - bg[0]) + Math.abs(img[o + 1] - bg[1]) + Math.abs(img[o + 2] - bg[2]) > 60;
        };
        let best = { x: -1, y: -1, score: -1 };
        for (let y = 4; y < c.height * 0.85; y += 2) {
          for (let x = 4; x < c.width * 0.6; x += 2) {
            if (!off(x, y)) continue;
            let score = 0;
            for (let dy = -3; dy <= 3; dy++) for (let dx = -3; dx <= 3; dx++) if (off(x + dx, y + dy)) score++;
            if (score > best.score) best = { x, y, score };
          }
        }
        const scale = c.width / c.getBoundingClientRect().width;
        return { x: best.x / scale, y: best.y / scale };
      });
    // The page draws on the next animation frame after the data arrives.
    const dot = await waitFor(
      async () => {
        const d = await findDot();
        return d.x > 0 ? d : false;
      },
      30_000,
      'a dot drawn on the map',
    );
    await canvas.hover({ position: dot });
    const tip = frame.locator('.um-tooltip-path');
    await tip.waitFor({ state: 'visible', timeout: 10_000 });
    const hovered = (await tip.textContent()) ?? '';
    await canvas.click({ position: dot });
    await activeTab(base(hovered)).waitFor({ state: 'visible', timeout: 30_000 });
    await editor!.screenshot('insights-6-map-opened-file');
    await frame.locator('.um-search input').fill('money back when a sailing is cancelled');
    await frame.locator('.um-search input').press('Enter');
    await frame.locator('#undertone-map[data-query-placed="true"]').waitFor({ state: 'attached', timeout: 30_000 });
    await editor!.screenshot('insights-7-map-query');
    // The status names the best of the ringed search results, with its score.
    expect(await frame.locator('.um-status-text').textContent()).toMatch(/best: \S+ \(score \d\.\d+\)/);
  });

  it("draws the opened file's sections as a trail, and opens the file at a section from it", async () => {
    // The file opened from the map by the test above is the active editor; the map draws its
    // sections as a trail. The check is against the file's own text on disk: the hovered point's
    // title (a heading's words, or a declaration's name such as "Class.method") is written inside
    // its line range, unless the section is a plain window of lines ("lines a–b"), and the click
    // puts the cursor on the range's first line.
    const frame: FrameLocator = editor!.webview(0);
    const mapRoot = frame.locator('#undertone-map');
    const n = await waitFor(
      async () => {
        const v = Number((await mapRoot.getAttribute('data-trail')) ?? '0');
        return v > 0 ? v : false;
      },
      30_000,
      'a trail of sections on the map',
    );
    const canvas = frame.locator('.um-map-canvas');
    const [x, y] = (await waitFor(async () => (await canvas.getAttribute('data-trail-last')) ?? false, 10_000, 'the trail drawn'))
      .split(',')
      .map(Number);
    await canvas.hover({ position: { x, y } });
    const where = frame.locator('.um-tooltip-topic');
    await where.waitFor({ state: 'visible', timeout: 10_000 });
    const range = (await where.textContent()) ?? '';
    expect(range).toMatch(new RegExp(`section ${n} of ${n}$`));
    const title = ((await frame.locator('.um-tooltip-path').textContent()) ?? '').trim();
    const rel = ((await frame.locator('.um-tooltip-terms').textContent()) ?? '').trim();
    const [, first, last] = /lines (\d+)–(\d+)/.exec(range)!.map(Number);
    const text = readFileSync(path.join(workspace, rel), 'utf8').split('\n');
    expect(first).toBeGreaterThanOrEqual(1);
    expect(last).toBeLessThanOrEqual(text.length);
    if (!/^lines \d+–\d+$/.test(title)) {
      const name = title
        .split(/[\s.]+/)
        .filter(Boolean)
        .pop()!;
      expect(text.slice(first - 1, last).join('\n')).toContain(name);
    }
    await editor!.screenshot('insights-8-map-trail');
    await canvas.click({ position: { x, y } });
    await activeTab(base(rel)).waitFor({ state: 'visible', timeout: 30_000 });
    await editor!.page
      .locator('.statusbar-item')
      .filter({ hasText: new RegExp(`Ln ${first}, Col 1\\b`) })
      .first()
      .waitFor({ state: 'visible', timeout: 30_000 });
  });
});
