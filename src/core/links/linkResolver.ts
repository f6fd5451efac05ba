/**
 * Resolves the links a note writes (linkReader.ts) to the notes they reach (noteCatalogue.ts).
 * A link that reaches no note of the collection (an outside address, a missing file, a mail
 * address, a fragment of the same page) is not a link here.
 * - Markdown, reference and HTML links: a path relative to the note's folder (`/…` from the top
 *   of the note's workspace folder), percent-escapes decoded (RFC 3986 §2.1); tried as written,
 *   then with `.md` added, then as a folder's `index.md` / `README.md`; a spelling with other
 *   capitals when nothing matches exactly.
 * - Double-bracket links: a path (with or without its ending) from the top or from the note's
 *   folder, else a file name (the nearest one when several notes share it: same folder first,
 *   then the shortest key), else a title.
 */
import type { RawLink } from './linkReader.js';
import { NoteCatalogue } from './noteCatalogue.js';

export interface ResolvedLink {
  readonly from: string;
  readonly to: string;
  readonly link: RawLink;
}

/** Keys with several workspace folders start with the folder's name; `/…` resolves under it. */
export interface ResolveOptions {
  /** The key prefix of the note's workspace folder ('' with one folder, else "name/"). @default '' */
  readonly rootPrefix: (key: string) => string;
}

export const DEFAULT_RESOLVE_OPTIONS: ResolveOptions = { rootPrefix: () => '' };

const SCHEME = /^[a-z][a-z0-9+.-]*:/i;

function folderOf(key: string): string {
  const slash = key.lastIndexOf('/');
  return slash < 0 ? '' : key.slice(0, slash + 1);
}

/** Joins a relative path onto a folder ('…/'), resolving '.' and '..'; null when it climbs out. */
export function joinPath(folder: string, relative: string): string | null {
  const parts = folder.split('/').filter((p) => p.length > 0);
  for (const seg of relative.split('/')) {
    if (seg === '' || seg === '.') continue;
    if (seg === '..') {
      if (parts.length === 0) return null;
      parts.pop();
    } else parts.push(seg);
  }
  return parts.join('/');
}

function decode(s: string): string {
  try {
    return decodeURIComponent(s);
  } catch {
    return s;
  }
}

export class LinkResolver {
  private readonly _options: ResolveOptions;

  constructor(
    private readonly _notes: NoteCatalogue,
    options: Partial<ResolveOptions> = {},
  ) {
    this._options = { ...DEFAULT_RESOLVE_OPTIONS, ...options };
  }

  /** The note a link from `from` reaches, or null when it reaches none (or only `from` itself). */
  resolve(from: string, link: RawLink): string | null {
    const to = link.kind === 'double-bracket' ? this.byName(from, link.target) : this.byPath(from, link.target);
    return to === from ? null : to;
  }

  /** Every resolved link of a note, in order (self-links and broken links left out). */
  resolveAll(from: string, links: readonly RawLink[]): ResolvedLink[] {
    const out: ResolvedLink[] = [];
    for (const link of links) {
      const to = this.resolve(from, link);
      if (to !== null) out.push({ from, to, link });
    }
    return out;
  }

  private byPath(from: string, target: string): string | null {
    const raw = target.trim();
    if (raw === '' || raw.startsWith('//') || SCHEME.test(raw)) return null;
    const path = decode(raw).replace(/\\/g, '/');
    const base = path.startsWith('/') ? this._options.rootPrefix(from) : folderOf(from);
    const joined = joinPath(base, path);
    if (joined === null || joined === '') return null;
    return this.firstKnown([joined, `${joined}.md`, `${joined}/index.md`, `${joined}/README.md`]);
  }

  private byName(from: string, target: string): string | null {
    const name = target.trim().replace(/\\/g, '/');
    if (name === '') return null;
    if (name.includes('/')) {
      const prefix = this._options.rootPrefix(from);
      for (const base of [prefix, folderOf(from)]) {
        const joined = joinPath(base, name.replace(/^\//, ''));
        if (joined === null) continue;
        const hit = this.firstKnown([joined, `${joined}.md`]);
        if (hit) return hit;
      }
      // A path written from somewhere in the collection: the note whose key ends with it.
      const tail = `/${name.replace(/^\/+/, '').toLowerCase()}`;
      const named = this._notes.byName(name.slice(name.lastIndexOf('/') + 1).replace(/\.[^./]*$/, ''));
      const ending = named.filter((k) => `/${k.toLowerCase()}`.endsWith(tail) || `/${k.toLowerCase()}`.endsWith(`${tail}.md`));
      return this.nearest(from, ending);
    }
    const exact = this._notes.has(name) ? name : null;
    if (exact) return exact;
    const stem = name.replace(/\.(md|markdown)$/i, '');
    return this.nearest(from, this._notes.byName(stem)) ?? this.nearest(from, this._notes.byTitle(name));
  }

  /** Of several notes, the one in `from`'s folder, else the shortest key (then the first in order). */
  private nearest(from: string, keys: readonly string[]): string | null {
    if (keys.length === 0) return null;
    const folder = folderOf(from);
    const same = keys.find((k) => folderOf(k) === folder);
    if (same) return same;
    return [...keys].sort((a, b) => a.length - b.length || (a < b ? -1 : 1))[0];
  }

  private firstKnown(candidates: readonly string[]): string | null {
    for (const c of candidates) if (this._notes.has(c)) return c;
    for (const c of candidates) {
      const k = this._notes.keyIgnoringCase(c);
      if (k) return k;
    }
    return null;
  }
}
