/** Link resolution and the link graph of a small collection (cases stating the rules in src/core/links/linkResolver.ts). */
import { describe, expect, it } from 'vitest';
import { LinkGraph } from '../../../src/core/links/linkGraph.js';
import { joinPath } from '../../../src/core/links/linkResolver.js';

const notes = [
  { key: 'index.md', text: '# Home\n[Guide](guides/setup.md) [dead](nowhere.md) [web](https://example.org/x.md) [mail](mailto:a@b)' },
  { key: 'guides/setup.md', text: '---\ntitle: "Setting things up"\n---\nBack [home](../index.md#top), [sibling](other%20guide.md).' },
  { key: 'guides/other guide.md', text: 'See [[Setup]] and [[Deep Note|alias]] and [[Setting things up]] and [[Missing]].' },
  { key: 'deep/Deep Note.md', text: 'Up: <a href="/index.md">home</a>; [ref][r]; [self](Deep%20Note.md)\n\n[r]: ../guides/Setup.MD\n' },
  { key: 'deep/folder/README.md', text: 'Folder [up](../) [own folder](.)' },
  { key: 'code.ts', text: '// [not a note](index.md)' },
];

describe('LinkGraph.fromNotes', () => {
  const graph = LinkGraph.fromNotes(notes);

  it('resolves relative paths, fragments, percent-escapes and ..; broken and outside links are not links', () => {
    expect(graph.linksFrom('index.md')).toEqual(['guides/setup.md']);
    expect(graph.linksFrom('guides/setup.md').slice().sort()).toEqual(['guides/other guide.md', 'index.md']);
  });

  it('resolves double-bracket links by file name, alias or not, and by title', () => {
    expect(graph.linksFrom('guides/other guide.md').slice().sort()).toEqual(['deep/Deep Note.md', 'guides/setup.md']);
  });

  it('resolves / from the top of the folder, reference links, other capitals; a self-link is none', () => {
    expect(graph.linksFrom('deep/Deep Note.md').slice().sort()).toEqual(['guides/setup.md', 'index.md']);
  });

  it('resolves a folder to its README.md or index.md', () => {
    expect(graph.linksFrom('deep/folder/README.md')).toEqual([]);
    const g = LinkGraph.fromNotes([
      { key: 'a/index.md', text: 'x' },
      { key: 'b.md', text: '[a](a/) [a again](a)' },
    ]);
    expect(g.linksFrom('b.md')).toEqual(['a/index.md']);
  });

  it('counts either direction as linked, and reads only notes', () => {
    expect(graph.linked('index.md', 'guides/setup.md')).toBe(true);
    expect(graph.linked('guides/setup.md', 'index.md')).toBe(true);
    expect(graph.linked('index.md', 'guides/other guide.md')).toBe(false);
    expect(graph.notes.has('code.ts')).toBe(false);
    expect(graph.linksTo('index.md').slice().sort()).toEqual(['deep/Deep Note.md', 'guides/setup.md']);
  });

  it('counts resolved links by how they are written', () => {
    expect(graph.styleCounts).toEqual({ inline: 3, reference: 1, 'double-bracket': 3, html: 1 });
  });

  it('takes the nearest of notes sharing a file name: the same folder first, then the shortest key', () => {
    const g = LinkGraph.fromNotes([
      { key: 'x/todo.md', text: '' },
      { key: 'y/z/todo.md', text: '' },
      { key: 'y/todo.md', text: '' },
      { key: 'y/z/a.md', text: '[[todo]]' },
      { key: 'q/b.md', text: '[[todo]] [[z/todo]]' },
    ]);
    expect(g.linksFrom('y/z/a.md')).toEqual(['y/z/todo.md']);
    expect(g.linksFrom('q/b.md')).toEqual(['x/todo.md', 'y/z/todo.md']);
  });

  it('refuses a note given twice', () => {
    expect(() => LinkGraph.fromNotes([notes[0], notes[0]])).toThrow(/twice/);
  });
});

describe('joinPath', () => {
  it('resolves . and .., and refuses to climb above the top', () => {
    expect(joinPath('a/b/', '../c/./d.md')).toBe('a/c/d.md');
    expect(joinPath('a/', '../../x.md')).toBeNull();
  });
});
