/**
 * Suggested links in the worker (linksProtocol.ts): reads the workspace's notes once per index
 * state to know their links (core/links/linkGraph.ts) and style, then answers each note's
 * suggestions (core/links/suggestLinks.ts) with the words behind them (core/explain) and the
 * link to insert. Suggestions stay within the note's own workspace folder (a relative link cannot
 * cross folders). The graph is cached until the index changes (a fold-in, a build, a removal).
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { LinkGraph, type NoteText } from '../../core/links/linkGraph.js';
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

/** The key prefix of a key's workspace folder ('' with one folder). */
export function rootPrefixOf(roots: RootMap, key: string): string {
  return roots.multi ? key.slice(0, key.indexOf('/') + 1) : '';
}

export class LinkService {
  private _cached: { readonly key: string; readonly run: Promise<Links> } | undefined;

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

  private async readLinks(index: LsiIndex, roots: RootMap): Promise<Links> {
    const catalogue = new NoteCatalogue();
    const notes: NoteText[] = [];
    for (const key of index.paths()) {
      if (!catalogue.isNote(key)) continue;
      const got = await readIndexableText(roots.refOf(key).fsPath, this._source.maxFileBytes()).catch(() => null);
      if (got?.kind === 'text') notes.push({ key, text: got.text });
    }
    const graph = LinkGraph.fromNotes(notes, { rootPrefix: (k) => rootPrefixOf(roots, k) });
    return { graph, style: detectLinkStyle(graph) };
  }
}
