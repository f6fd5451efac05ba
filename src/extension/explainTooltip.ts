/**
 * The Markdown of a result's tooltip in the Nearby and Search Results views: the plain tooltip
 * lines, then the terms that contribute most to the score (worked out in the worker, see
 * node/worker/explainHits.ts) with their shares, and the other terms summed so the column adds up
 * to the score. Terms that are not on both sides are set in italics: they count through the
 * concept space (words that occur with the other side's words), not by occurring in both.
 * Plain text in, Markdown string out; resultItem.ts wraps it in the editor's MarkdownString.
 */
import type { Why } from '../node/worker/insightProtocol.js';

/** Nearby and search results of whole files, or of sections (their own vectors and terms). */
export type WhyKind = 'nearby' | 'search' | 'nearbySection' | 'searchSection';

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
  const near = kind === 'nearby' || kind === 'nearbySection';
  const pair = kind === 'nearbySection' ? 'both sections' : 'both files';
  const conceptLines =
    concepts.length === 0
      ? []
      : [
          '',
          `Why it is near: the concepts ${pair} share`,
          '',
          `| Concept (its words in these ${kind === 'nearbySection' ? 'sections' : 'files'}) | Share |`,
          '| :-- | --: |',
          ...concepts.map((c) => `| ${escapeMarkdown(c.words.join(', ') || 'unnamed')} | ${formatShare(c.share)} |`),
          ...(why.conceptRest !== undefined ? [`| other concepts | ${formatShare(why.conceptRest)} |`] : []),
          ...(why.wordMatch ? [`| distinctive words ${pair} use | ${formatShare(why.wordMatch)} |`] : []),
        ];
  const heading = near
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
  const other = near ? pair : kind === 'searchSection' ? 'the query and the section' : 'the query and the file';
  if (why.terms.some((t) => !t.inBoth)) lines.push('', `_Italic_: not in ${other}; it counts through related words.`);
  if (kind === 'searchSection' && why.terms.length > 0)
    lines.push('', '_Worked out from this section’s own words; the word-match part is the whole file’s._');
  return lines.join('\n');
}
