/**
 * Readable words for index terms. The index stores Porter stems ("retriev", "configur"); people
 * want words. This counts, for each stem, the lowercase word forms that produced it in some texts,
 * and names the stem by its most frequent form (ties: the shorter, then the alphabetically first).
 * Words are found exactly as tokenize.ts finds them (same Unicode folding, word pattern and
 * identifier splitting, with joined compounds), so every stem the tokenizer emits can be named.
 * Stop-word and length filters are not repeated here: the caller asks only about stems it has.
 */
import { splitIdentifier, stemWord, type TokenizeOptions } from './tokenize.js';

const WORD = /[\p{L}\p{N}_$]+/gu;
const MARKS = /\p{M}+/gu;

export class SurfaceForms {
  private readonly _forms = new Map<string, Map<string, number>>();

  constructor(
    private readonly _options: Pick<TokenizeOptions, 'stem'> = { stem: true },
    /** When given, only these stems are tracked (saves memory on big folders). */
    private readonly _wanted?: ReadonlySet<string>,
  ) {}

  /** Counts the word forms of one text. */
  add(text: string): void {
    const normalised = text.normalize('NFKD').replace(MARKS, '');
    for (const m of normalised.matchAll(WORD)) {
      const parts = splitIdentifier(m[0]);
      for (const p of parts) this.count(p.toLowerCase());
      if (parts.length > 1) this.count(parts.join('').toLowerCase());
    }
  }

  /** The most frequent word form seen for a stem, or the stem itself when none was seen. */
  wordFor(stem: string): string {
    const forms = this._forms.get(stem);
    if (!forms) return stem;
    let best = stem;
    let bestCount = 0;
    for (const [form, n] of forms) {
      if (n > bestCount || (n === bestCount && (form.length < best.length || (form.length === best.length && form < best)))) {
        best = form;
        bestCount = n;
      }
    }
    return best;
  }

  /** Every form seen for a stem with its count, most frequent first. */
  formsOf(stem: string): [string, number][] {
    return [...(this._forms.get(stem) ?? new Map<string, number>())].sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1));
  }

  private count(word: string): void {
    if (word.length < 2) return;
    const stem = this._options.stem ? stemWord(word) : word;
    if (this._wanted && !this._wanted.has(stem)) return;
    let forms = this._forms.get(stem);
    if (!forms) this._forms.set(stem, (forms = new Map()));
    forms.set(word, (forms.get(word) ?? 0) + 1);
  }
}
