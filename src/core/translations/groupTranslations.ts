/**
 * Groups a page with its translations, so result lists show a page once, in the reader's
 * language, with the other languages one click away.
 *
 * Two files are translations of each other when (1) their paths agree once language segments
 * are removed (pathKey.ts), (2) they are in different languages (language.ts; when the text's
 * language cannot be told, the language codes in their paths must differ), and (3) their
 * structure is near-identical: the multiset Dice of their structure signatures (structure.ts) is
 * at least `minStructure`. Groups are the connected components of that relation (union-find).
 * Two files in one language whose paths name no different languages are never paired: such
 * copies are look-alikes, not translations. minStructure 0.6 is a round value below every
 * translation pair measured on the GNOME help tree (Debian gnome-user-docs 43.0-2, 1,758 pairs of
 * C/de/es/fr/ja/ru/zh_CN pages: least 0.64, 1% below 0.83, median 1.00), while 292 pairs of
 * unrelated pages had median 0.36 (22 of them at 0.6 or more); the path key does most of the work, structure guards against a shared name by chance.
 */
import { translationPath } from './pathKey.js';
import { UNDETERMINED } from './language.js';
import { structureContainment, type StructureSignature } from './structure.js';

export interface TranslationDoc {
  /** Index key of the file. */
  readonly key: string;
  /** Its '/'-separated path inside its folder (language segments are looked for here). */
  readonly path: string;
  /** ISO 639-3 code from language.ts, or UNDETERMINED; asked only when the paths name no different languages. */
  readonly language: () => string;
  readonly signature: StructureSignature;
}

export interface TranslationOptions {
  /** Least structure similarity of two translations. @default 0.6 */
  readonly minStructure: number;
}

export const DEFAULT_TRANSLATION_OPTIONS: TranslationOptions = { minStructure: 0.6 };

/**
 * True when the two files stand for different languages: their texts are in different languages,
 * or their paths name different languages. The second covers the untranslated slots of a
 * translation tree (a zh_CN/ page still in English is that page's Chinese slot, not a new page).
 */
export function differentLanguages(a: TranslationDoc, b: TranslationDoc): boolean {
  if (translationPath(a.path).locale !== translationPath(b.path).locale) return true;
  const la = a.language();
  const lb = b.language();
  return la !== UNDETERMINED && lb !== UNDETERMINED && la !== lb;
}

export function areTranslations(a: TranslationDoc, b: TranslationDoc, options: Partial<TranslationOptions> = {}): boolean {
  const o = { ...DEFAULT_TRANSLATION_OPTIONS, ...options };
  if (a.key === b.key || translationPath(a.path).key !== translationPath(b.path).key) return false;
  return differentLanguages(a, b) && structureContainment(a.signature, b.signature) >= o.minStructure;
}

/** Groups of two or more keys that are translations of one another (members in input order). */
export function groupTranslations(docs: readonly TranslationDoc[], options: Partial<TranslationOptions> = {}): string[][] {
  const byKey = new Map<string, number[]>();
  docs.forEach((d, i) => {
    const k = translationPath(d.path).key;
    const list = byKey.get(k);
    if (list) list.push(i);
    else byKey.set(k, [i]);
  });
  const parent = docs.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]];
    return i;
  };
  for (const members of byKey.values()) {
    for (let x = 0; x < members.length; x++) {
      for (let y = x + 1; y < members.length; y++) {
        const [i, j] = [members[x], members[y]];
        if (find(i) !== find(j) && areTranslations(docs[i], docs[j], options)) parent[find(j)] = find(i);
      }
    }
  }
  const groups = new Map<number, string[]>();
  docs.forEach((d, i) => {
    const r = find(i);
    const g = groups.get(r);
    if (g) g.push(d.key);
    else groups.set(r, [d.key]);
  });
  return [...groups.values()].filter((g) => g.length > 1);
}

export interface ShownCandidate {
  /** How well the member fits the reader (the question's words it covers, or 1 for the subject file's language). */
  readonly fit: number;
  /** Its place in the ranked results (Infinity when it was not ranked). */
  readonly rank: number;
  /** Its path names no language: the original of a gettext or translations/ tree. */
  readonly original: boolean;
}

/** Which member of a group to show: the best fit; then the original; then the best ranked. */
export function chooseShown(members: readonly ShownCandidate[]): number {
  let best = 0;
  for (let i = 1; i < members.length; i++) {
    const a = members[i];
    const b = members[best];
    if (a.fit > b.fit + 1e-9 || (Math.abs(a.fit - b.fit) <= 1e-9 && (a.original !== b.original ? a.original : a.rank < b.rank))) best = i;
  }
  return best;
}

/** A path names no language, or names the POSIX original "C" or English. */
export function isOriginalPath(path: string): boolean {
  const l = translationPath(path).locale;
  return l === undefined || l === 'C' || /^en(?:[_-]|$)/.test(l);
}

/** One result row after collapsing translations: the member shown, its hit, and the other members. */
export interface CollapsedHit<H> {
  readonly key: string;
  /** The ranked hit whose group this is (the first member that was ranked). */
  readonly hit: H;
  readonly others: string[];
}

/**
 * Ranked hits with each page and its translations made one row, shown in the member chooseShown
 * picks (fitOf: how well a member fits the reader); keys in `skip` (and their groups) are left
 * out; at most `top` rows.
 */
export function collapseTranslations<H extends { readonly path: string }>(
  hits: readonly H[],
  groups: ReadonlyMap<string, readonly string[]>,
  fitOf: (key: string) => number,
  top: number,
  skip: Iterable<string> = [],
): CollapsedHit<H>[] {
  const rankOf = new Map(hits.map((h, i) => [h.path, i]));
  const out: CollapsedHit<H>[] = [];
  const used = new Set<string>(skip);
  for (const h of hits) {
    if (out.length === top) break;
    if (used.has(h.path)) continue;
    const members = groups.get(h.path) ?? [h.path];
    for (const m of members) used.add(m);
    const shown =
      members.length < 2
        ? h.path
        : members[chooseShown(members.map((m) => ({ fit: fitOf(m), rank: rankOf.get(m) ?? Infinity, original: isOriginalPath(m) })))];
    out.push({ key: shown, hit: h, others: members.filter((m) => m !== shown) });
  }
  return out;
}
