/** The collection's link style and links written in it (rules in src/core/links/linkStyle.ts). */
import { describe, expect, it } from 'vitest';
import { LinkGraph } from '../../../src/core/links/linkGraph.js';
import { detectLinkStyle, formatLink, relativePath } from '../../../src/core/links/linkStyle.js';
import { readLinks } from '../../../src/core/links/linkReader.js';
import { noteTitle } from '../../../src/core/links/noteCatalogue.js';

describe('detectLinkStyle', () => {
  it('picks double-bracket links when they outnumber Markdown links, else Markdown', () => {
    const wiki = LinkGraph.fromNotes([
      { key: 'a.md', text: '[[b]] [[c]]' },
      { key: 'b.md', text: '[a](a.md)' },
      { key: 'c.md', text: '' },
    ]);
    expect(detectLinkStyle(wiki)).toEqual({ style: 'double-bracket', markdown: 1, doubleBracket: 2 });
    const md = LinkGraph.fromNotes([
      { key: 'a.md', text: '[[b]] [c](c.md) [ref]\n\n[ref]: b.md' },
      { key: 'b.md', text: '' },
      { key: 'c.md', text: '' },
    ]);
    expect(detectLinkStyle(md).style).toBe('markdown');
    expect(detectLinkStyle(LinkGraph.fromNotes([{ key: 'a.md', text: 'no links' }])).style).toBe('markdown');
  });

  it('counts only links that resolve (a collection of broken double-bracket links stays Markdown)', () => {
    const g = LinkGraph.fromNotes([
      { key: 'a.md', text: '[[gone]] [[also gone]] [b](b.md)' },
      { key: 'b.md', text: '' },
    ]);
    expect(detectLinkStyle(g).style).toBe('markdown');
  });
});

describe('formatLink', () => {
  const graph = LinkGraph.fromNotes([
    { key: 'notes/today.md', text: '' },
    { key: 'notes/ideas/big [plan].md', text: '# The Big Plan\n' },
    { key: 'archive/todo.md', text: '' },
    { key: 'notes/todo.md', text: '# todo\n' },
    { key: 'ref/Glossary.md', text: '# Glossary\n' },
    { key: 'notes/plan.md', text: '# The Big Plan\n' },
  ]);

  it('writes a relative Markdown link with the title as text, escaped', () => {
    const link = formatLink('markdown', 'notes/today.md', 'notes/ideas/big [plan].md', graph);
    expect(link).toBe('[The Big Plan](ideas/big%20[plan].md)');
    expect(formatLink('markdown', 'notes/ideas/big [plan].md', 'ref/Glossary.md', graph)).toBe('[Glossary](../../ref/Glossary.md)');
  });

  it('writes a link that the reader resolves back to its target', () => {
    for (const [style, to] of [
      ['markdown', 'notes/ideas/big [plan].md'],
      ['markdown', 'archive/todo.md'],
      ['double-bracket', 'ref/Glossary.md'],
      ['double-bracket', 'archive/todo.md'],
    ] as const) {
      const text = `x ${formatLink(style, 'notes/today.md', to, graph)} y`;
      const g = LinkGraph.fromNotes([
        { key: 'notes/today.md', text },
        { key: 'notes/ideas/big [plan].md', text: '# The Big Plan\n' },
        { key: 'archive/todo.md', text: '' },
        { key: 'notes/todo.md', text: '# todo\n' },
        { key: 'ref/Glossary.md', text: '# Glossary\n' },
      ]);
      expect(readLinks(text)).toHaveLength(1);
      expect(g.linksFrom('notes/today.md')).toEqual([to]);
    }
  });

  it('writes [[name]] when the title is the name, [[name|Title]] otherwise, and the path when names clash', () => {
    expect(formatLink('double-bracket', 'notes/today.md', 'ref/Glossary.md', graph)).toBe('[[Glossary]]');
    expect(formatLink('double-bracket', 'notes/today.md', 'notes/plan.md', graph)).toBe('[[plan|The Big Plan]]');
    expect(formatLink('double-bracket', 'notes/today.md', 'archive/todo.md', graph)).toBe('[[archive/todo|todo]]');
  });

  it('relativePath walks up and down from the note’s folder', () => {
    expect(relativePath('a/b/c.md', 'a/d/e.md')).toBe('../d/e.md');
    expect(relativePath('c.md', 'a/e.md')).toBe('a/e.md');
    expect(relativePath('a/c.md', 'a/e.md')).toBe('e.md');
  });
});

describe('noteTitle', () => {
  it('takes front matter title, then the first level-1 heading (not in code), then <title>, then the file name', () => {
    expect(noteTitle('a.md', '---\ntitle: "Front"\ntags: x\n---\n# Heading\n')).toBe('Front');
    expect(noteTitle('a.md', '```\n# not this\n```\nText\n# Heading one #\n')).toBe('Heading one');
    expect(noteTitle('a.html', '<html><title> Page  title </title>')).toBe('Page title');
    expect(noteTitle('dir/My note.md', 'plain text, ## not level one')).toBe('My note');
  });
});
