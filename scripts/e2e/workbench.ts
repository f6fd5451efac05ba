// Drives the editor's web workbench the way a person would: command palette,
// quick open, quick picks, views, notifications, webviews, screenshots.
// Every step waits on selectors or text; nothing sleeps for a fixed time.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { FrameLocator, Locator, Page } from 'playwright-core';
import { waitFor } from './process.js';

/** Workbench DOM selectors, in one place so an editor update is a one-line fix. */
export const SELECTORS = {
  quickInput: '.quick-input-widget',
  quickInputBox: '.quick-input-widget .quick-input-box input',
  quickInputRow: '.quick-input-widget .quick-input-list .monaco-list-row',
  rowLabel: '.monaco-icon-label .label-name',
  rowDescription: '.monaco-icon-label .label-description',
  activeTab: '.tabs-container .tab.active',
  pane: '.pane',
  paneHeader: '.pane-header',
  paneRow: '.pane-body .monaco-list-row',
  notification: '.notifications-toasts .notification-toast',
  webview: 'iframe.webview.ready',
  webviewContent: '#active-frame',
} as const;

export interface ListRow {
  label: string;
  description: string;
  /** Tree depth (1 = top level) where the list reports one. */
  level?: number;
  /** true/false for expandable tree rows; undefined for leaves. */
  expanded?: boolean;
}

export interface WaitOptions {
  timeoutMs?: number;
}

const DEFAULT_TIMEOUT = 30_000;
/** How long a quick input list may lack an expected row before its text is typed again. */
const RETYPE_MS = 2_000;

async function readRow(row: Locator): Promise<ListRow> {
  const label = (await row.locator(SELECTORS.rowLabel).first().textContent()) ?? '';
  const descriptions = row.locator(SELECTORS.rowDescription);
  const description = (await descriptions.count()) ? ((await descriptions.first().textContent()) ?? '') : '';
  const level = await row.getAttribute('aria-level');
  const expanded = await row.getAttribute('aria-expanded');
  return {
    label: label.trim(),
    description: description.trim(),
    level: level ? Number(level) : undefined,
    expanded: expanded === null ? undefined : expanded === 'true',
  };
}

/** The quick input widget: command palette, quick open, quick picks and input boxes. */
export class QuickInput {
  constructor(private readonly page: Page) {}

  get widget(): Locator {
    return this.page.locator(SELECTORS.quickInput);
  }

  async waitOpen(options: WaitOptions = {}): Promise<void> {
    await this.page.locator(SELECTORS.quickInputBox).waitFor({ state: 'visible', timeout: options.timeoutMs ?? DEFAULT_TIMEOUT });
  }

  async waitClosed(options: WaitOptions = {}): Promise<void> {
    await this.widget.waitFor({ state: 'hidden', timeout: options.timeoutMs ?? DEFAULT_TIMEOUT });
  }

  /** Waits until the widget is hidden or its input no longer holds `text` (another quick input took over). */
  async waitReplaced(text: string, options: WaitOptions = {}): Promise<void> {
    const input = this.page.locator(SELECTORS.quickInputBox);
    await waitFor(
      async () => !(await this.widget.isVisible()) || (await input.inputValue()) !== text,
      options.timeoutMs ?? DEFAULT_TIMEOUT,
      `the quick input showing "${text}" to close`,
    );
  }

  /** Replaces the input's text (include the leading ">" for commands). */
  async type(text: string): Promise<void> {
    await this.waitOpen();
    await this.page.locator(SELECTORS.quickInputBox).fill(text);
  }

  /** The first row whose label is exactly `label` (and whose description is exactly `description`, if given). */
  row(label: string, description?: string): Locator {
    let rows = this.page
      .locator(SELECTORS.quickInputRow)
      .filter({ has: this.page.locator(SELECTORS.rowLabel).getByText(label, { exact: true }) });
    if (description !== undefined) {
      rows = rows.filter({ has: this.page.locator(SELECTORS.rowDescription).getByText(description, { exact: true }) });
    }
    return rows.first();
  }

  async waitForRow(label: string, options: WaitOptions = {}): Promise<Locator> {
    const row = this.row(label);
    await row.waitFor({ state: 'visible', timeout: options.timeoutMs ?? DEFAULT_TIMEOUT });
    return row;
  }

  /** Labels and descriptions of the visible rows ([] when closed; the list is virtual, so only rendered rows). */
  async rows(): Promise<ListRow[]> {
    const rows = await this.page.locator(SELECTORS.quickInputRow).filter({ visible: true }).all();
    return Promise.all(rows.map(readRow));
  }

  /**
   * Waits for the row labelled `label` and accepts it: Enter when it is focused,
   * a click otherwise. The list is computed when the text changes, so while the
   * row is missing the current text is typed again (items registered late, such
   * as commands of an extension still loading, then show up).
   */
  async pick(label: string, options: WaitOptions & { description?: string } = {}): Promise<void> {
    const row = this.row(label, options.description);
    const input = this.page.locator(SELECTORS.quickInputBox);
    const text = await input.inputValue();
    let lastTyped = Date.now();
    await waitFor(
      async () => {
        if (await row.isVisible()) return true;
        if (Date.now() - lastTyped > RETYPE_MS) {
          await input.fill('');
          await input.fill(text);
          lastTyped = Date.now();
        }
        return false;
      },
      options.timeoutMs ?? DEFAULT_TIMEOUT,
      `quick input row "${label}"`,
    );
    const classes = (await row.getAttribute('class')) ?? '';
    if (classes.split(/\s+/).includes('focused')) await this.page.keyboard.press('Enter');
    else await row.click();
  }

  async submit(): Promise<void> {
    await this.page.keyboard.press('Enter');
  }

  async close(): Promise<void> {
    await this.page.keyboard.press('Escape');
    await this.waitClosed();
  }
}

export class Workbench {
  readonly quickInput: QuickInput;

  constructor(
    readonly page: Page,
    readonly outputDir: string,
  ) {
    this.quickInput = new QuickInput(page);
  }

  /**
   * F1, type the command's title, wait for its row and accept it. Returns once the
   * palette is gone: closed, or replaced by a quick input that the command opened
   * (answer that one with this.quickInput).
   */
  async runCommand(title: string, options: WaitOptions = {}): Promise<void> {
    const text = `>${title}`;
    await this.page.keyboard.press('F1');
    await this.quickInput.waitOpen(options);
    await this.quickInput.type(text);
    await this.quickInput.pick(title, options);
    await this.quickInput.waitReplaced(text, options);
  }

  /** Quick open (Ctrl+P) a workspace file by relative path; waits for its tab to be active. */
  async openFile(relPath: string, options: WaitOptions = {}): Promise<void> {
    const base = path.posix.basename(relPath.split(path.sep).join('/'));
    await this.page.keyboard.press('Control+P');
    await this.quickInput.waitOpen(options);
    await this.quickInput.type(relPath);
    // Quick open shows the file name as label and its folder as description.
    const folder = path.posix.dirname(relPath.split(path.sep).join('/'));
    await this.quickInput.pick(base, { ...options, description: folder === '.' ? undefined : folder });
    await this.page
      .locator(SELECTORS.activeTab)
      .filter({ hasText: base })
      .waitFor({ state: 'visible', timeout: options.timeoutMs ?? DEFAULT_TIMEOUT });
  }

  /** Waits until text (or a locator) is visible somewhere in the workbench and returns it. */
  async waitForText(target: string | RegExp | Locator, options: WaitOptions & { within?: Locator } = {}): Promise<Locator> {
    const scope = options.within ?? this.page.locator('body');
    const locator = typeof target === 'string' || target instanceof RegExp ? scope.getByText(target).first() : target.first();
    await locator.waitFor({ state: 'visible', timeout: options.timeoutMs ?? DEFAULT_TIMEOUT });
    return locator;
  }

  /** The view pane whose header title is `viewTitle` (case-insensitive, as headers are upper-cased by CSS). */
  pane(viewTitle: string): Locator {
    const header = this.page.locator(SELECTORS.paneHeader).filter({ hasText: new RegExp(`^\\s*${escapeRegExp(viewTitle)}`, 'i') });
    return this.page.locator(SELECTORS.pane).filter({ has: header }).first();
  }

  /**
   * Rows of a visible tree or list view (open its container first, e.g. with a
   * "Focus on … View" command). Expands the pane if collapsed; waits for at least
   * `minRows` rows (default 1; pass 0 for views that may be empty).
   */
  async readTreeView(viewTitle: string, options: WaitOptions & { minRows?: number } = {}): Promise<ListRow[]> {
    const timeout = options.timeoutMs ?? DEFAULT_TIMEOUT;
    const pane = this.pane(viewTitle);
    await pane.waitFor({ state: 'visible', timeout });
    const header = pane.locator(SELECTORS.paneHeader).first();
    if ((await header.getAttribute('aria-expanded')) === 'false') await header.click();
    const minRows = options.minRows ?? 1;
    const rows = pane.locator(SELECTORS.paneRow).filter({ visible: true });
    if (minRows > 0) await rows.nth(minRows - 1).waitFor({ state: 'visible', timeout });
    return Promise.all((await rows.all()).map(readRow));
  }

  /** Waits for a notification toast containing `text` and returns it. */
  async waitForNotification(text: string | RegExp, options: WaitOptions = {}): Promise<Locator> {
    const toast = this.page.locator(SELECTORS.notification).filter({ hasText: text }).first();
    await toast.waitFor({ state: 'visible', timeout: options.timeoutMs ?? DEFAULT_TIMEOUT });
    return toast;
  }

  /**
   * The content of the nth visible webview (editor or view). Webviews are
   * overlays outside the tab that owns them, so they are picked by position;
   * wait on text inside the result to tell them apart.
   */
  webview(nth = 0): FrameLocator {
    return this.page.locator(SELECTORS.webview).filter({ visible: true }).nth(nth).contentFrame().frameLocator(SELECTORS.webviewContent);
  }

  /**
   * A few lines on what the window shows (open tabs, the quick input, notifications, a dialog), for
   * failure messages: a CI log has no screenshots.
   */
  async describe(): Promise<string> {
    const page = this.page;
    const tabs = await page
      .locator('.tabs-container .tab')
      .evaluateAll((els) =>
        els.map((e) => `${e.getAttribute('data-resource-name') ?? e.textContent}${e.classList.contains('active') ? ' (active)' : ''}`),
      );
    const lines = [`tabs: ${tabs.join(', ') || 'none'}`];
    if (await page.locator(SELECTORS.quickInput).isVisible()) {
      const value = await page
        .locator(SELECTORS.quickInputBox)
        .inputValue()
        .catch(() => '?');
      const rows = (await this.quickInput.rows()).slice(0, 6).map((r) => `${r.label} [${r.description}]`);
      lines.push(`quick input "${value}": ${rows.join(' | ') || 'no rows'}`);
    }
    const toasts = await page.locator(SELECTORS.notification).filter({ visible: true }).allTextContents();
    if (toasts.length) lines.push(`notifications: ${toasts.join(' | ')}`);
    const dialog = page.locator('.monaco-dialog-box').filter({ visible: true });
    if (await dialog.count()) lines.push(`dialog: ${await dialog.first().textContent()}`);
    return lines.join('\n');
  }

  /** Saves a full-window PNG as <outputDir>/<name>.png and returns its path. */
  async screenshot(name: string): Promise<string> {
    mkdirSync(this.outputDir, { recursive: true });
    const file = path.join(this.outputDir, `${name}.png`);
    await this.page.screenshot({ path: file });
    return file;
  }
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
