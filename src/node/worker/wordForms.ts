/**
 * Readable words for index stems, learned from the files themselves (core/text/surfaceForms.ts),
 * for what the worker shows people: topic terms, the map's tooltips, "why" terms. The index keeps
 * stems only; a stem never seen keeps its stem. Reads at most `budget` files, spread evenly over
 * the list given, so a big workspace costs a bounded read.
 */
import { evenSpread } from '../../core/evenSpread.js';
import { SurfaceForms } from '../../core/text/surfaceForms.js';
import { readIndexableText } from '../scan.js';
import type { RootMap } from './rootMap.js';

export type WordFor = (stem: string) => string;

export const identityWord: WordFor = (stem) => stem;

/** Files read to learn spellings (our choice: frequent stems, the ones shown, turn up in any sample this size). */
export const DEFAULT_FORMS_BUDGET = 2000;

/** Word forms learned from some texts (identity when the index does not stem). */
export function formsFromTexts(texts: readonly string[], stem: boolean, wanted?: ReadonlySet<string>): WordFor {
  if (!stem) return identityWord;
  const forms = new SurfaceForms({ stem }, wanted);
  for (const t of texts) forms.add(t);
  return (s) => forms.wordFor(s);
}

/** Word forms learned by reading (some of) the files with the given index keys. */
export async function formsFromFiles(
  roots: RootMap,
  keys: readonly string[],
  options: { readonly stem: boolean; readonly maxFileBytes: number; readonly wanted?: ReadonlySet<string>; readonly budget?: number },
): Promise<WordFor> {
  if (!options.stem) return identityWord;
  const forms = new SurfaceForms({ stem: true }, options.wanted);
  for (const i of evenSpread(keys.length, options.budget ?? DEFAULT_FORMS_BUDGET)) {
    const got = await readIndexableText(roots.refOf(keys[i]).fsPath, options.maxFileBytes).catch(() => null);
    if (got?.kind === 'text') forms.add(got.text);
  }
  return (s) => forms.wordFor(s);
}
