import { describe, expect, it } from 'vitest';
import { escapeMarkdown, formatShare, whyMarkdown } from '../../src/extension/explainTooltip.js';
import type { Why } from '../../src/node/worker/insightProtocol.js';

const why: Why = {
  score: 0.62,
  terms: [
    { word: 'refund', share: 0.31, inBoth: true },
    { word: 'voucher', share: 0.12, inBoth: false },
    { word: 'weather', share: -0.02, inBoth: true },
  ],
  rest: 0.21,
  restTerms: 40,
};

describe('why tooltips', () => {
  it('lists the top terms with their shares, the rest summed, and the score they add up to', () => {
    const text = whyMarkdown('notes/refund-policy.md\nSimilarity in meaning: 0.62', why, 'nearby');
    const rows = text.split('\n').filter((l) => l.startsWith('| ') && !l.startsWith('| Term') && !l.startsWith('| :--'));
    expect(rows).toEqual([
      '| refund | 0.310 |',
      '| _voucher_ | 0.120 |',
      '| weather | −0.020 |',
      '| 40 other terms | 0.210 |',
      '| **Score** | **0.620** |',
    ]);
    // The shown column adds up to the score (0.31 + 0.12 − 0.02 + 0.21).
    expect(why.terms.reduce((s, t) => s + t.share, why.rest)).toBeCloseTo(why.score, 12);
    expect(text).toContain('Why it is near');
    expect(text).toContain('_Italic_: not in both files');
  });

  it('starts with the plain tooltip, its path in bold and escaped', () => {
    const text = whyMarkdown('notes/[draft]_refunds.md\nScore: 0.70', why, 'search');
    expect(text.split('\n')[0]).toBe('**notes/\\[draft\\]\\_refunds\\.md**  ');
    expect(text).toContain('Why it matches');
    expect(text).toContain('not in the query and the file');
  });

  it('is just the plain tooltip when there is no explanation', () => {
    expect(whyMarkdown('a.md\nScore: 0.50', undefined, 'search')).toBe('**a\\.md**  \nScore: 0\\.50');
    expect(whyMarkdown('a.md', { score: 0, terms: [], rest: 0, restTerms: 0 }, 'nearby')).toBe('**a\\.md**');
  });

  it('escapes every Markdown special character', () => {
    const specials = '\\`*_{}[]()#+-.!|<>~';
    expect(escapeMarkdown(specials)).toBe([...specials].map((c) => `\\${c}`).join(''));
    expect(formatShare(-0.0004)).toBe('0.000');
    expect(formatShare(-0.0006)).toBe('−0.001');
  });

  it('explains a nearby file first by the concepts both files share, their shares adding up to the score', () => {
    const why = {
      score: 0.6,
      terms: [{ word: 'suspend', share: 0.2, inBoth: true }],
      rest: 0.4,
      restTerms: 30,
      concepts: [
        { words: ['suspend', 'resume', 'sleep'], share: 0.35 },
        { words: ['power', 'battery'], share: 0.1 },
      ],
      conceptRest: 0.15,
    };
    const text = whyMarkdown('power/a.md', why, 'nearby');
    const concepts = text.indexOf('the concepts both files share');
    expect(concepts).toBeGreaterThan(0);
    expect(text.indexOf('| suspend, resume, sleep | 0.350 |')).toBeGreaterThan(concepts);
    expect(text).toContain('| other concepts | 0.150 |');
    expect(text.indexOf('And the terms contributing most')).toBeGreaterThan(concepts);
    expect(text).not.toContain('distinctive words both files use');
  });

  it('adds the word-match part of a blended nearby score as its own row, so the concept column adds up', () => {
    const why = {
      score: 0.6,
      terms: [{ word: 'suspend', share: 0.2, inBoth: true }],
      rest: 0.4,
      restTerms: 30,
      concepts: [{ words: ['suspend', 'resume', 'sleep'], share: 0.2 }],
      conceptRest: 0.1,
      wordMatch: 0.3,
    };
    const text = whyMarkdown('power/a.md', why, 'nearby');
    expect(text).toContain('| other concepts | 0.100 |');
    expect(text).toContain('| distinctive words both files use | 0.300 |');
  });

  it('speaks of sections for section results', () => {
    const near = whyMarkdown(
      'Refund window\nScore: 0.62',
      { ...why, concepts: [{ words: ['refund'], share: 0.4 }], conceptRest: 0.22 },
      'nearbySection',
    );
    expect(near).toContain('the concepts both sections share');
    expect(near).toContain('_Italic_: not in both sections');
    expect(near).not.toContain('files');
    const found = whyMarkdown('Refund window\nScore: 0.62', why, 'searchSection');
    expect(found).toContain('Why it matches');
    expect(found).toContain('_Italic_: not in the query and the section');
    expect(found).toContain('word-match part is the whole file’s');
  });
});
