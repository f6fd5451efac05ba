/**
 * What the "Unlinked Neighbours" view shows for a worker's answer (node/worker/linksProtocol.ts),
 * as plain data: one row per suggested note (its title, its similarity and the words behind it,
 * the link that "Insert Link" writes), and the state the welcome text follows. No editor API here.
 */
import type { LinkSuggestionsResult, LinkSuggestionWire } from '../node/worker/linksProtocol.js';

/** Why the view is empty, for its welcome text (context key undertone.linkIdeas). */
export type LinkViewState = 'suggestions' | 'quiet' | 'not-note' | 'no-index';

export interface LinkSuggestionRow {
  readonly type: 'linkSuggestion';
  /** The note the link goes into. */
  readonly subject: string;
  readonly suggestion: LinkSuggestionWire;
  readonly label: string;
  readonly description: string;
  readonly tooltip: string;
}

/** Words shown beside each row (the tooltip has them all). */
export const ROW_WORDS = 3;

export function linkRows(subjectFsPath: string, result: LinkSuggestionsResult | null, multiRoot: boolean): LinkSuggestionRow[] {
  if (!result) return [];
  return result.suggestions.map((s) => {
    const words = (s.why?.terms ?? []).slice(0, ROW_WORDS).map((t) => t.word);
    const where = multiRoot ? `${s.folder}/${s.relPath}` : s.relPath;
    return {
      type: 'linkSuggestion',
      subject: subjectFsPath,
      suggestion: s,
      label: s.title,
      description: `${s.similarity.toFixed(2)}${words.length ? ` · ${words.join(', ')}` : ''}`,
      tooltip: `${s.title}\n${where}\nSimilarity ${s.similarity.toFixed(3)} (not linked either way)\nInsert Link writes: ${s.link}`,
    };
  });
}

export function linkViewState(result: LinkSuggestionsResult | null | undefined, hasIndex: boolean): LinkViewState {
  if (!hasIndex) return 'no-index';
  if (!result) return 'not-note';
  return result.suggestions.length > 0 ? 'suggestions' : 'quiet';
}
