/**
 * Word-match answers while the first index of a workspace is being built. Once the counting stage
 * has ended (indexPipeline.ts, onCounted), the files' raw term counts and their vocabulary are
 * all a lexical ranking needs: this ranks files by plain BM25 (Robertson & Zaragoza 2009, bm25.ts,
 * with their common-practice k1 = 1.2 and b = 0.75, not the blend's tuning in fusion.ts) until the
 * concept model is ready and the full ranking takes over. Nothing here is saved; the counts are
 * the build's own (shared, not copied), and postings are made per query term on first use.
 * Scores are divided by the best one (the top result has 1), as the blended ranking does with its
 * lexical part before mixing it in.
 */
import { NoKnownTermsError } from '../../core/errors.js';
import type { IndexSettings } from '../../core/index/model/settings.js';
import { Bm25Scorer } from '../../core/index/search/bm25.js';
import { topN } from '../../core/index/search/topN.js';
import { countTerms, type DocTerms } from '../../core/counting/termCounts.js';
import { queryLanguage } from '../../core/text/detectLanguage.js';
import type { Language } from '../../core/text/languages.js';
import { tokenizeIn } from '../../core/text/tokenizeLanguage.js';
import type { CountedCorpus } from '../indexPipeline.js';

export type { CountedCorpus } from '../indexPipeline.js';

export interface WordMatchHit {
  /** The file's index key. */
  readonly path: string;
  /** BM25 score divided by the best file's (0…1]. */
  readonly score: number;
  /** The BM25 score itself. */
  readonly bm25: number;
}

export class WordMatchIndex {
  private readonly _slotOf = new Map<string, number>();
  private _scorer: Bm25Scorer | undefined;
  private _scores = new Float64Array(0);
  private readonly _main: Language;
  private readonly _present: readonly Language[];

  constructor(private readonly _corpus: CountedCorpus) {
    const count = new Map<Language, number>();
    _corpus.docs.forEach((d, i) => {
      this._slotOf.set(d.meta.path, i);
      const lang = d.meta.language ?? 'en';
      count.set(lang, (count.get(lang) ?? 0) + 1);
    });
    // The language most files were tokenized in (English when tied), as LsiIndex.mainLanguage.
    let best: Language = 'en';
    for (const [lang, n] of count) if (n > (count.get(best) ?? 0)) best = lang;
    this._main = best;
    this._present = [...count.keys()];
  }

  get size(): number {
    return this._corpus.docs.length;
  }

  get settings(): IndexSettings {
    return this._corpus.settings;
  }

  has(key: string): boolean {
    return this._slotOf.has(key);
  }

  /** A query's known terms with their counts (the vocabulary is not grown). */
  queryTerms(text: string): DocTerms {
    const tokenize = this._corpus.settings.tokenize;
    const language = queryLanguage(text, tokenize.languages, this._main, this._present);
    return countTerms(tokenizeIn(text, tokenize, language), this._corpus.vocab, false);
  }

  /** The best `top` files for the query's words; throws NoKnownTermsError when none of them occurs. */
  search(text: string, top: number): WordMatchHit[] {
    const q = this.queryTerms(text);
    if (q.termIds.length === 0) throw new NoKnownTermsError(text);
    this._scorer ??= new Bm25Scorer(this._corpus.docs.map((d) => d.terms));
    const n = this._corpus.docs.length;
    if (this._scores.length < n) this._scores = new Float64Array(n);
    const scores = this._scores.subarray(0, n).fill(0);
    this._scorer.scoreInto(q, scores);
    const ranked = topN(scores, top, (j) => scores[j] > 0);
    const best = ranked.length > 0 ? ranked[0].score : 1;
    return ranked.map(({ slot, score }) => ({ path: this._corpus.docs[slot].meta.path, score: score / best, bm25: score }));
  }
}
