/**
 * The structure of a document: what a translation keeps while every sentence changes. Markup
 * (tag names and attribute values, heading and list markers, directive names, link targets),
 * numbers, addresses and code identifiers survive translation; prose words do not. The
 * signature is the multiset of those tokens. Two signatures are compared by the multiset overlap
 * coefficient Σ min(a_t, b_t) / min(Σ a_t, Σ b_t) (Szymkiewicz–Simpson), which a translator's
 * added credits or a translation of only part of the page lower little; the multiset Dice
 * coefficient 2·Σ min / (Σ a + Σ b) (Dice 1945) is given too. Prose words in no script are tokens here, so two pages in one language and two
 * unrelated pages both score low unless they share their markup and code.
 */

export type StructureSignature = ReadonlyMap<string, number>;

const TAG = /<\/?([A-Za-z][\w:.-]*)([^>]*)>/g;
const ATTR = /([\w:.-]+)\s*=\s*"([^"]*)"/g;
const URL = /\b(?:https?|ftp|mailto):[^\s<>"')\]]+|[\w.+-]+@[\w-]+\.[\w.-]+/g;
const NUMBER = /\b\d+(?:[.,:]\d+)*\b/g;
/** Identifiers: snake_case, dotted or scoped names, calls, CamelCase inside a word. */
const IDENT = /[A-Za-z_][\w]*(?:(?:\.|::|->|\/)[A-Za-z_]\w*)+|\b[A-Za-z]*_[\w]+|\b[a-z]+[A-Z]\w*|\b\w+\(\)/g;
const INLINE_CODE = /`{1,2}([^`\n]+)`{1,2}/g;
const ROLE = /:([a-z]+):`([^`]*)`/g;
const MD_LINK = /\]\(([^)\s]+)\)/g;

function add(sig: Map<string, number>, token: string): void {
  sig.set(token, (sig.get(token) ?? 0) + 1);
}

/** The structure tokens of a text, with their counts. */
export function structureSignature(text: string): StructureSignature {
  const sig = new Map<string, number>();
  for (const m of text.matchAll(/^[ \t]*([=\-~^*#+])\1{2,}[ \t]*$/gm)) add(sig, `underline:${m[1]}`);
  for (const m of text.matchAll(/^[ \t]*(#{1,6})[ \t]/gm)) add(sig, `heading:${m[1].length}`);
  for (const m of text.matchAll(/^[ \t]*([-*+]|\d+[.)])[ \t]/gm)) add(sig, `list:${/\d/.test(m[1]) ? 'n' : m[1]}`);
  for (const m of text.matchAll(/^[ \t]*\.\.[ \t]+([\w:-]+)::/gm)) add(sig, `directive:${m[1]}`);
  for (const m of text.matchAll(TAG)) {
    add(sig, `tag:${m[1]}`);
    if (m[2].includes('=')) for (const a of m[2].matchAll(ATTR)) add(sig, `attr:${a[1]}=${a[2]}`);
  }
  const prose = text.replace(TAG, ' ');
  for (const m of prose.matchAll(ROLE)) add(sig, `role:${m[1]}:${m[2]}`);
  for (const m of prose.matchAll(MD_LINK)) add(sig, `link:${m[1]}`);
  for (const m of prose.matchAll(INLINE_CODE)) add(sig, `code:${m[1]}`);
  for (const m of prose.matchAll(URL)) add(sig, `url:${m[0]}`);
  const rest = prose.replace(URL, ' ');
  for (const m of rest.matchAll(IDENT)) add(sig, `id:${m[0]}`);
  for (const m of rest.matchAll(NUMBER)) add(sig, `num:${m[0]}`);
  return sig;
}

/** Multiset Dice coefficient of two signatures (0 when both are empty). */
export function structureSimilarity(a: StructureSignature, b: StructureSignature): number {
  let sa = 0;
  let sb = 0;
  let shared = 0;
  for (const [t, n] of a) {
    sa += n;
    const m = b.get(t);
    if (m !== undefined) shared += Math.min(n, m);
  }
  for (const n of b.values()) sb += n;
  return sa + sb === 0 ? 0 : (2 * shared) / (sa + sb);
}

/** Token kinds every page of a format shares (tag names, underlines, list markers): generic, not page-specific. */
const GENERIC = /^(?:tag|underline|heading|list|directive):/;
/** Page-specific tokens (link targets, ids, code, numbers) both sides need before they alone are compared. @default 5 */
export const MIN_SPECIFIC = 5;

function overlap(a: StructureSignature, b: StructureSignature, keep: (t: string) => boolean): { shared: number; sa: number; sb: number } {
  let sa = 0;
  let sb = 0;
  let shared = 0;
  for (const [t, n] of a) {
    if (!keep(t)) continue;
    sa += n;
    const m = b.get(t);
    if (m !== undefined) shared += Math.min(n, m);
  }
  for (const [t, n] of b) if (keep(t)) sb += n;
  return { shared, sa, sb };
}

/**
 * Share of the smaller signature's tokens found in the larger (multiset overlap coefficient).
 * When both have at least MIN_SPECIFIC page-specific tokens, only those are compared: pages of
 * one format share their generic markup whatever they say.
 */
export function structureContainment(a: StructureSignature, b: StructureSignature): number {
  const specific = overlap(a, b, (t) => !GENERIC.test(t));
  const use = specific.sa >= MIN_SPECIFIC && specific.sb >= MIN_SPECIFIC ? specific : overlap(a, b, () => true);
  const small = Math.min(use.sa, use.sb);
  return small === 0 ? 0 : use.shared / small;
}
