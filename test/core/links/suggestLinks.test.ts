/**
 * suggestLinks on real pages (80 pages of the Django manual, Debian python-django-doc,
 * test/fixtures/django-doc) with a link graph taken from the manual's own links: the contract
 * (no linked pair, threshold, words that add up to the similarity, each pair once for the whole
 * collection). How well it finds links: suggestLinks.eval.test.ts.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../../src/core/errors.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { LinkGraph } from '../../../src/core/links/linkGraph.js';
import {
  explainSimilarity,
  LINKS_WORD_MATCH_DELTA,
  LINKS_WORD_MATCH_NAMES,
  LINKS_WORD_MATCH_TERMS,
  LINKS_WORD_MATCH_TFIDF,
  spaceShare,
  suggestAllLinks,
  suggestLinks,
  unlinkedNeighbours,
} from '../../../src/core/links/suggestLinks.js';
import { DEFAULT_RANKING_OPTIONS } from '../../../src/core/index/search/fusion.js';
import { linkPairs } from '../../helpers/linkEval.js';
import { loadRankingFixture } from '../../helpers/rankingChecks.js';

let index: LsiIndex;
let graph: LinkGraph;
beforeAll(() => {
  const fx = loadRankingFixture('django-doc');
  const docs = fx.docs.filter((d) => d.id.startsWith('topics/') || d.id.startsWith('ref/models/')).slice(0, 80);
  const builder = new IndexBuilder();
  for (const d of docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  index = builder.build();
  const keep = new Set(docs.map((d) => d.id));
  graph = LinkGraph.fromPairs(
    index.paths(),
    linkPairs(fx.qrels, (k) => keep.has(k)),
  );
});

describe('suggestLinks', () => {
  it('suggests no note linked either way, at most top, none below the threshold, best Nearby score first', () => {
    let some = 0;
    for (const key of index.paths()) {
      const got = suggestLinks(index, graph, key, { top: 3, minSimilarity: 0.1 });
      some += got.length;
      expect(got.length).toBeLessThanOrEqual(3);
      for (const s of got) {
        expect(graph.linked(key, s.path)).toBe(false);
        expect(s.path).not.toBe(key);
        expect(s.similarity).toBeGreaterThanOrEqual(0.1);
      }
      for (let i = 1; i < got.length; i++) expect(got[i - 1].score).toBeGreaterThanOrEqual(got[i].score);
    }
    expect(some).toBeGreaterThan(0);
  });

  it('gives the words behind each suggestion; all their shares add up to the similarity', () => {
    const key = index.paths().find((k) => suggestLinks(index, graph, k).length > 0)!;
    const [s] = suggestLinks(index, graph, key);
    expect(s.terms.length).toBe(5);
    const e = explainSimilarity(index, key, s.path);
    expect(e.terms.reduce((a, t) => a + t.share, 0)).toBeCloseTo(s.similarity, 4);
    expect(s.similarity).toBeCloseTo(
      index.nearby(key, { top: index.size, filter: (p) => p === s.path })[0].conceptScore *
        spaceShare(index, key) *
        spaceShare(index, s.path),
      6,
    );
  });

  it("ranks with classic BM25 in the word match (δ 0, no TF-IDF share, no name field, 40 top words, where the threshold was calibrated), not Nearby's", () => {
    expect(LINKS_WORD_MATCH_DELTA).toBe(0);
    expect(LINKS_WORD_MATCH_TFIDF).toBe(0);
    expect(LINKS_WORD_MATCH_NAMES).toBe(0);
    expect(LINKS_WORD_MATCH_TERMS).toBe(40);
    expect(DEFAULT_RANKING_OPTIONS.nearbyDelta).toBeGreaterThan(0);
    let differ = 0;
    for (const key of index.paths()) {
      const filter = (p: string): boolean => p !== key && graph.notes.has(p) && !graph.linked(key, p);
      const got = unlinkedNeighbours(index, graph, key, 5);
      const classic = index.nearby(key, { top: 5, filter, wordMatchDelta: 0, wordMatchTfidf: 0, wordMatchNames: 0, wordMatchTerms: 40 });
      expect(got.map((h) => [h.path, h.score])).toEqual(classic.map((h) => [h.path, h.score]));
      if (index.nearby(key, { top: 5, filter }).some((h, i) => h.score !== classic[i]?.score)) differ++;
    }
    // The two word matches do differ on these pages, so the check above can tell them apart.
    expect(differ).toBeGreaterThan(0);
  });

  it('is empty for a note not in the index, and at a threshold of 1', () => {
    expect(suggestLinks(index, graph, 'nowhere.md')).toEqual([]);
    expect(suggestLinks(index, graph, index.paths()[0], { minSimilarity: 1 })).toEqual([]);
  });

  it('refuses a threshold outside [-1, 1] and a top below 1', () => {
    expect(() => suggestLinks(index, graph, index.paths()[0], { minSimilarity: 2 })).toThrow(InvalidInputError);
    expect(() => unlinkedNeighbours(index, graph, index.paths()[0], 0)).toThrow(InvalidInputError);
  });
});

describe('suggestAllLinks', () => {
  it('lists each unlinked pair once, most similar first, each as one of its notes suggests it', () => {
    const all = suggestAllLinks(index, graph, { minSimilarity: 0.1 });
    expect(all.length).toBeGreaterThan(0);
    const ids = all.map((s) => [s.from, s.path].sort().join('\0'));
    expect(new Set(ids).size).toBe(ids.length);
    for (let i = 1; i < all.length; i++) expect(all[i - 1].similarity).toBeGreaterThanOrEqual(all[i].similarity);
    for (const s of all) {
      expect(graph.linked(s.from, s.path)).toBe(false);
      expect(suggestLinks(index, graph, s.from, { minSimilarity: 0.1 }).map((x) => x.path)).toContain(s.path);
    }
  });
});
