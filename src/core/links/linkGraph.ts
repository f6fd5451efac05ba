/**
 * The links of a collection of notes: which note links to which (broken links and self-links
 * left out), read with linkReader.ts and resolved with linkResolver.ts, and how many links of each
 * style the notes write (for linkStyle.ts). Two notes are linked when either links to the other.
 */
import { InvalidInputError } from '../errors.js';
import { readLinks, type LinkKind, type RawLink } from './linkReader.js';
import { LinkResolver, type ResolveOptions } from './linkResolver.js';
import { NoteCatalogue, noteTitle, type NoteCatalogueOptions } from './noteCatalogue.js';

export interface NoteText {
  /** The note's index key. */
  readonly key: string;
  readonly text: string;
}

/** A note's title and written links (what the graph needs of its text). */
export interface ParsedNote {
  readonly key: string;
  readonly title: string;
  readonly links: readonly RawLink[];
}

/** Reads a note's title and links. */
export function parseNote(note: NoteText): ParsedNote {
  return { key: note.key, title: noteTitle(note.key, note.text), links: readLinks(note.text) };
}

export type LinkGraphOptions = NoteCatalogueOptions & ResolveOptions;

export class LinkGraph {
  private readonly _out = new Map<string, Set<string>>();
  private readonly _in = new Map<string, Set<string>>();
  /** Resolved links written in each style. */
  readonly styleCounts: Record<LinkKind, number> = { inline: 0, reference: 0, 'double-bracket': 0, html: 0 };

  private constructor(readonly notes: NoteCatalogue) {}

  /** Reads every note's links. Notes that are not notes by their ending are ignored. */
  static fromNotes(notes: readonly NoteText[], options: Partial<LinkGraphOptions> = {}): LinkGraph {
    const catalogue = new NoteCatalogue(options);
    return LinkGraph.fromParsed(notes.filter((n) => catalogue.isNote(n.key)).map(parseNote), options);
  }

  /**
   * The graph of notes already read (parseNote): titles and links are resolved anew, so a
   * caller that keeps each note's parse re-reads only the notes that changed.
   */
  static fromParsed(notes: readonly ParsedNote[], options: Partial<LinkGraphOptions> = {}): LinkGraph {
    const catalogue = new NoteCatalogue(options);
    const kept = notes.filter((n) => catalogue.isNote(n.key));
    const seen = new Set<string>();
    for (const n of kept) {
      if (seen.has(n.key)) throw new InvalidInputError(`the note "${n.key}" is given twice`);
      seen.add(n.key);
      catalogue.add(n.key, n.title);
    }
    const graph = new LinkGraph(catalogue);
    const resolver = new LinkResolver(catalogue, options);
    for (const n of kept) {
      for (const r of resolver.resolveAll(n.key, n.links)) {
        graph.styleCounts[r.link.kind]++;
        graph.addLink(r.from, r.to);
      }
    }
    return graph;
  }

  /** A graph over given notes and links (titles: the file names), for evaluations. */
  static fromPairs(
    keys: readonly string[],
    pairs: readonly (readonly [string, string])[],
    options: Partial<NoteCatalogueOptions> = {},
  ): LinkGraph {
    const catalogue = new NoteCatalogue({ noteExtensions: options.noteExtensions ?? [...new Set(keys.map(extOf))] });
    for (const k of keys) catalogue.add(k, k);
    const graph = new LinkGraph(catalogue);
    for (const [a, b] of pairs) if (a !== b && catalogue.has(a) && catalogue.has(b)) graph.addLink(a, b);
    return graph;
  }

  private addLink(from: string, to: string): void {
    add(this._out, from, to);
    add(this._in, to, from);
  }

  /** True when either note links to the other. */
  linked(a: string, b: string): boolean {
    return (this._out.get(a)?.has(b) ?? false) || (this._out.get(b)?.has(a) ?? false);
  }

  /** The notes a note links to. */
  linksFrom(key: string): readonly string[] {
    return [...(this._out.get(key) ?? [])];
  }

  /** The notes linking to a note. */
  linksTo(key: string): readonly string[] {
    return [...(this._in.get(key) ?? [])];
  }

  /** Distinct linked pairs (either direction counts once). */
  get pairCount(): number {
    let n = 0;
    for (const [a, tos] of this._out) for (const b of tos) if (a < b || !this._out.get(b)?.has(a)) n++;
    return n;
  }
}

function extOf(key: string): string {
  const name = key.slice(key.lastIndexOf('/') + 1);
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot).toLowerCase() : '';
}

function add(map: Map<string, Set<string>>, a: string, b: string): void {
  let s = map.get(a);
  if (!s) map.set(a, (s = new Set()));
  s.add(b);
}
