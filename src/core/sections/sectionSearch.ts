/**
 * Search and nearby at the level of sections, beside the file-level ranking of lsiIndex.ts and
 * with its evidence: a section's score is (1 − λ)·cos(section, q) + λ·lexical(file), where q is
 * the search's final concept query (after feedback) and lexical(file) the file's BM25 score over
 * the best file's, both from LsiIndex.searchPlan, so section scores and file scores share a scale.
 * Files can also be ranked with section evidence: the concept part becomes
 * (1 − γ)·cos(file, q) + γ·max over the file's sections of cos(section, q) (γ = sectionShare; a file
 * without sections uses its own cosine), in the spirit of combining document and best-passage
 * evidence (Callan 1994, "Passage-level evidence in document retrieval", SIGIR: a document's score
 * mixed with its best passage's). γ = 0 is the plain file ranking.
 * Nearby at a section: the section's own vector against every other file's sections.
 */
import type { LsiIndex } from '../index/lsiIndex.js';
import type { SearchOptions } from '../index/searchTypes.js';
import type { SectionHit } from './sectionStore.js';

export interface SectionSearchOptions extends SearchOptions {
  /** Sections of one file at most in the list. @default 3 */
  perFile: number;
  /**
   * Files with the best word-match scores whose sections are all ranked when the store visits only
   * part of the sections (sectionStore.ts lists), so a strong word match is not lost with its list.
   * @default 32 (common practice: a few times the list length; recall in bench/sectionLists.ts)
   */
  wordFiles: number;
}

export const DEFAULT_SECTION_SEARCH: Readonly<Pick<SectionSearchOptions, 'top' | 'perFile' | 'wordFiles'>> = {
  top: 10,
  perFile: 3,
  wordFiles: 32,
};

/** Slot of every live path (cached per index; rebuilt when documents are added). */
const slotCache = new WeakMap<LsiIndex, { length: number; map: Map<string, number> }>();
function slotsOf(index: LsiIndex): Map<string, number> {
  const slots = index.slots();
  const hit = slotCache.get(index);
  if (hit && hit.length === slots.length && hit.map.size === index.size) return hit.map;
  const map = new Map<string, number>();
  slots.forEach((s, i) => s && map.set(s.meta.path, i));
  slotCache.set(index, { length: slots.length, map });
  return map;
}

/**
 * The sections that best answer a plain-language query, best first. Throws NoKnownTermsError like
 * LsiIndex.search when no word of the query is known.
 */
export function searchSections(index: LsiIndex, text: string, options: Partial<SectionSearchOptions> = {}): SectionHit[] {
  const { top, perFile, wordFiles } = { ...DEFAULT_SECTION_SEARCH, ...options };
  const plan = index.searchPlan(text, options);
  const a = plan.known ? 1 - plan.lambda : 0;
  const slot = slotsOf(index);
  const also = plan.lambda > 0 ? bestWordFiles(index, plan.lexical, plan.accept, wordFiles) : [];
  // Rank by cosine with room for the lexical share to reorder, then blend. The store holds live
  // files only, so the plan's acceptance (live, options.filter, not marked like or unlike) is asked
  // per file only when there is a filter or a mark, by path: no path → slot look-up per file.
  const marked = new Set([...(options.like ?? []), ...(options.unlike ?? [])]);
  const filter = options.filter;
  const accept = filter || marked.size > 0 ? (path: string): boolean => !marked.has(path) && (!filter || filter(path)) : undefined;
  const pool = index.sections.rank(plan.vector, Math.max(top * 8, 64), accept, perFile, also);
  return pool
    .flatMap((h) => {
      const j = slot.get(h.path);
      return j === undefined ? [] : [{ ...h, score: a * h.score + plan.lambda * plan.lexical[j] }];
    })
    .sort((x, y) => y.score - x.score)
    .slice(0, top);
}

/** The keys of the `count` accepted files with the highest word-match scores above zero, best first. */
function bestWordFiles(index: LsiIndex, lexical: Float64Array, accept: (slot: number) => boolean, count: number): string[] {
  const best: { j: number; s: number }[] = [];
  if (count < 1) return [];
  for (let j = 0; j < lexical.length; j++) {
    const s = lexical[j];
    if (!(s > 0) || (best.length >= count && s <= best[best.length - 1].s) || !accept(j)) continue;
    let i = best.length;
    best.push({ j, s });
    while (i > 0 && best[i - 1].s < s) [best[i], i] = [best[i - 1], i - 1];
    best[i] = { j, s };
    if (best.length > count) best.length = count;
  }
  const slots = index.slots();
  return best.flatMap(({ j }) => (slots[j] ? [slots[j].meta.path] : []));
}

/**
 * Every live file's search score with section evidence (γ = sectionShare), as a map from path,
 * with the best section of each file that has sections. A full pass over files and sections
 * (for evaluation and for re-ranking a search's candidates).
 */
export function scoreFilesWithSections(
  index: LsiIndex,
  text: string,
  sectionShare: number,
  paths?: readonly string[],
): Map<string, { score: number; best: SectionHit | null }> {
  const plan = index.searchPlan(text);
  const a = plan.known ? 1 - plan.lambda : 0;
  const slot = slotsOf(index);
  const out = new Map<string, { score: number; best: SectionHit | null }>();
  for (const path of paths ?? index.paths()) {
    const j = slot.get(path);
    if (j === undefined || !plan.accept(j)) continue;
    const v = index.vectorOf(path);
    let cos = 0;
    for (let c = 0; c < v.length; c++) cos += v[c] * plan.vector[c];
    const best = index.sections.best(path, plan.vector);
    const concept = best ? (1 - sectionShare) * cos + sectionShare * best.score : cos;
    out.set(path, { score: a * concept + plan.lambda * plan.lexical[j], best });
  }
  return out;
}

/** The best section of each given file for a query's concept vector (for showing where a file result points). */
export function bestSections(index: LsiIndex, text: string, paths: readonly string[]): Map<string, SectionHit> {
  const q = index.projectText(text);
  const out = new Map<string, SectionHit>();
  for (const p of paths) {
    const b = index.sections.best(p, q);
    if (b) out.set(p, b);
  }
  return out;
}

/**
 * The sections of other files nearest to the section of `path` holding zero-based `line`, best
 * first; null when the file has no sections. Concept cosine only (a section is too short for the
 * file-level lexical query).
 */
export function nearbySections(
  index: LsiIndex,
  path: string,
  line: number,
  options: Partial<SectionSearchOptions> = {},
): { from: SectionHit; hits: SectionHit[] } | null {
  const { top, perFile } = { ...DEFAULT_SECTION_SEARCH, ...options };
  const at = index.sections.at(path, line);
  if (!at) return null;
  const f = index.sections.get(path)!;
  const [starts, ends, titles] = [f.starts, f.ends, f.titles]; // once: a reopened file's are made on each access
  const from: SectionHit = { path, index: at.index, start: starts[at.index], end: ends[at.index], title: titles[at.index], score: 1 };
  const filter = options.filter;
  const hits = index.sections.rank(at.vector, top, (p) => p !== path && (!filter || filter(p)), perFile);
  return { from, hits };
}
