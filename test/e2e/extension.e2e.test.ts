// The packaged extension in a real editor (code-server) and browser (Chromium), driven through
// the UI as a person would: palette commands, quick picks, the Undertone views, the editor and
// the Explorer. Expectations come from demo/expectations.json (written with the demo workspace:
// queries whose best answer uses other words, and files' expected neighbours).
// Run by `npm run test:e2e` (which installs the editor, builds and packages first).
import { appendFileSync, existsSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { Locator } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { OUTPUT_DIR, startEditor, type RunningEditor } from '../../scripts/e2e/editor.js';
import { waitFor } from '../../scripts/e2e/process.js';
import type { ListRow } from '../../scripts/e2e/workbench.js';
import { editorDirs, startOnDemoCopy } from '../helpers/demoEditor.js';

const REPO = path.resolve(import.meta.dirname, '../..');
const EXPECT = path.join(REPO, 'demo', 'expectations.json');

interface Expectations {
  queries: { text: string; expectTop3: string[] }[];
  neighbours: { file: string; expectAmongTop5: string[] }[];
  editScenario: { file: string; append: string; query: string; expectNotTop3Before: string[]; expectTop3After: string[] };
}

const base = (p: string) => p.slice(p.lastIndexOf('/') + 1);
/** Labels of the file rows (top level; a search result's passage is a row under it). */
const labels = (rows: ListRow[]) => rows.filter((r) => (r.level ?? 1) === 1).map((r) => r.label);

describe('Undertone in a real editor', () => {
  let root: string;
  let workspace: string;
  let editor: RunningEditor | undefined;
  let expectations: Expectations;
  const t0 = Date.now();

  /** Status bar text of the Undertone item. */
  const status = (): Locator =>
    editor!.page
      .locator('.statusbar-item')
      .filter({ hasText: /Undertone/ })
      .first();

  /** Reads a view's rows until `accept` holds (views update asynchronously). */
  const waitForRows = async (view: string, accept: (rows: ListRow[]) => boolean, what: string): Promise<ListRow[]> => {
    let last: ListRow[] = [];
    try {
      return await waitFor(
        async () => {
          last = await editor!.readTreeView(view, { minRows: 0 });
          return accept(last) ? last : false;
        },
        30_000,
        what,
      );
    } catch (err) {
      throw new Error(`${(err as Error).message}; last rows of ${view}: ${JSON.stringify(labels(last))}`);
    }
  };

  /** Runs the search command (which opens an input box at once) and returns the quick pick's first rows. */
  const search = async (query: string): Promise<ListRow[]> => {
    const title = 'Undertone: Search Workspace by Meaning…';
    await editor!.page.keyboard.press('F1');
    await editor!.quickInput.waitOpen();
    await editor!.quickInput.type(`>${title}`);
    await editor!.quickInput.pick(title);
    await inputTitled(/^Search Workspace by Meaning/);
    await editor!.quickInput.type(query);
    await editor!.quickInput.submit();
    await inputTitled(/files by meaning/);
    await editor!.page.locator('.quick-input-widget .quick-input-list .monaco-list-row').first().waitFor({ state: 'visible' });
    return editor!.quickInput.rows();
  };

  /** Waits for the quick input to show a title. */
  const inputTitled = (title: RegExp) =>
    editor!.page
      .locator('.quick-input-widget .quick-input-title')
      .filter({ hasText: title })
      .waitFor({ state: 'visible', timeout: 30_000 });

  /** With search results open: is `file` listed? Types its name into the quick pick's filter, as a person scanning the list would. */
  const listed = async (file: string): Promise<boolean> => {
    await editor!.quickInput.type(base(file));
    // The row shows the file name as label and its folder in the description.
    const row = editor!.quickInput.row(base(file)).filter({ hasText: path.posix.dirname(file) });
    const none = editor!.page.locator('.quick-input-widget .quick-input-list .monaco-list-row').first();
    await waitFor(async () => (await row.isVisible()) || !(await none.isVisible()), 10_000, `the filtered list for ${file}`);
    return row.isVisible();
  };

  /**
   * Quick open (Ctrl+P) by path: once the focused (first) row is the file, with its folder as
   * description, Enter opens it; then its tab must be the active one (matched by the tab's resource
   * name, which a badge or a description beside the label cannot change). The list re-sorts while
   * file results arrive, so a person who sees the wrong file first simply tries again.
   */
  const openFile = async (relPath: string): Promise<void> => {
    const dir = path.posix.dirname(relPath);
    const tab = editor!.page.locator(`.tabs-container .tab.active[data-resource-name="${base(relPath)}"]`);
    const focused = editor!.quickInput
      .row(base(relPath), dir === '.' ? undefined : dir)
      .and(editor!.page.locator('.monaco-list-row.focused'));
    try {
      await waitFor(
        async () => {
          if (await tab.isVisible()) return true;
          if (!(await editor!.quickInput.widget.isVisible())) {
            await editor!.page.keyboard.press('Control+P');
            await editor!.quickInput.type(relPath);
          }
          if (
            !(await focused.waitFor({ state: 'visible', timeout: 10_000 }).then(
              () => true,
              () => false,
            ))
          ) {
            await editor!.page.keyboard.press('Escape');
            return false;
          }
          await editor!.page.keyboard.press('Enter');
          return tab.waitFor({ state: 'visible', timeout: 5_000 }).then(
            () => true,
            () => false,
          );
        },
        60_000,
        `${relPath} to open`,
      );
    } catch (error) {
      throw new Error(`${(error as Error).message}\n${await editor!.describe()}`);
    }
  };

  const showUndertone = async (): Promise<void> => {
    await editor!.runCommand('Undertone: Focus on Nearby View');
  };

  beforeAll(async () => {
    if (!existsSync(EXPECT)) throw new Error('demo/expectations.json is missing');
    expectations = JSON.parse(readFileSync(EXPECT, 'utf8')) as Expectations;
    ({ root, workspace, editor } = await startOnDemoCopy('extension', { 'files.autoSave': 'off', 'explorer.confirmDelete': true }));
  });

  afterEach(async (ctx) => {
    if (ctx.task.result?.state === 'fail')
      console.log(`after "${ctx.task.name}":\n${await editor?.describe().catch((e: Error) => e.message)}`);
    if (ctx.task.result?.state === 'fail')
      await editor?.screenshot(`extension-failed-${ctx.task.name.slice(0, 40).replace(/\W+/g, '-')}`).catch(() => undefined);
  });

  afterAll(async () => {
    await editor?.stop();
    // The extension's log (from the editor logs copied by stop()) holds the measured save → Nearby times.
    const found = ['extension', 'extension-reopen'].flatMap((name) => {
      const logs = path.join(OUTPUT_DIR, `${name}.editor-logs`);
      return existsSync(logs) ? findFiles(logs, 'Undertone.log') : [];
    });
    const lines = new Set(
      found.flatMap((f) => readFileSync(f, 'utf8').split('\n')).filter((l) => /Loaded|Built|Since|Saved .*Nearby/.test(l)),
    );
    for (const line of [...lines].sort()) console.log(line.trim());
    console.log(`e2e: ${((Date.now() - t0) / 1000).toFixed(1)} s in all`);
    if (root) rmSync(root, { recursive: true, force: true });
  });

  it('builds the index after start-up and reports it in the status bar', async () => {
    await status()
      .filter({ hasText: /Undertone: [\d,]+ files, k=\d+/ })
      .waitFor({ state: 'visible', timeout: 120_000 });
    const text = (await status().textContent()) ?? '';
    const files = Number(/([\d,]+) files/.exec(text)![1].replace(/,/g, ''));
    expect(files).toBeGreaterThan(50);
    await showUndertone();
    await editor!.screenshot('extension-1-index-ready');
  });

  it('shows search results by meaning in a quick pick and in the Search Results view', async () => {
    const q = expectations.queries[0];
    const rows = await search(q.text);
    await editor!.screenshot('extension-2-search-quick-pick');
    expect(rows.length).toBeGreaterThan(3);
    // Each row shows its score and folder as description (and the matching passage as detail).
    for (const r of rows.slice(0, 3)) expect(r.description).toMatch(/^\d\.\d\d( · \S+)?$/);
    await editor!.quickInput.close();
    await showUndertone();
    const results = await waitForRows('Search Results', (r) => r.length > 0, 'search results in the view');
    expect(labels(results).slice(0, 3)).toEqual(labels(rows).slice(0, 3));
    await editor!.screenshot('extension-3-search-results-view');
  });

  it('lists the file that answers each planted query in other words', async () => {
    // demo/expectations.json: each query's expected answer avoids the query's own words ("absentWords").
    const missing: string[] = [];
    for (const q of expectations.queries) {
      await search(q.text);
      for (const want of q.expectTop3) if (!(await listed(want))) missing.push(`${want} for "${q.text}"`);
      await editor!.quickInput.close();
    }
    expect(missing).toEqual([]);
  });

  it('lists the expected neighbours of the file in the editor in the Nearby view', async () => {
    const n = expectations.neighbours[0];
    await openFile(n.file);
    await showUndertone();
    const rows = await waitForRows(
      'Nearby',
      (r) => n.expectAmongTop5.every((f) => labels(r).slice(0, 5).includes(base(f))),
      `neighbours of ${n.file}`,
    );
    expect(rows.length).toBeGreaterThanOrEqual(5);
    expect(rows[0].description).toMatch(/^\d\.\d\d/);
    await editor!.screenshot('extension-4-nearby');
  });

  it('follows an edit as soon as it is saved', async () => {
    const s = expectations.editScenario;
    let rows = await search(s.query);
    for (const f of s.expectNotTop3Before) expect(labels(rows).slice(0, 3)).not.toContain(base(f));
    await editor!.quickInput.close();
    await openFile(s.file);
    const text = editor!.page.locator('.editor-instance .monaco-editor .view-lines').first();
    await text.click();
    await editor!.page.keyboard.press('Control+End');
    await editor!.page.keyboard.insertText(s.append);
    await editor!.page.keyboard.press('Control+S');
    await editor!.page.locator('.tabs-container .tab.active.dirty').waitFor({ state: 'detached', timeout: 30_000 });
    // The Search Results view re-runs the last query when the index changes.
    await showUndertone();
    await waitForRows(
      'Search Results',
      (r) => s.expectTop3After.every((f) => labels(r).slice(0, 3).includes(base(f))),
      'the edited file in the search results',
    );
    await editor!.screenshot('extension-5-after-edit');
    rows = await search(s.query);
    for (const f of s.expectTop3After) expect(labels(rows).slice(0, 3)).toContain(base(f));
    await editor!.quickInput.close();
  });

  it('searches by meaning for the text selected in the editor, from its context menu', async () => {
    await openFile(expectations.neighbours[0].file);
    const text = editor!.page.locator('.editor-instance .monaco-editor .view-lines').first();
    await text.click();
    await editor!.page.keyboard.press('Control+Home');
    await editor!.page.keyboard.press('Shift+End');
    await text.click({ button: 'right', position: { x: 40, y: 8 } });
    const item = editor!.page.locator('.context-view .action-item').filter({ hasText: 'Search by Meaning for Selection' }).first();
    await item.waitFor({ state: 'visible', timeout: 30_000 });
    await editor!.screenshot('extension-6a-editor-context-menu');
    await item.click();
    await inputTitled(/files by meaning/);
    const rows = await editor!.quickInput.rows();
    expect(rows.length).toBeGreaterThan(0);
    await editor!.quickInput.close();
  });

  it('offers index actions from the status bar item, and rebuilds from there', async () => {
    await status().click();
    await inputTitled(/^Undertone$/);
    const actions = labels(await editor!.quickInput.rows());
    expect(actions).toEqual(expect.arrayContaining(['Search Workspace by Meaning…', 'Build Index', 'Delete Saved Index']));
    await editor!.screenshot('extension-6b-status-actions');
    await editor!.quickInput.pick('Build Index');
    // The rebuild is quick here; its line in the extension's log (Output panel) shows it ran and reused every file
    // (\s, not ' ': the editor renders spaces as no-break spaces).
    await editor!.runCommand('Undertone: Show Log');
    await editor!.waitForText(/Built\sthe\sindex:\s[\d,]+\sfiles\s\(0\sread,\s[\d,]+\sreused/, {
      within: editor!.page.locator('.part.panel'),
      timeoutMs: 120_000,
    });
    await status()
      .filter({ hasText: /Undertone: [\d,]+ files, k=\d+/ })
      .waitFor({ state: 'visible', timeout: 120_000 });
    await editor!.screenshot('extension-6c-log');
  });

  it('drops a deleted file from the Nearby and Search Results views', async () => {
    const n = expectations.neighbours[0];
    const victim = n.expectAmongTop5[0];
    const query = 'how the fare for a booking is calculated';
    await openFile(n.file);
    await showUndertone();
    await waitForRows('Nearby', (r) => labels(r).includes(base(victim)), `${victim} among the neighbours before deleting it`);
    await search(query);
    expect(await listed(victim)).toBe(true);
    await editor!.quickInput.close();
    // Delete it from the Explorer, as a person would.
    await openFile(victim);
    await editor!.runCommand('File: Reveal Active File in Explorer View');
    const row = editor!.page
      .locator('.explorer-folders-view .monaco-list-row.selected')
      .filter({ hasText: base(victim) })
      .first();
    await row.waitFor({ state: 'visible', timeout: 30_000 });
    await row.click();
    await editor!.page.keyboard.press('Delete');
    const dialog = editor!.page.locator('.monaco-dialog-box');
    await dialog.waitFor({ state: 'visible', timeout: 30_000 });
    await editor!.screenshot('extension-6-delete-dialog');
    await dialog
      .locator('.monaco-button')
      .filter({ hasText: /Delete|Move to Trash/ })
      .first()
      .click();
    await waitFor(() => !existsSync(path.join(workspace, victim)), 30_000, `${victim} to be deleted`);
    await openFile(n.file);
    await showUndertone();
    await waitForRows('Nearby', (r) => r.length > 0 && !labels(r).includes(base(victim)), `${victim} to leave the Nearby view`);
    await waitForRows(
      'Search Results',
      (r) => r.length > 0 && !labels(r).includes(base(victim)),
      `${victim} to leave the Search Results view`,
    );
    await editor!.screenshot('extension-7-after-delete');
    await search(query);
    expect(await listed(victim)).toBe(false);
    await editor!.quickInput.close();
  });

  it('loads the saved index when the folder is opened again, and folds in a file changed meanwhile', async () => {
    const port = editor!.port;
    await editor!.stop();
    const changed = expectations.neighbours[1].file;
    appendFileSync(
      path.join(workspace, changed),
      '\nA note added while the editor was closed: claims are answered within five working days.\n',
    );
    editor = await startEditor({
      workspaceFolder: workspace,
      ...editorDirs(root),
      settings: { 'files.autoSave': 'off' },
      name: 'extension-reopen',
      port, // the same address, so the editor finds this folder's workspace storage again
    });
    await status()
      .filter({ hasText: /Undertone: [\d,]+ files, k=\d+/ })
      .waitFor({ state: 'visible', timeout: 120_000 });
    await editor!.runCommand('Undertone: Show Log');
    const panel = editor!.page.locator('.part.panel');
    await editor!.waitForText(/Loaded\sthe\ssaved\sindex/, { within: panel });
    await editor!.waitForText(/Since\sthe\sindex\swas\ssaved:\s\d+\sadded,\s[1-9]\d*\schanged/, { within: panel });
    await editor!.screenshot('extension-9-reopened');
  });
});

function findFiles(dir: string, name: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...findFiles(p, name));
    else if (e.name === name) out.push(p);
  }
  return out;
}

describe('Undertone in an untrusted folder (Restricted Mode)', () => {
  let root: string;
  let editor: RunningEditor | undefined;

  beforeAll(async () => {
    ({ root, editor } = await startOnDemoCopy('extension-restricted', { 'security.workspace.trust.enabled': true }));
  });

  afterAll(async () => {
    await editor?.stop();
    if (root) rmSync(root, { recursive: true, force: true });
  });

  it('still indexes: the manifest declares that reading files for a local index is safe there', async () => {
    await editor!.page
      .locator('.statusbar-item')
      .filter({ hasText: /Restricted Mode/ })
      .first()
      .waitFor({ state: 'visible', timeout: 60_000 });
    await editor!.page
      .locator('.statusbar-item')
      .filter({ hasText: /Undertone: [\d,]+ files, k=\d+/ })
      .first()
      .waitFor({ state: 'visible', timeout: 120_000 });
    await editor!.screenshot('extension-8-restricted-mode');
  });
});
