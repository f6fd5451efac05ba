/**
 * Suggested links in the worker (linksProtocol.ts): knows the workspace's notes' links
 * (core/links/linkGraph.ts) and style per index state, then answers each note's suggestions
 * (core/links/suggestLinks.ts) with the words behind them (core/explain) and the link to insert.
 * Suggestions stay within the note's own workspace folder (a relative link cannot cross folders).
 * The graph is cached until the index changes (a fold-in, a build, a removal); then only the notes
 * whose size or modification time in the index changed are read again, the others keep their
 * parsed titles and links, and the links are resolved anew over all notes.
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { LinkGraph, parseNote, type ParsedNote } from '../../core/links/linkGraph.js';
import { detectLinkStyle, formatLink, type StyleVerdict } from '../../core/links/linkStyle.js';
import { NoteCatalogue } from '../../core/links/noteCatalogue.js';
import { DEFAULT_SUGGEST_OPTIONS, explainSimilarity, suggestLinks } from '../../core/links/suggestLinks.js';
import { readIndexableText } from '../scan.js';
import { toWhy } from './explainHits.js';
import { indexStateKey } from './insightService.js';
import type { LinkSuggestionsResult, LinksRequestType } from './linksProtocol.js';
import type { RootMap } from './rootMap.js';
import type { Handlers } from './server.js';
import { formsFromTexts } from './wordForms.js';

export interface LinkSource {
  /** The index in use, or undefined. */
  index(): LsiIndex | undefined;
  roots(): RootMap;
  maxFileBytes(): number;
}

interface Links {
  readonly graph: LinkGraph;
  readonly style: StyleVerdict;
}

interface KnownNote {
  readonly size: number;
  readonly mtimeMs: number;
  readonly note: ParsedNote;
}

/** What the last refresh of the link graph did. */
export interface LinkRefresh {
  /** Notes read from disk (new or changed in the index). */
  readonly read: number;
  /** Notes whose parse was kept. */
  readonly kept: number;
}

/** The key prefix of a key's workspace folder ('' with one folder). */
export function rootPrefixOf(roots: RootMap, key: string): string {
  return roots.multi ? key.slice(0, key.indexOf('/') + 1) : '';
}

export class LinkService {
  private _cached: { readonly key: string; readonly run: Promise<Links> } | undefined;
  private readonly _known = new Map<string, KnownNote>();
  private _lastRefresh: LinkRefresh = { read: 0, kept: 0 };

  constructor(private readonly _source: LinkSource) {}

  handlers(): Pick<Handlers, LinksRequestType> {
    return { suggestLinks: async ({ fsPath, top }) => this.suggest(fsPath, top) };
  }

  async suggest(fsPath: string, top: number = DEFAULT_SUGGEST_OPTIONS.top): Promise<LinkSuggestionsResult | null> {
    const t0 = performance.now();
    const index = this._source.index();
    const roots = this._source.roots();
    const key = roots.keyOf(fsPath);
    if (!index || key === undefined || !index.has(key) || !new NoteCatalogue().isNote(key)) return null;
    const links = await this.links(index, roots);
    if (this._source.index() !== index || !index.has(key)) return null;
    const prefix = rootPrefixOf(roots, key);
    const found = suggestLinks(index, links.graph, key, { top, words: 0 });
    const own = found.filter((s) => rootPrefixOf(roots, s.path) === prefix);
    const texts: string[] = [];
    for (const k of [key, ...own.map((s) => s.path)]) {
      const got = await readIndexableText(roots.refOf(k).fsPath, this._source.maxFileBytes()).catch(() => null);
      if (got?.kind === 'text') texts.push(got.text);
    }
    if (this._source.index() !== index || !index.has(key)) return null;
    const wordFor = formsFromTexts(texts, index.settings.tokenize.stem);
    const why = own.map((s) => {
      try {
        return toWhy(explainSimilarity(index, key, s.path), wordFor);
      } catch {
        return undefined; // the suggestion stays, without its words
      }
    });
    return {
      style: links.style.style,
      minSimilarity: DEFAULT_SUGGEST_OPTIONS.minSimilarity,
      linked: new Set([...links.graph.linksFrom(key), ...links.graph.linksTo(key)]).size,
      suggestions: own.map((s, i) => ({
        ...roots.refOf(s.path),
        title: links.graph.notes.titleOf(s.path),
        score: s.score,
        similarity: s.similarity,
        link: formatLink(links.style.style, key, s.path, links.graph),
        why: why[i],
      })),
      ms: performance.now() - t0,
    };
  }

  private links(index: LsiIndex, roots: RootMap): Promise<Links> {
    const state = indexStateKey(index, roots);
    if (this._cached?.key === state) return this._cached.run;
    const entry = { key: state, run: this.readLinks(index, roots) };
    this._cached = entry;
    entry.run.catch(() => {
      if (this._cached === entry) this._cached = undefined;
    });
    return entry.run;
  }

  /** What the last refresh of the link graph read and kept. */
  get lastRefresh(): LinkRefresh {
    return this._lastRefresh;
  }

  private async readLinks(index: LsiIndex, roots: RootMap): Promise<Links> {
    const catalogue = new NoteCatalogue();
    const notes: ParsedNote[] = [];
    const present = new Set<string>();
    let read = 0;
    for (const key of index.paths()) {
      if (!catalogue.isNote(key)) continue;
      const meta = index.meta(key);
      const fsPath = roots.refOf(key).fsPath;
      present.add(fsPath);
      const known = this._known.get(fsPath);
      if (
        known !== undefined &&
        meta !== undefined &&
        known.size === meta.size &&
        known.mtimeMs === meta.mtimeMs &&
        known.note.key === key
      ) {
        notes.push(known.note);
        continue;
      }
      read++;
      const got = await readIndexableText(fsPath, this._source.maxFileBytes()).catch(() => null);
      if (got?.kind !== 'text') {
        this._known.delete(fsPath);
        continue;
      }
      const note = parseNote({ key, text: got.text });
      notes.push(note);
      if (meta !== undefined) this._known.set(fsPath, { size: meta.size, mtimeMs: meta.mtimeMs, note });
    }
    for (const fsPath of [...this._known.keys()]) if (!present.has(fsPath)) this._known.delete(fsPath);
    this._lastRefresh = { read, kept: notes.length - read };
    const graph = LinkGraph.fromParsed(notes, { rootPrefix: (k) => rootPrefixOf(roots, k) });
    return { graph, style: detectLinkStyle(graph) };
  }
}
