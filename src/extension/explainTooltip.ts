/**
 * The Markdown of a result's tooltip in the Nearby and Search Results views: the plain tooltip
 * lines, then the terms that contribute most to the score (worked out in the worker, see
 * node/worker/explainHits.ts) with their shares, and the other terms summed so the column adds up
 * to the score. Terms that are not on both sides are set in italics: they count through the
 * concept space (words that occur with the other side's words), not by occurring in both.
 * Plain text in, Markdown string out; resultItem.ts wraps it in the editor's MarkdownString.
 */
import type { Why } from '../node/worker/insightProtocol.js';

export type WhyKind = 'nearby' | 'search';

/** Escapes Markdown's special characters so paths and words show as written. */
export function escapeMarkdown(text: string): string {
  return text.replace(/[\\`*_{}[\]()#+\-.!|<>~]/g, (c) => `\\${c}`);
}

/** A share as shown: three decimals, a minus sign for terms that pull the other way (none on a rounded zero). */
export function formatShare(share: number): string {
  const s = share.toFixed(3);
  return /^-0\.0+$/.test(s) ? s.slice(1) : s.replace(/^-/, '−');
}

export function whyMarkdown(plainTooltip: string, why: Why | undefined, kind: WhyKind): string {
  const [first, ...rest] = plainTooltip.split('\n');
  const out = [`**${escapeMarkdown(first)}**`, ...rest.map((l) => escapeMarkdown(l))].join('  \n');
  if (!why || why.terms.length === 0) return out;
  const concepts = why.concepts ?? [];
  const conceptLines =
    concepts.length === 0
      ? []
      : [
          '',
          'Why it is near: the concepts both files share',
          '',
          '| Concept (its words in these files) | Share |',
          '| :-- | --: |',
          ...concepts.map((c) => `| ${escapeMarkdown(c.words.join(', ') || 'unnamed')} | ${formatShare(c.share)} |`),
          ...(why.conceptRest !== undefined ? [`| other concepts | ${formatShare(why.conceptRest)} |`] : []),
          ...(why.wordMatch ? [`| distinctive words both files use | ${formatShare(why.wordMatch)} |`] : []),
        ];
  const heading =
    kind === 'nearby'
      ? concepts.length
        ? 'And the terms contributing most'
        : 'Why it is near: the terms contributing most'
      : 'Why it matches: the terms contributing most';
  const rows = why.terms.map((t) => `| ${t.inBoth ? escapeMarkdown(t.word) : `_${escapeMarkdown(t.word)}_`} | ${formatShare(t.share)} |`);
  if (why.restTerms > 0) rows.push(`| ${why.restTerms} other ${why.restTerms === 1 ? 'term' : 'terms'} | ${formatShare(why.rest)} |`);
  const lines = [
    out,
    ...conceptLines,
    '',
    `${heading}:`,
    '',
    '| Term | Share |',
    '| :-- | --: |',
    ...rows,
    `| **Score** | **${formatShare(why.score)}** |`,
  ];
  const other = kind === 'nearby' ? 'both files' : 'the query and the file';
  if (why.terms.some((t) => !t.inBoth)) lines.push('', `_Italic_: not in ${other}; it counts through related words.`);
  return lines.join('\n');
}
