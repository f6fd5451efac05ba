/**
 * The notes of a collection as links see them: which index keys are notes (by extension), each
 * note's title (front matter `title:`, else its first level-1 heading, else its HTML <title>,
 * else its file name), and look-ups by key, by file name and by title for resolving links
 * (linkResolver.ts). Names and titles match case-insensitively (common practice in note
 * collections, whose files are named by hand).
 */

export interface NoteCatalogueOptions {
  /** File endings (lower case, with the dot) whose files are notes. @default Markdown, HTML and plain text */
  readonly noteExtensions: readonly string[];
}

export const DEFAULT_NOTE_CATALOGUE_OPTIONS: NoteCatalogueOptions = {
  noteExtensions: ['.md', '.markdown', '.mdown', '.mkd', '.mdx', '.html', '.htm', '.txt'],
};

/** The file name without its folder and ending ("a/b/Some Note.md" → "Some Note"). */
export function baseName(key: string): string {
  const name = key.slice(key.lastIndexOf('/') + 1);
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(0, dot) : name;
}

/** The file ending, lower case with the dot ('' when none). */
export function extensionOf(key: string): string {
  const name = key.slice(key.lastIndexOf('/') + 1);
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot).toLowerCase() : '';
}

/** A note's title from its text, or its file name when the text names none. */
export function noteTitle(key: string, text: string): string {
  const front = /^---[ \t]*\r?\n([\s\S]*?)\r?\n(?:---|\.\.\.)[ \t]*(?:\r?\n|$)/.exec(text);
  if (front) {
    const t = /^title:[ \t]*(.+?)[ \t]*$/m.exec(front[1]);
    if (t) return unquote(t[1]);
  }
  const body = front ? text.slice(front[0].length) : text;
  const heading = /^ {0,3}#[ \t]+(.+?)[ \t#]*$/m.exec(body.replace(/^ {0,3}(`{3,}|~{3,})[\s\S]*?^ {0,3}\1[ \t]*$/gm, ''));
  if (heading) return heading[1].trim();
  const html = /<title[^>]*>([^<]+)<\/title>/i.exec(body);
  if (html && html[1].trim()) return html[1].trim().replace(/\s+/g, ' ');
  return baseName(key);
}

function unquote(s: string): string {
  const m = /^(["'])(.*)\1$/.exec(s);
  return m ? m[2] : s;
}

export class NoteCatalogue {
  private readonly _titles = new Map<string, string>();
  private readonly _byName = new Map<string, string[]>();
  private readonly _byTitle = new Map<string, string[]>();
  private readonly _byLowerKey = new Map<string, string>();
  private readonly _extensions: ReadonlySet<string>;

  constructor(options: Partial<NoteCatalogueOptions> = {}) {
    this._extensions = new Set((options.noteExtensions ?? DEFAULT_NOTE_CATALOGUE_OPTIONS.noteExtensions).map((e) => e.toLowerCase()));
  }

  /** Whether a key names a note (by its ending). */
  isNote(key: string): boolean {
    return this._extensions.has(extensionOf(key));
  }

  /** Adds a note with its title (noteTitle). Adding a key twice replaces its title. */
  add(key: string, title: string): void {
    if (this._titles.has(key)) this.remove(key);
    this._titles.set(key, title);
    this._byLowerKey.set(key.toLowerCase(), key);
    push(this._byName, baseName(key).toLowerCase(), key);
    push(this._byTitle, title.trim().toLowerCase(), key);
  }

  private remove(key: string): void {
    const title = this._titles.get(key)!;
    this._titles.delete(key);
    this._byLowerKey.delete(key.toLowerCase());
    drop(this._byName, baseName(key).toLowerCase(), key);
    drop(this._byTitle, title.trim().toLowerCase(), key);
  }

  has(key: string): boolean {
    return this._titles.has(key);
  }

  /** The key spelled with other capitals, if one exists. */
  keyIgnoringCase(key: string): string | undefined {
    return this._byLowerKey.get(key.toLowerCase());
  }

  titleOf(key: string): string {
    return this._titles.get(key) ?? baseName(key);
  }

  keys(): string[] {
    return [...this._titles.keys()];
  }

  get size(): number {
    return this._titles.size;
  }

  /** Notes with this file name (without ending), case-insensitive, in key order. */
  byName(name: string): readonly string[] {
    return this._byName.get(name.trim().toLowerCase()) ?? [];
  }

  /** Notes with this title, case-insensitive, in key order. */
  byTitle(title: string): readonly string[] {
    return this._byTitle.get(title.trim().toLowerCase()) ?? [];
  }
}

function push(map: Map<string, string[]>, name: string, key: string): void {
  const list = map.get(name);
  if (!list) map.set(name, [key]);
  else {
    list.push(key);
    list.sort();
  }
}

function drop(map: Map<string, string[]>, name: string, key: string): void {
  const list = map.get(name);
  if (!list) return;
  const at = list.indexOf(key);
  if (at >= 0) list.splice(at, 1);
  if (list.length === 0) map.delete(name);
}
