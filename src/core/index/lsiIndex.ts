/**
 * The workspace index: documents, their raw term counts, the frozen concept model, one unit
 * concept vector per document, and the lexical (BM25) scorer. Answers searches by meaning
 * (query folded into the concept space, cosine ranking, optionally blended with BM25) and
 * nearest-file questions; accepts edits by folding changed documents in with the frozen weights
 * (Berry, Dumais & O'Brien 1995) and reports how stale the model has become (staleness.ts).
 * The unit vectors sit in one block (conceptRows.ts); search and nearby screen them with 8-bit codes and exact
 * bounds (conceptCodes.ts, screenedTop.ts) and take exact products only for rows that can place,
 * so the ranking is that of a full pass. The BM25 scorer is made on first use (it builds the
 * postings of a term when a query first needs it) and then kept up to date. How the concept and
 * lexical evidence combine, with feedback, is in search/fusion.ts.
 * A caller that keeps the index open (the editor's worker) can call prepare() to build both the
 * codes and every term's postings ahead of time, in slices, so no search pays for them; a search
 * that arrives while the codes are half made takes a full pass instead of finishing them.
 */
import { InvalidInputError, NoKnownTermsError, NotIndexedError } from '../errors.js';
import { tokenize } from '../text/tokenize.js';
import { tokenizeIn } from '../text/tokenizeLanguage.js';
import { fileLanguage, queryLanguage, withLanguage } from '../text/detectLanguage.js';
import type { Language } from '../text/languages.js';
import { Bm25Scorer } from './search/bm25.js';
import {
  DEFAULT_RANKING_OPTIONS,
  QUESTION_FILLER,
  distinctiveTerms,
  mergeTerms,
  rocchio,
  SPREAD_SAMPLE,
  spreadOf,
  spreadShare,
  stripPointing,
  type RankingOptions,
} from './search/fusion.js';
import { ConceptCodes } from './search/conceptCodes.js';
import { declaringName, NameField, PathNameTokens } from './search/nameField.js';
import { TfidfNorms, TfidfNormsBuilder } from './search/tfidfCosine.js';
import { MeanRow } from './search/meanRow.js';
import { FOCUS_SAMPLE, focusOf, focusWeights, meanResultant, type Resultant } from './search/termFocus.js';
import { ConceptRows } from './search/conceptRows.js';
import { ScreenScratch, screenedTop } from './search/screenedTop.js';
import { projectTerms, type ConceptModel } from './model/conceptModel.js';
import type { IndexSettings } from './model/settings.js';
import { ChangeCounters, type Staleness, type StalenessCounters } from './update/staleness.js';
import { countTermIds, countTerms, type DocTerms, type Vocabulary } from '../counting/termCounts.js';
import { topN } from './search/topN.js';
import { SectionStore } from '../sections/sectionStore.js';
import { foldContextOf, foldSections } from '../sections/sectionVectors.js';

export type { Staleness, StalenessCounters } from './update/staleness.js';

export {
  DEFAULT_PREPARE_OPTIONS,
  type DocMeta,
  type DocSlot,
  type NearbyHit,
  type NearbyOptions,
  type PrepareOptions,
  type SearchHit,
  type SearchOptions,
} from './searchTypes.js';
import {
  DEFAULT_PREPARE_OPTIONS,
  type DocMeta,
  type DocSlot,
  type NearbyHit,
  type NearbyOptions,
  type PrepareOptions,
  type SearchHit,
  type SearchOptions,
} from './searchTypes.js';

/** What a search ranks with (LsiIndex.searchPlan). */
export interface SearchPlan {
  readonly terms: DocTerms;
  readonly lexicalQuery: DocTerms;
  readonly vector: Float32Array;
  readonly scale: number;
  readonly known: boolean;
  readonly lexical: Float64Array;
  readonly accept: (slot: number) => boolean;
  /** The lexical share λ of this query (settings.lexicalBlend on standardised scores, fusion.ts spreadShare; raised by coverageBlend). */
  readonly lambda: number;
  /** Each query word's weight in the concept fold (termFocus.ts), by vocabulary id; null when off. */
  readonly focus: ReadonlyMap<number, number> | null;
}

export class LsiIndex {
  private _slots: (DocSlot | null)[];
  private readonly _rows: ConceptRows;
  private readonly _slotOf = new Map<string, number>();
  private _bm25: Bm25Scorer | null = null;
  /** The name field of the word match (nameField.ts), made from the paths on first use, then kept up to date. */
  private _names: NameField | null = null;
  private _pathTokens: PathNameTokens | null = null;
  /** The name field being built by prepare() in slices (dropped by any edit before it completes). */
  private _namesBuild: { field: NameField; next: number } | null = null;
  /** Name words not in the vocabulary yet → the slots whose names hold them (completed when a fold-in brings the word). */
  private readonly _unknownNames = new Map<string, Set<number>>();
  private _scratch = new Float64Array(0);
  private _codes: ConceptCodes | null | undefined;
  private readonly _screen = new ScreenScratch();
  private readonly _changes = new ChangeCounters();
  private _filler: ReadonlySet<string> | null = null;
  /** Query-word focus inputs (termFocus.ts); an edit forgets those of the words its file held or holds. */
  private readonly _resultants = new Map<number, Resultant>();
  private _meanRow: MeanRow | null = null;
  /** TF-IDF document norms (tfidfCosine.ts), made on first use, cleared on every edit. */
  private _tfidf: TfidfNorms | null = null;
  /** The TF-IDF norms being built by prepare() in slices, until done or the documents change. */
  private _tfidfBuilder: TfidfNormsBuilder | null = null;
  private _tfidfScores = new Float64Array(0);
  private _mainLanguage: Language | undefined;
  private _languagesPresent: readonly Language[] | undefined;
  /** How search and nearby combine their evidence (fusion.ts); not saved with the index. */
  ranking: RankingOptions = DEFAULT_RANKING_OPTIONS;
  /** Each file's sections with their concept vectors (src/core/sections), saved with the index. */
  readonly sections: SectionStore;

  private constructor(
    readonly settings: IndexSettings,
    readonly vocab: Vocabulary,
    readonly model: ConceptModel,
    slots: (DocSlot | null)[],
    rows: ConceptRows,
  ) {
    this._slots = slots;
    this._rows = rows;
    this.sections = new SectionStore(model.k);
    slots.forEach((s, i) => s && this._slotOf.set(s.meta.path, i));
  }

  /**
   * Builds the document vectors of a fresh model (used by IndexBuilder and by loading): projected
   * from the terms, copied from `vectors` when given as an array, or kept as they are when given
   * as rows already filled (a reopen reads the saved vectors straight into them).
   */
  static assemble(
    settings: IndexSettings,
    vocab: Vocabulary,
    model: ConceptModel,
    slots: (DocSlot | null)[],
    vectors?: Float32Array | ConceptRows,
  ): LsiIndex {
    const k = model.k;
    if (vectors instanceof ConceptRows) {
      // Rows already filled (a reopen reads the saved vectors straight into them).
      if (vectors.k !== k || vectors.capacity < slots.length) throw new InvalidInputError('concept vectors do not cover every document');
      return new LsiIndex(settings, vocab, model, slots, vectors);
    }
    if (vectors && vectors.length < slots.length * k) throw new InvalidInputError('concept vectors do not cover every document');
    const rows = new ConceptRows(k, slots.length, vectors?.subarray(0, slots.length * k));
    if (!vectors) slots.forEach((s, i) => s && rows.setRow(i, projectTerms(model, s.terms).vector));
    return new LsiIndex(settings, vocab, model, slots, rows);
  }

  get k(): number {
    return this.model.k;
  }

  /** Number of documents. */
  get size(): number {
    return this._slotOf.size;
  }

  /** Document paths in slot order. */
  paths(): string[] {
    return this._slots.filter((s): s is DocSlot => s !== null).map((s) => s.meta.path);
  }

  has(path: string): boolean {
    return this._slotOf.has(path);
  }

  meta(path: string): DocMeta | undefined {
    const s = this._slotOf.get(path);
    return s === undefined ? undefined : this._slots[s]!.meta;
  }

  /** Raw term counts of a document (ids of this.vocab). */
  termsOf(path: string): DocTerms {
    return this._slots[this.slot(path)]!.terms;
  }

  /** The unit concept vector of a document (a view; do not modify). */
  vectorOf(path: string): Float32Array {
    const s = this.slot(path);
    return this._rows.rows.subarray(s * this.k, (s + 1) * this.k);
  }

  /** Internal slots, including null holes left by removals (for persistence and bulk views). */
  slots(): readonly (DocSlot | null)[] {
    return this._slots;
  }

  /** All slots' concept vectors, slots.length × k (holes are zero rows). */
  vectors(): Float32Array {
    return this._rows.rows.subarray(0, this._slots.length * this.k);
  }

  /**
   * Counts a query's terms against the vocabulary without growing it. Question filler words
   * (fusion.ts) are left out when known words remain without them.
   */
  queryTerms(text: string): DocTerms {
    const language = queryLanguage(text, this.settings.tokenize.languages, this.mainLanguage(), this.languagesPresent());
    const tokens = tokenizeIn(text, this.settings.tokenize, language);
    if (this.ranking.dropFiller) {
      this._filler ??= new Set(tokenize(QUESTION_FILLER.join(' '), this.settings.tokenize));
      const filler = this._filler;
      const kept = countTerms(
        tokenizeIn(stripPointing(text), this.settings.tokenize, language).filter((t) => !filler.has(t)),
        this.vocab,
        false,
      );
      if (kept.termIds.length > 0) return kept;
    }
    return countTerms(tokens, this.vocab, false);
  }

  /**
   * The language most documents were tokenized in (English when tied or empty): a question
   * without stop words of its own is read in it (detectLanguage.ts).
   */
  mainLanguage(): Language {
    if (this._mainLanguage === undefined) {
      const count = this.languageCounts();
      let best: Language = 'en';
      for (const [lang, n] of count) if (n > (count.get(best) ?? 0)) best = lang;
      this._mainLanguage = best;
      this._languagesPresent = [...count.keys()];
    }
    return this._mainLanguage;
  }

  /** The languages the documents were tokenized in (a question is read in one of them). */
  languagesPresent(): readonly Language[] {
    this.mainLanguage();
    return this._languagesPresent ?? [];
  }

  private languageCounts(): Map<Language, number> {
    const count = new Map<Language, number>();
    for (const s of this._slots) if (s) count.set(s.meta.language ?? 'en', (count.get(s.meta.language ?? 'en') ?? 0) + 1);
    return count;
  }

  /** Concept vector of free text (zeros if no model term occurs). */
  projectText(text: string): Float32Array {
    return projectTerms(this.model, this.queryTerms(text)).vector;
  }

  /**
   * Ranks documents by meaning for plain-language text: the query's concept cosine (after
   * pseudo-relevance feedback, and moved towards files marked like / away from files marked
   * unlike) blended with max-normalised BM25 (fusion.ts). Files marked like or unlike are not
   * ranked. Throws NoKnownTermsError when neither the text nor a liked file gives known words.
   */
  search(text: string, options: Partial<SearchOptions> = {}): SearchHit[] {
    const plan = this.searchPlan(text, options);
    const { lexical, accept } = plan;
    const lambda = plan.lambda;
    const { ranked, product } = this.rank(
      plan.vector,
      plan.known ? 1 - lambda : 0,
      lambda,
      lexical,
      options.top ?? 10,
      accept,
      this._scratch.subarray(this._slots.length, 2 * this._slots.length),
    );
    return ranked.map(({ slot, score }) => ({
      path: this._slots[slot]!.meta.path,
      score,
      conceptScore: product(slot),
      lexicalScore: lexical[slot],
    }));
  }

  /**
   * What a search ranks with: the text's terms, the lexical query (the text's terms and the liked
   * files' distinctive terms), the final concept query vector (after pseudo-relevance and user
   * feedback; `scale` is the factor the text's own unit vector carries in it), the BM25 scores
   * divided by their maximum (a view overwritten by the next search) and the slots that may rank.
   */
  searchPlan(text: string, options: Partial<SearchOptions> = {}): SearchPlan {
    const r = this.ranking;
    const q = this.queryTerms(text);
    const liked = (options.like ?? []).map((p) => this.slot(p));
    const unliked = (options.unlike ?? []).map((p) => this.slot(p));
    if (q.termIds.length === 0 && liked.length === 0) throw new NoKnownTermsError(text);
    const focus = r.termFocus > 0 && q.termIds.length > 1 ? this.focusWeights(q) : null;
    let lexQuery = q;
    for (const s of liked) lexQuery = mergeTerms(lexQuery, this.fileQuery(s, r.likeWeight / liked.length));
    const proj = projectTerms(this.model, q, focus ? (t) => focus.get(t) ?? 1 : undefined);
    const n = this._slots.length;
    // Two reused n-long arrays (allocating 2 × 8n bytes per query made the collector run often).
    if (this._scratch.length < 2 * n) this._scratch = new Float64Array(2 * Math.ceil(n * 1.25));
    const lexical = this._scratch.subarray(0, n).fill(0);
    let lambda = this.settings.lexicalBlend;
    if (lambda > 0) {
      this.bm25().scoreInto(lexQuery, lexical, r.lengthNorm);
      divideByMax(lexical);
      if (r.nameWeight > 0) this.addSearchNames(lexQuery, lexical);
      if (r.tfidfShare > 0 && !r.tfidfFromConcept) this.addTfidf(lexQuery, lexical, 1 - r.tfidfShare, r.tfidfShare, r.tfidfSlope);
      if (r.coverageBlend) lambda += (1 - lambda) * this.unknownShare(q);
      if (r.tfidfShare > 0 && r.tfidfFromConcept && proj.knownTerms > 0) {
        // (1 − λ)(1 − ν)·cos + λ·BM25 + (1 − λ)ν·TF-IDF, the last two as one part of share λ'.
        const moved = (1 - lambda) * r.tfidfShare;
        this.addTfidf(lexQuery, lexical, lambda / (lambda + moved), moved / (lambda + moved), r.tfidfSlope);
        lambda += moved;
      }
    }
    const marked = new Set([...liked, ...unliked]);
    const live = this.acceptor(options.filter);
    const accept = marked.size ? (j: number): boolean => !marked.has(j) && live(j) : live;
    let vector = proj.vector;
    let scale = proj.knownTerms > 0 ? 1 : 0;
    let known = proj.knownTerms > 0;
    const base = lambda;
    if (known && r.spreadBlend && lambda > 0) lambda = this.spreadLambda(base, vector, lexical);
    if (known && r.feedbackDocs > 0 && r.feedbackWeight > 0) {
      const first = this.rank(vector, 1 - lambda, lambda, lexical, r.feedbackDocs, accept, this._scratch.subarray(n, 2 * n));
      const moved = rocchio(vector, [{ weight: r.feedbackWeight, vectors: first.ranked.map(({ slot }) => this.slotVector(slot)) }]);
      if (moved) [vector, scale] = [moved.vector, scale * moved.scale];
    }
    if (liked.length > 0 || unliked.length > 0) {
      const moved = rocchio(vector, [
        { weight: r.likeWeight, vectors: liked.map((s) => this.slotVector(s)) },
        { weight: -r.unlikeWeight, vectors: unliked.map((s) => this.slotVector(s)) },
      ]);
      if (moved) [vector, scale, known] = [moved.vector, scale * moved.scale, true];
    }
    if (known && r.spreadBlend && base > 0) lambda = this.spreadLambda(base, vector, lexical);
    return { terms: q, lexicalQuery: lexQuery, vector, scale, known, lexical, accept, lambda, focus };
  }

  /**
   * The files nearest in meaning to a file, itself excluded: the concept cosine blended with the
   * BM25 score of the file's most distinctive terms against the others, divided by the best
   * other file's (fusion.ts).
   */
  nearby(path: string, options: Partial<NearbyOptions> = {}): NearbyHit[] {
    const self = this.slot(path);
    const live = this.acceptor(options.filter);
    const accept = (j: number): boolean => j !== self && live(j);
    const n = this._slots.length;
    const { lexical, lexicalShare: mu } = this.nearbyPlan(
      path,
      options.wordMatchDelta,
      options.wordMatchTfidf,
      options.wordMatchNames,
      options.wordMatchTerms,
    );
    const { ranked, product } = this.rank(
      this.vectorOf(path),
      1 - mu,
      mu,
      lexical,
      options.top ?? 10,
      accept,
      this._scratch.subarray(n, 2 * n),
    );
    return ranked.map(({ slot, score }) => ({
      path: this._slots[slot]!.meta.path,
      score,
      conceptScore: product(slot),
      lexicalScore: lexical[slot],
    }));
  }

  /**
   * Nearby's lexical evidence for a file: its lexical query (most distinctive terms), the best
   * BM25 score among the other files, and every file's score divided by it (itself 0; a view
   * overwritten by the next search); with a TF-IDF share ν, (1 − ν) of that plus ν·the TF-IDF
   * score of `tfidfQuery` (the file's nearbyTfidfTerms most distinctive terms, or all its terms)
   * divided by the best other file's (`tfidfMax`).
   * Without a lexical share (nearbyLexical = 0) all zeros. `lexicalShare` is the word match's share
   * of the score (nearbyLexical, raised when the TF-IDF part is taken from the concept part) and
   * `tfidfShare` the TF-IDF part's share within the word match.
   * `delta`: BM25L's δ of the word match (default: the ranking options' nearbyDelta); `tfidf`: ν
   * (default: nearbyTfidfShare); `names`: η (default: nearbyNameWeight); `terms`: how many of the
   * file's most distinctive terms form its query (default: nearbyTerms).
   */
  nearbyPlan(
    path: string,
    delta: number = this.ranking.nearbyDelta,
    tfidf: number = this.ranking.nearbyTfidfShare,
    names: number = this.ranking.nearbyNameWeight,
    terms: number = this.ranking.nearbyTerms,
  ): {
    lexicalQuery: DocTerms;
    max: number;
    lexical: Float64Array;
    tfidfShare: number;
    tfidfMax: number;
    tfidfQuery: DocTerms;
    lexicalShare: number;
    /** The name field's weight η and the maxima of its two parts (0 when a part found nothing). */
    names: number;
    namesMax: number;
    ownNameMax: number;
  } {
    const self = this.slot(path);
    const n = this._slots.length;
    if (this._scratch.length < 2 * n) this._scratch = new Float64Array(2 * Math.ceil(n * 1.25));
    const lexical = this._scratch.subarray(0, n).fill(0);
    const lexicalQuery = this.fileQuery(self, 1, terms);
    let max = 0;
    let tfidfMax = 0;
    const share = this.ranking.nearbyLexical > 0 ? tfidf : 0;
    if (this.ranking.nearbyLexical > 0) {
      this.bm25().scoreInto(lexicalQuery, lexical, this.ranking.nearbyLengthNorm, delta);
      lexical[self] = 0;
      max = divideByMax(lexical);
    }
    let namesMax = 0;
    let ownNameMax = 0;
    if (this.ranking.nearbyLexical > 0 && names > 0) {
      namesMax = this.addNames(lexicalQuery, lexical, names, delta, self);
      const own = this.names().namesOf(self);
      if (own) {
        const extra = this._scratch.subarray(n, 2 * n).fill(0);
        this.bm25().scoreInto(own, extra, this.ranking.nearbyLengthNorm, delta);
        extra[self] = 0;
        ownNameMax = divideByMax(extra);
        addScaled(lexical, names, extra);
      }
    }
    const words = this.ranking.nearbyTfidfTerms;
    // The TF-IDF part's query (only made when it has a share; the BM25 query stands in otherwise).
    const tfidfQuery =
      share <= 0 || words === terms ? lexicalQuery : words <= 0 ? this._slots[self]!.terms : this.fileQuery(self, 1, words);
    let mu = this.ranking.nearbyLexical;
    let [wl, wt] = [1 - share, share];
    if (share > 0 && this.ranking.nearbyTfidfFromConcept) {
      // (1 − μ)(1 − ν)·cos + μ·BM25L + (1 − μ)ν·TF-IDF, the last two as one part of share μ'.
      const moved = (1 - mu) * share;
      [wl, wt] = [mu / (mu + moved), moved / (mu + moved)];
      mu += moved;
    }
    if (share > 0) tfidfMax = this.addTfidf(tfidfQuery, lexical, wl, wt, 1, self);
    return {
      lexicalQuery,
      max,
      lexical,
      tfidfShare: share > 0 ? wt : 0,
      tfidfMax,
      tfidfQuery,
      lexicalShare: mu,
      names,
      namesMax,
      ownNameMax,
    };
  }

  /** One term's TF-IDF score for a file (tfidfCosine.ts, cosine), before division by the best; for explanations. */
  tfidfTermScore(termId: number, queryCount: number, tf: number, slot: number): number {
    return this.tfidfNorms().termScore(termId, queryCount, tf, slot);
  }

  /**
   * The lexical share for standardised scores (fusion.ts, spreadShare): the spread of the concept
   * cosines over evenly spaced files (every ⌊n/SPREAD_SAMPLE⌋-th: all files below 2·SPREAD_SAMPLE,
   * fewer than 2·SPREAD_SAMPLE above), the lexical scores' over all files.
   */
  private spreadLambda(lambda: number, q: Float32Array, lexical: Float64Array): number {
    const slots = this._slots;
    const live = (j: number): boolean => slots[j] !== null;
    return spreadShare(lambda, conceptSpread(this._rows.rows, this.k, slots, q), spreadOf(lexical, live));
  }

  /** Each query word's weight in the concept fold (termFocus.ts), by vocabulary id. */
  private focusWeights(q: DocTerms): Map<number, number> {
    const focus = Array.from(q.termIds, (t) => focusOf(this.resultantOf(t), this.meanNormSquared()));
    const w = focusWeights(focus, { power: this.ranking.termFocus });
    return new Map(Array.from(q.termIds, (t, i) => [t, w[i]]));
  }

  /**
   * The mean resultant of a word's files (termFocus.ts), kept until an edit of a file that holds the word: of every
   * ⌊df/FOCUS_SAMPLE⌋-th holder (all of them below 2·FOCUS_SAMPLE), the chance level then counting
   * the files visited.
   */
  private resultantOf(t: number): Resultant {
    let res = this._resultants.get(t);
    if (!res) {
      const rows = this._rows.rows;
      const slots = this._slots;
      const step = Math.max(1, Math.floor(this.bm25().docFrequency(t) / FOCUS_SAMPLE));
      let seen = 0;
      res = meanResultant(rows, this.k, (visit) =>
        this.bm25().forEachHolder(t, (slot) => {
          if (seen++ % step === 0 && slot < slots.length && slots[slot] !== null) visit(slot);
        }),
      );
      this._resultants.set(t, res);
    }
    return res;
  }

  /** ‖μ‖² for μ the mean of the files' unit concept vectors; an edit adds only its block again (meanRow.ts). */
  private meanNormSquared(): number {
    const slots = this._slots;
    this._meanRow ??= new MeanRow(this.k);
    return this._meanRow.normSquared(this._rows.rows, slots.length, (j) => slots[j] !== null);
  }

  /** The idf-weighted share of a query's terms that the concept model does not know (0…1). */
  private unknownShare(q: DocTerms): number {
    const { columnOf } = this.model;
    let all = 0;
    let unknown = 0;
    for (let i = 0; i < q.termIds.length; i++) {
      const t = q.termIds[i];
      const w = q.counts[i] * this.bm25().idf(t);
      all += w;
      if (t >= columnOf.length || columnOf[t] < 0) unknown += w;
    }
    return all > 0 ? unknown / all : 0;
  }

  /** A file's lexical query: its `count` most distinctive terms with their counts, times `weight`. */
  private fileQuery(slot: number, weight: number, count = this.ranking.nearbyTerms): DocTerms {
    const terms = distinctiveTerms(this._slots[slot]!.terms, count, (t) => this.bm25().idf(t));
    if (weight !== 1) for (let i = 0; i < terms.counts.length; i++) terms.counts[i] *= weight;
    return terms;
  }

  private slotVector(slot: number): Float32Array {
    return this._rows.rows.subarray(slot * this.k, (slot + 1) * this.k);
  }

  /**
   * Top N of a·(v_j·q) + b·lexical_j over accepted slots: screened with the 8-bit codes when they
   * are ready (the same ranking and scores as a full pass), else a full pass into `scratch`.
   */
  private rank(
    q: Float32Array,
    a: number,
    b: number,
    lexical: Float64Array,
    top: number,
    accept: (slot: number) => boolean,
    scratch: Float64Array,
  ): { ranked: { slot: number; score: number }[]; product: (slot: number) => number } {
    const codes = this.codes();
    const n = this._slots.length;
    const screened =
      codes &&
      a > 0 &&
      screenedTop({ codes, rows: this._rows, q, n, top, accept, a, ...(b > 0 ? { extra: { b, values: lexical } } : {}) }, this._screen);
    if (screened) return { ranked: screened.ranked, product: (slot) => screened.product(slot) };
    const concept = this.liveDots(q);
    blend(a, concept, b, lexical, scratch);
    const ranked = topN(scratch, top, accept);
    return { ranked, product: (slot) => concept[slot] };
  }

  /** Cosine of a unit concept vector with every slot (holes score −Infinity). */
  cosines(vector: Float32Array): Float64Array {
    return this.liveDots(vector).slice();
  }

  /** Dot products with every slot, holes −Infinity: a view overwritten by the next call. */
  private liveDots(vector: Float32Array): Float64Array {
    const out = this._rows.dots(vector, this._slots.length);
    markHoles(this._slots, out);
    return out;
  }

  /**
   * Builds what searches need ahead of time (the 8-bit codes, then every term's BM25 postings,
   * then the TF-IDF norms of Nearby's word match, then a reopened index's section listing),
   * pausing between slices of about sliceMs;
   * resolves true when all is ready, false when aborted. Cheap once done; later edits keep the
   * codes and postings up to date, while the norms (every file's depends on every idf) are built
   * again by the next prepare() or, when none has run, by the first request that needs them.
   */
  async prepare(options: Partial<PrepareOptions> = {}): Promise<boolean> {
    const { sliceMs, signal, pause } = { ...DEFAULT_PREPARE_OPTIONS, ...options };
    for (;;) {
      if (signal?.aborted) return false;
      if (this.prepareSlice(sliceMs)) return true;
      await pause();
    }
  }

  /** One slice of prepare(): works about budgetMs (at least one chunk); true when all is ready. */
  prepareSlice(budgetMs: number): boolean {
    const t0 = performance.now();
    const more = (): boolean => performance.now() - t0 < budgetMs;
    if (!this.fillCodes(more)) return false;
    if (this.settings.lexicalBlend <= 0) return this.fileSavedSections(more);
    if (!this.bm25().prepare(more)) return false;
    if ((this.ranking.nameWeight > 0 || this.ranking.nearbyNameWeight > 0) && !this.stepNames(more)) return false;
    // The TF-IDF norms Nearby's (and an opt-in search's) word match divides by: built after BM25.
    if ((this.ranking.nearbyTfidfShare > 0 || this.ranking.tfidfShare > 0) && this.stepTfidf(more) === null) return false;
    return this.fileSavedSections(more);
  }

  /**
   * Last: a reopened index's saved section listing (SectionStore.fileSaved), one step of its own
   * (about 0.15 s on the Linux tree), which the first section search or the first edit would pay.
   */
  private fileSavedSections(more: () => boolean): boolean {
    if (!this.sections.savedListingPending) return true;
    if (!more()) return false;
    this.sections.fileSaved();
    return true;
  }

  /** Codes the rows not coded yet while more() says so (at least one chunk); true when complete. */
  private fillCodes(more: () => boolean): boolean {
    if (this._codes === undefined) this._codes = ConceptCodes.empty(this.k, this._rows.capacity);
    return !this._codes || this._codes.fill(this._rows.rows, this._slots.length, more);
  }

  /** The 8-bit screening copy of the vectors, made on first use (null without WebAssembly or while prepare is filling it). */
  private codes(): ConceptCodes | null {
    if (this._codes === undefined) this.fillCodes(() => true);
    return this._codes && this._codes.filled >= this._slots.length ? this._codes : null;
  }

  /** Whether a slot may be ranked: occupied, and its path passes the filter. */
  private acceptor(filter: ((path: string) => boolean) | undefined): (slot: number) => boolean {
    const slots = this._slots;
    return filter ? (j) => slots[j] !== null && filter(slots[j]!.meta.path) : (j) => slots[j] !== null;
  }

  /**
   * Works out what foldIn would for a file (its language, tokens, term counts, concept vector and
   * sections' vectors) and keeps none of it: the index, its vocabulary included, is unchanged.
   * Run on a few of the workspace's files while idle, it has the engine optimise the fold's code
   * before a person's first save pays for that (warming a JIT: common practice).
   */
  rehearseFold(meta: DocMeta, text: string): void {
    const language = fileLanguage(meta.path, text, this.settings.tokenize.languages);
    const terms = countTerms(tokenizeIn(text, this.settings.tokenize, language), this.vocab, false);
    projectTerms(this.model, terms);
    foldSections(foldContextOf(this), meta.path, text);
  }

  /**
   * Adds or replaces a document by folding it into the concept space with the frozen model.
   * New words join the vocabulary (and lexical search) but not the concept space until a rebuild.
   */
  foldIn(meta: DocMeta, text: string): DocTerms {
    const language = fileLanguage(meta.path, text, this.settings.tokenize.languages);
    meta = withLanguage(meta, language);
    const tokens = tokenizeIn(text, this.settings.tokenize, language);
    const before = this.vocab.size;
    const terms = countTerms(tokens, this.vocab, true);
    this._changes.folded(terms, before);
    const proj = projectTerms(this.model, terms);
    let s = this._slotOf.get(meta.path);
    const previous = s === undefined ? null : this._slots[s];
    // A file saved again in the language it had leaves every language's count and first slot as they were.
    if (!previous || (previous.meta.language ?? 'en') !== (meta.language ?? 'en')) this._mainLanguage = undefined;
    if (s === undefined) {
      s = this._slots.length;
      this._slots.push(null);
      this._rows.ensureCapacity(this._slots.length);
      this._slotOf.set(meta.path, s);
    }
    this._slots[s] = { meta, terms, folded: true, residual: proj.residual };
    this._rows.setRow(s, proj.vector);
    this._codes?.ensureCapacity(this._slots.length);
    this._codes?.setRow(s, proj.vector);
    this._bm25?.setDocument(s, terms);
    this._namesBuild = null;
    if (this._names) {
      this._names.set(s, this.nameTerms(meta, s), declaringName(meta.path));
      // New words may complete other files' names too, as an index built afresh would have them.
      for (let id = before; id < this.vocab.size && this._unknownNames.size > 0; id++) {
        const waiting = this._unknownNames.get(this.vocab.termOf(id));
        if (!waiting) continue;
        this._unknownNames.delete(this.vocab.termOf(id));
        for (const j of waiting)
          if (j !== s && this._slots[j])
            this._names.set(j, this.nameTerms(this._slots[j]!.meta, j), declaringName(this._slots[j]!.meta.path));
      }
    }
    this.forgetFocus(s, previous?.terms ?? null, terms, previous !== null);
    this.sections.set(meta.path, foldSections(foldContextOf(this), meta.path, text));
    return terms;
  }

  /** Removes a document; returns false when it was not indexed. */
  remove(path: string): boolean {
    const s = this._slotOf.get(path);
    if (s === undefined) return false;
    const wasFolded = this._slots[s]!.folded;
    const previous = this._slots[s]!.terms;
    this._slots[s] = null;
    this._mainLanguage = undefined;
    this._rows.clearRow(s);
    this._codes?.clearRow(s);
    this._slotOf.delete(path);
    this.sections.delete(path);
    this._changes.removed(wasFolded);
    this._bm25?.setDocument(s, null);
    this._names?.set(s, null);
    this._namesBuild = null;
    this.forgetFocus(s, previous, null);
    return true;
  }

  /** lexical = wl·lexical + wt·(TF-IDF score / its maximum) (tfidfCosine.ts); returns that maximum. */
  private addTfidf(q: DocTerms, lexical: Float64Array, wl: number, wt: number, slope: number, exclude = -1): number {
    const norms = this.tfidfNorms();
    if (this._tfidfScores.length !== lexical.length) this._tfidfScores = new Float64Array(lexical.length);
    const t = this._tfidfScores.fill(0);
    const bm25 = this.bm25();
    norms.scoreInto(q, (term, fn) => bm25.forEachHolder(term, fn), t, { slope });
    if (exclude >= 0) t[exclude] = 0;
    const max = divideByMax(t);
    blend(wl, lexical, wt, t, lexical);
    return max;
  }

  /** True when the TF-IDF norms of the current files are built (by prepare() or a first request). */
  get tfidfPrepared(): boolean {
    return this._tfidf !== null;
  }

  /** The TF-IDF norms of the current files, finishing (or starting) their build when prepare() has not. */
  private tfidfNorms(): TfidfNorms {
    return this.stepTfidf(() => true)!;
  }

  /** Builds the TF-IDF norms while more() says so; null until complete. */
  private stepTfidf(more: () => boolean): TfidfNorms | null {
    if (this._tfidf) return this._tfidf;
    this._tfidfBuilder ??= new TfidfNormsBuilder(this._slots.map((s) => s?.terms ?? null));
    this._tfidf = this._tfidfBuilder.step(more);
    if (this._tfidf) this._tfidfBuilder = null;
    return this._tfidf;
  }

  /**
   * After slot s changed from `before` to `after` terms: the TF-IDF norms (every file's depends on
   * every idf) go; of the words' resultants only those of words the file held or holds (no other
   * word's holders or their rows changed); the mean row adds s's block again (inPlace: s was
   * occupied before and still is).
   */
  private forgetFocus(s: number, before: DocTerms | null, after: DocTerms | null, inPlace = false): void {
    this._tfidf = null;
    this._tfidfBuilder = null;
    if (this._resultants.size > 0) for (const d of [before, after]) if (d) for (const t of d.termIds) this._resultants.delete(t);
    this._meanRow?.touched(s, inPlace);
  }

  staleness(): Staleness {
    return this._changes.measure(this._slots, this.size, this.model.residualMean);
  }

  /** Change counters since the last build (persisted with the index). */
  counters(): StalenessCounters {
    return this._changes.counters;
  }

  restoreCounters(c: StalenessCounters): void {
    this._changes.restore(c);
  }

  /** The lexical scorer over all current documents (made on first use, then kept up to date). */
  bm25(): Bm25Scorer {
    if (!this._bm25)
      this._bm25 = new Bm25Scorer(
        this._slots.map((s) => s?.terms ?? null),
        { b: this.ranking.lengthNorm },
      );
    return this._bm25;
  }

  /** The name field of every current file (nameField.ts), made on first use. */
  names(): NameField {
    return this.stepNames(() => true)!;
  }

  /** Builds the name field while more() says so (at least one chunk of files); null until complete. */
  private stepNames(more: () => boolean): NameField | null {
    if (this._names) return this._names;
    if (!this._namesBuild) {
      this._unknownNames.clear();
      this._namesBuild = { field: new NameField(), next: 0 };
    }
    const b = this._namesBuild;
    do {
      const end = Math.min(this._slots.length, b.next + NAMES_CHUNK);
      for (; b.next < end; b.next++) {
        const s = this._slots[b.next];
        if (s) b.field.set(b.next, this.nameTerms(s.meta, b.next), declaringName(s.meta.path));
      }
    } while (b.next < this._slots.length && more());
    if (b.next < this._slots.length) return null;
    this._names = b.field;
    this._namesBuild = null;
    return this._names;
  }

  /**
   * A file's name terms: its path's words (nameField.ts) in its language, numbers left out, words of
   * the vocabulary only; the others are noted, so the fold-in that brings one completes the name.
   */
  private nameTerms(meta: DocMeta, slot: number): DocTerms {
    this._pathTokens ??= new PathNameTokens(this.settings.tokenize);
    const tokens = this._pathTokens.tokens(meta.path, meta.language ?? 'en');
    // countTerms(tokens, vocab, false) with each token looked up once and no maps (a name has a
    // few tokens; the whole tree's 78,300 names are counted on a search's first use of the field).
    const ids: number[] = [];
    for (const t of tokens) {
      const id = this.vocab.idOf(t);
      if (id !== undefined) {
        ids.push(id);
        continue;
      }
      let waiting = this._unknownNames.get(t);
      if (!waiting) this._unknownNames.set(t, (waiting = new Set()));
      waiting.add(slot);
    }
    return countTermIds(ids);
  }

  /**
   * Search: lexical += η·(the name field's BM25 of the query / its maximum)·c^p (nameField.ts
   * searchScoresInto: c the idf-weighted share of the query a name covers, p nameCoverage; code
   * files' names only); returns that maximum (0 when no such name holds a query word).
   */
  private addSearchNames(query: DocTerms, lexical: Float64Array): number {
    const n = lexical.length;
    const extra = this._scratch.subarray(n, 2 * n);
    const max = this.names().searchScoresInto(query, this.queryWeight(query), this.ranking.nameCoverage, extra);
    if (max > 0) addScaled(lexical, this.ranking.nameWeight, extra);
    return max;
  }

  /** A query term's weight in the name field's coverage: its count times its idf in the text (BM25's). */
  queryWeight(query: DocTerms): (i: number) => number {
    const bm25 = this.bm25();
    return (i) => query.counts[i] * bm25.idf(query.termIds[i]);
  }

  /**
   * Nearby: lexical += η·(the name field's BM25 of the query / its maximum), `exclude` left out;
   * returns that maximum (0 when no name holds a query word).
   */
  private addNames(query: DocTerms, lexical: Float64Array, eta: number, delta: number, exclude: number): number {
    const n = lexical.length;
    const extra = this._scratch.subarray(n, 2 * n).fill(0);
    this.names().scoreInto(query, extra, delta, exclude);
    const max = divideByMax(extra);
    addScaled(lexical, eta, extra);
    return max;
  }

  private slot(path: string): number {
    const s = this._slotOf.get(path);
    if (s === undefined) throw new NotIndexedError(path);
    return s;
  }
}

// The loops over every slot live in small functions of their own, which the engine optimises
// whole (loops inside a long method are optimised on their own and leave it at each exit).

/** a[j] /= max(a) when the maximum is positive; returns the maximum (0 when none is positive). */
function divideByMax(a: Float64Array): number {
  let max = 0;
  for (let j = 0; j < a.length; j++) max = Math.max(max, a[j]);
  if (max > 0) for (let j = 0; j < a.length; j++) a[j] /= max;
  return max;
}

/** Standard deviation of v_j·q over every ⌊n/SPREAD_SAMPLE⌋-th occupied slot (all below 2·SPREAD_SAMPLE). */
function conceptSpread(rows: Float32Array, k: number, slots: readonly (DocSlot | null)[], q: Float32Array): number {
  const step = Math.max(1, Math.floor(slots.length / SPREAD_SAMPLE));
  let s = 0;
  let ss = 0;
  let n = 0;
  for (let j = 0; j < slots.length; j += step) {
    if (slots[j] === null) continue;
    let d = 0;
    const o = j * k;
    for (let c = 0; c < k; c++) d += rows[o + c] * q[c];
    s += d;
    ss += d * d;
    n++;
  }
  if (n < 2) return 0;
  const m = s / n;
  return Math.sqrt(Math.max(0, ss / n - m * m));
}

/** Files whose names are made between two looks at the clock while prepare() builds the name field. */
const NAMES_CHUNK = 256;

/** out[j] += w·a[j]. */
function addScaled(out: Float64Array, w: number, a: Float64Array): void {
  for (let j = 0; j < out.length; j++) out[j] += w * a[j];
}

/** out[j] = wa·a[j] + wb·b[j]. */
function blend(wa: number, a: Float64Array, wb: number, b: Float64Array, out: Float64Array): void {
  for (let j = 0; j < out.length; j++) out[j] = wa * a[j] + wb * b[j];
}

function markHoles(slots: readonly (DocSlot | null)[], out: Float64Array): void {
  for (let j = 0; j < slots.length; j++) if (slots[j] === null) out[j] = Number.NEGATIVE_INFINITY;
}
