// The packaged extension on a real public documentation tree nobody here wrote: the GNOME desktop
// help from Debian's gnome-user-docs 43.0-2 (CC-BY-SA 3.0), the original (C/) and eight
// translations, about 2,900 Mallard pages (installed by scripts/e2e/docTree.sh, which
// scripts/e2e/setup.sh runs). What a person meets in the first hour: the status item, the
// progress notification, the search box (placeholder, calm messages), folders beside results,
// readable passages, a page grouped with its translations, Nearby, "why it is near", Delete
// Saved Index, and the concept map. Screenshots: test-output/e2e/real-*.png.
//
// Two checks depend on other branches and may fail here until they are merged (marked
// "[after merge]"): the overlap view's header (branch i10 renames it "Overlaps") and topic labels
// made of the topics' words (branch i17: never "Topic N").
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { startEditor, type RunningEditor } from '../../scripts/e2e/editor.js';
import { waitFor } from '../../scripts/e2e/process.js';
import type { ListRow } from '../../scripts/e2e/workbench.js';
import { translationPath } from '../../src/core/translations/pathKey.js';
import { EMPTY_QUESTION_MESSAGE, SEARCH_PLACEHOLDER } from '../../src/extension/viewModels.js';
import { editorDirs, VSIX } from '../helpers/demoEditor.js';

const REPO = path.resolve(import.meta.dirname, '../..');
const top = (rows: ListRow[]) => rows.filter((r) => (r.level ?? 1) === 1);

describe('Undertone on a real documentation tree with translations (GNOME help, ~2,900 pages)', () => {
  let root: string;
  let tree: string;
  let editor: RunningEditor | undefined;
  const shot = (name: string) => editor!.screenshot(`real-${name}`);
  const status = () =>
    editor!.page
      .locator('.statusbar-item')
      .filter({ hasText: /Undertone/ })
      .first();
  const ready = () =>
    status()
      .filter({ hasText: /Undertone: [\d,]+ files, k=\d+/ })
      .waitFor({ state: 'visible', timeout: 240_000 });
  const box = () => editor!.page.locator('.quick-input-widget .quick-input-box input');
  const boxMessage = () => editor!.page.locator('.quick-input-widget .quick-input-message');

  const openSearchBox = async (): Promise<void> => {
    await editor!.runCommand('Undertone: Search Workspace by Meaning…');
    await editor!.page
      .locator('.quick-input-widget .quick-input-title')
      .filter({ hasText: /^Search Workspace by Meaning/ })
      .waitFor({ state: 'visible' });
  };

  const search = async (query: string): Promise<ListRow[]> => {
    await openSearchBox();
    await editor!.quickInput.type(query);
    await editor!.quickInput.submit();
    await editor!.page
      .locator('.quick-input-widget .quick-input-title')
      .filter({ hasText: /files by meaning/ })
      .waitFor({ state: 'visible', timeout: 60_000 });
    await editor!.page.locator('.quick-input-widget .quick-input-list .monaco-list-row').first().waitFor({ state: 'visible' });
    return editor!.quickInput.rows();
  };

  const waitForRows = async (view: string, accept: (rows: ListRow[]) => boolean, what: string): Promise<ListRow[]> => {
    let last: ListRow[] = [];
    try {
      return await waitFor(
        async () => {
          last = await editor!.readTreeView(view, { minRows: 0 });
          return accept(last) ? last : false;
        },
        60_000,
        what,
      );
    } catch (err) {
      throw new Error(`${(err as Error).message}; last rows of ${view}: ${JSON.stringify(last)}`);
    }
  };

  beforeAll(async () => {
    tree = execFileSync('bash', [path.join(REPO, 'scripts/e2e/docTree.sh')], { encoding: 'utf8' }).trim();
    root = mkdtempSync(path.join(tmpdir(), 'undertone-real-'));
    editor = await startEditor({ workspaceFolder: tree, ...editorDirs(root), vsixPath: VSIX, name: 'real', startTimeoutMs: 120_000 });
  });

  afterEach(async (ctx) => {
    if (ctx.task.result?.state === 'fail') {
      console.log(`after "${ctx.task.name}":\n${await editor?.describe().catch((e: Error) => e.message)}`);
      await editor?.screenshot(`real-failed-${ctx.task.name.slice(0, 40).replace(/\W+/g, '-')}`).catch(() => undefined);
    }
  });

  afterAll(async () => {
    await editor?.stop();
    if (root) rmSync(root, { recursive: true, force: true });
  });

  it('shows the status item at once, and a progress notification that does not repeat the name', async () => {
    // The workbench is up (startEditor waited for it): the item must be there already, not seconds later.
    await status().waitFor({ state: 'visible', timeout: 5_000 });
    expect(await status().textContent()).toMatch(/Undertone: (loading…|indexing \d+%|[\d,]+ files)/);
    const toast = editor!.page
      .locator('.notifications-toasts .notification-toast')
      .filter({ hasText: /Indexing the workspace/ })
      .first();
    let seen = await toast.waitFor({ state: 'visible', timeout: 30_000 }).then(
      () => true,
      () => false,
    );
    if (!seen) {
      // The first build was over before the toast could be read: a second one shows it again.
      await ready();
      await editor!.runCommand('Undertone: Build Index');
      seen = await toast.waitFor({ state: 'visible', timeout: 30_000 }).then(
        () => true,
        () => false,
      );
    }
    expect(seen).toBe(true);
    await shot('1-progress');
    expect(await toast.textContent()).not.toMatch(/Undertone:\s*Indexing/i);
    await ready();
    const files = Number(/([\d,]+) files/.exec((await status().textContent()) ?? '')![1].replace(/,/g, ''));
    expect(files).toBeGreaterThan(2000);
  });

  it('offers a neutral placeholder, and answers an empty question and unknown words in the box', async () => {
    await openSearchBox();
    expect(await box().getAttribute('placeholder')).toBe(SEARCH_PLACEHOLDER);
    await editor!.quickInput.type('');
    await editor!.quickInput.submit();
    await boxMessage()
      .filter({ hasText: EMPTY_QUESTION_MESSAGE.slice(0, 30) })
      .waitFor({ state: 'visible' });
    expect(await box().isVisible()).toBe(true);
    await shot('2-empty-question');
    await editor!.quickInput.type('zqxvw blorft');
    await editor!.quickInput.submit();
    await boxMessage()
      .filter({ hasText: /None of the words in “zqxvw blorft” occur/ })
      .waitFor({ state: 'visible', timeout: 30_000 });
    expect(
      await editor!.page
        .locator('.notifications-toasts .notification-toast')
        .filter({ hasText: /search failed/i })
        .count(),
    ).toBe(0);
    await shot('3-unknown-words');
    await editor!.quickInput.close();
  });

  it('shows folders beside results, a readable passage, and one row per page with its translations folded in', async () => {
    const rows = await search('what happens when I suspend my computer');
    await shot('4-search-quick-pick');
    // Every row names its folder; many pages share a file name across folders.
    for (const r of rows) expect(r.description).toMatch(/^\d\.\d\d · \S+/);
    // No page appears twice in different languages: translations are grouped under one row.
    const keys = rows.map((r) => translationPath(`${r.description.split(' · ')[1]}/${r.label}`).key);
    expect(new Set(keys).size).toBe(keys.length);
    const page = rows.find((r) => r.label === 'power-suspend.page');
    expect(page, JSON.stringify(rows)).toBeDefined();
    // An English question shows the original (C/), with the other languages one click away.
    expect(page!.description).toMatch(/ · C\/gnome-help · \+\d+ languages?$/);
    await editor!.quickInput.close();

    await editor!.runCommand('Undertone: Focus on Search Results View');
    const view = await waitForRows('Search Results', (r) => top(r).length > 0 && r.some((x) => x.level === 2), 'results with passages');
    const first = view.findIndex((r) => r.level === 1);
    const passage = view[first + 1];
    expect(passage.level).toBe(2);
    expect((passage.label.match(/\p{L}{2,}/gu) ?? []).length).toBeGreaterThanOrEqual(4);
    // The question's words are highlighted in the passage.
    expect(await editor!.pane('Search Results').locator('.monaco-list-row .monaco-highlighted-label .highlight').count()).toBeGreaterThan(
      0,
    );
    await shot('5-search-results-view');
  });

  it('shows a German question the German page', async () => {
    const rows = await search('Was passiert, wenn ich den Rechner in Bereitschaft versetze');
    const page = rows.find((r) => r.label === 'power-suspend.page');
    expect(page, JSON.stringify(rows)).toBeDefined();
    expect(page!.description).toMatch(/ · de\/gnome-help · \+\d+ languages?$/);
    await shot('6-german-question');
    await editor!.quickInput.close();
  });

  it("lists a page's own translations apart in Nearby, and explains a neighbour by shared concepts", async () => {
    await editor!.openFile('de/gnome-help/power-suspend.page');
    await editor!.runCommand('Undertone: Focus on Nearby View');
    const rows = await waitForRows('Nearby', (r) => top(r).length > 3, 'neighbours of the German suspend page');
    expect(top(rows)[0].label).toMatch(/^This page in \d+ other languages?$/);
    // None of the neighbours is the same page in another language.
    expect(
      top(rows)
        .slice(1)
        .map((r) => r.label),
    ).not.toContain('power-suspend.page');
    // Neighbours are shown in the German folder where they have a German version.
    const neighbours = top(rows).slice(1);
    expect(neighbours.filter((r) => / · de\//.test(r.description)).length).toBeGreaterThan(neighbours.length / 2);
    await shot('7-nearby-translations');
    const row = editor!.pane('Nearby').locator('.monaco-list-row').filter({ hasText: neighbours[0].label }).first();
    await row.hover();
    const hover = editor!.page
      .locator('.monaco-hover, .workbench-hover')
      .filter({ hasText: /concepts both files share/ })
      .first();
    await hover.waitFor({ state: 'visible', timeout: 15_000 });
    await shot('8-why-near');
  });

  it('[after merge of i10] names the overlap view "Overlaps"', async () => {
    // Branch i10 renames the view (a name that survives title case); until it is merged this fails.
    await editor!.runCommand('Undertone: Focus on Nearby View');
    const headers = await editor!.page.locator('.pane-header .title').allTextContents();
    expect(
      headers.map((h) => h.trim()),
      'view headers',
    ).toContainEqual(expect.stringMatching(/^Overlaps$/i));
  });

  it('[after merge of i17] names no topic "Topic N"', async () => {
    // Branch i17 names topics by their words; until it is merged this may fail.
    await editor!.runCommand('Undertone: Focus on Nearby View');
    const topics = await editor!.readTreeView('Topics', { minRows: 1, timeoutMs: 120_000 });
    await shot('9-topics');
    for (const t of top(topics)) expect(t.label).not.toMatch(/^Topic \d+/);
  });

  it('draws a map told apart by colour, shape and region labels, says what its rings are, and explains the spectrum', async () => {
    await editor!.runCommand('Undertone: Open Concept Map');
    const page = editor!.webview(0);
    const app = page.locator('[data-files]');
    await app.waitFor({ state: 'attached', timeout: 120_000 });
    await waitFor(async () => ((await app.getAttribute('data-region-labels')) ?? '') !== '', 60_000, 'topic labels on the map');
    const labels = ((await app.getAttribute('data-region-labels')) ?? '').split(' | ');
    expect(labels.length).toBeGreaterThan(1);
    await shot('10-map');
    const input = page.locator('input[type="search"]').first();
    await input.fill('what happens when I suspend my computer and the battery runs out while it sleeps');
    await input.press('Enter');
    const statusText = page.locator('.um-status-text');
    await statusText.filter({ hasText: /ringed: its \d+ best search results/ }).waitFor({ state: 'visible', timeout: 60_000 });
    // One line: the status never runs over the hint.
    const [s, h] = [await statusText.boundingBox(), await page.locator('.um-hint').boundingBox()];
    expect(s && h).toBeTruthy();
    expect(s!.x + s!.width).toBeLessThanOrEqual(h!.x + 1);
    expect(s!.height).toBeLessThan(2 * 18);
    await shot('11-map-query');
    await page
      .locator('[role="tab"]')
      .filter({ hasText: /Spectrum/ })
      .first()
      .click();
    const caption = page.locator('.um-spectrum-caption');
    await caption.waitFor({ state: 'visible' });
    expect(await caption.textContent()).toMatch(/k = \d+ concepts, which keep [\d.]+% .*(k looks large enough|More concepts could still)/s);
    await shot('12-spectrum');
  });

  it('asks before deleting the saved index, and every view then says there is none', async () => {
    await editor!.runCommand('Undertone: Delete Saved Index');
    const dialog = editor!.page.locator('.monaco-dialog-box');
    await dialog.waitFor({ state: 'visible' });
    expect(await dialog.textContent()).toMatch(/Delete the saved Undertone index/);
    await shot('13-delete-confirmation');
    await dialog
      .locator('.monaco-button')
      .filter({ hasText: /^Delete$/ })
      .first()
      .click();
    await status()
      .filter({ hasText: /no index/ })
      .waitFor({ state: 'visible', timeout: 30_000 });
    await editor!.runCommand('Undertone: Focus on Nearby View');
    const welcome = editor!.pane('Nearby').locator('.welcome-view-content');
    await welcome.filter({ hasText: /no index for this workspace yet/ }).waitFor({ state: 'visible', timeout: 30_000 });
    expect(await welcome.locator('.monaco-button').allTextContents()).toEqual(['Build Index']);
    const results = editor!.pane('Search Results');
    await results
      .locator('.welcome-view-content')
      .filter({ hasText: /once the workspace is indexed/ })
      .waitFor({ state: 'visible', timeout: 30_000 });
    expect(await results.locator('.pane-body .monaco-list-row').filter({ visible: true }).count()).toBe(0);
    await shot('14-after-delete');
  });
});
