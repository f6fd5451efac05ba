/**
 * What the Nearby and Search Results views and the search quick pick show for each result, as
 * plain data (the tree providers turn these into TreeItems). Paths are shown relative to their
 * workspace folder; with several folders the folder's name is shown too.
 */
import type { Why } from '../node/worker/insightProtocol.js';
import type { WhyKind } from './explainTooltip.js';
import type { ScoredFile, SearchMatch, SectionMatch, SectionPlace, TranslationRef } from '../node/worker/workerProtocol.js';

/** The matching passage of a search result, shown as a row under it with the query's words marked. */
export interface PassageEntry {
  readonly kind: 'passage';
  readonly key: string;
  readonly fsPath: string;
  readonly text: string;
  readonly highlights: readonly (readonly [number, number])[];
  /** Zero-based line the passage starts at. */
  readonly line: number;
}

/** Files (fsPaths) a search should find more / fewer like ("More Like This" / "Fewer Like This"). */
export interface SearchFeedback {
  readonly like: readonly string[];
  readonly unlike: readonly string[];
}

export const NO_FEEDBACK: SearchFeedback = Object.freeze({ like: [], unlike: [] });

/**
 * The feedback of a refined search: the file joins one list (and leaves the other); the query
 * stays. The lists are kept short (the latest MAX_FEEDBACK_FILES of each, common practice).
 */
export function refineFeedback(current: SearchFeedback, fsPath: string, kind: 'like' | 'unlike'): SearchFeedback {
  const other = kind === 'like' ? 'unlike' : 'like';
  const add = [...current[kind].filter((p) => p !== fsPath), fsPath].slice(-MAX_FEEDBACK_FILES);
  const keep = current[other].filter((p) => p !== fsPath);
  return kind === 'like' ? { like: add, unlike: keep } : { like: keep, unlike: add };
}

export const MAX_FEEDBACK_FILES = 5;

/** The Search Results view's description of the feedback in force ("+2 like, −1 unlike"), or ''. */
export function feedbackDescription(feedback: SearchFeedback): string {
  const parts: string[] = [];
  if (feedback.like.length) parts.push(`more like ${feedback.like.length}`);
  if (feedback.unlike.length) parts.push(`fewer like ${feedback.unlike.length}`);
  return parts.join(', ');
}

export interface ResultEntry {
  readonly kind?: 'file';
  readonly key: string;
  readonly fsPath: string;
  /** File name. */
  readonly label: string;
  readonly description: string;
  readonly tooltip: string;
  /** Zero-based line to reveal when opened (search results). */
  readonly line?: number;
  /** The terms contributing most to the score, for the tooltip (explainTooltip.ts). */
  readonly why?: Why;
  /** What the tooltip explains (default: nearby without a line, search with one). */
  readonly whyKind?: WhyKind;
  /** Rows under it: the matching passage and the same page in other languages. */
  readonly children?: readonly ResultNode[];
  /** Open its children at first (a search result's passage) or leave them folded (translations only). */
  readonly expanded?: boolean;
  /** A heading row that only holds other rows (it opens nothing itself). */
  readonly heading?: boolean;
}

/** A row of the Nearby or Search Results view. */
export type ResultNode = ResultEntry | PassageEntry;

export function isPassage(node: ResultNode): node is PassageEntry {
  return node.kind === 'passage';
}

/** "+2 languages": what a result row says about the translations folded under it. */
export function translationsNote(count: number): string {
  return count === 0 ? '' : `+${count} ${count === 1 ? 'language' : 'languages'}`;
}

/** The rows for the same page in other languages (under a result, or under "Translations of this file"). */
export function translationEntries(refs: readonly TranslationRef[], multiRoot: boolean): ResultEntry[] {
  return refs.map((t) => {
    const where = locationOf(t, multiRoot);
    return {
      key: `${t.key}#translation`,
      fsPath: t.fsPath,
      label: fileName(t.relPath),
      description: where ? `${t.language} · ${where}` : t.language,
      tooltip: `${shownPath(t, multiRoot)}\nThe same page in another language (${t.language}).`,
    };
  });
}

/** A similarity score as shown: two decimals. */
export function formatScore(score: number): string {
  return score.toFixed(2);
}

/** Where a file is, for a description: its folder path relative to the workspace folder. */
export function locationOf(ref: { readonly folder: string; readonly relPath: string }, multiRoot: boolean): string {
  const slash = ref.relPath.lastIndexOf('/');
  const dir = slash < 0 ? '' : ref.relPath.slice(0, slash);
  if (multiRoot) return dir ? `${ref.folder} › ${dir}` : ref.folder;
  return dir;
}

function fileName(relPath: string): string {
  return relPath.slice(relPath.lastIndexOf('/') + 1);
}

function shownPath(ref: { readonly folder: string; readonly relPath: string }, multiRoot: boolean): string {
  return multiRoot ? `${ref.folder}/${ref.relPath}` : ref.relPath;
}

/** The row above Nearby's results that holds the active file's own translations (none: no row). */
export function subjectTranslationsEntry(
  subjectKey: string,
  subjectFsPath: string,
  refs: readonly TranslationRef[],
  multiRoot: boolean,
): ResultEntry[] {
  if (refs.length === 0) return [];
  return [
    {
      key: `${subjectKey}#own-translations`,
      fsPath: subjectFsPath,
      label: refs.length === 1 ? 'This page in 1 other language' : `This page in ${refs.length} other languages`,
      description: refs.map((r) => r.language).join('; '),
      tooltip: 'The same page in other languages: left out of the list below, which shows other pages.',
      children: translationEntries(refs, multiRoot),
      expanded: false,
      heading: true,
    },
  ];
}

/** "0.86 · notes/safety · +2 languages": score, folder (as the editor's own result lists show it) and translations. */
/** The mark of a result ranked by its words alone (the first index is still being built). */
export const WORD_MATCH_MARK = 'word match only';

function wordMatchMark(m: SearchMatch): string {
  return m.wordMatchOnly ? `${WORD_MATCH_MARK} · ` : '';
}

function wordMatchLine(m: SearchMatch): string {
  return m.wordMatchOnly
    ? "\nRanked by the question's words alone: the index is still being built. Results by meaning replace these when it is done."
    : '';
}

function describe(
  score: number,
  ref: { readonly folder: string; readonly relPath: string },
  multiRoot: boolean,
  translations: number,
): string {
  return [formatScore(score), locationOf(ref, multiRoot), translationsNote(translations)].filter(Boolean).join(' · ');
}

function languageLine(h: ScoredFile): string {
  const n = h.translations?.length ?? 0;
  return n ? `\nIn ${h.language}; also in ${h.translations!.map((t) => t.language).join('; ')} (listed under it).` : '';
}

export function nearbyEntries(hits: readonly ScoredFile[], multiRoot: boolean): ResultEntry[] {
  return hits.map((h) => {
    const translations = translationEntries(h.translations ?? [], multiRoot);
    return {
      key: h.key,
      fsPath: h.fsPath,
      label: fileName(h.relPath),
      description: describe(h.score, h, multiRoot, translations.length),
      tooltip: `${shownPath(h, multiRoot)}\nSimilarity in meaning: ${formatScore(h.score)} (cosine, 1 = same concepts)${languageLine(h)}`,
      why: h.why,
      ...(translations.length ? { children: translations, expanded: false } : {}),
    };
  });
}

export function searchEntries(matches: readonly SearchMatch[], multiRoot: boolean): ResultEntry[] {
  return matches.map((m) => {
    const translations = translationEntries(m.translations ?? [], multiRoot);
    const passage: PassageEntry[] = m.lineText
      ? [{ kind: 'passage', key: `${m.key}#passage`, fsPath: m.fsPath, text: m.lineText, highlights: m.highlights ?? [], line: m.line }]
      : [];
    // The passage shows at once; the other languages wait, folded, one row below it.
    const languages: ResultEntry[] =
      translations.length === 0
        ? []
        : [
            {
              key: `${m.key}#translations`,
              fsPath: m.fsPath,
              label: translations.length === 1 ? 'In 1 other language' : `In ${translations.length} other languages`,
              description: (m.translations ?? []).map((t) => t.language.split(',')[0]).join(', '),
              tooltip: 'The same page in other languages, grouped under the one in the language of the question.',
              children: translations,
              expanded: false,
              heading: true,
            },
          ];
    const children: ResultNode[] = [...passage, ...languages];
    return {
      key: m.key,
      fsPath: m.fsPath,
      label: fileName(m.relPath),
      description: wordMatchMark(m) + describe(m.score, m, multiRoot, translations.length) + (m.section ? ` · ${m.section.title}` : ''),
      tooltip: `${shownPath(m, multiRoot)}, line ${m.line + 1}\nScore: ${formatScore(m.score)}${languageLine(m)}${sectionLine(m.section)}${wordMatchLine(m)}`,
      line: m.section && !(m.section.start <= m.line && m.line < m.section.end) ? m.section.start : m.line,
      why: m.why,
      ...(children.length ? { children, expanded: passage.length > 0 } : {}),
    };
  });
}

/** The passage with the query's words in bold (Markdown), for tooltips. */
export function markedPassage(text: string, highlights: readonly (readonly [number, number])[], escape: (s: string) => string): string {
  let out = '';
  let at = 0;
  for (const [a, b] of highlights) {
    if (a < at) continue;
    out += `${escape(text.slice(at, a))}**${escape(text.slice(a, b))}**`;
    at = b;
  }
  return out + escape(text.slice(at));
}

/** A quick pick row for a search result (plain data; the command adds the editor's fields). */
export interface SearchPickItem {
  readonly label: string;
  readonly description: string;
  readonly detail: string;
  readonly entry: ResultEntry;
}

export function searchPickItems(matches: readonly SearchMatch[], multiRoot: boolean): SearchPickItem[] {
  const entries = searchEntries(matches, multiRoot);
  return matches.map((m, i) => ({
    label: `$(file) ${fileName(m.relPath)}`,
    description: wordMatchMark(m) + describe(m.score, m, multiRoot, m.translations?.length ?? 0),
    detail: m.lineText,
    entry: entries[i],
  }));
}

/** Entries without the given keys (files just deleted disappear at once, before any new query). */
export function withoutKeys<T extends { readonly key: string }>(entries: readonly T[], removed: ReadonlySet<string>): T[] {
  return entries.filter((e) => !removed.has(e.key));
}

/** The search box's placeholder: neutral, so it fits every workspace. */
export const SEARCH_PLACEHOLDER = 'A question or a few words about what you are looking for';

/** Said in the search box when Enter is pressed with nothing typed. */
export const EMPTY_QUESTION_MESSAGE = 'Type a question or a few words first, then press Enter (Escape closes the box).';

/** Said in the search box when none of the question's words occur in the indexed files. */
export function noKnownWordsMessage(query: string): string {
  const q = query.length > 40 ? `${query.slice(0, 39)}…` : query;
  return `None of the words in “${q}” occur in the indexed files. Try the words the files themselves would use, or a longer description.`;
}

/** Said in the search box when a search finds nothing. */
export const NO_MATCH_MESSAGE = 'No indexed file matches that. Try other words, or a longer description.';

/** The title-bar description of the Search Results view for a query. */
export function searchViewDescription(query: string | undefined, count: number): string {
  if (query === undefined) return '';
  const q = query.length > 40 ? `${query.slice(0, 39)}…` : query;
  return `“${q}” · ${count} ${count === 1 ? 'result' : 'results'}`;
}

/** "\nBest section: Title (lines 12–40)" for a result's tooltip ('' without a section). */
function sectionLine(s: SectionPlace | undefined): string {
  return s ? `\nBest section: ${s.title} (lines ${s.start + 1}–${s.end})` : '';
}

/** Rows for sections as results (section search, Nearby at the cursor): titled, opening at their first line. */
export function sectionEntries(matches: readonly SectionMatch[], multiRoot: boolean, from: 'search' | 'nearby' = 'search'): ResultEntry[] {
  return matches.map((m) => ({
    why: m.why,
    whyKind: from === 'nearby' ? 'nearbySection' : 'searchSection',
    key: `${m.key}#${m.start}`,
    fsPath: m.fsPath,
    label: m.title,
    description: `${fileName(m.relPath)} · lines ${m.start + 1}–${m.end} · ${formatScore(m.score)}`,
    tooltip: `${shownPath(m, multiRoot)}, lines ${m.start + 1}–${m.end}\nSection: ${m.title}\nScore: ${formatScore(m.score)}`,
    line: m.start,
  }));
}
