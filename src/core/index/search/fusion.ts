/**
 * How search and nearby combine their evidence (one default configuration for every workspace).
 *
 * - Nearby: the concept cosine beside full-term-space evidence. A file's lexical query is its
 *   `nearbyTerms` most distinctive terms (log(1 + tf)·idf, the BM25 idf) with their counts, scored
 *   by BM25 against every other file and divided by the best other file's score (0…1). The
 *   selection of a file's top terms as its query is the classic "more like this" query of
 *   relevance feedback (Salton & Buckley 1990, "Improving retrieval performance by relevance
 *   feedback"); 25–50 terms is common practice. Opt-in (off): a share of TF-IDF cosine
 *   (nearbyTfidfShare, tfidfCosine.ts) of the file's top terms against every other file's full
 *   term vector, divided by the best other file's, in the word match or taken from the concept part.
 * - Search: the concept cosine of the query, blended with max-normalised BM25
 *   (settings.lexicalBlend, raised by the share of the query's words the concept space does not
 *   know: coverageBlend); optionally (spreadBlend) that share applies to standardised scores
 *   (spreadShare: each part weighed by the inverse of its standard deviation over the files,
 *   Montague & Aslam 2001), so the raw share adapts to each query. Then pseudo-relevance
 *   feedback: the query's concept vector moves
 *   towards the mean concept vector of the first pass's `feedbackDocs` best files, by
 *   `feedbackWeight` (Rocchio 1971, "Relevance feedback in information retrieval"; in the LSI
 *   space as in Dumais 1991, "Improving the retrieval of information from external sources").
 * - User feedback ("more like this" / "fewer like this"): Rocchio with the chosen files,
 *   q' = q + β·mean(liked) − γ·mean(unliked) in the concept space (β = 0.75, γ = 0.25, the values
 *   Salton & Buckley 1990 report as robust), and the liked files' top terms join the lexical query.
 * - Questions: filler words of questions ("happens", "tell me", "the code that") are dropped from a
 *   query when something else remains (our own list, common practice: stop words for queries).
 * - Length normalisation: BM25's b is 0.3 for nearby (a whole file's top terms as the query), below
 *   the common 0.75 that search keeps; 0.75 let long pages crowd out the linked short ones.
 *   Nearby's word match takes BM25L's form (nearbyDelta, Lv & Zhai 2011), which keeps a long file's
 *   matches from sinking towards zero; the link suggestions keep classic BM25 (δ 0, suggestLinks.ts).
 * - Name field (nameField.ts): the words of a file's path, scored by BM25 over the names alone and
 *   added to the word match (search: the query against code files' names, by the share of the query
 *   a name covers, nameWeight and nameCoverage; Nearby: the page's
 *   top words against the others' names and the page's own name words against the others' text,
 *   nearbyNameWeight); the link suggestions keep theirs without it (suggestLinks.ts).
 * - Query-word focus (termFocus.ts): in the concept fold of a search, a word weighs by how tightly
 *   its files sit together in the concept space beyond chance, relative to the query's most
 *   focused word.
 * Every choice was validated by leaving one collection out (docs/ranking-checks.md;
 * scripts/fixtures/rankingFusionExplore.ts).
 */
import { STOP_WORDS } from '../../text/stopWords.js';
import type { DocTerms } from '../../counting/termCounts.js';

export interface RankingOptions {
  /** Share of the lexical part in nearby scores, 0…1 (0 = concept cosine only). @default 0.5 */
  nearbyLexical: number;
  /**
   * Most distinctive terms of a file that form its lexical query (Nearby, and a liked file's part
   * of a search). 25–50 is common practice for "more like this" queries; chosen among 20, 40, 60,
   * 80, 100, 120, 160, 240 and all of the page's terms by leaving one manual out: every fold picks
   * 60 or 80 and gains on the manual left out; 80 has the best worst share (docs/ranking-checks.md,
   * seventh round). The link suggestions keep 40 (suggestLinks.ts). @default 80
   */
  nearbyTerms: number;
  /** First-pass files whose mean concept vector is added to a query (0 = no feedback). @default 5 */
  feedbackDocs: number;
  /** Weight of that mean (the query vector has weight 1). @default 0.25 */
  feedbackWeight: number;
  /** Rocchio weight of files marked "more like this". @default 0.75 */
  likeWeight: number;
  /** Rocchio weight of files marked "fewer like this". @default 0.25 */
  unlikeWeight: number;
  /** Drop question filler words from queries when other words remain. @default true */
  dropFiller: boolean;
  /**
   * Raise a query's lexical share by the idf-weighted share u of its words that the concept space
   * does not know (pruned as too rare or too common): λ_q = λ + (1 − λ)·u. No constant to fit:
   * what the concept cosine cannot see, only the word match can score. On by default since it was
   * the one lever that moved both code collections the same way (rxjs +1.0%, lodash +1.3% MRR@10;
   * the four dev collections within ±0.2% MAP; docs/ranking-checks.md). @default true
   */
  coverageBlend: boolean;
  /**
   * BM25 length normalisation b of search (Robertson & Zaragoza 2009 give 0.75 as common
   * practice). @default 0.75
   */
  lengthNorm: number;
  /** BM25 length normalisation b of nearby's lexical part (a file's top terms as the query). @default 0.3 */
  nearbyLengthNorm: number;
  /**
   * Search: weigh each part by the inverse of its score spread over the files (z-score fusion),
   * so the blend share λ applies to standardised scores: λ_q = (λ/σ_lex)/((1 − λ)/σ_cos + λ/σ_lex).
   * Off by default: with λ = 0.6 and b = 0.5 it puts code search and CACM within 1% of BM25 but
   * costs CRAN, ADI and two demo questions (docs/ranking-checks.md). @default false
   */
  spreadBlend: boolean;
  /**
   * Search: each query word's weight in the concept fold is its focus relative to the query's most
   * focused word, to this power (termFocus.ts); 0 = off. The word match is left as it is (weighing
   * it too cost CACM 6%). @default 1
   */
  termFocus: number;
  /**
   * BM25L's δ for nearby's word match (Lv & Zhai 2011, "When documents are very long, BM25 fails!";
   * 0.5 is the value they recommend); 0 = classic BM25. Chosen by every leave-one-manual-out fold
   * and above the default without it on all three manuals (share of the best plain baseline, δ 0 →
   * 0.5: CMake 1.012 → 1.052, Django 1.017 → 1.019, Sphinx 1.006 → 1.011; docs/ranking-checks.md).
   * The link suggestions pass their own δ (core/links/suggestLinks.ts,
   * LINKS_WORD_MATCH_DELTA = 0), where their similarity threshold was calibrated. @default 0.5
   */
  nearbyDelta: number;
  /**
   * Search: share ν of the word match given to TF-IDF cosine over the full term space
   * (tfidfCosine.ts), max-normalised like BM25: lexical = (1 − ν)·BM25/max + ν·TFIDF/max.
   * 0 = BM25 alone. Off: measured in the third search round and not chosen by every
   * leave-one-out fold (docs/ranking-checks.md); explanations still split the word match as
   * BM25 alone. @default 0
   */
  tfidfShare: number;
  /** Pivoted normalisation slope of that TF-IDF score (tfidfCosine.ts; 1 = cosine). @default 1 */
  tfidfSlope: number;
  /**
   * Take TF-IDF's share ν from the concept part instead of the word match:
   * (1 − λ)(1 − ν)·cos + λ·BM25/max + (1 − λ)ν·TFIDF/max. @default false
   */
  tfidfFromConcept: boolean;
  /**
   * Nearby: share ν of the word match given to the TF-IDF cosine of the page's full term vector
   * (tfidfCosine.ts; Salton & Buckley 1988's ltc weights, scikit-learn's TfidfVectorizer form),
   * divided by the best other page's: lexical = (1 − ν)·BM25L/max + ν·TFIDF/max. Chosen by every
   * leave-one-manual-out fold among twelve configurations (ν 0.1 / 0.25 / 0.5, pivoted, taken from
   * the concept part, or over the page's top terms; docs/ranking-checks.md, fourth round), but
   * off by default: over every word of the page it took Nearby of a file on the whole kernel tree
   * from a median of 12 ms to 52–60 ms (p95 135–168 ms). Over the page's top words
   * (nearbyTfidfTerms) it is affordable, but in the fifth round leaving one manual out no longer
   * gained on every manual (CMake's fold chose a form that cost CMake 7%), so it stays off. @default 0
   */
  nearbyTfidfShare: number;
  /**
   * Nearby: how many of the page's most distinctive words (log(1 + tf)·idf, as `nearbyTerms` picks
   * them) form the TF-IDF part's query; 0 = every word of the page. Each word's postings are read
   * once per request, so this bounds the part's cost as `nearbyTerms` bounds BM25's; the pages'
   * norms stay those of their full term vectors. @default 40
   */
  nearbyTfidfTerms: number;
  /**
   * Nearby: take the TF-IDF share ν from the concept part instead of the word match:
   * (1 − μ)(1 − ν)·cos + μ·BM25L/max + (1 − μ)ν·TFIDF/max. With ν 0.25 over 80 top words it
   * raised all three manuals (docs/ranking-checks.md, fifth round) but was chosen by two folds of
   * three and cost Nearby of a file about 12 ms more CPU on the whole kernel tree. @default false
   */
  nearbyTfidfFromConcept: boolean;
  /**
   * Search: weight η of the name field (nameField.ts: the words of a code file's path, scored by
   * BM25 over the names alone, times the share of the query the name covers to the power
   * nameCoverage): word match = BM25/max + η·c^p·names/max. 0 = the body alone. Plain (p 0, every
   * file's name) η .5 gained on both code collections (rxjs +8.8%, lodash +10%) but took three of
   * the demo's questions out of the top 3. With the two guards (code files' names, coverage) the
   * configurations that keep every demo question in its place were compared leaving one code
   * collection out; each fold gains on the one left out, and η .5, p 1 has the best worst share
   * (docs/ranking-checks.md, seventh round). The four abstract collections do not move (their
   * files' names are numbers). @default 0.5
   */
  nameWeight: number;
  /**
   * Search: the power p of the share c of the query (idf-weighted) a file's name covers, by which
   * its name score counts (0 = the plain score). @default 1
   */
  nameCoverage: number;
  /**
   * Nearby: weight η of the name field in both directions: the page's top words against the other
   * files' names, and the page's own name words against the other files' text (BM25L, δ as the
   * word match's): word match = BM25L/max + η·names/max + η·BM25L(own name)/max. Chosen among 0,
   * .2, .25, .35 and .5 by leaving one manual out (each fold gains on the manual left out); .35 has
   * the best worst share on all three (docs/ranking-checks.md, sixth round). @default 0.35
   */
  nearbyNameWeight: number;
}

export const DEFAULT_RANKING_OPTIONS: Readonly<RankingOptions> = Object.freeze({
  nearbyLexical: 0.5,
  nearbyTerms: 80,
  feedbackDocs: 5,
  feedbackWeight: 0.25,
  likeWeight: 0.75,
  unlikeWeight: 0.25,
  dropFiller: true,
  coverageBlend: true,
  lengthNorm: 0.75,
  nearbyLengthNorm: 0.3,
  spreadBlend: false,
  termFocus: 1,
  nearbyDelta: 0.5,
  tfidfShare: 0,
  tfidfSlope: 1,
  tfidfFromConcept: false,
  nearbyTfidfShare: 0,
  nearbyTfidfTerms: 40,
  nearbyTfidfFromConcept: false,
  nameWeight: 0.5,
  nameCoverage: 1,
  nearbyNameWeight: 0.35,
});

/** About how many files give the spread of concept scores (every file below twice this; common practice). */
export const SPREAD_SAMPLE = 2048;

/**
 * The lexical share of a blend of standardised scores, as a share of the raw scores:
 * (1 − λ)·(c − m_c)/σ_c + λ·(l − m_l)/σ_l ranks as (1 − λ_q)·c + λ_q·l with
 * λ_q = (λ/σ_l)/((1 − λ)/σ_c + λ/σ_l) (score normalisation by mean and standard deviation,
 * Montague & Aslam 2001, "Relevance score normalization for metasearch"). λ when a spread vanishes.
 */
export function spreadShare(lambda: number, sdConcept: number, sdLexical: number): number {
  if (!(sdConcept > 1e-12) || !(sdLexical > 1e-12) || lambda <= 0 || lambda >= 1) return lambda;
  const l = lambda / sdLexical;
  return l / ((1 - lambda) / sdConcept + l);
}

/** Standard deviation of a[j] over the slots where live(j). */
export function spreadOf(a: Float64Array, live: (j: number) => boolean): number {
  let s = 0;
  let ss = 0;
  let n = 0;
  for (let j = 0; j < a.length; j++) {
    if (!live(j)) continue;
    const x = a[j];
    s += x;
    ss += x * x;
    n++;
  }
  if (n < 2) return 0;
  const m = s / n;
  return Math.sqrt(Math.max(0, ss / n - m * m));
}

/**
 * Words that ask rather than say what is sought (beyond the stop words, which go anyway). Our own
 * list, common practice for question answering over search engines.
 */
export const QUESTION_FILLER: readonly string[] = `
happen happens happened happening whether wonder please tell explain someone somebody something
anything anyone anybody really actually exactly just maybe perhaps basically
`
  .split(/\s+/)
  .filter((w) => w.length > 0 && !STOP_WORDS.has(w));

/** "the code that …", "the file where …": a pointing noun before a relative word, dropped with it kept. */
const POINTING = /\b(?:code|file|files|function|functions|place)\s+(?=(?:that|which|where|whose|who)\b)/giu;

/** The query text with pointing nouns of relative clauses removed ("where is the code that sends" → "where is the that sends"). */
export function stripPointing(text: string): string {
  return text.replace(POINTING, '');
}

/**
 * The `count` terms of a document with the highest log(1 + tf)·idf, with their counts, in term-id
 * order (ties: lower id first). `idf` gives a term's inverse document frequency.
 */
export function distinctiveTerms(doc: DocTerms, count: number, idf: (termId: number) => number): DocTerms {
  const n = doc.termIds.length;
  if (n <= count) return { termIds: Int32Array.from(doc.termIds), counts: Float32Array.from(doc.counts), length: doc.length };
  const score = new Float64Array(n);
  for (let i = 0; i < n; i++) score[i] = Math.log1p(doc.counts[i]) * idf(doc.termIds[i]);
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => score[b] - score[a] || a - b);
  const kept = order.slice(0, count).sort((a, b) => a - b);
  let length = 0;
  for (const i of kept) length += doc.counts[i];
  return { termIds: Int32Array.from(kept, (i) => doc.termIds[i]), counts: Float32Array.from(kept, (i) => doc.counts[i]), length };
}

/** Adds the terms of b into a (both in ascending term order), counts summed. */
export function mergeTerms(a: DocTerms, b: DocTerms): DocTerms {
  const ids: number[] = [];
  const counts: number[] = [];
  let i = 0;
  let j = 0;
  while (i < a.termIds.length || j < b.termIds.length) {
    const ta = i < a.termIds.length ? a.termIds[i] : Infinity;
    const tb = j < b.termIds.length ? b.termIds[j] : Infinity;
    if (ta === tb) {
      ids.push(ta);
      counts.push(a.counts[i++] + b.counts[j++]);
    } else if (ta < tb) {
      ids.push(ta);
      counts.push(a.counts[i++]);
    } else {
      ids.push(tb);
      counts.push(b.counts[j++]);
    }
  }
  return { termIds: Int32Array.from(ids), counts: Float32Array.from(counts), length: a.length + b.length };
}

/**
 * unit(q + Σ_i w_i·mean(vectors_i)) for unit rows, with the factor `scale` = 1/‖q + Σ…‖ that the
 * original q carries in it (explanations split a cosine into the query's part and the rest);
 * null when the sum vanishes.
 */
export function rocchio(
  q: Float32Array,
  parts: readonly { weight: number; vectors: readonly Float32Array[] }[],
): { vector: Float32Array; scale: number } | null {
  const acc = Float64Array.from(q);
  for (const { weight, vectors } of parts) {
    if (vectors.length === 0 || weight === 0) continue;
    const w = weight / vectors.length;
    for (const v of vectors) for (let c = 0; c < acc.length; c++) acc[c] += w * v[c];
  }
  let ss = 0;
  for (let c = 0; c < acc.length; c++) ss += acc[c] * acc[c];
  if (!(ss > 1e-24)) return null;
  const norm = Math.sqrt(ss);
  return { vector: Float32Array.from(acc, (x) => x / norm), scale: 1 / norm };
}
