/**
 * The hidden-link evaluation of suggested links (src/core/links/suggestLinks.ts): a share of a
 * collection's links is hidden (left out of the link graph the suggester sees; the fixtures' texts
 * hold no link addresses, see each fixture's README), every note gets its top-5 suggestions among
 * the notes it is not (visibly) linked with, and a hidden link counts as found when it is among
 * the top 5 of either end. Also: plain TF-IDF cosine as the reference ranking (scikit-learn's
 * TfidfVectorizer defaults: raw counts, smooth idf ln((1+n)/(1+df))+1, L2 rows; written out here on
 * the index's own terms), and the score threshold that best separates hidden links from the other
 * suggestions (best F1), to check on another collection.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { createRandom } from '../../src/core/random.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { LinkGraph } from '../../src/core/links/linkGraph.js';
import { LINKS_WORD_MATCH_DELTA, LINKS_WORD_MATCH_NAMES, LINKS_WORD_MATCH_TFIDF, spaceShare } from '../../src/core/links/suggestLinks.js';

export interface Ranked {
  readonly path: string;
  readonly score: number;
}

/** Ranks the notes for `key` among those `accept` lets through, best first, at most `top`. */
export type Ranker = (key: string, accept: (path: string) => boolean, top: number) => Ranked[];

export interface HiddenSplit {
  /** The graph the suggester sees (hidden links removed). */
  readonly visible: LinkGraph;
  /** Hidden pairs as "a\0b" with a < b. */
  readonly hidden: ReadonlySet<string>;
}

export const pairId = (a: string, b: string): string => (a < b ? `${a}\0${b}` : `${b}\0${a}`);

/** Undirected link pairs from a qrels map (either page linking the other), each once. */
export function linkPairs(qrels: ReadonlyMap<string, ReadonlySet<string>>, keep: (key: string) => boolean): [string, string][] {
  const seen = new Set<string>();
  const out: [string, string][] = [];
  for (const [a, rel] of qrels)
    for (const b of rel) {
      if (a === b || !keep(a) || !keep(b)) continue;
      const id = pairId(a, b);
      if (seen.has(id)) continue;
      seen.add(id);
      out.push(a < b ? [a, b] : [b, a]);
    }
  return out.sort((x, y) => (x[0] < y[0] ? -1 : x[0] > y[0] ? 1 : x[1] < y[1] ? -1 : 1));
}

/** Hides a seeded random `share` of the pairs. */
export function hideLinks(keys: readonly string[], pairs: readonly [string, string][], share: number, seed: number): HiddenSplit {
  const rnd = createRandom(seed);
  const order = pairs.map((p, i) => ({ p, r: rnd.next(), i })).sort((a, b) => a.r - b.r || a.i - b.i);
  const cut = Math.round(order.length * share);
  const hidden = new Set(order.slice(0, cut).map(({ p }) => pairId(p[0], p[1])));
  const visible = LinkGraph.fromPairs(
    keys,
    order.slice(cut).map(({ p }) => p),
  );
  return { visible, hidden };
}

export interface Candidate {
  readonly from: string;
  readonly to: string;
  readonly score: number;
  readonly hidden: boolean;
}

/** Every note's top-`top` candidates among the notes it is not visibly linked with. */
export function candidates(keys: readonly string[], split: HiddenSplit, rank: Ranker, top = 5): Candidate[] {
  const out: Candidate[] = [];
  for (const a of keys) {
    for (const h of rank(a, (p) => p !== a && !split.visible.linked(a, p), top))
      out.push({ from: a, to: h.path, score: h.score, hidden: split.hidden.has(pairId(a, h.path)) });
  }
  return out;
}

export interface ThresholdFigures {
  readonly threshold: number;
  /** Hidden links found (top 5 of either end, score ≥ threshold) / hidden links. */
  readonly recall: number;
  /** Suggested pairs (distinct) that are hidden links / suggested pairs. */
  readonly precision: number;
  readonly f1: number;
  /** Notes left with no suggestion. */
  readonly quietShare: number;
}

export function atThreshold(cands: readonly Candidate[], hiddenCount: number, notes: number, threshold: number): ThresholdFigures {
  const pairs = new Map<string, boolean>();
  const speaking = new Set<string>();
  for (const c of cands)
    if (c.score >= threshold) {
      pairs.set(pairId(c.from, c.to), c.hidden);
      speaking.add(c.from);
    }
  let found = 0;
  for (const h of pairs.values()) if (h) found++;
  const recall = hiddenCount ? found / hiddenCount : 0;
  const precision = pairs.size ? found / pairs.size : 0;
  const f1 = recall + precision > 0 ? (2 * recall * precision) / (recall + precision) : 0;
  return { threshold, recall, precision, f1, quietShare: notes ? 1 - speaking.size / notes : 0 };
}

/** The threshold (one of the candidates' scores) with the best F1; ties: the lower threshold. */
export function bestThreshold(cands: readonly Candidate[], hiddenCount: number, notes: number): ThresholdFigures {
  const scores = [...new Set(cands.map((c) => Math.round(c.score * 1000) / 1000))].sort((a, b) => a - b);
  let best = atThreshold(cands, hiddenCount, notes, -Infinity);
  for (const t of scores) {
    const f = atThreshold(cands, hiddenCount, notes, t);
    if (f.f1 > best.f1) best = f;
  }
  return best;
}

/**
 * Undertone's Nearby ranking (concept cosine blended with BM25) as the link suggestions use it (their
 * word match's δ, LINKS_WORD_MATCH_DELTA, and TF-IDF share, LINKS_WORD_MATCH_TFIDF), each hit carrying the score the suggestions' threshold
 * applies to: the discounted concept cosine (suggestLinks.ts says why).
 */
export function nearbyRanker(index: LsiIndex): Ranker {
  const share = new Map(index.paths().map((p) => [p, spaceShare(index, p)]));
  return (key, accept, top) =>
    index
      .nearby(key, {
        top,
        filter: accept,
        wordMatchDelta: LINKS_WORD_MATCH_DELTA,
        wordMatchTfidf: LINKS_WORD_MATCH_TFIDF,
        wordMatchNames: LINKS_WORD_MATCH_NAMES,
      })
      .map((h) => ({ path: h.path, score: h.conceptScore * share.get(key)! * share.get(h.path)! }));
}

/** Plain TF-IDF cosine over the index's raw terms (TfidfVectorizer defaults, see the header). */
export function tfidfRanker(index: LsiIndex): Ranker {
  const keys = index.paths();
  const n = keys.length;
  const df = new Map<number, number>();
  for (const k of keys) for (const t of index.termsOf(k).termIds) df.set(t, (df.get(t) ?? 0) + 1);
  const idf = (t: number): number => Math.log((1 + n) / (1 + df.get(t)!)) + 1;
  const postings = new Map<number, { doc: number; w: number }[]>();
  const rows = keys.map((k, doc) => {
    const { termIds, counts } = index.termsOf(k);
    const w = Array.from(termIds, (t, i) => counts[i] * idf(t));
    const norm = Math.sqrt(w.reduce((acc, v) => acc + v * v, 0)) || 1;
    const row = Array.from(termIds, (t, i) => ({ t, w: w[i] / norm }));
    for (const { t, w: v } of row) {
      let list = postings.get(t);
      if (!list) postings.set(t, (list = []));
      list.push({ doc, w: v });
    }
    return row;
  });
  const slotOf = new Map(keys.map((k, i) => [k, i]));
  return (key, accept, top) => {
    const scores = new Float64Array(n);
    for (const { t, w } of rows[slotOf.get(key)!]) for (const p of postings.get(t)!) scores[p.doc] += w * p.w;
    const best: number[] = []; // the top indices, best first (ties: the lower index)
    for (let i = 0; i < n; i++) {
      if (best.length === top && scores[i] <= scores[best[top - 1]]) continue;
      if (!accept(keys[i])) continue;
      let at = best.length;
      while (at > 0 && scores[best[at - 1]] < scores[i]) at--;
      best.splice(at, 0, i);
      if (best.length > top) best.pop();
    }
    return best.map((i) => ({ path: keys[i], score: scores[i] }));
  };
}

/** Each page's links with their visible words (a fixture's anchors.jsonl.gz, scripts/fixtures/doc_links.py). */
export function loadAnchors(dir: string): Map<string, [string, string][]> {
  const text = gunzipSync(readFileSync(join(dir, 'anchors.jsonl.gz'))).toString('utf8');
  const out = new Map<string, [string, string][]>();
  for (const line of text.split('\n'))
    if (line.length > 0) {
      const { id, links } = JSON.parse(line) as { id: string; links: [string, string][] };
      out.set(id, links);
    }
  return out;
}

/**
 * The stricter reading of "hide a link": its visible words leave the text as well. Each hidden
 * link's words are cut from its page once (the first place they still stand; a page links the
 * same words from one place in most cases, and the count of words cut is right either way).
 */
export function withoutHiddenAnchors(
  docs: readonly { id: string; text: string }[],
  anchors: ReadonlyMap<string, readonly [string, string][]>,
  hidden: ReadonlySet<string>,
): { id: string; text: string; cut: number }[] {
  return docs.map((d) => {
    let text = d.text;
    let cut = 0;
    for (const [to, words] of anchors.get(d.id) ?? []) {
      if (!hidden.has(pairId(d.id, to))) continue;
      const at = text.indexOf(words);
      if (at < 0) continue;
      text = `${text.slice(0, at)} ${text.slice(at + words.length)}`;
      cut++;
    }
    return { id: d.id, text, cut };
  });
}
