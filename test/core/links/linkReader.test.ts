/**
 * The link reader against the CommonMark specification 0.31.2 (https://spec.commonmark.org/0.31.2/,
 * §6.3 links, §4.7 link reference definitions, §6.1 code spans, §4.5 fenced code): each case cites
 * the behaviour the spec states; the example texts are recalled from the spec from memory and
 * shortened. Double-bracket links have no standard: the cases state our reading (header of
 * src/core/links/linkReader.ts).
 */
import { describe, expect, it } from 'vitest';
import { readLinks, withoutLinks } from '../../../src/core/links/linkReader.js';

const targets = (text: string) => readLinks(text).map((l) => [l.kind, l.target, l.text]);

describe('readLinks: inline links (CommonMark §6.3)', () => {
  it('reads destination and text, with or without a title', () => {
    expect(targets('[link](/uri "title")')).toEqual([['inline', '/uri', 'link']]);
    expect(targets("see [a note](notes/b.md 'its title') and [c](c.md)")).toEqual([
      ['inline', 'notes/b.md', 'a note'],
      ['inline', 'c.md', 'c'],
    ]);
  });

  it('accepts a destination in pointy brackets, with spaces', () => {
    expect(targets('[link](<my note.md>)')).toEqual([['inline', 'my note.md', 'link']]);
  });

  it('balances parentheses in a bare destination', () => {
    expect(targets('[link](foo(and(bar)))')).toEqual([['inline', 'foo(and(bar))', 'link']]);
  });

  it('keeps the fragment apart from the target', () => {
    const [l] = readLinks('[x](guide.md#install-steps)');
    expect([l.target, l.fragment]).toEqual(['guide.md', 'install-steps']);
  });

  it('nests brackets in the link text', () => {
    expect(targets('[link [foo [bar]]](/uri)')).toEqual([['inline', '/uri', 'link [foo [bar]]']]);
  });

  it('is not a link with a space between ] and (, nor an image, nor escaped', () => {
    expect(targets('[link] (/uri)')).toEqual([]);
    expect(targets('![alt](picture.png)')).toEqual([]);
    expect(targets('\\[not](a.md)')).toEqual([]);
  });

  it('ignores links inside code spans and fenced code (§6.1, §4.5)', () => {
    expect(targets('`[not a link](/foo)`')).toEqual([]);
    expect(targets('```\n[no](x.md)\n```\n[yes](y.md)')).toEqual([['inline', 'y.md', 'yes']]);
    expect(targets('~~~~\n[no](x.md)\n~~~~\n')).toEqual([]);
  });

  it('records where each link sits, so it can be cut out', () => {
    const text = 'A [b](b.md) c [[D]] e.';
    const links = readLinks(text);
    expect(links.map((l) => text.slice(l.start, l.end))).toEqual(['[b](b.md)', '[[D]]']);
    expect(withoutLinks(text, links)).toBe('A  c  e.');
  });
});

describe('readLinks: reference-style links (CommonMark §4.7, §6.3)', () => {
  it('full, collapsed and shortcut references resolve through a definition', () => {
    const text = '[Foo bar][ref], [ref][] and [Ref].\n\n[ref]: other.md "Title"\n';
    expect(targets(text)).toEqual([
      ['reference', 'other.md', 'Foo bar'],
      ['reference', 'other.md', 'ref'],
      ['reference', 'other.md', 'Ref'],
    ]);
  });

  it('matches labels case-insensitively with white space collapsed; the first definition wins', () => {
    const text = '[see][The   Label]\n\n[the label]: first.md\n[THE LABEL]: second.md\n';
    expect(targets(text)).toEqual([['reference', 'first.md', 'see']]);
  });

  it('a reference without a definition is plain text, and a definition alone is not a link', () => {
    expect(targets('[foo][missing] and [bar]')).toEqual([]);
    expect(targets('[foo]: /url\n')).toEqual([]);
  });

  it('accepts a definition whose destination is in pointy brackets', () => {
    expect(targets('[x]\n\n[x]: <with space.md>\n')).toEqual([['reference', 'with space.md', 'x']]);
  });
});

describe('readLinks: double-bracket links (our reading)', () => {
  it('reads target, alias and heading anchor', () => {
    const links = readLinks('[[Plain]] [[Other note|shown words]] [[Guide#Setup]] [[Guide#Setup|words]]');
    expect(links.map((l) => [l.target, l.fragment, l.text])).toEqual([
      ['Plain', '', 'Plain'],
      ['Other note', '', 'shown words'],
      ['Guide', 'Setup', 'Guide'],
      ['Guide', 'Setup', 'words'],
    ]);
    expect(links.every((l) => l.kind === 'double-bracket')).toBe(true);
  });

  it('counts an embedded note (![[…]]) as a link, and a heading of the same note as none', () => {
    const links = readLinks('![[Diagram note]] and [[#Only a heading]]');
    expect(links.map((l) => l.target)).toEqual(['Diagram note', '']);
  });

  it('does not cross lines or nest', () => {
    expect(targets('[[broken\nlink]]')).toEqual([]);
  });
});

describe('readLinks: HTML anchors', () => {
  it('reads href in double, single or no quotes, entities decoded', () => {
    expect(
      targets('<a href="a.html">A</a> <a class="x" href=\'b.md#top\'>B <em>b</em></a> <a href=c.html>C</a> <a href="d?x=1&amp;y=2">D</a>'),
    ).toEqual([
      ['html', 'a.html', 'A'],
      ['html', 'b.md', 'B b'],
      ['html', 'c.html', 'C'],
      ['html', 'd', 'D'],
    ]);
  });

  it('ignores anchors in code', () => {
    expect(targets('`<a href="x.html">x</a>`')).toEqual([]);
  });
});
