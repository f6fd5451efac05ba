// The passage shown beside a search result. Real text: a GNOME help page (test/fixtures/gnome-help,
// Debian gnome-user-docs 43.0-2, CC-BY-SA 3.0). The scorer here counts the query's words, a stand-in
// for the index's scorer (node/worker/bestLine.ts, tested with CISI in test/node/worker/bestLine.test.ts).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { choosePassage, cleanLine, highlightRanges, shortenAround, type PassageScorer } from '../../../src/core/text/passage.js';

const page = readFileSync(path.resolve(import.meta.dirname, '../../fixtures/gnome-help/C/gnome-help/power-suspend.page'), 'utf8');

function wordScorer(query: string): PassageScorer {
  const words = new Set(query.toLowerCase().split(/\s+/));
  const stem = (w: string) => w.toLowerCase().replace(/(ing|ed|s)$/, '');
  const stems = new Set([...words].map(stem));
  return {
    score: (text) => (text.toLowerCase().match(/[a-z]+/g) ?? []).filter((w) => stems.has(stem(w))).length,
    isQueryWord: (w) => stems.has(stem(w)),
  };
}

describe('passage of a result', () => {
  it('picks readable prose over markup, with the query words marked', () => {
    const p = choosePassage(page, wordScorer('save work before suspending'));
    expect(p.text).not.toMatch(/[<>]/);
    expect((p.text.match(/\p{L}{2,}/gu) ?? []).length).toBeGreaterThanOrEqual(6);
    const marked = p.highlights.map(([a, b]) => p.text.slice(a, b).toLowerCase());
    expect(marked).toEqual(expect.arrayContaining(['save', 'work', 'before']));
    expect(page.split('\n')[p.line]).toMatch(/save|work|suspend/i);
  });

  it('prefers a sentence about a word to a line holding the word alone', () => {
    // The shape of reStructuredText reference pages: a literal on its own line, the explanation further down.
    const text = [
      '``suspend``',
      '',
      'Other notes.',
      '',
      'To suspend the machine, write mem to the state file; it sleeps until a key is pressed.',
    ].join('\n');
    const p = choosePassage(text, wordScorer('suspend'));
    expect(p.line).toBe(4);
    expect(p.text.slice(p.highlights[0][0], p.highlights[0][1])).toBe('suspend');
  });

  it('reads a term and the description under it as one passage', () => {
    const p = choosePassage('memory.oom.group\n  When set, the whole group is killed together when memory runs out.', wordScorer('memory'));
    expect(p.line).toBe(0);
    expect(p.text).toBe('memory.oom.group When set, the whole group is killed together when memory runs out.');
  });

  it('cleans markup and shortens around the first marked word', () => {
    expect(cleanLine('  * See :ref:`power` and <link xref="x">the **guide**</link>.')).toBe('See power and the guide .');
    const long = `${'lorem '.repeat(60)}suspend ${'ipsum '.repeat(60)}`.trim();
    const s = shortenAround(long, long.indexOf('suspend'), 80);
    expect(s.length).toBeLessThanOrEqual(80);
    expect(s).toContain('suspend');
    expect(s.startsWith('…') && s.endsWith('…')).toBe(true);
    expect(highlightRanges('Suspend, then resume', (w) => w.toLowerCase() === 'resume')).toEqual([[14, 20]]);
    expect(choosePassage('', wordScorer('x'))).toEqual({ line: 0, text: '', highlights: [] });
  });
});
