/**
 * Suggested links, measured on real documentation nobody here wrote (provenance in each
 * fixture's README): the HTML manuals of Debian packages python-django-doc
 * (3:3.2.25-0+deb12u7; test/fixtures/django-doc, 258 pages), cmake-doc (3.25.1-1;
 * test/fixtures/cmake-doc, 1,906 pages) and sphinx-doc (5.3.0-4; test/fixtures/sphinx-doc, 91
 * pages), whose pages link to each other. Two pages are linked when either links to the other
 * (the fixtures' qrels, scripts/fixtures/doc_links.py); the indexed texts hold no link addresses.
 * A fifth of the links is hidden from the suggester (seeded), in two readings: the link unwrapped
 * (its visible words stay in the text, as in the fixtures' texts) and the link cut with its
 * visible words (anchors.jsonl.gz); every page gets its top 5 suggestions among the pages it is
 * not visibly linked with; a hidden link is found when it is among the top 5 of either end
 * (test/helpers/linkEval.ts). Reference: plain TF-IDF cosine in the same run on the same terms
 * (scikit-learn TfidfVectorizer's defaults, written out in the helper). The threshold
 * (src/core/links/suggestLinks.ts) is fitted on each tree (words cut) and checked on the others.
 * The share hidden (a fifth) and the floors (measured figure less a margin) are our choices.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { LinkGraph } from '../../../src/core/links/linkGraph.js';
import { DEFAULT_MIN_SIMILARITY, suggestLinks } from '../../../src/core/links/suggestLinks.js';
import {
  atThreshold,
  bestThreshold,
  candidates,
  hideLinks,
  linkPairs,
  loadAnchors,
  nearbyRanker,
  tfidfRanker,
  withoutHiddenAnchors,
  type Candidate,
  type HiddenSplit,
} from '../../helpers/linkEval.js';
import { buildFixtureIndex, loadRankingFixture } from '../../helpers/rankingChecks.js';
import { fixturePath, loadCollection } from '../../helpers/shared.js';

const HIDDEN_SHARE = 0.2;

interface Run {
  readonly nearby: Candidate[];
  readonly tfidf: Candidate[];
  readonly hidden: number;
  readonly notes: number;
}

interface Tree {
  readonly name: string;
  /** Hidden links unwrapped: their words stay in the text (the fixtures' texts). */
  readonly kept: Run[];
  /** Hidden links cut with their words (withoutHiddenAnchors). */
  readonly cut: Run[];
}

function runOn(index: LsiIndex, split: HiddenSplit): Run {
  const keys = index.paths();
  return {
    nearby: candidates(keys, split, nearbyRanker(index)),
    tfidf: candidates(keys, split, tfidfRanker(index)),
    hidden: split.hidden.size,
    notes: keys.length,
  };
}

/** Both readings of "hide a link" on one tree, a split per seed. */
function evaluate(name: string, seeds: readonly number[]): Tree {
  const fx = loadRankingFixture(name);
  const anchors = loadAnchors(fixturePath(name));
  const index = buildFixtureIndex(fx);
  const keys = index.paths();
  const pairs = linkPairs(fx.qrels, (k) => index.has(k));
  const kept: Run[] = [];
  const cut: Run[] = [];
  for (const seed of seeds) {
    const split = hideLinks(keys, pairs, HIDDEN_SHARE, seed);
    kept.push(runOn(index, split));
    const builder = new IndexBuilder();
    for (const d of withoutHiddenAnchors(fx.docs, anchors, split.hidden))
      builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    cut.push(runOn(builder.build(), split));
  }
  return { name, kept, cut };
}

const recall = (c: Candidate[], r: Run): number => atThreshold(c, r.hidden, r.notes, -Infinity).recall;
const fmt = (xs: number[]): string => `${xs.map((x) => x.toFixed(3)).join(' / ')}`;
/** A tree's best-F1 threshold: the mean over its splits (hidden links cut with their words). */
const fitOf = (t: Tree): number => t.cut.reduce((s, r) => s + bestThreshold(r.nearby, r.hidden, r.notes).threshold, 0) / t.cut.length;

describe('hidden links found in the top 5 of either end (a fifth of the links hidden)', () => {
  let trees: Map<string, Tree>;
  beforeAll(() => {
    trees = new Map(
      [evaluate('django-doc', [1, 2, 3]), evaluate('cmake-doc', [1]), evaluate('sphinx-doc', [1, 2, 3])].map((t) => [t.name, t]),
    );
    for (const t of trees.values())
      for (const reading of ['kept', 'cut'] as const)
        console.log(
          `${t.name} recall@5 (either end), hidden links' words ${reading}: Nearby ${fmt(t[reading].map((r) => recall(r.nearby, r)))}; TF-IDF cosine ${fmt(t[reading].map((r) => recall(r.tfidf, r)))}`,
        );
  }, 900_000);

  // Floors: the measured figures (report of issue 16) less a margin, our choice.
  it.each([
    ['django-doc', 0.5, 0.44, 1.1],
    ['cmake-doc', 0.36, 0.29, 1.1],
  ] as const)('%s: Nearby finds more hidden links than TF-IDF cosine, words kept and words cut', (name, keptFloor, cutFloor, ratio) => {
    const t = trees.get(name)!;
    t.kept.forEach((r) => {
      expect(recall(r.nearby, r)).toBeGreaterThanOrEqual(keptFloor);
      expect(recall(r.nearby, r)).toBeGreaterThan(ratio * recall(r.tfidf, r));
    });
    t.cut.forEach((r) => {
      expect(recall(r.nearby, r)).toBeGreaterThanOrEqual(cutFloor);
      expect(recall(r.nearby, r)).toBeGreaterThan(ratio * recall(r.tfidf, r));
    });
  });

  // The small Sphinx manual (91 pages) is where Nearby does not win: measured 0.629 / 0.710 /
  // 0.645 against TF-IDF's 0.742 / 0.726 / 0.710 (words kept), 0.548 / 0.677 / 0.597 against
  // 0.677 / 0.661 / 0.613 (words cut). The check: it finds half the hidden links, and stays
  // within a fifth of TF-IDF's figure on each split.
  it('sphinx-doc: Nearby finds half the hidden links, below TF-IDF cosine by less than a fifth', () => {
    for (const r of [...trees.get('sphinx-doc')!.kept, ...trees.get('sphinx-doc')!.cut]) {
      expect(recall(r.nearby, r)).toBeGreaterThanOrEqual(0.5);
      expect(recall(r.nearby, r)).toBeGreaterThan(0.8 * recall(r.tfidf, r));
    }
  });

  it('each tree’s threshold, fitted on the other two trees, beats no threshold there; the default is the mean of the three fits', () => {
    const fits = new Map([...trees.values()].map((t) => [t.name, fitOf(t)]));
    console.log(
      `best-F1 similarity (words cut): ${[...fits].map(([n, f]) => `${n} ${f.toFixed(3)}`).join(', ')}; default ${DEFAULT_MIN_SIMILARITY}`,
    );
    for (const t of trees.values()) {
      const others = [...fits].filter(([n]) => n !== t.name).map(([, f]) => f);
      const held = others.reduce((a, b) => a + b, 0) / others.length;
      for (const r of t.cut) {
        const on = (x: number) => atThreshold(r.nearby, r.hidden, r.notes, x);
        const [none, atHeld, dflt] = [on(-Infinity), on(held), on(DEFAULT_MIN_SIMILARITY)];
        console.log(
          `${t.name} F1: none ${none.f1.toFixed(4)}, at the others' fit ${held.toFixed(3)} ${atHeld.f1.toFixed(4)}, at the default ${dflt.f1.toFixed(4)} (recall ${dflt.recall.toFixed(3)} of ${none.recall.toFixed(3)}, precision ${dflt.precision.toFixed(3)} of ${none.precision.toFixed(3)}, quiet ${dflt.quietShare.toFixed(3)})`,
        );
        expect(atHeld.f1).toBeGreaterThan(none.f1);
        expect(dflt.f1).toBeGreaterThan(none.f1);
        expect(dflt.quietShare).toBeLessThan(0.25);
      }
    }
    const mean = [...fits.values()].reduce((a, b) => a + b, 0) / fits.size;
    expect(Math.abs(DEFAULT_MIN_SIMILARITY - mean)).toBeLessThan(0.02);
  });

  it('a text foreign to the collection gets no suggestion (CRAN aeronautics abstracts added one at a time to the Django manual)', () => {
    // test/fixtures/corpora/cran: the Cranfield collection's abstracts (provenance in its README).
    const dj = loadRankingFixture('django-doc');
    const cran = loadCollection('cran').docs.slice(0, 3);
    for (const doc of cran) {
      const id = `cran-${doc.id}.txt`;
      const builder = new IndexBuilder();
      for (const d of [...dj.docs, { id, text: doc.text }]) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
      const index = builder.build();
      const graph = LinkGraph.fromPairs(index.paths(), [], { noteExtensions: ['.html', '.txt'] });
      const best = index.nearby(id, { top: 1 })[0];
      console.log(`${id} among the Django pages: Nearby score ${best.score.toFixed(3)}, concept cosine ${best.conceptScore.toFixed(3)}`);
      expect(suggestLinks(index, graph, id)).toEqual([]);
      // ...while a Django page, in a collection without any link, does get suggestions.
      expect(suggestLinks(index, graph, 'topics/db/models.html').length).toBeGreaterThan(0);
    }
  });
});
